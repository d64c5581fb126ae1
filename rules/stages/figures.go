package stages

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// A calc computes figures for a match. Arguments name pattern parts, except
// netArgs (pattern nets) and wordArgs (plain words).
type calc struct {
	args, required, netArgs, wordArgs []string
	fn                                func(x *figCtx)
}

// calcs is the table of figure calculations a pattern may ask for. Each
// names the formula it uses beside the code.
var calcs map[string]calc

func init() {
	calcs = map[string]calc{
		"tank":         {args: []string{"coil", "caps", "winding", "check"}, required: []string{"coil", "caps"}, wordArgs: []string{"winding", "check"}, fn: calcTank},
		"hartley":      {args: []string{"coil", "caps"}, required: []string{"coil", "caps"}, fn: calcHartley},
		"colpitts":     {args: []string{"coil", "c1", "c2"}, required: []string{"coil", "c1", "c2"}, fn: calcColpitts},
		"clapp":        {args: []string{"coil", "c1", "c2", "c3"}, required: []string{"coil", "c1", "c2", "c3"}, fn: calcClapp},
		"crystal":      {args: []string{"xtal"}, required: []string{"xtal"}, fn: calcCrystal},
		"rc":           {args: []string{"r", "c", "use"}, required: []string{"r", "c"}, wordArgs: []string{"use"}, fn: calcRC},
		"bypass":       {args: []string{"device", "r", "c", "load", "load_net"}, required: []string{"device", "r", "c"}, netArgs: []string{"load_net"}, fn: calcBypass},
		"rc-phase":     {args: []string{"r", "c"}, required: []string{"r", "c"}, fn: calcPhaseShift},
		"wien":         {args: []string{"r1", "c1", "r2", "c2"}, required: []string{"r1", "c1", "r2", "c2"}, fn: calcWien},
		"gain":         {args: []string{"device", "load", "load_net", "degeneration", "form"}, required: []string{"device", "form"}, netArgs: []string{"load_net"}, wordArgs: []string{"form"}, fn: calcGain},
		"double-tuned": {args: []string{"xfmr", "caps1", "caps2"}, required: []string{"xfmr", "caps1", "caps2"}, fn: calcDoubleTuned},
		"mixer":        {args: []string{"coil", "caps", "ift", "ift_caps", "winding"}, required: []string{"coil", "caps", "ift", "ift_caps"}, wordArgs: []string{"winding"}, fn: calcMixer},
		"pi":           {args: []string{"c1", "coil", "c2"}, required: []string{"c1", "coil", "c2"}, fn: calcPi},
		"smoothing":    {args: []string{"c1", "series", "c2"}, required: []string{"c1", "series", "c2"}, fn: calcSmoothing},
		"coupling":     {args: []string{"c"}, required: []string{"c"}, fn: calcCoupling},
		"value":        {args: []string{"part", "key"}, required: []string{"part", "key"}, wordArgs: []string{"key"}, fn: calcValue},
		"ratio":        {args: []string{"xfmr"}, required: []string{"xfmr"}, fn: calcRatio},
		"tuned-gain":   {args: []string{"device", "coil", "winding", "caps"}, required: []string{"device", "coil", "caps"}, wordArgs: []string{"winding"}, fn: calcTunedGain},
	}
}

// figCtx is what a calc sees: the match, and the stage it writes into.
type figCtx struct {
	w    *world
	m    *match
	st   *Stage
	spec FigureSpec
}

func (x *figCtx) key(k string) string {
	if x.spec.Prefix != "" {
		return x.spec.Prefix + "_" + k
	}
	return k
}

func (x *figCtx) set(k string, v float64) {
	if !math.IsNaN(v) && !math.IsInf(v, 0) {
		x.st.Figures[x.key(k)] = v
	}
}

func (x *figCtx) flag(format string, args ...any) {
	f := fmt.Sprintf(format, args...)
	for _, g := range x.st.Flags {
		if g == f {
			return
		}
	}
	x.st.Flags = append(x.st.Flags, f)
}

// index returns the position of a pattern part in the match, -1 when the
// variant left it out.
func (x *figCtx) index(name string) int {
	for i, vp := range x.m.v.parts {
		if vp.pp.Name == name {
			return i
		}
	}
	return -1
}

// parts returns the circuit parts an argument names, skipping absent ones.
func (x *figCtx) parts(arg string) []*graph.Part {
	var out []*graph.Part
	for _, n := range x.spec.Args[arg] {
		if i := x.index(n); i >= 0 {
			out = append(out, x.w.parts[x.m.parts[i]])
		}
	}
	return out
}

