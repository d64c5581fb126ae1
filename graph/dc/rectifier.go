package dc

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"pare/graph"
)

// A DC analysis has no AC source, so a captured mains rectifier cannot be
// solved: its output is estimated. A transformer that gives `vac` (the RMS
// voltage of its rectifier winding, end to end) and feeds a half-wave,
// centre-tapped full-wave or bridge rectifier into a reservoir capacitor
// makes the reservoir net an estimated rail: held, like a declared rail, at
// the voltage the capacitor-input filter gives at the load current the DC
// solve computes, iterated until the two agree (solveRails).
//
// The estimate is the reservoir's periodic steady state: its equation
// stepped through the mains cycle with the winding's rdc and each
// junction's own law (Shockley, or the three-halves law of a rectifier
// valve) until the cycle repeats (rectwave.go). Beside it, as the named
// cross-check, the classical conduction-angle analysis of a capacitor-input
// filter with a large reservoir (the limit of Schade's curves at large
// ωC·RL: O. H. Schade, "Analysis of rectifier operation", Proc. IRE 31(7),
// 1943; the ripple as in Sedra and Smith, "Microelectronic Circuits", the
// peak rectifier):
//
//	conduction   I = k·Vp·(sin θ − θ·cos θ)/(π·Rs)   θ half the conduction angle, k = 1 half-wave, 2 full-wave
//	top          Vtop = Vp·cos θ − n·Vd              Vp = √2·Vac across the conducting path, n diodes in it
//	ripple p-p   Vr = I·(1/f − θ/(π·fmains))/C        f = k·fmains; the discharge lasts the period less the conduction
//	mean         Vdc = Vtop − Vr/2
//
// with Vd at the mean current while a diode conducts, π·I/(k·θ). Leakage
// inductance and the mains transformer's regulation are not modelled.
//
// A surge resistor between the rectifier and the reservoir (one resistor
// from the diodes' cathodes to the reservoir's net) carries the same
// charging pulses as the winding: it adds to the source resistance of the
// estimate, and in the DC solve the diodes' net is held at the reservoir's
// mean plus the load current times it (the mean of the pulses through the
// resistor is the load current), so the resistor carries the load and the
// reservoir's net solves to the estimate; a fault in the resistor changes
// the DC solve as any resistor's does (railfault.go).
// rectifier_test.go checks the estimate against an ngspice transient of the
// same rectifier (docs/references.md §18).
const rectifierMethod = "capacitor-input filter: the reservoir's periodic steady state over the mains cycle (winding rdc, each junction's own law); cross-check: conduction angle (Schade, Proc. IRE 1943)"

// Estimate is a rail pare estimates from a captured rectifier and reservoir
// instead of holding it at declared volts.
type Estimate struct {
	Net     string  `json:"net"`
	Volts   float64 `json:"volts"`     // mean DC at the reservoir
	Formula float64 `json:"formula"`   // the conduction-angle formula's mean, the cross-check
	Ripple  float64 `json:"ripple_pp"` // peak-to-peak ripple at the reservoir
	// Fundamental is the ripple's fundamental (at the ripple frequency),
	// peak to peak, from the steady state's own waveform.
	Fundamental float64 `json:"ripple_fundamental_pp"`
	Amps        float64 `json:"amps"` // the load current the estimate is taken at
	Peak        float64 `json:"peak"` // √2·Vac across the conducting path, open circuit
	Drop        float64 `json:"drop"` // peak less the reservoir's top: diodes and winding
	Wave        string  `json:"wave"` // "half-wave", "full-wave centre-tapped", "full-wave bridge"
	// Surge is the resistor between the rectifier and the reservoir, ""
	// for none; SurgeOhms its resistance, counted in the source
	// resistance; PulseRMS the RMS of the charging current through it
	// over the cycle (its heat is PulseRMS²·R, not the mean's square).
	Surge       string  `json:"surge,omitempty"`
	SurgeOhms   float64 `json:"surge_ohms,omitempty"`
	PulseRMS    float64 `json:"pulse_rms,omitempty"`
	Transformer string  `json:"transformer"`
	// Mains is the inlet or port that gives the mains volts of a rectifier
	// straight off the mains (no transformer), "" otherwise.
	Mains string `json:"mains,omitempty"`
	// Hz is the mains frequency of a rectifier off the mains (with Mains).
	Hz     float64 `json:"hz,omitempty"`
	Method string  `json:"method"`
}

