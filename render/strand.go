package render

import "slices"

// The page-balance search (pagesearch.go) cuts rows the greedy flow never
// tries, and a part no frame holds is a stretch of its own wherever the
// whole sheet's placement put it: review15 a05's anode decoupler (C3, and
// R2 from the smoothed line) stood by x either side of the rectifier, so a
// row of the rectifier alone took them both, away from the amplifier whose
// anode line they feed and from the smoothing filter that feeds them, and
// their nets looped out to off-row connectors at both edges. A reader
// looks for a decoupler beside the stage it serves (common practice: the
// parts of a line drawn where the line is used); a row that holds such a
// part with none of the stages it is wired to strands it, and the search
// never chooses that row.

// homes are, per stretch, the framed stretches an unframed part of a
// supply line is wired to (through wired nets, across other unframed
// stretches): the supply stage that feeds it and the stages it serves.
// nil for a framed stretch, a port, the loose parts, and an unframed part
// wired to no supply stage.
func (f *flow) homes() [][]int {
	if f.home != nil {
		return f.home
	}
	framed, supply := map[string]bool{}, map[string]bool{}
	for _, fr := range f.s.Frames {
		for _, r := range fr.Parts {
			framed[r] = true
			supply[r] = supply[r] || fr.Supply
		}
	}
	kind := make([]int, len(f.bs)) // 0 unframed, 1 framed, 2 neither (a port, the loose parts)
	for i, b := range f.bs {
		switch {
		case b.port || b.loose:
			kind[i] = 2
		case slices.ContainsFunc(b.refs, func(r string) bool { return framed[r] }):
			kind[i] = 1
		}
	}
	f.home = make([][]int, len(f.bs))
	for i := range f.bs {
		if kind[i] != 0 {
			continue
		}
		home := f.reach(i, kind)
		// only a part of a supply line (one reaching a rectifier or
		// smoothing frame): a loudspeaker or a volume control between
		// two stages reads on either row
		if slices.ContainsFunc(home, func(k int) bool {
			return slices.ContainsFunc(f.bs[k].refs, func(r string) bool { return supply[r] })
		}) {
			f.home[i] = home
		}
	}
	return f.home
}

// reach walks from unframed stretch i along wired nets, through the
// unframed stretches it meets, and gives the framed ones it reaches, in
// order.
func (f *flow) reach(i int, kind []int) []int {
	seen := map[int]bool{i: true}
	queue := []int{i}
	var out []int
	for len(queue) > 0 {
		j := queue[0]
		queue = queue[1:]
		for _, r := range f.bs[j].refs {
			p := f.part[r]
			if p == nil {
				continue
			}
			for _, n := range wiredNets(f.s.Circuit, p) {
				for _, cn := range f.s.Circuit.ConnsOf(n) {
					k, ok := f.blockOf[cn.Part.Ref]
					if !ok || seen[k] {
						continue
					}
					seen[k] = true
					switch kind[k] {
					case 0:
						queue = append(queue, k)
					case 1:
						out = append(out, k)
					}
				}
			}
		}
	}
	slices.Sort(out)
	return out
}

// strands says whether the row [a, b) holds an unframed stretch wired to
// stages none of which is on the row.
func (f *flow) strands(a, b int) bool {
	home := f.homes()
	for i := a; i < b; i++ {
		if len(home[i]) == 0 {
			continue
		}
		if !slices.ContainsFunc(home[i], func(k int) bool { return k >= a && k < b }) {
			return true
		}
	}
	return false
}

// stranded says whether any of the rows ending at ends strands a stretch.
func (f *flow) stranded(ends []int) bool {
	for i := range ends {
		if f.strands(start(ends, i), ends[i]) {
			return true
		}
	}
	return false
}
