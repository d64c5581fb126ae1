package stages

import (
	"math"

	"pare/graph"
	"pare/graph/figure"
)

// The formulas of tuned circuits and oscillator tanks, by the names a
// figure's origin gives them (docs/references.md §1, §3; handbook formulas).
var (
	byResonance     = figure.ByFormula("f = 1/(2π√(LC))")
	byTankC         = figure.BySolver("capacitance across the coil, nodal analysis", "")
	byHartleyL      = figure.ByFormula("L = L1 + L2 + 2M, M = k√(L1L2)")
	byColpitts      = figure.ByFormula("Ceff = C1C2/(C1+C2)")
	byColpittsTuned = figure.ByFormula("Ceff = Ct + C1C2/(C1+C2)")
	byColpittsBlock = figure.ByFormula("Ceff = Ct + 1/(1/C1 + 1/C2 + 1/Cb)")
	byClapp         = figure.ByFormula("1/Ceff = 1/C1 + 1/C2 + 1/C3")
	bySeriesShare   = figure.ByFormula("(1/C3)/(1/C1 + 1/C2 + 1/C3), C3 at its largest")
	byFeedback      = figure.ByFormula("β = C1/C2")
	byColpittsA     = figure.ByFormula("A ≥ C2/C1")
	byPi            = figure.ByFormula("f = 1/(2π√(L·C1C2/(C1+C2)))")
	byPiStep        = figure.ByFormula("Z2/Z1 ≈ (C2/C1)²")
	byTurnsRatio    = figure.ByFormula("n = √(L1/L2)")
	byPartValue     = figure.FromNetlist("part value")
	byCoilL         = figure.FromNetlist("coil inductance end to end (L1 + L2 + 2M for a tapped coil)")
)

// resonance is f = 1/(2π√(LC)) (docs/references.md §1, handbook formula).
func resonance(l, c float64) float64 {
	if l <= 0 || c <= 0 {
		return math.NaN()
	}
	return 1 / (2 * math.Pi * math.Sqrt(l*c))
}

// tankFigures writes the capacitance and the resonance of a tank: the
// solver's peak of the tank's impedance in circuit, with 1/(2π√(LC)) on
// the capacitors the pattern names as its cross-check; a range when a
// variable capacitor takes part (full capacitance gives the low end of f,
// least the high end).
func (x *figCtx) tankFigures(c coilEnds, caps []*graph.Part) {
	capAt := func(frac float64) float64 { return c.capAcross(x.w, caps, frac) }
	cmin, cmax := capAt(0), capAt(1)
	x.set("l", figure.Henry, c.l, byCoilL)
	if hasVariable(caps) && cmax > cmin*1.0001 {
		x.span("c", figure.Farad, cmin, cmax, byTankC)
	} else {
		x.set("c", figure.Farad, cmax, byTankC)
	}
	formulaAt := func(frac float64) float64 {
		if !hasVariable(caps) {
			frac = 1
		}
		return resonance(c.l, capAt(frac))
	}
	x.resonanceFigure("f", c.ref, c.l, c.a, c.b, formulaAt, byResonance, tuningRefs(caps, cmax))
}

// tankBypassRatio is how many times a tank's largest capacitance a
// capacitor in its loop must be to be a bypass, not a tuning capacitor:
// 100, so in series with the tuning it moves the tank's C (and f) by under
// 1 %, inside the formula check's 2 % (common practice: a 100 nF decoupler
// at the cold end of a winding tuned by a few hundred pF).
const tankBypassRatio = 100

// tuningRefs lists the capacitors that tune a tank of capacitance c: one
// tankBypassRatio times c or more (an AGC or supply decoupler at a
// winding's cold end, in series with the tuning) is a bypass to AC ground,
// not one of the tank's own.
func tuningRefs(caps []*graph.Part, c float64) []string {
	var out []string
	for _, p := range caps {
		if c > 0 && p.Capacitance(1) >= tankBypassRatio*c {
			continue
		}
		out = append(out, p.Ref)
	}
	return out
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
	if ci := x.partIndex(x.w.c.Part(c.ref)); ci >= 0 && x.notMainsTuned(ci) {
		return
	}
	if restore, ok := x.uncoupleTuned(); ok {
		// A transformer tuned on both sides is tuned as an aligner peaks
		// each side: with the other's coupling out (calcDoubleTuned), so
		// the pair's split is not read as this side's frequency.
		defer restore()
	}
	x.tankFigures(c, x.parts("caps"))
	x.loadedQ(c.ref, c.q)
	x.confirmTank(c.ref)
	x.doubtTank(c.ref)
	if x.word("check", "") == "if" {
		if f, ok := x.get("f"); ok && f.Range == nil {
			x.checkIF(c.ref, f.Value)
		}
	}
}