// rectifier is one captured rectifier and its reservoir.
type rectifier struct {
	net, xfmr, wave string
	mains           bool // xfmr is the mains inlet or port of a set without a transformer
	// feed is the diodes' cathodes' net when a surge resistor (surge,
	// rsurge ohms) stands between it and the reservoir's net, "" without
	// one; the DC solve holds feed (held).
	feed, surge     string
	rsurge          float64
	full            bool
	peak, hz, c, rs float64
	ends            []string // the winding's nets that carry the secondary's AC
	diodes          int      // diodes in series in the conducting path
	valve           bool     // a valve rectifier (three-halves law), else Shockley
	is, n           float64  // the semiconductor diode's saturation current and ideality
	perv            float64  // the rectifier valve's perveance per anode
	parts           []string // the rectifying diodes' refs
	sec             string   // the rectifier winding's name (a centre-tapped one: its halves' stem)
	dead            bool     // a fault stops it rectifying (railfault.go)
	// warm is the last steady state found (rectwave.go): its cycle's start
	// voltage and the formula's mean then, the next search's start.
	warm struct {
		set            bool
		start, formula float64
	}
}

// rippleHz is the ripple frequency: the mains for half-wave, twice it for
// full-wave.
func (r *rectifier) rippleHz() float64 {
	if r.full {
		return 2 * r.hz
	}
	return r.hz
}

// drop is one rectifying junction's forward voltage at current i: the
// three-halves law of a rectifier valve's anode, or Shockley's with Is from
// the diode's vf.
func (r *rectifier) drop(i float64) float64 {
	if r.valve {
		return math.Pow(i/r.perv, 2.0/3)
	}
	return r.n * VT * math.Log1p(i/r.is)
}

// at is the estimate at load current i: the reservoir's periodic steady
// state (rectwave.go), with the conduction-angle formula as its cross-check.
func (r *rectifier) at(i float64) Estimate {
	e := Estimate{Net: r.net, Volts: r.peak, Formula: r.peak, Amps: i, Peak: r.peak, Wave: r.wave, Method: rectifierMethod,
		Surge: r.surge, SurgeOhms: r.rsurge}
	if r.mains {
		e.Mains, e.Hz, e.Method = r.xfmr, r.hz, mainsRectifierMethod
	} else {
		e.Transformer = r.xfmr
	}
	if r.dead {
		e.Volts, e.Formula = 0, 0
		return e
	}
	if !(i > 0) {
		return e
	}
	e.Formula = r.formula(i)
	w := r.steady(i, e.Formula)
	e.Volts, e.Ripple, e.Drop, e.Fundamental = math.Max(w.mean, 0), w.top-w.bottom, r.peak-w.top, w.fundamental
	if r.surge != "" {
		e.PulseRMS = w.rms
	}
	return e
}

// formula is the conduction-angle estimate of the mean at load current i.
func (r *rectifier) formula(i float64) float64 {
	pulses := 1.0 // charging pulses per mains cycle
	if r.full {
		pulses = 2
	}
	theta := conductionAngle(i, r.peak, r.rs, pulses)
	iav := math.Pi * i / (pulses * theta) // mean current while a diode conducts
	if theta == 0 {
		iav = i
	}
	drop := r.peak*(1-math.Cos(theta)) + float64(r.diodes)*r.drop(iav)
	// The reservoir discharges between pulses: the ripple period less the
	// conduction time 2θ/ω (Vr = I/(f·C) takes the whole period and reads high).
	ripple := i * (1/r.rippleHz() - theta/(math.Pi*r.hz)) / r.c
	return math.Max(r.peak-drop-ripple/2, 0)
}

