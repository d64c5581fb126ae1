package rules

import (
	"math"
	"strings"

	"pare/graph"
)

// branch is one terminal on a net, seen as a path away from the net.
type branch struct {
	z    float64 // |Z| bound, Ω; +Inf for an open path, 0 for an unknown one
	text string  // "R7 1 kΩ", "V1 cathode ≈ ra/(µ+1) 476 Ω"
}

func omega(f float64) float64 { return 2 * math.Pi * f }

// capMin is the smallest capacitance a capacitor can present: the worst case
// for a bypass (largest reactance).
func capMin(p *graph.Part) float64 {
	if p.Type == graph.CapTrimmer && p.Set > 0 {
		return p.Set
	}
	return p.Value.Min
}

func capMax(p *graph.Part) float64 {
	if p.Type == graph.CapTrimmer && p.Set > 0 {
		return p.Set
	}
	return p.Value.Max
}

// windingL is the self-inductance seen from one pin of a coil or
// transformer: the smallest (lowest) or largest of the windings that end on
// it. Coupling to other windings is not subtracted: that would take the
// coupled windings as shorted, which in a working circuit they are not (a
// fully coupled tap would then count as a dead short); tuned circuits are
// caught separately by resonance.
func windingL(p *graph.Part, pin string, lowest bool) float64 {
	if len(p.Windings) == 0 {
		return p.Value.Max
	}
	best := math.Inf(1)
	if !lowest {
		best = 0
	}
	for _, w := range p.Windings {
		if w.From != pin && w.To != pin {
			continue
		}
		if lowest {
			best = math.Min(best, w.L)
		} else {
			best = math.Max(best, w.L)
		}
	}
	if math.IsInf(best, 1) {
		return 0
	}
	return best
}

// pathL is the inductance of a coil between two of its pins when one
// winding (or a whole tapped coil) joins them directly, else 0.
func pathL(p *graph.Part, a, b string) float64 {
	if len(p.Windings) == 0 {
		if p.Kind == graph.Inductor {
			return p.Value.Max
		}
		return 0
	}
	for _, w := range p.Windings {
		if (w.From == a && w.To == b) || (w.From == b && w.To == a) {
			return w.L
		}
	}
	// the two ends of a tapped coil: both sections, with their mutual inductance
	if p.Kind == graph.Inductor && ((a == "1" && b == "2") || (a == "2" && b == "1")) {
		return p.Inductance()
	}
	// the two ends of a centre-tapped transformer winding NAME1–NAMEt–NAME2
	if p.Kind == graph.Transformer && len(a) > 1 && len(b) > 1 && a[:len(a)-1] == b[:len(b)-1] {
		base := a[:len(a)-1]
		wa, wb := p.Winding(base+"a"), p.Winding(base+"b")
		if wa != nil && wb != nil {
			return wa.L + wb.L + 2*p.K(wa.Name, wb.Name)*math.Sqrt(wa.L*wb.L)
		}
	}
	return 0
}

// lowBranch bounds from below the impedance a terminal presents at f, taking
// whatever is beyond it as AC ground (which only lowers it).
func lowBranch(p *graph.Part, pin string, f float64) branch {
	w := omega(f)
	switch p.Kind {
	case graph.Resistor:
		return branch{p.Value.Max, p.Ref + " " + ohms(p.Value.Max)}
	case graph.Capacitor:
		z := 1 / (w * capMax(p))
		return branch{z, p.Ref + " " + ohms(z)}
	case graph.Inductor, graph.Transformer:
		l := windingL(p, pin, true)
		z := w * l
		if l == 0 {
			return branch{0, p.Ref + "." + pin + " (no winding on this pin)"}
		}
		return branch{z, p.Ref + "." + pin + " ωL " + ohms(z)}
	case graph.Pot:
		r, s := p.Value.Max, p.Set
		var z float64
		switch pin {
		case "1":
			z = r * s
		case "2":
			z = r * (1 - s)
		default:
			z = r * math.Min(s, 1-s)
		}
		return branch{z, p.Ref + "." + pin + " " + ohms(z)}
	case graph.Valve, graph.BJT, graph.FET:
		return deviceBranch(p, pin)
	case graph.Diode:
		return diodeBranch(p, pin)
	case graph.Crystal:
		return crystalBranch(p)
	case graph.Port:
		return branch{0, p.Ref + " (port: the net goes on beyond this sheet)"}
	}
	return branch{0, p.Ref + " (" + string(p.Kind) + ": impedance unknown)"}
}

// LowerZ bounds from below the impedance from a net to AC ground at f,
// through everything on it except the parts in skip: the parallel
// combination of each terminal's lower bound (|1/Z| ≤ Σ|Y|). It returns the
// bound and a text listing the branches, for the why.
func (x *Ctx) LowerZ(net string, f float64, skip ...*graph.Part) (float64, string) {
	return x.lowerZ(net, f, true, skip...)
}

// lowerZ is LowerZ; withLoad lets a common electrode count the load on its
// output electrode (commonBranch). The load itself is bounded without it,
// so the look-ahead is one net deep and ends on any circuit.
func (x *Ctx) lowerZ(net string, f float64, withLoad bool, skip ...*graph.Part) (float64, string) {
	return x.lowerZIn(net, f, 0, withLoad, skip...)
}

// LowerZIn is LowerZ over the band lo..hi: a winding whose far end is tuned
// to AC ground in that band counts as the tank's loop (tunedLoop), whose
// reactances cancel at resonance, instead of its ωL at lo.
func (x *Ctx) LowerZIn(net string, lo, hi float64, skip ...*graph.Part) (float64, string) {
	return x.lowerZIn(net, lo, hi, true, skip...)
}

