package check

import (
	"fmt"
	"math"

	"pare/render/geom"
)

// leadClear is the distance, in grid steps, from a part's pin on either
// crossing net within which a crossing reads as the crossing wire joined at
// the pin, across the part's lead (review16 a03: the triode's
// anode wire crossed the HT side of its own anode load a step from the
// resistor's end, and the resistor read as shorted).
const leadClear = 2.0

// nearPins finds crossings within leadClear to a part's pin on either
// of the two nets; a part with pins on both nets reads as shorted.
func (r *Report) nearPins(g *geom.Sheet, xs []crossing) {
	var pix bucketed
	type pinAt struct {
		sym int
		pin geom.Pin
	}
	var pins []pinAt
	for i, s := range g.Symbols {
		if s.Kind == "" {
			continue // the sheet's own flags and connectors have no lead
		}
		for _, p := range s.Pins {
			pix.add(len(pins), geom.Rect{X0: p.At.X, Y0: p.At.Y, X1: p.At.X, Y1: p.At.Y})
			pins = append(pins, pinAt{i, p})
		}
	}
	for _, x := range xs {
		for _, i := range pix.near(geom.Rect{X0: x.at.X, Y0: x.at.Y, X1: x.at.X, Y1: x.at.Y}.Inset(leadClear)) {
			p := pins[i]
			d := math.Hypot(p.pin.At.X-x.at.X, p.pin.At.Y-x.at.Y)
			if d > leadClear+geom.Eps || p.pin.Net != x.a && p.pin.Net != x.b {
				continue
			}
			s := g.Symbols[p.sym]
			how := "reads as joined there"
			other := x.a
			if p.pin.Net == x.a {
				other = x.b
			}
			for _, q := range s.Pins {
				if q.Net == other {
					how = "reads as shorted"
				}
			}
			r.NearPins = append(r.NearPins, fmt.Sprintf("wires of %s and %s cross at %s, %g from %s's pin %s: %s %s", x.a, x.b, pt(x.at), d, s.Ref, p.pin.Name, s.Ref, how))
			break
		}
	}
}

// commonPins are the common electrode's pin name by symbol kind: the
// emitter, source or cathode whose lead a reader follows down to its
// resistor and bypass.
var commonPins = map[string]string{"bjt": "e", "fet": "s", "valve": "k"}

// commonLeads finds crossings on the straight run of wire that leaves a
// device's common electrode: a wire drawn across an emitter or cathode
// lead reads as joined to it (review18 b04: the bootstrap wire across the
// driver's emitter lead). One finding per crossing.
func (r *Report) commonLeads(g *geom.Sheet, xs []crossing) {
	for _, s := range g.Symbols {
		name, ok := commonPins[s.Kind]
		if !ok {
			continue
		}
		for _, p := range s.Pins {
			if p.Name != name {
				continue
			}
			for _, w := range g.Wires {
				if w.Net != p.Net {
					continue
				}
				for _, sg := range w.Segs {
					if !samePt(sg.A, p.At) && !samePt(sg.B, p.At) {
						continue
					}
					for _, x := range xs {
						if (x.a == p.Net || x.b == p.Net) && inside(sg, x.at) {
							r.CommonLeads = append(r.CommonLeads, fmt.Sprintf("wire of %s crosses %s's %s lead (%s) at %s", otherNet(x, p.Net), s.Ref, name, p.Net, pt(x.at)))
						}
					}
				}
			}
		}
	}
}

// samePt says whether two points are one.
func samePt(a, b geom.Pt) bool {
	return math.Abs(a.X-b.X) < geom.Eps && math.Abs(a.Y-b.Y) < geom.Eps
}

// inside says whether point q lies on segment s short of its ends.
func inside(s geom.Seg, q geom.Pt) bool {
	b := s.Box()
	if s.Horizontal() {
		return math.Abs(q.Y-b.Y0) < geom.Eps && q.X > b.X0+geom.Eps && q.X < b.X1-geom.Eps
	}
	return math.Abs(q.X-b.X0) < geom.Eps && q.Y > b.Y0+geom.Eps && q.Y < b.Y1-geom.Eps
}

// otherNet is the net of a crossing that is not net.
func otherNet(x crossing, net string) string {
	if x.a == net {
		return x.b
	}
	return x.a
}