func (x *figCtx) part(arg string) *graph.Part {
	if ps := x.parts(arg); len(ps) > 0 {
		return ps[0]
	}
	return nil
}

func (x *figCtx) word(arg, def string) string {
	if v := x.spec.Args[arg]; len(v) > 0 {
		return v[0]
	}
	return def
}

// coilEnds is a coil as a tank sees it: the folded nets at its two ends,
// the pin names there, its inductance and Q.
type coilEnds struct {
	ref        string
	a, b       int
	pinA, pinB string
	l, q       float64
}

// coil gives the coil an argument names: a plain or tapped inductor end to
// end (L1 + L2 + 2M, graph.Part.Inductance), or the winding of a transformer
// the pattern maps (winding = "1" is the first in the pattern's list).
func (x *figCtx) coil(arg string) (coilEnds, bool) {
	names := x.spec.Args[arg]
	if len(names) == 0 {
		return coilEnds{}, false
	}
	i := x.index(names[0])
	if i < 0 {
		return coilEnds{}, false
	}
	ci := x.m.parts[i]
	p := x.w.parts[ci]
	switch p.Kind {
	case graph.Inductor:
		q := 0.0
		if len(p.Windings) > 0 {
			q = p.Windings[0].Q
		}
		return coilEnds{ref: p.Ref, a: x.w.pinNet(ci, "1"), b: x.w.pinNet(ci, "2"), pinA: "1", pinB: "2", l: p.Inductance(), q: q}, true
	case graph.Transformer:
		wi := 0
		if x.word("winding", "1") == "2" {
			wi = 1
		}
		if wi >= len(x.m.coils[i]) {
			return coilEnds{}, false
		}
		cl := x.w.coils[ci][x.m.coils[i][wi]]
		first, last := cl.pins[0], cl.pins[len(cl.pins)-1]
		return coilEnds{ref: p.Ref, a: x.w.pinNet(ci, first), b: x.w.pinNet(ci, last), pinA: first, pinB: last, l: cl.l, q: cl.q}, true
	}
	return coilEnds{}, false
}

// resonance is f = 1/(2π√(LC)) (reference-values §1, handbook formula).
func resonance(l, c float64) float64 {
	if l <= 0 || c <= 0 {
		return math.NaN()
	}
	return 1 / (2 * math.Pi * math.Sqrt(l*c))
}

// tankFigures writes the capacitance and the resonance of a tank, as a range
// when a variable capacitor takes part (Cmax gives f_min, Cmin f_max).
func (x *figCtx) tankFigures(l float64, a, b int, caps []*graph.Part) {
	cmin := capBetween(x.w, caps, a, b, 0)
	cmax := capBetween(x.w, caps, a, b, 1)
	x.set("l_h", l)
	if hasVariable(caps) && cmax > cmin*1.0001 {
		x.set("c_min_f", cmin)
		x.set("c_max_f", cmax)
		x.set("f_min_hz", resonance(l, cmax))
		x.set("f_max_hz", resonance(l, cmin))
		return
	}
	x.set("c_f", cmax)
	x.set("f_hz", resonance(l, cmax))
}

func hasVariable(caps []*graph.Part) bool {
	for _, c := range caps {
		if c.Type == graph.CapVariable {
			return true
		}
	}
	return false
}

func calcTank(x *figCtx) {
	c, ok := x.coil("coil")
	if !ok {
		return
	}
	x.tankFigures(c.l, c.a, c.b, x.parts("caps"))
	if x.word("check", "") == "if" {
		if f, ok := x.st.Figures[x.key("f_hz")]; ok {
			x.checkIF(c.ref, f)
		}
	}
}

// calcHartley: the tank inductance of a Hartley coil is L1 + L2 + 2M with
// M = k√(L1L2), windings aiding (reference-values §3).
func calcHartley(x *figCtx) {
	p := x.part("coil")
	c, ok := x.coil("coil")
	if !ok || p == nil {
		return
	}
	if len(p.Windings) == 2 {
		// l1 is the section from the hot end (the pattern's first terminal)
		// to the tap, l2 from the tap to the cold end, however the coil's
		// pins were written.
		l1, l2 := p.Windings[0].L, p.Windings[1].L
		if i := x.index(x.spec.Args["coil"][0]); i >= 0 {
			hot := x.m.nets[x.m.v.parts[i].slots[0]]
			if x.w.pinNet(x.m.parts[i], "1") != hot {
				l1, l2 = l2, l1
			}
		}
		m := p.K(p.Windings[0].Name, p.Windings[1].Name) * math.Sqrt(l1*l2)
		x.set("l1_h", l1)
		x.set("l2_h", l2)
		x.set("m_h", m)
	}
	x.tankFigures(c.l, c.a, c.b, x.parts("caps"))
}

