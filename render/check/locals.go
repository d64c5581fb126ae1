package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// localNear is how close, in grid steps, a ground, rail or flag symbol may
// come to another net's wire, pin or junction dot: an earth bar drawn on a
// mains primary's junction read as that primary tied to chassis, and a flag
// set on an earth symbol read as the earthed part going to the flag's net.
// Anything under one grid step reads as touching at print size.
const localNear = 1.0

// localOn is the distance under which such a symbol sits on the other net:
// touching its wire, or on the grid line next to its pin or junction dot
// (the earth bars half a step from a mains primary's dot).
const localOn = 0.5

// localsNear reports each local symbol (earth, rail tag, net flag) whose
// drawn box lies on or within localNear of a wire, a pin or a junction dot
// of another net: in LocalsOn when it touches the wire or comes within
// localOn of the pin or dot, else in LocalsNear. The symbol's own stub and its own net's wires are its
// connection, so they do not count; overlaps with symbols are
// symbolOverlaps' and wires through it wiresThrough's.
func (r *Report) localsNear(g *geom.Sheet, segs []netSeg) {
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	type pinAt struct {
		ref string
		p   geom.Pin
	}
	var pins []pinAt
	var pix, dix bucketed
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			pix.add(len(pins), geom.Rect{X0: p.At.X, Y0: p.At.Y, X1: p.At.X, Y1: p.At.Y})
			pins = append(pins, pinAt{s.Ref, p})
		}
	}
	dotNets := dotsNets(g, segs, &six)
	for i, d := range g.Dots {
		dix.add(i, geom.Rect{X0: d.X, Y0: d.Y, X1: d.X, Y1: d.Y})
	}
	for _, l := range g.Locals {
		name := fmt.Sprintf("%s %s at %s.%s", localWord(l.Kind), l.Net, l.Owner, l.Pin)
		area := l.Box.Inset(localNear)
		for _, j := range six.near(area) {
			w := segs[j]
			if w.net == l.Net || w.net == notConnected {
				continue
			}
			if d := rectSeg(l.Box, w.seg); d < localNear-geom.Eps {
				r.addLocal(d < geom.Eps, fmt.Sprintf("%s is %.2g from a wire of %s %s-%s", name, d, w.net, pt(w.seg.A), pt(w.seg.B)))
				break
			}
		}
		for _, j := range pix.near(area) {
			p := pins[j]
			if p.p.Net == l.Net || p.p.Net == notConnected {
				continue
			}
			if d := rectPt(l.Box, p.p.At); d < localNear-geom.Eps {
				r.addLocal(d < localOn, fmt.Sprintf("%s is %.2g from pin %s.%s of %s", name, d, p.ref, p.p.Name, p.p.Net))
				break
			}
		}
		for _, j := range dix.near(area) {
			if dotNets[j][l.Net] {
				continue
			}
			if d := rectPt(l.Box, g.Dots[j]); d < localNear-geom.Eps {
				r.addLocal(d < localOn, fmt.Sprintf("%s is %.2g from a junction dot at %s", name, d, pt(g.Dots[j])))
				break
			}
		}
	}
}

// earthsFacing reports each earth symbol with a wire of another net less
// than localNear past its bars, across their width: the eye runs the stub
// on through the bars into that wire, so the wire reads as chassis. An
// earth beside a wire (LocalsNear) does not read so; one in front of it
// does, whichever view or net.
func (r *Report) earthsFacing(g *geom.Sheet, segs []netSeg) {
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	for _, l := range g.Locals {
		if l.Kind != geom.LocalGround {
			continue
		}
		b := l.Box
		ahead := geom.Rect{X0: b.X0, Y0: b.Y0 - localNear, X1: b.X1, Y1: b.Y0}
		if l.Down {
			ahead = geom.Rect{X0: b.X0, Y0: b.Y1, X1: b.X1, Y1: b.Y1 + localNear}
		}
		for _, j := range six.near(ahead) {
			w := segs[j]
			if w.net == l.Net || w.net == notConnected {
				continue
			}
			if d := rectSeg(ahead, w.seg); d < geom.Eps {
				r.EarthsFacing = append(r.EarthsFacing, fmt.Sprintf("earth symbol of %s at %s.%s faces a wire of %s %s-%s", l.Net, l.Owner, l.Pin, w.net, pt(w.seg.A), pt(w.seg.B)))
				break
			}
		}
	}
}

func (r *Report) addLocal(on bool, what string) {
	if on {
		r.LocalsOn = append(r.LocalsOn, what)
		return
	}
	r.LocalsNear = append(r.LocalsNear, what)
}

// dotsNets lists the nets whose wires pass through each junction dot.
func dotsNets(g *geom.Sheet, segs []netSeg, six *bucketed) []map[string]bool {
	out := make([]map[string]bool, len(g.Dots))
	for i, d := range g.Dots {
		out[i] = map[string]bool{}
		for _, j := range six.near(geom.Rect{X0: d.X, Y0: d.Y, X1: d.X, Y1: d.Y}) {
			if pointSeg(d, segs[j].seg) < geom.Eps {
				out[i][segs[j].net] = true
			}
		}
	}
	return out
}

func localWord(k geom.LocalKind) string {
	switch k {
	case geom.LocalGround:
		return "earth symbol of"
	case geom.LocalRail:
		return "rail tag of"
	}
	return "net flag of"
}

// rectPt is the distance from p to the rectangle b (0 inside it).
func rectPt(b geom.Rect, p geom.Pt) float64 {
	x := math.Max(b.X0, math.Min(p.X, b.X1))
	y := math.Max(b.Y0, math.Min(p.Y, b.Y1))
	return math.Hypot(p.X-x, p.Y-y)
}

// rectSeg is the distance from the axis-parallel segment s to the rectangle
// b (0 when they touch).
func rectSeg(b geom.Rect, s geom.Seg) float64 {
	sb := s.Box()
	dx := math.Max(0, math.Max(sb.X0-b.X1, b.X0-sb.X1))
	dy := math.Max(0, math.Max(sb.Y0-b.Y1, b.Y0-sb.Y1))
	return math.Hypot(dx, dy)
}
