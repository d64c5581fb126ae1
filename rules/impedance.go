package rules

import (
	"math"
	"strings"

	"pare/graph"
)

// Small-signal device figures used when a netlist gives none. They serve
// only to bound the impedance a terminal presents, so the output resistances
// come as a low and a high value: bypass and coupling judgements take the
// low one (they must hold against the stiffest load), choke judgements the
// high one. The central values are the ones graph/ac's models use
// (ac.Defaults; a test holds the two tables together), typical of domestic
// receiving valves and small transistors (from memory).
var deviceDefaults = struct {
	triodeGm, pentodeGm, multigridGm float64 // S
	triodeRaLow, triodeRaHi          float64 // Ω
	multiRaLow, multiRaHi            float64 // Ω, tetrodes to octodes
	screenFactor                     float64 // a further grid drawing current looks like screenFactor/gm
	bjtIc, bjtBeta                   float64
	bjtRoLow, bjtRoHi                float64
	fetGm, fetRdLow, fetRdHi         float64
	vt                               float64 // thermal voltage at 300 K
}{
	triodeGm: 2e-3, pentodeGm: 2e-3, multigridGm: 0.5e-3,
	triodeRaLow: 5e3, triodeRaHi: 100e3, multiRaLow: 300e3, multiRaHi: 2e6,
	screenFactor: 4, // screen current is about a quarter of the cathode current (from memory, rough)
	bjtIc:        1e-3, bjtBeta: 100, bjtRoLow: 10e3, bjtRoHi: 1e6,
	fetGm: 4e-3, fetRdLow: 10e3, fetRdHi: 1e6,
	vt: 0.025852, // kT/q at 300 K, reference-values.md §5 (SI 2019 exact constants)
}

func valveGm(p *graph.Part) float64 {
	if v, ok := p.Param("gm"); ok && v > 0 {
		return v
	}
	if mu, ok := p.Param("mu"); ok {
		if ra, ok2 := p.Param("ra"); ok2 && ra > 0 {
			return mu / ra
		}
	}
	switch p.Type {
	case "triode":
		return deviceDefaults.triodeGm
	case "tetrode", "pentode":
		return deviceDefaults.pentodeGm
	}
	return deviceDefaults.multigridGm
}

func valveRa(p *graph.Part, high bool) float64 {
	if v, ok := p.Param("ra"); ok && v > 0 {
		return v
	}
	if mu, ok := p.Param("mu"); ok {
		if gm, ok2 := p.Param("gm"); ok2 && gm > 0 {
			return mu / gm
		}
	}
	triode := p.Type == "triode"
	switch {
	case triode && high:
		return deviceDefaults.triodeRaHi
	case triode:
		return deviceDefaults.triodeRaLow
	case high:
		return deviceDefaults.multiRaHi
	}
	return deviceDefaults.multiRaLow
}

func bjtGm(p *graph.Part) float64 {
	if v, ok := p.Param("gm"); ok && v > 0 {
		return v
	}
	ic := deviceDefaults.bjtIc
	if v, ok := p.Param("ic"); ok && v > 0 {
		ic = v
	}
	return ic / deviceDefaults.vt
}

func bjtRpi(p *graph.Part) float64 {
	if v, ok := p.Param("rpi"); ok && v > 0 {
		return v
	}
	beta := deviceDefaults.bjtBeta
	if v, ok := p.Param("beta"); ok && v > 0 {
		beta = v
	}
	return beta / bjtGm(p)
}

func paramOr(p *graph.Part, name string, def float64) float64 {
	if v, ok := p.Param(name); ok && v > 0 {
		return v
	}
	return def
}