// calcColpitts: Ceff = C1C2/(C1+C2); feedback fraction β = C1/C2 with C1
// across the output and C2 across the input, so the loop needs |A| ≥ C2/C1
// (reference-values §3).
func calcColpitts(x *figCtx) {
	coil, ok := x.coil("coil")
	l := coil.l
	c1, c2 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1)
	if !ok || c1 <= 0 || c2 <= 0 {
		return
	}
	ceff := c1 * c2 / (c1 + c2)
	x.set("l_h", l)
	x.set("c_eff_f", ceff)
	x.set("feedback", c1/c2)
	x.set("gain_min", c2/c1)
	x.set("f_hz", resonance(l, ceff))
}

// calcClapp: 1/Ceff = 1/C1 + 1/C2 + 1/C3 (reference-values §3).
func calcClapp(x *figCtx) {
	coil, ok := x.coil("coil")
	l := coil.l
	c1, c2, c3 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1), sumCap(x.parts("c3"), 1)
	if !ok || c1 <= 0 || c2 <= 0 || c3 <= 0 {
		return
	}
	ceff := 1 / (1/c1 + 1/c2 + 1/c3)
	x.set("l_h", l)
	x.set("c_eff_f", ceff)
	x.set("feedback", c1/c2)
	x.set("f_hz", resonance(l, ceff))
}

func calcCrystal(x *figCtx) {
	if p := x.part("xtal"); p != nil {
		x.set("f_hz", p.Value.Max)
	}
}

// calcRC: τ = RC and the corner fc = 1/(2πRC) (reference-values §4). use =
// "agc" or "detector" adds the checks a repairer makes on those.
func calcRC(x *figCtx) {
	r := parallelR(x.parts("r"))
	c := sumCap(x.parts("c"), 1)
	if x.word("use", "") == "detector" {
		// The diode's load is everything resistive from its output to
		// ground: the load resistor, and the filter and volume control
		// beyond it.
		if cs := x.parts("c"); len(cs) > 0 {
			for j := range cs[0].Pins {
				if id := x.w.pinNet(x.partIndex(cs[0]), cs[0].Pins[j].Name); id != groundNet {
					if dc := resistanceToGround(x.w, id); dc > 0 {
						r = dc
						x.set("r_load_ohm", dc)
					}
				}
			}
		}
	}
	if r <= 0 || c <= 0 {
		return
	}
	if x.word("use", "") == "section" && x.backwards(x.parts("r"), x.parts("c")) {
		return // the capacitor is the previous section's: no figures, the guard drops the match
	}
	if x.word("use", "") == "coupling" && x.upstream(x.parts("r"), x.parts("c")) {
		return // the resistor is the source's (an anode load, a source resistor): no figures, the guard drops the match
	}
	tau := r * c
	fc := 1 / (2 * math.Pi * tau)
	x.set("tau_s", tau)
	if x.word("use", "") == "section" {
		if loads := x.loadsBeyond(x.parts("c")); len(loads) > 0 {
			// 1/(2πRC) holds only for a section into an open circuit; the
			// next section draws current from C, so the true −3 dB point
			// is lower. Say so rather than print a corner that is not there.
			x.set("f_c_unloaded_hz", fc)
			verb := "loads"
			if len(loads) > 1 {
				verb = "load"
			}
			x.st.Notes = append(x.st.Notes, fmt.Sprintf("corner figured unloaded: %s %s the section, so its real corner is lower",
				strings.Join(loads, ", "), verb))
			return
		}
	}
	x.set("f_c_hz", fc)
	switch x.word("use", "") {
	case "agc":
		// Common practice, no source: an AGC line wants roughly 0.05–0.5 s,
		// slow enough not to follow the lowest audio, quick enough to follow fading.
		if tau < 0.02 {
			x.flag("AGC time constant %s is short: the AGC will follow low audio notes and distort them", FigureText("tau_s", tau))
		}
		if tau > 1 {
			x.flag("AGC time constant %s is long: the set will be slow to follow fading and tuning", FigureText("tau_s", tau))
		}
	case "detector":
		// Common practice, no source: the load must pass the top audio
		// (about 5 kHz for AM) yet hold the IF ripple.
		if fc < 3e3 {
			x.flag("detector load corner %s is below 3 kHz: the top of the audio is lost and deep modulation clips", FigureText("f_c_hz", fc))
		}
		if ifHz := x.w.c.Freqs["if"]; ifHz > 0 && fc > ifHz/5 {
			x.flag("detector load corner %s is close to the IF (%s): IF ripple reaches the audio", FigureText("f_c_hz", fc), FigureText("f_hz", ifHz))
		}
	}
}

