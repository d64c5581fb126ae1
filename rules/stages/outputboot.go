package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A bootstrapped load: a driver's load resistor split in two, the tap
// taken by a capacitor to the output its signal drives (an output pair's
// mid-point), so the load's top end follows the signal and the driver sees
// a load many times the resistor's (handbook: R/(1 − A), A the gain from
// the driver's output to the tap, from memory). The stage is the driver:
// the amplifying device whose output electrode reaches the load through
// DC paths (resistors, diodes, a preset: an output pair's bias network),
// with its common resistors to chassis. Named only where the solver bears
// the bootstrap out: the load the driver's output sees in circuit, the
// driver made quiet, is at least bootMinRatio times what it is with the
// bootstrap capacitor open.
func init() {
	calcs["bootstrap"] = calc{args: []string{"ra", "rb", "cb"}, required: []string{"ra", "rb", "cb"}, fn: calcBootstrap}
}

// bootMinRatio is the least rise of the driver's load that the bootstrap
// must give: two (6 dB of gain; common practice, no source: a working
// bootstrap gives ten or more).
const bootMinRatio = 2.0

var byBootPlain = figure.ByFormula("R = Ra + Rb, the load resistors in series without the bootstrap")

func calcBootstrap(x *figCtx) {
	ra, rb, cb := x.part("ra"), x.part("rb"), x.part("cb")
	if ra == nil || rb == nil || cb == nil {
		return
	}
	boot := sharedNet(ra, rb)
	ra, rb, top, drv, out := bootDriver(x.w.c, ra, rb, boot)
	if drv == nil {
		return // no driver reaches the load: no figures, the guard drops the match
	}
	lead := commonLeadOf(x.w.c, drv)
	take := append([]*graph.Part{drv}, lead.parts...)
	take = append(take, decoupledLine(x.w.c, rb, boot)...)
	x.claimInstead(nil, take)
	x.set("r_load_plain", figure.Ohm, ra.Value.Max+rb.Value.Max, byBootPlain)
	if !x.solve {
		return
	}
	b := x.w.c.BandOf(drv)
	if b.Min <= 0 || b.Max <= b.Min {
		return
	}
	f := math.Sqrt(b.Min * b.Max)
	base := withPart(x.solverCircuit(), quietPart(drv))
	whole, okZ := drivenZ(base, out, f)
	with, okW := resistorZ(base, out, top, boot, ra.Value.Max, f)
	plain, okP := resistorZ(without(base, cb.Ref), out, top, boot, ra.Value.Max, f)
	if !okZ || !okW || !okP {
		return
	}
	at := hz(f) + ", " + drv.Ref + " made quiet, 1 A into " + out
	x.put(figure.Figure{Name: "r_boot", Unit: figure.Ohm, Value: with,
		Origin: figure.BySolver(ra.Ref+"·V("+top+")/(V("+top+") − V("+boot+")): what the load presents", at)})
	x.putChecked(&figure.Figure{Name: "r_load_plain", Unit: figure.Ohm, Value: plain,
		Origin: figure.BySolver("the same with "+cb.Ref+" open", at)},
		&figure.Figure{Name: "r_load_plain", Unit: figure.Ohm, Value: ra.Value.Max + rb.Value.Max, Origin: byBootPlain}, nil)
	x.put(figure.Figure{Name: "r_load", Unit: figure.Ohm, Value: whole,
		Origin: figure.BySolver("|Z("+out+")|: everything the driver's output sees, the next stage's input too", at)})
	ctl := drv.NetOf(drv.PinWithRole(graph.RoleControl))
	if g, ok := transferAt(x.solverCircuit(), ctl, out, f); ok && ctl != "" {
		check, why := x.partBypass(drv, lead, ctl, out, f, g, whole)
		x.putChecked(&figure.Figure{Name: "gain", Unit: figure.Ratio, Value: g,
			Origin: figure.BySolver("V("+out+")/V("+ctl+")", hz(f)+", "+gangMid.at)}, check, why)
	}
	if with < bootMinRatio*plain {
		x.st.unconfirmed = fmt.Sprintf("%s raises the load %s presents to %s only from %s to %s in circuit", cb.Ref, ra.Ref, drv.Ref,
			figure.Format(plain, figure.Ohm, figure.Text), figure.Format(with, figure.Ohm, figure.Text))
		return
	}
	if whole < with/bootMinRatio {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("the bootstrap lifts %s's load to %s, but what else %s feeds (the next stage's input) brings the whole load down to %s",
			ra.Ref, figure.Format(with, figure.Ohm, figure.Text), out, figure.Format(whole, figure.Ohm, figure.Text)))
	}
}

