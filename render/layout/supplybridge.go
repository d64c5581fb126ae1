package layout

import (
	"pare/graph"
	"pare/render/geom"
)

// A four-diode bridge drawn as the trade's diamond (supplyflow.go): its
// corners at the compass points, the AC corners at the top and bottom,
// the − corner left and the + corner right, each diode an upright symbol
// on the side between the two corners it joins.

// bridge is a four-diode bridge: minus[i] from the − net to ac[i],
// plus[i] from ac[i] to the + net.
type bridge struct {
	ac          [2]string
	minus, plus [2]*cell
}

// diodeNets are a diode cell's anode and cathode nets.
func diodeNets(cl *cell) (a, k string, ok bool) {
	if cl.part == nil || cl.part.Kind != graph.Diode {
		return "", "", false
	}
	a, k = cl.part.NetOf("a"), cl.part.NetOf("k")
	return a, k, a != "" && k != "" && a != k
}

// findBridges finds the four-diode bridges among cells: two diodes from
// different nets into one cathode net, and two from one anode net into
// those two nets.
func findBridges(cells []*cell) []bridge {
	var out []bridge
	used := map[*cell]bool{}
	for i, p0 := range cells {
		a0, k0, ok := diodeNets(p0)
		if !ok || used[p0] {
			continue
		}
		for _, p1 := range cells[i+1:] {
			a1, k1, ok := diodeNets(p1)
			if !ok || used[p1] || k1 != k0 || a1 == a0 {
				continue
			}
			m0, m1 := minusInto(cells, a0, a1, used)
			if m0 == nil {
				continue
			}
			b := bridge{ac: [2]string{a0, a1}, minus: [2]*cell{m0, m1}, plus: [2]*cell{p0, p1}}
			for _, c := range []*cell{p0, p1, m0, m1} {
				used[c] = true
			}
			out = append(out, b)
			break
		}
	}
	return out
}

// minusInto finds two diodes with cathodes on x and y and one anode net
// between them.
func minusInto(cells []*cell, x, y string, used map[*cell]bool) (*cell, *cell) {
	for _, m0 := range cells {
		a0, k0, ok := diodeNets(m0)
		if !ok || used[m0] || k0 != x {
			continue
		}
		for _, m1 := range cells {
			a1, k1, ok := diodeNets(m1)
			if ok && m1 != m0 && !used[m1] && k1 == y && a1 == a0 {
				return m0, m1
			}
		}
	}
	return nil, nil
}

// bridgeDiode says whether a cell is one of a drawn bridge's diodes.
func (ly *state) bridgeDiode(cl *cell) bool {
	for _, b := range ly.bridges {
		for i := range 2 {
			if b.minus[i] == cl || b.plus[i] == cl {
				return true
			}
		}
	}
	return false
}

// diamonds sets each bridge's diodes on the sides of its diamond: the
// pair on the AC line the transformer's secondary brings in higher at
// the top, − diode left and + diode right in their columns, the other
// pair under it far enough that the + corner's wire and the locals at the
// − corner pass between; the transformer's wires reach the AC corners
// from above and below. A move that would touch another part is not made.
func (ly *state) diamonds(cols [][]*block) {
	blockOf := map[*cell]*block{}
	var all []*block
	for _, col := range cols {
		for _, b := range col {
			all = append(all, b)
			for _, cl := range b.cells {
				blockOf[cl] = b
			}
		}
	}
	for _, br := range ly.bridges {
		ly.diamond(br, blockOf, all)
	}
}

// diamond places one bridge (see diamonds).
func (ly *state) diamond(br bridge, blockOf map[*cell]*block, all []*block) {
	four := []*cell{br.minus[0], br.plus[0], br.minus[1], br.plus[1]}
	for _, cl := range four {
		if b := blockOf[cl]; b == nil || len(b.cells) != 1 || len(b.chain) > 0 {
			return
		}
	}
	y0, y1 := ly.acLevel(br, 0), ly.acLevel(br, 1)
	top := 0
	if y1 < y0 {
		top = 1
	}
	h := 0.0
	for _, cl := range four {
		h = max(h, blockOf[cl].fp.H())
	}
	mid := (y0 + y1) / 2
	gap := h + ly.gapY()
	want := map[*cell]float64{}
	for i := range 2 {
		y := mid + gap/2
		if i == top {
			y = mid - gap/2
		}
		want[br.minus[i]], want[br.plus[i]] = y, y
	}
	moves := map[*block]geom.Pt{}
	for _, cl := range four {
		moves[blockOf[cl]] = geom.Pt{Y: snap(want[cl] - pinY(cl, "a"))}
	}
	for b, d := range moves {
		r := b.fp.Move(d)
		for _, o := range all {
			if _, mine := moves[o]; !mine && o.fp.Overlaps(r) {
				return
			}
		}
	}
	for b, d := range moves {
		b.move(d)
	}
}

// acLevel is the height an AC line comes in at: the transformer pin on it,
// else the − diode's pin.
func (ly *state) acLevel(br bridge, i int) float64 {
	for _, cl := range ly.cells {
		if cl.part.Kind != graph.Transformer {
			continue
		}
		for _, p := range cl.shape.Pins {
			if p.Net == br.ac[i] {
				return p.At.Y
			}
		}
	}
	return pinY(br.minus[i], "k")
}

// pinY is the height of a cell's pin.
func pinY(cl *cell, name string) float64 {
	for _, p := range cl.shape.Pins {
		if p.Name == name {
			return p.At.Y
		}
	}
	return (cl.shape.Box.Y0 + cl.shape.Box.Y1) / 2
}

// snap rounds a move to whole grid steps.
func snap(v float64) float64 {
	if v < 0 {
		return -float64(int(-v + 0.5))
	}
	return float64(int(v + 0.5))
}