// calcPhaseShift: three equal RC sections give f = 1/(2πRC√6) and need a
// gain of 29 (handbook formula, from memory).
func calcPhaseShift(x *figCtx) {
	rs, cs := x.parts("r"), x.parts("c")
	if len(rs) == 0 || len(cs) == 0 {
		return
	}
	r, c := rs[0].Value.Max, cs[0].Value.Max
	for _, p := range rs {
		if math.Abs(p.Value.Max-r) > 0.05*r {
			x.flag("phase-shift sections are unequal: f uses %s and %s and is only a guide", rs[0].Ref, cs[0].Ref)
		}
	}
	for _, p := range cs {
		if math.Abs(p.Value.Max-c) > 0.05*c {
			x.flag("phase-shift sections are unequal: f uses %s and %s and is only a guide", rs[0].Ref, cs[0].Ref)
		}
	}
	x.set("f_hz", 1/(2*math.Pi*r*c*math.Sqrt(6)))
	x.set("gain_min", 29)
}

// calcWien: f = 1/(2π√(R1R2C1C2)); with equal arms the loop needs a gain of
// 3 (handbook formula, from memory).
func calcWien(x *figCtx) {
	r1, c1, r2, c2 := parallelR(x.parts("r1")), sumCap(x.parts("c1"), 1), parallelR(x.parts("r2")), sumCap(x.parts("c2"), 1)
	if r1 <= 0 || r2 <= 0 || c1 <= 0 || c2 <= 0 {
		return
	}
	x.set("f_hz", 1/(2*math.Pi*math.Sqrt(r1*r2*c1*c2)))
	x.set("gain_min", 1+r1/r2+c2/c1)
}

// calcPi: a pi network C1–L–C2 resonates with L and C1 in series with C2
// (the loop), f = 1/(2π√(L·C1C2/(C1+C2))); as a matching network it steps
// the impedance by about (C2/C1)² (from memory, high-Q approximation).
func calcPi(x *figCtx) {
	coil, ok := x.coil("coil")
	l := coil.l
	c1, c2 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1)
	if !ok || c1 <= 0 || c2 <= 0 {
		return
	}
	x.set("f_hz", resonance(l, c1*c2/(c1+c2)))
	x.set("z_ratio", (c2/c1)*(c2/c1))
}

// calcSmoothing: the second section's corner, 1/(2π√(LC2)) with a choke or
// 1/(2πRC2) with a resistor (handbook formulas, from memory).
func calcSmoothing(x *figCtx) {
	s := x.part("series")
	c2 := sumCap(x.parts("c2"), 1)
	c1 := sumCap(x.parts("c1"), 1)
	// The pattern is symmetric, so the match may have it either way round:
	// the reservoir is the capacitor on the side that faces the rectifier
	// or the supply input, and the corner is set by the other one.
	if x.feeds(x.st.nets["out"]) > x.feeds(x.st.nets["in"]) {
		c1, c2 = c2, c1
	}
	if s == nil || c2 <= 0 {
		return
	}
	x.set("c_reservoir_f", c1)
	x.set("c_smoothing_f", c2)
	switch s.Kind {
	case graph.Inductor:
		x.set("f_c_hz", resonance(s.Inductance(), c2))
	case graph.Resistor:
		x.set("f_c_hz", 1/(2*math.Pi*s.Value.Max*c2))
	}
}

// feeds scores how surely a net is the supply input of a smoothing filter:
// a rectifier (a diode) on it counts most, then a port (a battery, the
// supply's connection), then a declared supply role; the declared voltage
// breaks ties, since each filter section drops some. Higher is nearer the
// source.
func (x *figCtx) feeds(net string) float64 {
	id, ok := x.w.netID[net]
	if !ok || id == groundNet {
		return math.Inf(-1)
	}
	score := 0.0
	for _, ci := range x.w.conns[id] {
		switch x.w.parts[ci].Kind {
		case graph.Diode:
			score = max(score, 4)
		case graph.Port:
			score = max(score, 2)
		}
	}
	if n := x.w.c.Net(net); n != nil {
		if n.Role == graph.Supply {
			score = max(score, 1)
		}
		// volts add less than a step: a tie-break between like nets
		score += math.Atan(math.Abs(n.Volts)) / math.Pi
	}
	return score
}