// lowerZIn is lowerZ; hi > 0 asks for the tuned-loop check over f..hi.
func (x *Ctx) lowerZIn(net string, f, hi float64, withLoad bool, skip ...*graph.Part) (float64, string) {
	y := 0.0
	var texts, opens []string
	for _, cn := range x.Conns(net) {
		if isSkipped(cn.Part, skip) {
			continue
		}
		b := lowBranch(cn.Part, cn.Pin, f)
		switch {
		case cn.Part.Kind == graph.Inductor || cn.Part.Kind == graph.Transformer:
			b = x.throughCoil(cn.Part, cn.Pin, net, f, b)
			if loop, ok := x.tunedLoop(cn.Part, cn.Pin, net, f, hi); hi > 0 && ok && loop.z < b.z {
				b = loop
			}
		case withLoad && cn.Part.IsActive() && graph.RoleOfPin(cn.Part.Kind, cn.Pin) == graph.RoleCommon:
			b = x.commonBranch(cn.Part, cn.Pin, f)
		}
		switch {
		case b.z == 0:
			return 0, b.text
		case math.IsInf(b.z, 1):
			if b.text != "" {
				opens = append(opens, b.text)
			}
		default:
			y += 1 / b.z
			texts = append(texts, b.text)
		}
	}
	z := math.Inf(1)
	if y > 0 {
		z = 1 / y
	}
	text := strings.Join(texts, " ∥ ")
	if text == "" {
		text = "nothing else to AC ground"
	}
	if len(opens) > 0 {
		text += "; " + strings.Join(opens, ", ")
	}
	return z, text
}

// throughCoil refines the bound of a coil path that leads on to a net
// where everything else is resistive to AC ground (bias resistors, a base's
// rπ, a cathode's impedance): the path is then jωL in series with a real R, whose
// magnitude is √(X² + R²). A winding into a base bias point sees the base,
// not a short. Anything reactive beyond keeps the plain ωL bound, since a
// reactance there could cancel the coil's.
func (x *Ctx) throughCoil(p *graph.Part, pin, net string, f float64, b branch) branch {
	if b.z == 0 || math.IsInf(b.z, 1) {
		return b
	}
	far := ""
	for _, other := range p.Pins {
		if other.Name != pin && pathL(p, pin, other.Name) > 0 && windingL(p, pin, true) == pathL(p, pin, other.Name) {
			far = other.Net
			break
		}
	}
	if far == "" || far == net || far == "nc" || x.IsACGround(far) {
		return b
	}
	y := 0.0
	for _, cn := range x.Conns(far) {
		q := cn.Part
		if q == p {
			continue
		}
		var r float64
		switch {
		case q.Kind == graph.Resistor && len(q.Pins) == 2:
			other := q.Pins[0].Net
			if other == far {
				other = q.Pins[1].Net
			}
			if !x.IsACGround(other) {
				return b
			}
			r = q.Value.Max
		case q.IsActive():
			qb := lowBranch(q, cn.Pin, f)
			if qb.z == 0 {
				return b
			}
			r = qb.z
		default:
			return b
		}
		if !math.IsInf(r, 1) {
			y += 1 / r
		}
	}
	if y == 0 {
		return branch{math.Inf(1), p.Ref + "." + pin + " leads only to an open input on " + far}
	}
	rm := 1 / y
	z := math.Hypot(b.z, rm)
	return branch{z, p.Ref + "." + pin + " ωL " + ohms(b.z) + " + " + ohms(rm) + " on " + far + " = " + ohms(z)}
}

func isSkipped(p *graph.Part, skip []*graph.Part) bool {
	for _, s := range skip {
		if s == p {
			return true
		}
	}
	return false
}

// UpperZ bounds from above the impedance from a net to AC ground at f: the
// smallest of the paths known to end on AC ground (a part with its other
// terminal there, or an anode, collector or drain whose common electrode is
// there). +Inf when nothing bounds it.
func (x *Ctx) UpperZ(net string, f float64, skip ...*graph.Part) (float64, string) {
	best, text := math.Inf(1), ""
	w := omega(f)
	consider := func(z float64, t string) {
		if z < best {
			best, text = z, t
		}
	}
	for _, cn := range x.Conns(net) {
		p := cn.Part
		if isSkipped(p, skip) {
			continue
		}
		if len(p.Pins) == 2 && (p.Kind == graph.Resistor || p.Kind == graph.Capacitor || (p.Kind == graph.Inductor && len(p.Windings) <= 1)) {
			other := p.Pins[0].Net
			if other == net {
				other = p.Pins[1].Net
			}
			if !x.IsACGround(other) {
				continue
			}
			switch p.Kind {
			case graph.Resistor:
				consider(p.Value.Max, p.Ref+" "+ohms(p.Value.Max)+" to AC ground")
			case graph.Capacitor:
				z := 1 / (w * capMin(p))
				consider(z, p.Ref+" "+ohms(z)+" to AC ground")
			case graph.Inductor:
				z := w * p.Inductance()
				consider(z, p.Ref+" "+ohms(z)+" to AC ground")
			}
			continue
		}
		if !p.IsActive() || graph.RoleOfPin(p.Kind, cn.Pin) != graph.RoleOutput {
			continue
		}
		if common := p.NetOf(p.PinWithRole(graph.RoleCommon)); common == "" || !x.IsACGround(common) {
			continue
		}
		if b := deviceBranch(p, cn.Pin); b.z > 0 {
			consider(b.z, b.text)
		}
	}
	return best, text
}