// branch is one terminal on a net, seen as a path away from the net.
type branch struct {
	z    float64 // |Z| bound, Ω; +Inf for an open path, 0 for an unknown one
	text string  // "R7 1 kΩ", "V1 cathode ≈ 1/gm 400 Ω"
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
	case graph.Valve:
		gm := valveGm(p)
		switch graph.RoleOfPin(p.Kind, pin) {
		case graph.RoleCommon:
			return branch{1 / gm, p.Ref + " cathode ≈ 1/gm " + ohms(1/gm)}
		case graph.RoleOutput:
			ra := valveRa(p, false)
			return branch{ra, p.Ref + " anode ≈ ra " + ohms(ra)}
		case graph.RoleGrid:
			z := deviceDefaults.screenFactor / gm
			return branch{z, p.Ref + " " + pin + " ≈ " + num(deviceDefaults.screenFactor) + "/gm " + ohms(z)}
		}
		return branch{math.Inf(1), ""}
	case graph.BJT:
		switch pin {
		case "e":
			z := 1 / bjtGm(p)
			return branch{z, p.Ref + " emitter ≈ 1/gm " + ohms(z)}
		case "b":
			z := bjtRpi(p)
			return branch{z, p.Ref + " base ≈ rπ " + ohms(z)}
		case "c":
			z := paramOr(p, "ro", deviceDefaults.bjtRoLow)
			return branch{z, p.Ref + " collector ≈ ro " + ohms(z)}
		}
	case graph.FET:
		switch pin {
		case "s":
			z := 1 / paramOr(p, "gm", deviceDefaults.fetGm)
			return branch{z, p.Ref + " source ≈ 1/gm " + ohms(z)}
		case "d":
			z := paramOr(p, "rd", deviceDefaults.fetRdLow)
			return branch{z, p.Ref + " drain ≈ rd " + ohms(z)}
		}
		return branch{math.Inf(1), ""}
	case graph.Diode:
		if off, ok := p.Param("off"); ok && off != 0 {
			return branch{math.Inf(1), ""}
		}
		if rd, ok := p.Param("rd"); ok {
			return branch{rd, p.Ref + " rd " + ohms(rd)}
		}
		// A detector diode conducts only at the crests; without rd it is
		// counted as open, and the why says so.
		return branch{math.Inf(1), p.Ref + " counted open (no rd given)"}
	case graph.Crystal:
		rm, _ := p.Param("rm")
		return branch{rm, p.Ref + " " + ohms(rm) + " at series resonance"}
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
	y := 0.0
	var texts, opens []string
	for _, cn := range x.conns[net] {
		if isSkipped(cn.Part, skip) {
			continue
		}
		b := lowBranch(cn.Part, cn.Pin, f)
		if cn.Part.Kind == graph.Inductor || cn.Part.Kind == graph.Transformer {
			b = x.throughCoil(cn.Part, cn.Pin, net, f, b)
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
// rπ, a cathode's 1/gm): the path is then jωL in series with a real R, whose
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
	var parts []string
	for _, cn := range x.conns[far] {
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
			parts = append(parts, q.Ref)
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
	for _, cn := range x.conns[net] {
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
		switch p.Kind {
		case graph.Valve:
			ra := valveRa(p, true)
			consider(ra, p.Ref+" anode ≈ ra "+ohms(ra))
		case graph.BJT:
			ro := paramOr(p, "ro", deviceDefaults.bjtRoHi)
			consider(ro, p.Ref+" collector ≈ ro "+ohms(ro))
		case graph.FET:
			rd := paramOr(p, "rd", deviceDefaults.fetRdHi)
			consider(rd, p.Ref+" drain ≈ rd "+ohms(rd))
		}
	}
	return best, text
}

// bandOn gives the lowest and highest frequency of interest over the given
// parts and every part on the given nets: a net that also feeds an audio
// stage carries audio, whatever the region of the capacitor on it. from names
// the part that sets the low edge. A part with no band stops the reduction
// with a clear message.
func (x *Ctx) bandOn(parts []*graph.Part, nets ...string) (lo, hi float64, from *graph.Part, ok bool) {
	lo, hi = math.Inf(1), 0
	visit := func(p *graph.Part) {
		if p.Kind == graph.Port {
			return
		}
		b := x.c.BandOf(p)
		if b.Max <= 0 || b.Min <= 0 {
			x.fail(p.Pos, "%s: no band of interest for this part (it is in no region, and the file has no top-level band): add band = \"LOW..HIGH\" or put %s in a region", p.Ref, p.Ref)
			ok = false
			return
		}
		if b.Min < lo {
			lo, from = b.Min, p
		}
		hi = math.Max(hi, b.Max)
	}
	ok = true
	for _, p := range parts {
		visit(p)
	}
	for _, n := range nets {
		for _, cn := range x.conns[n] {
			visit(cn.Part)
		}
	}
	if from == nil {
		ok = false
	}
	return lo, hi, from, ok
}

// bandWhy says where the low edge comes from: "20 Hz (region audio, via C15)".
func (x *Ctx) bandWhy(lo float64, from *graph.Part, self *graph.Part) string {
	s := hz(lo)
	if from == nil {
		return s
	}
	where := "the default band"
	if r := x.c.RegionOf(from); r != nil {
		where = "region " + r.Name
	}
	if from != self {
		return s + " (" + where + ", via " + from.Ref + " on the same net)"
	}
	return s + " (" + where + ")"
}

// resonance looks for a coil that forms a parallel tuned circuit with a
// capacitance range, resonating inside or near the band (within a factor of
// two of its edges): a coil path from one of the nets to AC ground, or
// between the two nets. A capacitor in such a circuit is a tank capacitor,
// not a bypass or a coupling capacitor. It returns the coil, its
// inductance and the resonant frequency range.
func (x *Ctx) resonance(nets []string, cmin, cmax, lo, hi float64, skip *graph.Part) (*graph.Part, float64, float64, float64, bool) {
	target := func(n string) bool {
		if x.IsACGround(n) {
			return true
		}
		for _, m := range nets {
			if m == n {
				return true
			}
		}
		return false
	}
	for _, n := range nets {
		for _, cn := range x.conns[n] {
			p := cn.Part
			if p == skip || (p.Kind != graph.Inductor && p.Kind != graph.Transformer) {
				continue
			}
			for _, other := range p.Pins {
				if other.Name == cn.Pin || other.Net == n || !target(other.Net) {
					continue
				}
				l := pathL(p, cn.Pin, other.Name)
				if l <= 0 {
					continue
				}
				fHi := 1 / (2 * math.Pi * math.Sqrt(l*cmin))
				fLo := 1 / (2 * math.Pi * math.Sqrt(l*cmax))
				if fHi >= lo/2 && fLo <= hi*2 {
					return p, l, fLo, fHi, true
				}
			}
		}
	}
	return nil, 0, 0, 0, false
}