// backwards tells whether a series resistor runs against the signal into
// its shunt capacitor: the resistor's free end (not on the capacitor) is
// farther from the inputs than the capacitor's net. In a ladder R1 C1 R2 C2
// the pair R2–C1 has the shape of a section but C1 belongs to R1.
func (x *figCtx) backwards(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	ri, cj := x.partIndex(rs[0]), x.partIndex(cs[0])
	if ri < 0 || cj < 0 || len(x.w.pins[ri]) != 2 {
		return false
	}
	onC := map[int]bool{}
	for _, id := range x.w.pins[cj] {
		onC[id] = true
	}
	free, shared := -1, -1
	for _, id := range x.w.pins[ri] {
		if onC[id] && id != groundNet {
			shared = id
		} else {
			free = id
		}
	}
	if free < 0 || shared < 0 {
		return false
	}
	return x.netDist(free, ri, cj) > x.netDist(shared, ri, cj)
}

// upstream tells whether the shunt resistor of a coupling capacitor sits on
// the capacitor's driven side: the net it shares with the capacitor is
// nearer the inputs than the capacitor's other end. A coupling corner is
// set by the resistance the capacitor feeds (the next grid leak or load),
// f = 1/(2πRC); the resistor on the driving side (an anode load, a source
// resistor) is part of the source and sets no corner with it.
func (x *figCtx) upstream(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	ri, cj := x.partIndex(rs[0]), x.partIndex(cs[0])
	if ri < 0 || cj < 0 || len(x.w.pins[cj]) != 2 {
		return false
	}
	onR := map[int]bool{}
	for _, id := range x.w.pins[ri] {
		onR[id] = true
	}
	shared, other := -1, -1
	for _, id := range x.w.pins[cj] {
		if onR[id] && id != groundNet && shared < 0 {
			shared = id
		} else {
			other = id
		}
	}
	if shared < 0 || other < 0 || other == shared {
		return false
	}
	return x.netDist(shared, ri, cj) < x.netDist(other, ri, cj)
}

// netDist is how far a net lies from the inputs: a declared input -1, else
// the least distance of the parts on it other than those given, MaxInt when
// none is reached.
func (x *figCtx) netDist(net int, skip ...int) int {
	if x.w.isInput(net) {
		return -1
	}
	dist := x.w.signalDist()
	d := math.MaxInt
	for _, ci := range x.w.conns[net] {
		if slices.Contains(skip, ci) {
			continue
		}
		if od, ok := dist[x.w.parts[ci].Ref]; ok && od < d {
			d = od
		}
	}
	return d
}

// loadsBeyond lists the parts outside the match on the signal nets of the
// given shunt parts that draw current: everything but ports and the control
// terminal of an amplifying device (a grid or gate takes next to none).
func (x *figCtx) loadsBeyond(shunts []*graph.Part) []string {
	in := map[int]bool{}
	for _, ci := range x.m.parts {
		in[ci] = true
	}
	seen := map[string]bool{}
	var out []string
	for _, p := range shunts {
		pi := x.partIndex(p)
		if pi < 0 {
			continue
		}
		for _, net := range x.w.pins[pi] {
			if net == groundNet {
				continue
			}
			for _, ci := range x.w.conns[net] {
				q := x.w.parts[ci]
				if in[ci] || q.Kind == graph.Port || seen[q.Ref] || x.controlOnly(ci, net) {
					continue
				}
				seen[q.Ref] = true
				out = append(out, q.Ref)
			}
		}
	}
	sort.Strings(out)
	return out
}

// controlOnly tells whether part ci touches net only through its control
// terminal (grid, base, gate): a high-impedance input, not a load.
func (x *figCtx) controlOnly(ci, net int) bool {
	touches := false
	for j, id := range x.w.pins[ci] {
		if id != net {
			continue
		}
		if x.w.roles[ci][j] != graph.RoleControl {
			return false
		}
		touches = true
	}
	return touches
}