// conductionAngle solves I = k·Vp·(sin θ − θ·cos θ)/(π·Rs) for the half
// conduction angle θ (k charging pulses per cycle): the current through the
// winding resistance Rs while the source exceeds the reservoir, averaged
// over the cycle, equals the load current. Bisection on [0, π/2], where the
// left side rises from 0; a load beyond what the winding can give sits at
// π/2 (the reservoir then no longer holds near the peak).
func conductionAngle(i, vp, rs, k float64) float64 {
	if !(rs > 0) || !(vp > 0) {
		return 0
	}
	want := i * math.Pi * rs / (k * vp)
	lo, hi := 0.0, math.Pi/2
	for n := 0; n < 60; n++ {
		mid := (lo + hi) / 2
		if math.Sin(mid)-mid*math.Cos(mid) < want {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2
}

// rectDiode is one rectifying junction: a semiconductor diode or one anode
// of a valve diode.
type rectDiode struct {
	a, k  string
	valve bool
	part  *graph.Part
}

func rectDiodes(c *graph.Circuit) []rectDiode {
	var out []rectDiode
	for _, p := range c.Parts {
		switch {
		case p.Kind == graph.Diode:
			out = append(out, rectDiode{p.NetOf("a"), p.NetOf("k"), false, p})
		case p.Kind == graph.Valve && (p.Type == "diode" || p.Type == "double-diode"):
			for _, an := range []string{"a", "a1", "a2"} {
				if a := p.NetOf(an); a != "" {
					out = append(out, rectDiode{a, p.NetOf("k"), true, p})
				}
			}
		}
	}
	return out
}

// findRectifiers finds the rectifier of every transformer that gives vac,
// then of every mains inlet that does (rectmains.go).
func findRectifiers(c *graph.Circuit) ([]rectifier, error) {
	diodes := rectDiodes(c)
	var out []rectifier
	for _, p := range c.Parts {
		vac, ok := p.Param("vac")
		if !ok || p.Kind != graph.Transformer {
			continue
		}
		r, err := rectifierOf(c, p, vac, diodes)
		if err != nil {
			return nil, &graph.Error{Pos: p.Pos, Msg: fmt.Sprintf("transformer %s: %v", p.Ref, err)}
		}
		out = append(out, r)
	}
	mains, err := findMainsRectifiers(c, diodes)
	return append(out, mains...), err
}

// secondary is the winding feeding the rectifier: its two ends and, for a
// centre-tapped one, the tap.
type secondary struct{ name, e1, e2, tap string }

func rectifierOf(c *graph.Circuit, p *graph.Part, vac float64, diodes []rectDiode) (rectifier, error) {
	sec, err := rectifierWinding(c, p, diodes)
	if err != nil {
		return rectifier{}, err
	}
	isGround := func(n string) bool { return n != "" && c.RoleOf(n) == graph.Ground }
	var fwd, ret []rectDiode
	outs := map[string]bool{}
	for _, d := range diodes {
		switch {
		case d.a == sec.e1 || d.a == sec.e2:
			fwd = append(fwd, d)
			outs[d.k] = true
		case (d.k == sec.e1 || d.k == sec.e2) && isGround(d.a):
			ret = append(ret, d)
		}
	}
	if len(outs) != 1 {
		return rectifier{}, fmt.Errorf("the rectifier on winding %s must feed one reservoir net through the diodes' cathodes (a positive supply), not %d", sec.name, len(outs))
	}
	r := rectifier{net: fwd[0].k, xfmr: p.Ref, hz: def("mains", "hz"), peak: math.Sqrt2 * vac, diodes: 1}
	if hz, ok := p.Param("hz"); ok {
		r.hz = hz
	}
	for _, n := range []string{sec.e1, sec.e2, sec.tap} {
		if n != "" && !isGround(n) {
			r.ends = append(r.ends, n)
		}
	}
	r.rs, r.valve = windingR(p, sec), fwd[0].valve
	r.junctionLaw(fwd[0].part)
	ends := map[string]bool{}
	for _, d := range fwd {
		ends[d.a] = true
	}
	for _, d := range append(fwd, ret...) {
		if !slices.Contains(r.parts, d.part.Ref) {
			r.parts = append(r.parts, d.part.Ref)
		}
	}
	r.sec = sec.name
	switch {
	case len(ends) == 2 && len(ret) >= 2:
		r.wave, r.full, r.diodes = "full-wave bridge", true, 2
	case len(ends) == 2 && isGround(sec.tap):
		r.wave, r.full, r.peak = "full-wave centre-tapped", true, r.peak/2
	case len(ends) == 1 && (isGround(sec.e1) || isGround(sec.e2)):
		r.wave = "half-wave"
	default:
		return rectifier{}, fmt.Errorf("the rectifier on winding %s is none pare can estimate (half-wave with one end at chassis, centre-tapped full-wave with the tap at chassis, or a bridge)", sec.name)
	}
	if r.c = reservoir(c, r.net); !(r.c > 0) {
		sr := surgeResistor(c, r.net)
		if sr == nil {
			return rectifier{}, fmt.Errorf("no reservoir capacitor from %s to chassis: pare estimates capacitor-input filters only", r.net)
		}
		r.feed, r.surge, r.rsurge = r.net, sr.Ref, sr.Value.Max
		r.net = sr.Pins[0].Net
		if r.net == r.feed {
			r.net = sr.Pins[1].Net
		}
		r.c, r.rs = reservoir(c, r.net), r.rs+r.rsurge
	}
	return r, nil
}

// junctionLaw takes the rectifying junction's law from part: a rectifier
// valve's perveance, or a diode's Shockley law.
func (r *rectifier) junctionLaw(part *graph.Part) {
	if r.valve {
		r.perv = def("rectifier valve", "perveance")
		if v, ok := part.Param("perveance"); ok {
			r.perv = v
		}
		return
	}
	var o origins // the build lists the diode's law; here only its values
	r.is, r.n, _ = diodeLaw(part, &o)
}

// reservoir is the capacitance from net to chassis: the reservoir and any
// capacitor in parallel with it.
func reservoir(c *graph.Circuit, net string) float64 {
	total := 0.0
	for _, part := range c.Parts {
		if part.Kind == graph.Capacitor && len(part.Pins) == 2 {
			a, b := part.Pins[0].Net, part.Pins[1].Net
			if (a == net && c.RoleOf(b) == graph.Ground) || (b == net && c.RoleOf(a) == graph.Ground) {
				total += part.Value.Max
			}
		}
	}
	return total
}

// solveRails solves the model; with estimated rails it alternates the DC
// solve and the estimate at the load current it gives until the rail
// voltages agree to a microvolt (the load current changes little with the
// rail, so this settles in a few rounds).
func (m *model) solveRails() ([]float64, string, int, error) {
	v, method, iter, err := m.solve(nil, nil)
	for round := 0; err == nil && len(m.rects) > 0 && round < 50; round++ {
		moved := 0.0
		parts := partCurrents(m, v)
		m.estimates = m.estimates[:0]
		for k := range m.rects {
			r := &m.rects[k] // keeps its warm start across the rounds
			e := r.at(m.drawn(parts, r.held()))
			v := r.heldVolts(e)
			moved = math.Max(moved, math.Abs(v-m.fixedV[m.rectFixed[k]]))
			m.fixedV[m.rectFixed[k]] = v
			m.estimates = append(m.estimates, e)
		}
		if moved < 1e-6 {
			break
		}
		v, method, iter, err = m.solve(v, nil)
	}
	return v, method, iter, err
}

// drawn is the current the circuit draws from net: the sum of the currents
// into every pin on it.
func (m *model) drawn(parts []PartDC, net string) float64 {
	t := m.netTerm[net]
	total := 0.0
	for _, pd := range parts {
		p := m.circuit.Part(pd.Ref)
		if p == nil {
			continue
		}
		for _, pi := range pd.Pins {
			if n := p.NetOf(pi.Pin); n != "" && m.netTerm[n] == t {
				total += pi.Amps
			}
		}
	}
	return total
}

// isWindingEnd reports whether net is an end of an estimated rectifier's
// winding.
func (m *model) isWindingEnd(net string) bool {
	for _, r := range m.rects {
		for _, e := range r.ends {
			if e == net {
				return true
			}
		}
	}
	return false
}

// Source names what an estimate's rectifier is fed from: "T1" for a
// transformer, "the mains at P1" for a set without one.
func (e *Estimate) Source() string {
	if e.Mains != "" {
		return "the mains at " + e.Mains
	}
	return e.Transformer
}

// source is the rectifier's Source, for warnings.
func (r *rectifier) source() string {
	if r.mains {
		return "the mains at " + r.xfmr
	}
	return "transformer " + r.xfmr
}

// isMainsNet reports whether net carries the mains to a rectifier straight
// off it (rectmains.go).
func (m *model) isMainsNet(net string) bool {
	for _, r := range m.rects {
		if r.mains && slices.Contains(r.ends, net) {
			return true
		}
	}
	return false
}

// estimateFor returns the estimate of a rail, or nil.
func (p *Point) estimateFor(net string) *Estimate {
	i := sort.Search(len(p.Estimates), func(i int) bool { return p.Estimates[i].Net >= net })
	if i < len(p.Estimates) && p.Estimates[i].Net == net {
		return &p.Estimates[i]
	}
	return nil
}
