package layout

import "strings"

// The faded view is the full view's geometry: the router never looks at
// which pins are faded, and once a net is wired fadeRuns marks the steps
// that serve only faded pins, so the two views draw the same wires and
// differ only in style.

// fadeRuns greys the steps of net id that serve only faded pins: the wired
// tree pruned leaf by leaf from every end that is not a live pin. What is
// left joins the live pins and stays black; a net with one live pin or none
// is faded whole.
func (rt *router) fadeRuns(id int) {
	nr := rt.nets[id]
	net := int32(id + 1)
	live := map[int]bool{}
	someFaded := false
	for _, p := range nr.pins {
		if p.faded {
			someFaded = true
		} else {
			live[p.cell] = true
		}
	}
	for _, c := range nr.cells { // flags left from an earlier emit of this grid
		if rt.edgeE(c, net) {
			rt.setFaded(c, fFadedE, false)
		}
		if rt.edgeS(c, net) {
			rt.setFaded(c, fFadedS, false)
		}
	}
	if !someFaded {
		return
	}
	gone := map[int]bool{}
	var queue []int
	for _, c := range nr.cells {
		if !live[c] && len(rt.stepsLeft(c, net, gone)) == 1 {
			queue = append(queue, c)
		}
	}
	for len(queue) > 0 {
		c := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		st := rt.stepsLeft(c, net, gone)
		if live[c] || len(st) != 1 {
			continue // already pruned through another end
		}
		s := st[0]
		gone[s.key] = true
		if s.key%2 == 0 {
			rt.setFaded(s.key/2, fFadedE, true)
		} else {
			rt.setFaded(s.key/2, fFadedS, true)
		}
		if !live[s.to] && len(rt.stepsLeft(s.to, net, gone)) == 1 {
			queue = append(queue, s.to)
		}
	}
}

// step is one unit step of a net's wire: key 2c is the step east of cell c,
// 2c+1 the step south; to is the cell at its other end.
type step struct{ key, to int }

// stepsLeft are the net's steps at cell c not yet pruned.
func (rt *router) stepsLeft(c int, net int32, gone map[int]bool) []step {
	var out []step
	add := func(key, to int) {
		if !gone[key] {
			out = append(out, step{key, to})
		}
	}
	if rt.edgeE(c, net) {
		add(2*c, c+1)
	}
	if c%rt.w > 0 && rt.edgeE(c-1, net) {
		add(2*(c-1), c-1)
	}
	if rt.edgeS(c, net) {
		add(2*c+1, c+rt.w)
	}
	if rt.edgeS(c-rt.w, net) {
		add(2*(c-rt.w)+1, c-rt.w)
	}
	return out
}

// mergeMark is the label item of a part merged into another ("→ VC1a").
func mergeMark(to string) string { return "\u2192 " + to }

// plain takes the faded style and the merge marks off a laid-out sheet,
// leaving every box, symbol and wire where it is: the label keeps the room
// its mark took, so nothing moves between the full and the faded view.
func plain(ly *state, res *Result) {
	g := &res.Geom
	marks := map[string]string{}
	for _, cl := range ly.cells {
		if cl.mark != "" {
			marks[cl.ref] = cl.mark
		}
	}
	for i := range res.Placed {
		res.Placed[i].Faded = false
	}
	for i := range g.Symbols {
		g.Symbols[i].Faded = false
	}
	for i := range g.Locals {
		g.Locals[i].Faded = false
	}
	for i := range g.Wires {
		for k := range g.Wires[i].Faded {
			g.Wires[i].Faded[k] = false
		}
	}
	for i := range g.Labels {
		l := &g.Labels[i]
		l.Faded = false
		if m := marks[l.Owner]; m != "" && !l.Small && len(l.Lines) > 1 {
			l.Lines = append([]string(nil), l.Lines...)
			l.Lines[1] = dropItem(l.Lines[1], m)
			if l.Lines[1] == "" {
				l.Lines = append(l.Lines[:1], l.Lines[2:]...)
			}
		}
	}
}

// dropItem removes item from a label line of items joined by ", ".
func dropItem(line, item string) string {
	switch {
	case line == item:
		return ""
	case strings.HasPrefix(line, item+", "):
		return strings.TrimPrefix(line, item+", ")
	}
	return strings.Replace(line, ", "+item, "", 1)
}