// calcCoupling: a series capacitor and the resistance it feeds, the
// resistive network from its far side to AC ground (the next grid leak or
// input resistance), make a high-pass: τ = RC, fc = 1/(2πRC)
// (reference-values §4). The far side is the one downstream in signal
// order; a capacitor into a tank or port alone has no corner.
func calcCoupling(x *figCtx) {
	p := x.part("c")
	if p == nil {
		return
	}
	c := p.Value.Max
	x.set("c_f", c)
	ci := x.partIndex(p)
	if ci < 0 || len(x.w.pins[ci]) != 2 || c <= 0 {
		return
	}
	// The downstream side is the one farther from the inputs (a declared
	// input is upstream by definition). Only a resistance there is what the
	// capacitor feeds; one on the upstream side (an anode load) is its source.
	var sides [2]struct {
		d int
		r float64
	}
	for i, net := range x.w.pins[ci] {
		if net == groundNet {
			return
		}
		// a side nothing else reaches from the inputs is downstream (MaxInt)
		sides[i].d, sides[i].r = x.netDist(net, ci), resistanceToGround(x.w, net)
	}
	var bestR float64
	down := -1
	switch {
	case sides[0].d > sides[1].d:
		down = 0
	case sides[1].d > sides[0].d:
		down = 1
	case (sides[0].r > 0) != (sides[1].r > 0):
		// No order to go by (no inputs declared): the one resistive side.
		down = 0
		if sides[1].r > 0 {
			down = 1
		}
	}
	if down >= 0 {
		bestR = sides[down].r
	}
	if bestR <= 0 {
		if down >= 0 {
			for _, other := range x.w.conns[x.w.pins[ci][down]] {
				if q := x.w.parts[other]; q.Kind == graph.Port {
					port := q.Ref
					if q.Label != "" {
						port += " (" + q.Label + ")"
					}
					x.st.Notes = append(x.st.Notes, fmt.Sprintf("no corner figured: %s feeds %s, and the resistance beyond is not in this circuit",
						p.Ref, port))
					break
				}
			}
		}
		return
	}
	tau := bestR * c
	x.set("r_in_ohm", bestR)
	x.set("tau_s", tau)
	x.set("f_c_hz", 1/(2*math.Pi*tau))
}

func calcValue(x *figCtx) {
	p := x.part("part")
	if p == nil {
		return
	}
	v := p.Value.Max
	if p.Kind == graph.Inductor {
		v = p.Inductance()
	}
	x.set(x.word("key", "value"), v)
}

// calcRatio: the turns ratio from the winding inductances, n = √(L1/L2),
// since inductance goes with turns squared on one core (from memory).
func calcRatio(x *figCtx) {
	i := x.index(x.spec.Args["xfmr"][0])
	if i < 0 {
		return
	}
	ci := x.m.parts[i]
	coils := x.w.coils[ci]
	if len(coils) < 2 {
		return
	}
	assigned := x.m.coils[i]
	first := coils[assigned[0]]
	var other *coil
	for j := range coils {
		if j != assigned[0] {
			other = &coils[j]
			break
		}
	}
	if other == nil || other.l <= 0 || first.l <= 0 {
		return
	}
	x.set("turns_ratio", math.Sqrt(first.l/other.l))
}

func (x *figCtx) partIndex(p *graph.Part) int {
	if i, ok := x.w.index[p]; ok {
		return i
	}
	return -1
}

// resistanceToGround is the DC resistance from a net to AC ground through
// every resistor and potentiometer of the circuit (a pot as two sections
// split at its wiper), found by nodal analysis with 1 A into the net. 0 when
// no resistive path reaches ground.
func resistanceToGround(w *world, net int) float64 {
	adj := w.resistive()
	// The nets the net reaches through resistors, ground excluded.
	idx := map[int]int{net: 0}
	order := []int{net}
	grounded := false
	var branches []branch
	for k := 0; k < len(order); k++ {
		for _, br := range adj[order[k]] {
			other := br.b
			if other == order[k] {
				other = br.a
			}
			branches = append(branches, br) // seen from both ends; counted once below
			if other == groundNet {
				grounded = true
				continue
			}
			if _, ok := idx[other]; !ok {
				idx[other] = len(order)
				order = append(order, other)
			}
		}
	}
	if !grounded {
		return 0
	}
	n := len(order)
	mat := make([][]float64, n)
	for i := range mat {
		mat[i] = make([]float64, n+1)
	}
	mat[0][n] = 1 // 1 A into the net
	seen := map[branch]bool{}
	for _, br := range branches {
		if seen[br] {
			continue
		}
		seen[br] = true
		i, j := -1, -1
		if br.a != groundNet {
			i = idx[br.a]
		}
		if br.b != groundNet {
			j = idx[br.b]
		}
		if i == j {
			continue
		}
		if i >= 0 {
			mat[i][i] += br.g
		}
		if j >= 0 {
			mat[j][j] += br.g
		}
		if i >= 0 && j >= 0 {
			mat[i][j] -= br.g
			mat[j][i] -= br.g
		}
	}
	v := solve(mat)
	return v[0]
}

// branch is one resistive path between two nets (a resistor, or one side of
// a pot's wiper).
type branch struct {
	a, b int
	g    float64
	part int
	half int
}