// calcHartley: the tank inductance of a Hartley coil is L1 + L2 + 2M with
// M = k√(L1L2), windings aiding (docs/references.md §3).
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
		x.set("l1", figure.Henry, l1, byPartValue)
		x.set("l2", figure.Henry, l2, byPartValue)
		x.set("m", figure.Henry, m, byHartleyL)
	}
	x.tankFigures(c, x.withAcross(c, x.parts("caps")))
}

// calcColpitts: Ceff = C1C2/(C1+C2); feedback fraction β = C1/C2 with C1
// across the output and C2 across the input, so the loop needs |A| ≥ C2/C1
// (docs/references.md §3). A tuning capacitor across the coil (`tune`: a
// VFO's gang section with its trimmer) adds to the divider's series pair:
// Ceff = Ct + C1C2/(C1+C2) is then what the coil resonates with, a range
// over the gang, and the resonance formula counts it; the divider alone
// would print a capacitance the tank does not have. A DC block between the
// coil's hot end and the divider (`block`: a VFO's coupling capacitor to
// the base) is in series with the divider as the coil sees it, so it adds
// as a reciprocal (series capacitors, handbook formula): left out, the
// formula's tank sits lower than the oscillator runs and reads as pulled.
func calcColpitts(x *figCtx) {
	coil, ok := x.coil("coil")
	l := coil.l
	c1, c2 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1)
	if !ok || c1 <= 0 || c2 <= 0 {
		return
	}
	x.set("l", figure.Henry, l, byCoilL)
	tune, block := x.parts("tune"), x.parts("block")
	series, plain := c1*c2/(c1+c2), byColpitts
	if cb := sumCap(block, 1); cb > 0 {
		series, plain = 1/(1/c1+1/c2+1/cb), byColpittsBlock
	}
	ceffAt := func(frac float64) float64 { return sumCap(tune, frac) + series }
	switch {
	case len(tune) == 0:
		x.set("c_eff", figure.Farad, ceffAt(1), plain)
	case hasVariable(tune) && ceffAt(1) > ceffAt(0)*1.0001:
		x.span("c_eff", figure.Farad, ceffAt(0), ceffAt(1), tunedOrigin(plain))
	default:
		x.set("c_eff", figure.Farad, ceffAt(1), tunedOrigin(plain))
	}
	x.set("feedback", figure.Ratio, c1/c2, byFeedback)
	x.set("gain_min", figure.Ratio, c2/c1, byColpittsA)
	var refs []string
	for _, cs := range [][]*graph.Part{tune, block, x.parts("c1"), x.parts("c2")} {
		refs = append(refs, refsOf(cs)...)
	}
	formulaAt := func(frac float64) float64 {
		if !hasVariable(tune) {
			frac = 1
		}
		return resonance(l, ceffAt(frac))
	}
	x.resonanceFigure("f", coil.ref, coil.l, coil.a, coil.b, formulaAt, byResonance, refs)
}

// tunedOrigin is the origin of a Colpitts's Ceff with a tuning capacitor
// across the coil: the block's formula names Ct already.
func tunedOrigin(plain figure.Origin) figure.Origin {
	if plain == byColpitts {
		return byColpittsTuned
	}
	return plain
}

// fixedResonance is a tank's f from a formula on a fixed capacitance (the
// Colpitts and Clapp series strings, a pi network's loop), put as the
// solver's peak across the coil in circuit with the formula beside it.
func (x *figCtx) fixedResonance(name string, coil coilEnds, f float64, o figure.Origin, caps ...[]*graph.Part) {
	var refs []string
	for _, cs := range caps {
		refs = append(refs, refsOf(cs)...)
	}
	x.resonanceFigure(name, coil.ref, coil.l, coil.a, coil.b, func(float64) float64 { return f }, o, refs)
}

