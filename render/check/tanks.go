package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// tankReach is the farthest, in grid steps, a capacitor across a winding
// may stand from it, or from another capacitor standing beside the same
// winding: the trade draws a tuned circuit's L and C side by side (common
// practice), a wire's run, a rail tag and a label apart at most.
const tankReach = 8.0

// farTanks reports each capacitor across a winding drawn more than
// tankReach from it, measured from the capacitor's body to the winding's
// pins, unless it stands that near another capacitor of the same tank. A capacitor is across a winding when its nets are the winding's
// two ends (nets at AC ground, those with a ground or rail symbol,
// counting as one), or one end and AC ground while the other end returns
// to AC ground through another capacitor and carries only resistors and
// capacitors besides (a padder, a decoupled cold end). Electrolytic
// capacitors and chokes are left out: no tuned circuit.
func (r *Report) farTanks(g *geom.Sheet) {
	acg := map[string]bool{}
	for _, l := range g.Locals {
		if l.Kind == geom.LocalGround || l.Kind == geom.LocalRail {
			acg[l.Net] = true
		}
	}
	same := func(a, b string) bool { return a == b || acg[a] && acg[b] }
	onNet := map[string][]int{}
	for i, s := range g.Symbols {
		for _, p := range s.Pins {
			onNet[p.Net] = append(onNet[p.Net], i)
		}
	}
	// returns: the net goes to AC ground through a fixed capacitor other
	// than not, and holds nothing but resistors and fixed capacitors
	// besides coil (a padder, a decoupled cold end)
	returns := func(net string, coil, not int) bool {
		found := false
		for _, i := range onNet[net] {
			s := g.Symbols[i]
			switch {
			case i == coil || i == not || s.Kind == "resistor":
			case s.Kind == "capacitor" && (s.Type == "variable" || s.Type == "trimmer"):
				return false // the hot end a gang section or trimmer tunes
			case s.Kind == "capacitor" && len(s.Pins) == 2:
				found = found || acg[s.Pins[0].Net] || acg[s.Pins[1].Net]
			default:
				return false
			}
		}
		return found && !acg[net]
	}
	used := map[int]bool{}
	type tankCap struct {
		cap, coil int
		w         [2]string
		gap       float64
	}
	var found []tankCap
	for ci, coil := range g.Symbols {
		if coil.Type == "choke" {
			continue
		}
		for _, w := range coil.Windings {
			p1, p2 := pinNamed(coil, w[0]), pinNamed(coil, w[1])
			if p1 == nil || p2 == nil || same(p1.Net, p2.Net) {
				continue
			}
			for k, s := range g.Symbols {
				if used[k] || s.Kind != "capacitor" || s.Type == "electrolytic" || len(s.Pins) != 2 {
					continue
				}
				a, b := s.Pins[0].Net, s.Pins[1].Net
				if acg[a] && acg[b] || a == notConnected || b == notConnected {
					continue
				}
				across := same(a, p1.Net) && same(b, p2.Net) || same(a, p2.Net) && same(b, p1.Net) ||
					acg[b] && (a == p1.Net && returns(p2.Net, ci, k) || a == p2.Net && returns(p1.Net, ci, k)) ||
					acg[a] && (b == p1.Net && returns(p2.Net, ci, k) || b == p2.Net && returns(p1.Net, ci, k))
				if !across {
					continue
				}
				used[k] = true
				span := geom.Rect{X0: math.Min(p1.At.X, p2.At.X), Y0: math.Min(p1.At.Y, p2.At.Y), X1: math.Max(p1.At.X, p2.At.X), Y1: math.Max(p1.At.Y, p2.At.Y)}
				if coil.Kind != "transformer" {
					span = coil.Box
				}
				found = append(found, tankCap{k, ci, w, rectGap(s.Box, span)})
			}
		}
	}
	// a capacitor beside another that stands beside the same winding (a
	// trimmer beside the gang section) is part of the tank too
	near := map[int]bool{}
	for grown := true; grown; {
		grown = false
		for _, a := range found {
			if near[a.cap] {
				continue
			}
			ok := a.gap <= tankReach+geom.Eps
			for _, b := range found {
				ok = ok || near[b.cap] && b.coil == a.coil && b.w == a.w && rectGap(g.Symbols[a.cap].Box, g.Symbols[b.cap].Box) <= tankReach+geom.Eps
			}
			if ok {
				near[a.cap], grown = true, true
			}
		}
	}
	for _, a := range found {
		if !near[a.cap] {
			r.FarTanks = append(r.FarTanks, fmt.Sprintf("capacitor %s across %s's winding %s-%s stands %g from it", g.Symbols[a.cap].Ref, g.Symbols[a.coil].Ref, a.w[0], a.w[1], a.gap))
		}
	}
}

func pinNamed(s geom.Symbol, name string) *geom.Pin {
	for i := range s.Pins {
		if s.Pins[i].Name == name {
			return &s.Pins[i]
		}
	}
	return nil
}

// rectGap is the distance between two boxes along the grid (the larger of
// the horizontal and vertical gaps), 0 when they touch or overlap.
func rectGap(a, b geom.Rect) float64 {
	dx := math.Max(0, math.Max(a.X0-b.X1, b.X0-a.X1))
	dy := math.Max(0, math.Max(a.Y0-b.Y1, b.Y0-a.Y1))
	return math.Round(math.Max(dx, dy)*10) / 10
}