// resistive indexes the circuit's resistive branches by net, built once.
func (w *world) resistive() map[int][]branch {
	if w.resAdj != nil {
		return w.resAdj
	}
	w.resAdj = map[int][]branch{}
	add := func(br branch) {
		w.resAdj[br.a] = append(w.resAdj[br.a], br)
		if br.b != br.a {
			w.resAdj[br.b] = append(w.resAdj[br.b], br)
		}
	}
	for ci, p := range w.parts {
		switch p.Kind {
		case graph.Resistor:
			if len(w.pins[ci]) == 2 && p.Value.Max > 0 {
				add(branch{w.pins[ci][0], w.pins[ci][1], 1 / p.Value.Max, ci, 0})
			}
		case graph.Pot:
			one, wiper, two := w.pinNet(ci, "1"), w.pinNet(ci, "w"), w.pinNet(ci, "2")
			r := p.Value.Max
			if one < 0 || two < 0 || r <= 0 {
				continue
			}
			set := math.Min(math.Max(p.Set, 1e-6), 1-1e-6)
			if wiper < 0 {
				add(branch{one, two, 1 / r, ci, 0})
				continue
			}
			add(branch{one, wiper, 1 / (set * r), ci, 1})
			add(branch{wiper, two, 1 / ((1 - set) * r), ci, 2})
		}
	}
	return w.resAdj
}

// sumCap adds capacitors in parallel at a setting of the variable ones.
func sumCap(ps []*graph.Part, frac float64) float64 {
	t := 0.0
	for _, p := range ps {
		t += p.Capacitance(frac)
	}
	return t
}

// parallelR combines resistors in parallel.
func parallelR(ps []*graph.Part) float64 {
	g := 0.0
	for _, p := range ps {
		if p.Value.Max > 0 {
			g += 1 / p.Value.Max
		}
	}
	if g == 0 {
		return 0
	}
	return 1 / g
}

// capBetween is the capacitance the given capacitors present between nets a
// and b (folded ids), however they are wired (series padders, parallel
// trimmers): the capacitors' nodal matrix is solved with a at 1 V, b at 0 V
// and the charge on a read off. Variable sections are set at frac.
func capBetween(w *world, caps []*graph.Part, a, b int, frac float64) float64 {
	if a == b {
		return 0
	}
	idx := map[int]int{}
	var nodes []int
	node := func(n int) int {
		if i, ok := idx[n]; ok {
			return i
		}
		idx[n] = len(nodes)
		nodes = append(nodes, n)
		return idx[n]
	}
	node(a)
	node(b)
	type edge struct {
		i, j int
		c    float64
	}
	var edges []edge
	for _, p := range caps {
		if len(p.Pins) != 2 {
			continue
		}
		ci, ok := w.index[p]
		if !ok {
			continue
		}
		edges = append(edges, edge{node(w.pins[ci][0]), node(w.pins[ci][1]), p.Capacitance(frac)})
	}
	n := len(nodes)
	// Unknowns: the voltages of nodes 2..n-1.
	m := n - 2
	mat := make([][]float64, m)
	for i := range mat {
		mat[i] = make([]float64, m+1)
	}
	for _, e := range edges {
		for _, pair := range [][2]int{{e.i, e.j}, {e.j, e.i}} {
			r, c := pair[0]-2, pair[1]-2
			if r < 0 {
				continue
			}
			mat[r][r] += e.c
			switch {
			case c >= 0:
				mat[r][c] -= e.c
			case pair[1] == 0: // node a at 1 V
				mat[r][m] += e.c
			}
		}
	}
	v := solve(mat)
	volt := func(i int) float64 {
		switch i {
		case 0:
			return 1
		case 1:
			return 0
		}
		if v == nil {
			return 0
		}
		return v[i-2]
	}
	q := 0.0
	for _, e := range edges {
		if e.i == 0 {
			q += e.c * (1 - volt(e.j))
		} else if e.j == 0 {
			q += e.c * (1 - volt(e.i))
		}
	}
	return q
}

// solve does Gaussian elimination with partial pivoting on an augmented
// matrix; a floating node (zero row) is left at 0 V.
func solve(a [][]float64) []float64 {
	n := len(a)
	for col := 0; col < n; col++ {
		piv := col
		for r := col + 1; r < n; r++ {
			if math.Abs(a[r][col]) > math.Abs(a[piv][col]) {
				piv = r
			}
		}
		a[col], a[piv] = a[piv], a[col]
		if math.Abs(a[col][col]) < 1e-30 {
			continue
		}
		for r := 0; r < n; r++ {
			if r == col {
				continue
			}
			f := a[r][col] / a[col][col]
			for k := col; k <= n; k++ {
				a[r][k] -= f * a[col][k]
			}
		}
	}
	out := make([]float64, n)
	for i := range out {
		if math.Abs(a[i][i]) > 1e-30 {
			out[i] = a[i][n] / a[i][i]
		}
	}
	return out
}

