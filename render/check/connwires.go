package check

import (
	"fmt"
	"math"
	"sort"

	"pare/render/geom"
)

// ConnectorWires reads the wires that lead to the off-row connectors of one
// page: a connector's run is its net's wire from the connector's pin to
// the first junction or other pin. Two runs crossing read as a tangle at
// the sheet's edge (review16 b03, b05: connectors stacked in an order that
// was not their nets', their wires crossing on the way to them), and a run
// that passes its connector towards the edge and comes back to it is a
// loop (review16 a04's push-pull page: a grid wire ran out to the left
// edge, round the connector above, and back). Both lists are sorted.
func ConnectorWires(g *geom.Sheet) (crossings, loops []string) {
	type run struct {
		ref  string
		segs []geom.Seg
	}
	var runs []run
	for _, s := range g.Symbols {
		if _, _, ok := geom.ConnectorOf(s.Ref); !ok || len(s.Pins) != 1 {
			continue
		}
		p := s.Pins[0]
		segs := leadRun(g, p)
		runs = append(runs, run{s.Ref, segs})
		if loopsPast(s, segs) {
			loops = append(loops, fmt.Sprintf("wire to connector %s runs past it towards the edge and back", s.Ref))
		}
	}
	for i, a := range runs {
		for _, b := range runs[i+1:] {
			if n := CrossCount(a.segs, b.segs); n > 0 {
				crossings = append(crossings, fmt.Sprintf("wires to connectors %s and %s cross %d time(s)", a.ref, b.ref, n))
			}
		}
	}
	sort.Strings(crossings)
	sort.Strings(loops)
	return crossings, loops
}

// leadRun is the wire of p's net from p to the first point where it
// branches, ends or meets another pin.
func leadRun(g *geom.Sheet, p geom.Pin) []geom.Seg {
	var segs []geom.Seg
	for _, w := range g.Wires {
		if w.Net == p.Net {
			segs = append(segs, w.Segs...)
		}
	}
	segs = splitAtEnds(segs)
	adj := map[geom.Pt][]geom.Pt{}
	for _, s := range segs {
		a, b := snap(s.A), snap(s.B)
		if a != b {
			adj[a] = append(adj[a], b)
			adj[b] = append(adj[b], a)
		}
	}
	pins := map[geom.Pt]bool{}
	for _, s := range g.Symbols {
		for _, q := range s.Pins {
			if q.Net == p.Net {
				pins[snap(q.At)] = true
			}
		}
	}
	start, ok := nearestEnd(adj, p.At)
	if !ok {
		return nil
	}
	var out []geom.Seg
	prev, cur := start, start
	for step := 0; step <= len(segs); step++ {
		var next []geom.Pt
		for _, q := range adj[cur] {
			if q != prev {
				next = append(next, q)
			}
		}
		if len(next) != 1 || cur != start && pins[cur] {
			break
		}
		out = append(out, geom.Seg{A: cur, B: next[0]})
		prev, cur = cur, next[0]
	}
	return out
}

// nearestEnd is the point of a net's wire graph nearest pin point at,
// within a grid step: a connector's pin stands off the routing grid by a
// fraction of a step (its body is centred on its text), and the wire stops
// on the grid beside it.
func nearestEnd(adj map[geom.Pt][]geom.Pt, at geom.Pt) (geom.Pt, bool) {
	var best geom.Pt
	bd := 1.0
	ok := false
	for q := range adj {
		d := math.Abs(q.X-at.X) + math.Abs(q.Y-at.Y)
		if d < bd || d == bd && ok && (q.Y < best.Y || q.Y == best.Y && q.X < best.X) {
			best, bd, ok = q, d, true
		}
	}
	return best, ok
}

// splitAtEnds cuts each segment at every end of another segment lying
// inside it, so that a T onto a wire is a point of the wire's graph.
func splitAtEnds(segs []geom.Seg) []geom.Seg {
	var ends []geom.Pt
	for _, s := range segs {
		ends = append(ends, snap(s.A), snap(s.B))
	}
	var out []geom.Seg
	for _, s := range segs {
		a, b := snap(s.A), snap(s.B)
		cuts := []geom.Pt{a, b}
		for _, e := range ends {
			if e != a && e != b && onSeg(e, a, b) {
				cuts = append(cuts, e)
			}
		}
		sort.Slice(cuts, func(i, j int) bool {
			return math.Abs(cuts[i].X-a.X)+math.Abs(cuts[i].Y-a.Y) < math.Abs(cuts[j].X-a.X)+math.Abs(cuts[j].Y-a.Y)
		})
		for i := 1; i < len(cuts); i++ {
			if cuts[i] != cuts[i-1] {
				out = append(out, geom.Seg{A: cuts[i-1], B: cuts[i]})
			}
		}
	}
	return out
}

// onSeg reports whether e lies on the axis-parallel segment a–b.
func onSeg(e, a, b geom.Pt) bool {
	return e.X >= math.Min(a.X, b.X)-geom.Eps && e.X <= math.Max(a.X, b.X)+geom.Eps &&
		e.Y >= math.Min(a.Y, b.Y)-geom.Eps && e.Y <= math.Max(a.Y, b.Y)+geom.Eps
}

// snap rounds a point to a thousandth of a grid step, so that ends meeting
// on the grid compare equal.
func snap(p geom.Pt) geom.Pt {
	return geom.Pt{X: math.Round(p.X*1000) / 1000, Y: math.Round(p.Y*1000) / 1000}
}

// loopsPast reports whether a run reaches more than half a grid step
// beyond where it meets its connector, towards the connector's body (the
// sheet's edge).
func loopsPast(s geom.Symbol, segs []geom.Seg) bool {
	if len(segs) == 0 {
		return false
	}
	x0 := segs[0].A.X
	sign := 1.0
	if (s.Box.X0+s.Box.X1)/2 < x0 {
		sign = -1
	}
	for _, sg := range segs {
		for _, q := range []geom.Pt{sg.A, sg.B} {
			if (q.X-x0)*sign > 0.5 {
				return true
			}
		}
	}
	return false
}

// CrossCount counts the perpendicular crossings of two sets of segments
// inside both (the sheet tests count grey over black wires with it).
func CrossCount(a, b []geom.Seg) int {
	n := 0
	for _, s := range a {
		for _, t := range b {
			if s.Horizontal() == t.Horizontal() {
				continue
			}
			h, v := s, t
			if !s.Horizontal() {
				h, v = t, s
			}
			x, y := v.A.X, h.A.Y
			if x > math.Min(h.A.X, h.B.X)+geom.Eps && x < math.Max(h.A.X, h.B.X)-geom.Eps &&
				y > math.Min(v.A.Y, v.B.Y)+geom.Eps && y < math.Max(v.A.Y, v.B.Y)-geom.Eps {
				n++
			}
		}
	}
	return n
}
