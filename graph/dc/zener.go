package dc

import (
	"fmt"

	"pare/graph"
	dev "pare/graph/device"
	"pare/graph/value"
)

// diodeCurrent is the current the chart lists for a diode: a zener that
// declares its breakdown works backwards, so its current is read from
// cathode to anode (the regulator's shunt current, positive in breakdown);
// any other diode's is its forward current.
func diodeCurrent(part *graph.Part) (what, pin string, sign float64) {
	if _, ok := dev.ZenerOf(part); ok {
		return "zener current (cathode to anode)", "k", 1
	}
	return "forward current", "a", 1
}

// noteZeners says plainly when a zener declares no breakdown voltage: the
// solve then knows none, the diode is open backwards, and the line it holds
// reads what its dropper and loads alone give, high of the set's (a blind
// review's VFO: an 8.2 V line read 10.01 V with no word said). A zener
// across two held nets (a declared rail and chassis) changes nothing the
// chart shows, and is passed over: the rail's declaration holds the line.
func (p *Point) noteZeners() {
	for _, part := range p.Circuit.Parts {
		if len(part.Pins) != 2 {
			continue
		}
		if z, ok := dev.ZenerOf(part); ok {
			p.noteHeldZener(part, z)
			continue
		}
		if !dev.NoBreakdown(part) {
			continue
		}
		line := part.NetOf("k")
		if t, ok := p.m.netTerm[line]; !ok || t < 0 {
			line = part.NetOf("a")
		}
		t, ok := p.m.netTerm[line]
		if !ok || t < 0 {
			continue
		}
		v, _ := p.Volts(line)
		// four figures, as the chart prints its test points
		p.Notes = append(p.Notes, fmt.Sprintf("%s (zener) has no breakdown voltage declared: treated as open; the line it holds (%s, %s here) may read high; give its breakdown voltage (vz = \"8V2\" for an 8.2 V zener) to model it",
			part.Ref, line, value.FormatPrec(v, value.Volt, value.Symbol, 4)))
	}
}

// noteHeldZener: a zener across two held nets (a rail declared with its
// volts and chassis) whose breakdown lies below the volts held across it
// conducts as far as its rz lets it, tens of milliamps and more, which in
// the set would pull the line down to its vz: the declaration and the
// zener disagree, and the chart says so rather than show the current as
// the set's.
func (p *Point) noteHeldZener(part *graph.Part, z dev.Zener) {
	ta, okA := p.m.netTerm[part.NetOf("a")]
	tk, okK := p.m.netTerm[part.NetOf("k")]
	if !okA || !okK || ta >= 0 || tk >= 0 {
		return
	}
	vr := p.m.voltOf(p.v, tk) - p.m.voltOf(p.v, ta)
	if vr <= z.Vz {
		return
	}
	ir, _ := z.Reverse(vr)
	p.Notes = append(p.Notes, fmt.Sprintf("%s (zener, vz %s) sits across %s held at %s: above its breakdown, it carries %s as solved, where in the set it would hold the line near its vz; check the rail's declared volts against the zener",
		part.Ref, value.FormatPrec(z.Vz, value.Volt, value.Symbol, 3), part.NetOf("k"), value.FormatPrec(vr, value.Volt, value.Symbol, 4), value.FormatPrec(ir, value.Ampere, value.Symbol, 3)))
}

// zenerOpenRd is the resistance above which a zener's slope at the bias is
// taken for open: a millionth of a siemens, far above any load a regulated
// line sees (a reverse-biased junction's slope is nanosiemens and less), so
// the origins say "does not conduct" rather than print a gigohm.
const zenerOpenRd = 1e6

// zenerRds fills rd of each zener that declares its breakdown and gives
// neither rd nor off: its slope at the operating point, rz (a little more
// near the knee) in breakdown; off when it does not conduct, so the AC
// model does not take it in breakdown when the circuit holds it below.
func (p *Point) zenerRds(out *graph.Circuit, set func(*graph.Part, string, float64, string)) {
	for i := range p.m.devices {
		d := &p.m.devices[i]
		part := out.Part(d.ref)
		if d.kind != devDiode || !d.breaks || part == nil {
			continue
		}
		if _, ok := part.Param("rd"); ok {
			continue
		}
		if off, ok := part.Param("off"); ok && off != 0 {
			continue
		}
		vr := p.m.voltOf(p.v, d.t[1]) - p.m.voltOf(p.v, d.t[0])
		g := p.slopes(d)[0][0]
		if !(g > 1/zenerOpenRd) {
			set(part, "off", 1, fmt.Sprintf("%s reverse, below its breakdown (vz %s): it does not conduct", value.FormatPrec(vr, value.Volt, value.Symbol, 4), value.FormatPrec(d.zener.Vz, value.Volt, value.Symbol, 3)))
			continue
		}
		ir, _ := d.zener.Reverse(vr)
		set(part, "rd", 1/g, fmt.Sprintf("slope of the breakdown at %s, %s reverse", value.FormatPrec(ir, value.Ampere, value.Symbol, 3), value.FormatPrec(vr, value.Volt, value.Symbol, 4)))
	}
}