// FigureText formats a figure for people, by the unit its key ends in:
// "1.47 MHz", "0.1 s", "90.9 pF", "-16.5", "12 dB".
func FigureText(key string, v float64) string {
	switch {
	case strings.HasSuffix(key, "_hz"):
		return value.FormatPrec(v, value.Hertz, value.Symbol, 4)
	case strings.HasSuffix(key, "_s"):
		// Time constants from a tenth of a second up read best in plain
		// seconds ("0.1 s", "2.2 s"); shorter ones with a prefix ("4.7 ms").
		if math.Abs(v) >= 0.1 {
			return trimFloat(v) + " s"
		}
		return value.FormatPrec(v, value.Second, value.Symbol, 3)
	case strings.HasSuffix(key, "_f"):
		return value.FormatPrec(v, value.Farad, value.Symbol, 4)
	case strings.HasSuffix(key, "_h"):
		return value.FormatPrec(v, value.Henry, value.Symbol, 4)
	case strings.HasSuffix(key, "_ohm"):
		return value.FormatPrec(v, value.Ohm, value.Symbol, 3)
	case strings.HasSuffix(key, "_db"):
		return fmt.Sprintf("%.1f dB", v)
	case strings.HasSuffix(key, "_pct"):
		return fmt.Sprintf("%.1f %%", v)
	}
	return trimFloat(v)
}

// figureNames are the words for figure names (a key without its unit
// suffix) whose plain spelling, underscores as spaces, reads badly. The keys
// themselves, in JSON, stay as they are.
var figureNames = map[string]string{
	"if":            "IF",
	"ift_f":         "IF transformer f",
	"load_f":        "load tuned f",
	"f_c_unloaded":  "f c (unloaded)",
	"r_dyn":         "dynamic R",
	"bw":            "bandwidth",
	"pad_c":         "suggested 3-point padder", // a proposed design, not the fitted part
	"pad_l":         "suggested 3-point coil",
	"pad_trim":      "suggested 3-point trimmer",
	"gain_min":      "gain needed to oscillate ≥", // the loop's threshold, not the stage's gain
	"gain_ac":       "gain (AC check)",
	"track_err_max": "track err max",
}

// FigureName gives the words a person reads before a figure ("if_hz" →
// "IF", "ift_f_hz" → "IF transformer f"), with false for keys whose plain
// spelling serves (the caller then prints the key with spaces).
func FigureName(key string) (string, bool) {
	name := key
	for _, unit := range []string{"_hz", "_ohm", "_s", "_f", "_h", "_db"} {
		if n, ok := strings.CutSuffix(key, unit); ok && n != "" {
			name = n
			break
		}
	}
	w, ok := figureNames[name]
	return w, ok
}

// trimFloat prints a plain ratio with three significant digits, or more
// where the integer part needs them.
func trimFloat(v float64) string {
	if v == 0 {
		return "0"
	}
	a := math.Abs(v)
	switch {
	case a >= 1000:
		return fmt.Sprintf("%.0f", v)
	case a >= 0.001:
		digits := 2 - int(math.Floor(math.Log10(a)))
		if digits < 0 {
			digits = 0
		}
		s := fmt.Sprintf("%.*f", digits, v)
		return trimZeros(s)
	}
	return fmt.Sprintf("%.3g", v)
}

func trimZeros(s string) string {
	if !strings.Contains(s, ".") {
		return s
	}
	for s[len(s)-1] == '0' {
		s = s[:len(s)-1]
	}
	if s[len(s)-1] == '.' {
		s = s[:len(s)-1]
	}
	return s
}

// KeyFigures lists a stage's figure keys in the order a table shows them:
// frequencies first, then the rest, each group sorted.
func KeyFigures(figs map[string]float64) []string {
	keys := sortedKeys(figs)
	sort.SliceStable(keys, func(i, j int) bool { return figRank(keys[i]) < figRank(keys[j]) })
	return keys
}

func figRank(k string) int {
	switch {
	case strings.HasSuffix(k, "_hz"):
		return 0
	case k == "gain" || strings.HasSuffix(k, "gain"):
		return 1
	case strings.HasSuffix(k, "_s"):
		return 2
	}
	return 3
}

func sqrt(x float64) float64 { return math.Sqrt(x) }