// calcClapp: 1/Ceff = 1/C1 + 1/C2 + 1/C3 (docs/references.md §3).
func calcClapp(x *figCtx) {
	coil, ok := x.coil("coil")
	l := coil.l
	c1, c2, c3 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1), sumCap(x.parts("c3"), 1)
	if !ok || c1 <= 0 || c2 <= 0 || c3 <= 0 {
		return
	}
	ceff := 1 / (1/c1 + 1/c2 + 1/c3)
	x.set("l", figure.Henry, l, byCoilL)
	x.set("c_eff", figure.Farad, ceff, byClapp)
	x.set("feedback", figure.Ratio, c1/c2, byFeedback)
	// a variable capacitor among the three (a tuned Clapp's series
	// capacitor) moves the formula's frequency with the gang, so the
	// formula gives a range beside the solver's, not one end of it
	at := func(frac float64) float64 {
		a, b, c := sumCap(x.parts("c1"), frac), sumCap(x.parts("c2"), frac), sumCap(x.parts("c3"), frac)
		return resonance(l, 1/(1/a+1/b+1/c))
	}
	var refs []string
	for _, role := range []string{"c1", "c2", "c3"} {
		refs = append(refs, refsOf(x.parts(role))...)
	}
	x.resonanceFigure("f", coil.ref, coil.l, coil.a, coil.b, at, byResonance, refs)
}

// calcSeriesShare: the part of 1/Ceff = 1/C1 + 1/C2 + 1/C3 that the
// capacitor in series with the coil holds, at its largest. A Clapp's series
// capacitor sets the frequency almost alone (the larger part); a DC block
// in series with a Colpitts tank is several times the divider's and holds
// little (common practice): the guard of a pattern that cannot tell the two
// apart by wiring.
func calcSeriesShare(x *figCtx) {
	c1, c2, c3 := sumCap(x.parts("c1"), 1), sumCap(x.parts("c2"), 1), sumCap(x.parts("c3"), 1)
	if c1 <= 0 || c2 <= 0 || c3 <= 0 {
		return
	}
	x.set("series_share", figure.Ratio, (1/c3)/(1/c1+1/c2+1/c3), bySeriesShare)
}

// calcCrystal: the crystal's marked (series) frequency.
func calcCrystal(x *figCtx) {
	if p := x.part("xtal"); p != nil {
		x.set("f", figure.Hertz, p.Value.Max, byPartValue)
	}
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
	x.fixedResonance("f", coil, resonance(l, c1*c2/(c1+c2)), byPi, x.parts("c1"), x.parts("c2"))
	x.set("z_ratio", figure.Ratio, (c2/c1)*(c2/c1), byPiStep)
}

// valueUnits is the unit of a part's main value by its kind, for the value
// calc: the figure takes the part's unit, so a pattern names a figure and
// never spells a unit.
var valueUnits = map[graph.Kind]figure.Unit{
	graph.Resistor: figure.Ohm, graph.Pot: figure.Ohm, graph.Capacitor: figure.Farad,
	graph.Inductor: figure.Henry, graph.Crystal: figure.Hertz,
}

// calcValue: a part's own value as a figure ("r_track" for a volume
// control's track), in the unit of its kind.
func calcValue(x *figCtx) {
	p := x.part("part")
	if p == nil {
		return
	}
	u, ok := valueUnits[p.Kind]
	if !ok {
		return
	}
	v := p.Value.Max
	if p.Kind == graph.Inductor {
		v = p.Inductance()
	}
	x.set(x.word("name", "value"), u, v, byPartValue)
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
	x.set("turns_ratio", figure.Ratio, math.Sqrt(first.l/other.l), byTurnsRatio)
}

// sqrt is math.Sqrt for match.go, which joins tapped windings with it.
func sqrt(x float64) float64 { return math.Sqrt(x) }

// uncoupleTuned, where the figure names the other winding's tuning
// capacitors (other_caps) and they are there, has the solver see the
// coil's transformer with its windings uncoupled until restore is called.
func (x *figCtx) uncoupleTuned() (restore func(), ok bool) {
	names := x.spec.Args["coil"]
	if len(x.parts("other_caps")) == 0 || len(names) == 0 {
		return nil, false
	}
	i := x.index(names[0])
	if i < 0 || len(x.m.coils[i]) < 2 {
		return nil, false
	}
	ci := x.m.parts[i]
	sub := x.sub
	x.sub = withPart(x.solverCircuit(), x.w.uncoupled(ci, x.m.coils[i][0], x.m.coils[i][1]))
	return func() { x.sub = sub }, true
}