// bootDriver finds the driver beyond the load resistor ra from the tap
// boot; the two halves are alike to the matcher, so with rb's far end on a
// decoupled line, not chassis, the driver may be beyond either, and the
// halves come back in order (ra the driver's side) with the load's top.
func bootDriver(c *graph.Circuit, ra, rb *graph.Part, boot string) (ra2, rb2 *graph.Part, top string, drv *graph.Part, out string) {
	top = farEnd(ra, boot)
	drv, out = drivingDevice(c, top, boot)
	if drv == nil && !c.RoleOf(farEnd(rb, boot)).IsACGround() {
		ra, rb = rb, ra
		top = farEnd(ra, boot)
		drv, out = drivingDevice(c, top, boot)
	}
	return ra, rb, top, drv, out
}

// decoupledLine is the resistor from the rail and the capacitor to chassis
// of the driver's own decoupled line where rb ends on one: they serve this
// load alone, not an RC section of their own. None where rb ends on chassis.
func decoupledLine(c *graph.Circuit, rb *graph.Part, boot string) []*graph.Part {
	rail := farEnd(rb, boot)
	if c.RoleOf(rail).IsACGround() {
		return nil
	}
	caps, rs, ok := footOf(c, rail, rb)
	if !ok || len(caps) == 0 {
		return nil
	}
	return append(caps, rs...)
}

// farEnd is the net of a two-pin part that is not net.
func farEnd(p *graph.Part, net string) string {
	if n := p.NetOf(p.Pins[0].Name); n != net {
		return n
	}
	return p.NetOf(p.Pins[1].Name)
}

// transferAt is V(out)/V(in) at f with in driven, signed by its real
// part (an inverting stage's gain is negative).
func transferAt(c *graph.Circuit, in, out string, f float64) (float64, bool) {
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return 0, false
	}
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return 0, false
	}
	g := cmplx.Abs(h)
	if real(h) < 0 {
		g = -g
	}
	return g, true
}

// transferAtC is V(out)/V(in) at f with in driven, as solved: complex.
func transferAtC(c *graph.Circuit, in, out string, f float64) (complex128, bool) {
	r, err := ac.NewTransfer(c, in, out, gangMid.options())
	if err != nil {
		return 0, false
	}
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return 0, false
	}
	return h, true
}

// resistorZ is what a load resistor r from top to tap presents to the
// circuit, |r·V(top)/(V(top) − V(tap))|, with 1 A driven into net at f: r
// itself with its tap at AC ground, far more where the tap follows the
// signal.
func resistorZ(c *graph.Circuit, net, top, tap string, r, f float64) (float64, bool) {
	vt, err1 := ac.NewTransimpedance(c, net, top, gangMid.options())
	vb, err2 := ac.NewTransimpedance(c, net, tap, gangMid.options())
	if err1 != nil || err2 != nil {
		return 0, false
	}
	ht, e1 := vt.At(f)
	hb, e2 := vb.At(f)
	if e1 != nil || e2 != nil || ht == hb {
		return 0, false
	}
	z := cmplx.Abs(complex(r, 0) * ht / (ht - hb))
	return z, !math.IsNaN(z) && !math.IsInf(z, 0)
}

// drivenZ is |Z| into net at f, nil-safe.
func drivenZ(c *graph.Circuit, net string, f float64) (float64, bool) {
	r, err := ac.NewTransimpedance(c, net, net, gangMid.options())
	if err != nil {
		return 0, false
	}
	m := magnitude(r, f)
	return m, !math.IsNaN(m) && m > 0
}

// bootWalkDepth is how many parts a walk from a load to its driver may
// cross: an output pair's bias network has up to three (two diodes and a
// preset).
const bootWalkDepth = 4

// drivingDevice is the amplifying device whose output electrode net
// reaches net through DC paths (resistors, pots, diodes, a Vbe
// multiplier collector to emitter) within
// bootWalkDepth parts, never through AC ground nor back through the
// bootstrap tap (the far half of the load leads to the rail, not to a
// driver: walked through the tap, a load whose far end is a decoupled line
// finds the driver from the wrong end), and that output net; nil when none
// does, or more than one.
func drivingDevice(c *graph.Circuit, net, tap string) (*graph.Part, string) {
	seen := map[string]bool{net: true, tap: true}
	frontier := []string{net}
	for d := 0; d <= bootWalkDepth && len(frontier) > 0; d++ {
		var next []string
		var found *graph.Part
		at := ""
		for _, n := range frontier {
			for _, cn := range c.ConnsOf(n) {
				p := cn.Part
				if p.IsActive() && graph.RoleOfPin(p.Kind, cn.Pin) == graph.RoleOutput {
					if e := p.NetOf("e"); vbeMultiplierAcross(c, p) && !seen[e] {
						seen[e] = true // a bias source, crossed like diodes
						next = append(next, e)
						continue
					}
					if found != nil && found != p {
						return nil, ""
					}
					found, at = p, n
					continue
				}
				if p.Kind != graph.Resistor && p.Kind != graph.Pot && p.Kind != graph.Diode {
					continue
				}
				for _, q := range p.Pins {
					if q.Net != n && !seen[q.Net] && !c.RoleOf(q.Net).IsACGround() {
						seen[q.Net] = true
						next = append(next, q.Net)
					}
				}
			}
		}
		if found != nil {
			return found, at
		}
		frontier = next
	}
	return nil, ""
}
