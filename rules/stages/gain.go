package stages

import (
	"fmt"
	"math"

	"pare/graph"
	model "pare/graph/device"
	"pare/graph/figure"
)

// The formulas behind the gain figures, by the names a figure's origin
// gives them (docs/references.md §5; from memory where calcGain says so).
var (
	byDecibels  = figure.ByFormula("20·log10|A|")
	byLoad      = figure.ByFormula("RL = load ∥ every resistor to AC ground")
	byDynamicR  = figure.ByFormula("Rd = Q·ω0·L")
	byTapShare  = figure.ByFormula("n = √Lcold/(√L1 + √L2)")
	byTunedGain = figure.ByFormula("A = −gm·(Rd·n² ∥ rout)")
	// byTunedGainNoRout: no output resistance given, none counted.
	byTunedGainNoRout = figure.ByFormula("A = −gm·Rd·n² (rout not given)")
	byBypassR         = figure.ByFormula("R = Rk ∥ Z into the common electrode")
)

// device is the small-signal description of an amplifying part, as the
// stage figures read it: the values are graph/device's (the model the AC
// solver stamps), with those resting on a class default dropped (see
// deviceOf). 0 stands for an infinite output resistance, as in parallel.
type device struct {
	kind      graph.Kind
	mu, ra    float64 // valve
	gm        float64 // all
	beta, rpi float64 // BJT
	rOut      float64 // BJT ro, FET rd (0 = infinite)
	small     model.Small
	missing   string
}

// deviceOf reads a part's model for the figures. A figure a repairer checks
// rests on the part's own parameters: what only a class default gives is
// dropped (model.Small.GivenOnly), so an output resistance not given counts
// as infinite, as in the textbook formulas, and a gain that would rest on a
// default transconductance or µ is not computed; missing names what to give.
func deviceOf(p *graph.Part) device {
	d := device{kind: p.Kind}
	s, err := model.Of(p)
	if err != nil {
		d.missing = "parameters the model accepts (" + err.Error() + ")"
		return d
	}
	g := s.GivenOnly()
	d.small, d.gm = g, g.Gm
	switch p.Kind {
	case graph.Valve:
		if s.Given(model.Gm | model.ROut) {
			d.mu, d.ra = s.Mu, s.ROut
		} else {
			d.missing = "mu and ra (or gm and one of them)"
		}
	case graph.BJT, graph.FET:
		d.beta = g.Beta
		if s.Given(model.RPi) {
			d.rpi = g.RPi
		}
		if s.Given(model.ROut) {
			d.rOut = g.ROut
		}
		if d.gm == 0 {
			d.missing = map[graph.Kind]string{graph.BJT: "gm or the bias current ic", graph.FET: "gm"}[p.Kind]
		}
	}
	return d
}

func parallel(a, b float64) float64 {
	switch {
	case a == 0:
		return b
	case b == 0:
		return a
	}
	return a * b / (a + b)
}

// calcGain computes the mid-band voltage gain by the textbook formula for
// the stage's form (docs/references.md §5):
//
//	common       valve −µRL/(ra+RL); BJT, FET −gm·(RL∥ro)
//	degenerated  valve −µRL/(ra+RL+(µ+1)Rk); BJT −βRL/(rπ+(β+1)RE)
//	             (−gmRL/(1+gmRE) without β); FET −gmRL/(1+gmRS)
//	follower     valve µRk/(ra+(µ+1)Rk), Rout = ra/(µ+1) ∥ Rk;
//	             BJT gmRE/(1+gmRE); FET gmRS/(1+gmRS)
//	grid         grounded grid / common base / common gate: valve
//	             (µ+1)RL/(ra+RL); BJT, FET gm·RL (from memory)
//	cascode      −gm1·RL, the upper device's output resistance taken as
//	             large (from memory)
//	pair         long-tailed pair, one output: −gm·RL/2 (from memory)
//
// The load RL is the parallel of the pattern's load parts and every other
// resistor from the load net to AC ground (the next stage's grid leak
// loads the anode too).
func calcGain(x *figCtx) {
	p := x.part("device")
	if p == nil {
		return
	}
	d := deviceOf(p)
	if d.missing != "" {
		x.flag("gain not computed: give %s %s", p.Ref, d.missing)
		return
	}
	rl := x.load()
	// a tapped load's upper resistor (degeneration_foot) is in series with
	// the rest: the whole of it carries the common electrode's current
	rk := parallelR(x.parts("degeneration"))
	for _, p := range x.parts("degeneration_foot") {
		rk += p.Value.Max
	}
	form := x.word("form", "common")
	if form != "follower" && rl == 0 {
		return
	}
	a, name := gainFormula(d, form, rl, rk)
	if name == "" {
		return
	}
	if form == "follower" {
		x.followerROut(p, d, rk)
	}
	check := figure.Figure{Name: "gain", Unit: figure.Ratio, Value: a, Origin: figure.ByFormula(name)}
	sv, why := x.solveGain(p, form, d, rl, rk)
	x.putChecked(sv, &check, why)
	x.stageImpedances(p, form, d, rk)
	if g, ok := x.get("gain"); ok && g.Value != 0 {
		x.set("gain", figure.Decibel, 20*math.Log10(math.Abs(g.Value)), byDecibels)
	}
	if form == "follower" {
		x.checkFollower(p)
	} else {
		x.set("r_load", figure.Ohm, rl, byLoad)
	}
}

// gainFormula is the textbook mid-band gain of a form (see calcGain) and
// the formula's name as a figure's origin gives it; name is "" for a form
// the table does not know or a follower without its resistor.
func gainFormula(d device, form string, rl, rk float64) (a float64, name string) {
	valve := d.kind == graph.Valve
	switch {
	case form == "common" && valve:
		return -d.mu * rl / (d.ra + rl), "A = −µ·RL/(ra+RL)"
	case form == "common" && d.rOut > 0:
		return -d.gm * parallel(rl, d.rOut), "A = −gm·(RL∥ro)"
	case form == "common":
		return -d.gm * rl, "A = −gm·RL"
	case form == "degenerated" && valve:
		return -d.mu * rl / (d.ra + rl + (d.mu+1)*rk), "A = −µ·RL/(ra+RL+(µ+1)Rk)"
	case form == "degenerated" && d.kind == graph.BJT && d.beta > 0:
		return -d.beta * rl / (d.rpi + (d.beta+1)*rk), "A = −β·RL/(rπ+(β+1)RE)"
	case form == "degenerated":
		return -d.gm * rl / (1 + d.gm*rk), "A = −gm·RL/(1+gm·RS)"
	case form == "follower" && rk == 0:
		return 0, ""
	case form == "follower" && valve:
		return d.mu * rk / (d.ra + (d.mu+1)*rk), "A = µ·Rk/(ra+(µ+1)Rk)"
	case form == "follower":
		return d.gm * rk / (1 + d.gm*rk), "A = gm·RE/(1+gm·RE)"
	case form == "grid" && valve:
		return (d.mu + 1) * rl / (d.ra + rl), "A = (µ+1)·RL/(ra+RL)"
	case form == "grid":
		return d.gm * rl, "A = gm·RL"
	case form == "cascode":
		return -d.gm * rl, "A = −gm1·RL"
	case form == "pair" && valve:
		return -d.mu * rl / (2 * (d.ra + rl)), "A = −µ·RL/(2(ra+RL))"
	case form == "pair":
		return -d.gm * rl / 2, "A = −gm·RL/2"
	}
	return 0, ""
}

// load is the AC load at the stage's output, see calcGain.
func (x *figCtx) load() float64 {
	seen := map[*graph.Part]bool{}
	var rs []*graph.Part
	for _, p := range x.parts("load") {
		if p.Kind == graph.Resistor {
			seen[p] = true
			rs = append(rs, p)
		}
	}
	if nets := x.spec.Args["load_net"]; len(nets) > 0 {
		name := x.st.nets[nets[0]]
		id, ok := x.w.netID[name]
		if ok && id != groundNet {
			for _, ci := range x.w.conns[id] {
				p := x.w.parts[ci]
				if p.Kind != graph.Resistor || seen[p] || len(x.w.pins[ci]) != 2 {
					continue
				}
				a, b := x.w.pins[ci][0], x.w.pins[ci][1]
				if a == id && b == groundNet || b == id && a == groundNet {
					seen[p] = true
					rs = append(rs, p)
				}
			}
		}
	}
	return parallelR(rs)
}

// calcTunedGain: a tuned stage's load at resonance is the tank's dynamic
// resistance Rd = Q·ω0·L (handbook formula, from memory); with the output
// electrode on a tap it sees Rd·n², n the tap's share of the turns counted
// from the cold end (turns go with √L on one core). The gain to the output
// electrode is then −gm·(Rd·n² ∥ ra) with the secondary's load left out:
// the cross-check of the gain, which is the solver's peak in circuit
// (solveTunedGain), the secondary's load and the windings' coupling in.
func calcTunedGain(x *figCtx) {
	p := x.part("device")
	c, ok := x.coil("coil")
	if p == nil || !ok {
		return
	}
	d := deviceOf(p)
	q := c.q
	if q == 0 {
		if t := x.part("coil"); t != nil {
			q, _ = t.Param("q")
		}
	}
	f0 := resonance(c.l, capBetween(x.w, x.parts("caps"), c.a, c.b, 0.5))
	if q <= 0 || math.IsNaN(f0) {
		return
	}
	rd := q * 2 * math.Pi * f0 * c.l
	x.set("r_dyn", figure.Ohm, rd, byDynamicR)
	n := x.tapShare()
	x.set("tap_share", figure.Ratio, n, byTapShare)
	if d.missing != "" {
		x.flag("gain not computed: give %s %s", p.Ref, d.missing)
		return
	}
	rOut := d.rOut
	if d.kind == graph.Valve {
		rOut = d.ra
	}
	gm := d.gm
	if d.kind == graph.Valve && gm == 0 && d.ra > 0 {
		gm = d.mu / d.ra
	}
	x.checkTuned(x.tank, x.tankOK)
	// The formula names rout only where it counts one: a transistor's ro
	// not given is infinite here (deviceOf), as in the textbook.
	origin := byTunedGain
	if rOut == 0 {
		origin = byTunedGainNoRout
	}
	check := figure.Figure{Name: "gain", Unit: figure.Ratio, Value: -gm * parallel(rd*n*n, rOut), Origin: origin}
	if x.tunedSecondaryGain(p, gm, rd*n*n, rOut, f0) {
		return
	}
	sv, why := x.solveTunedGain(p, rd*n*n, rOut)
	x.putChecked(sv, &check, why)
}

// tapShare is the share of the tuned winding's turns between its cold end
// and the tap the output electrode is on: 1 when it is on the hot end.
func (x *figCtx) tapShare() float64 {
	i := x.index(x.spec.Args["coil"][0])
	if i < 0 || len(x.m.coils[i]) == 0 {
		return 1
	}
	ci := x.m.parts[i]
	p := x.w.parts[ci]
	cl := x.w.coils[ci][x.m.coils[i][0]]
	if len(cl.pins) != 3 {
		return 1
	}
	var out int = -1
	for _, pin := range x.m.v.parts[x.index(x.spec.Args["device"][0])].pp.Pins {
		if pin.Key == "output" {
			out = x.w.netID[x.st.nets[pin.Net]]
		}
	}
	if x.w.pinNet(ci, cl.pins[1]) != out {
		return 1
	}
	// The halves: first pin to tap, tap to last pin; the cold end is the one at AC ground.
	var la, lb float64
	for _, w := range p.Windings {
		if w.From == cl.pins[0] && w.To == cl.pins[1] {
			la = w.L
		}
		if w.From == cl.pins[1] && w.To == cl.pins[2] {
			lb = w.L
		}
	}
	if la <= 0 || lb <= 0 {
		return 1
	}
	// The cold end is at chassis, or on the decoupled line the pattern's
	// return bypass holds (ret): the winding's supply end.
	cold := la
	if end := x.w.pinNet(ci, cl.pins[2]); end == groundNet || end == x.patternNet("ret") {
		cold = lb
	}
	return math.Sqrt(cold) / (math.Sqrt(la) + math.Sqrt(lb))
}

// patternNet is the circuit net the match bound to the pattern net name,
// -1 where the pattern has none or the match left it out.
func (x *figCtx) patternNet(name string) int {
	n, ok := x.st.nets[name]
	if !ok {
		return -1
	}
	id, ok := x.w.netID[n]
	if !ok {
		return -1
	}
	return id
}

// calcBypass gives the corner of a cathode (emitter, source) bypass
// capacitor. The capacitor works against everything at the common
// electrode: the resistor in parallel with the impedance looking into the
// electrode, graph/device's ZCommon(RL): (ra + RL)/(µ + 1) for a valve,
// (rd + RL)/(1 + gm·rd) for a FET, rπ ∥ (ro + RL)/(1 + gm·ro) for a BJT,
// 1/gm where the output resistance is not given (textbook small-signal
// results, from memory; the BJT figure leaves out the base source
// resistance over β + 1). Taking the resistor alone, as 1/(2πRkCk), puts
// the corner too low by the factor Rk/R.
func calcBypass(x *figCtx) {
	p := x.part("device")
	rk := parallelR(x.parts("r"))
	ck := sumCap(x.parts("c"), 1)
	if p == nil || rk <= 0 || ck <= 0 {
		return
	}
	d := deviceOf(p)
	var zin float64
	if d.gm > 0 {
		zin = d.small.ZCommon(x.load())
	}
	r := rk
	if zin > 0 && !math.IsInf(zin, 1) {
		r = parallel(rk, zin)
		x.set("r", figure.Ohm, r, byBypassR)
	}
	tau := r * ck
	x.set("tau", figure.Second, tau, byTau)
	check := figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: 1 / (2 * math.Pi * tau), Origin: byCorner}
	cs := x.parts("c")
	b := x.bypassInCircuit(p, cs[0])
	if b.solved && len(cs) == 1 {
		x.checkBypass(p, cs[0], b)
	}
	if !b.solved || !b.hasCorner || len(cs) != 1 {
		x.put(check)
		return
	}
	sv := &figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: b.corner,
		Origin: figure.BySolver("−3 dB of the stage's gain below a perfect bypass's", gangMid.at)}
	x.putChecked(sv, &check, func() string {
		return fmt.Sprintf("the formula is the pole of %s with %s; the gain runs from %s with no bypass to %s with a perfect one, and its −3 dB point meets the pole only where the first is far below the second",
			cs[0].Ref, figure.Format(r, figure.Ohm, figure.Text), figure.Plain(b.open), figure.Plain(b.full))
	})
}

// checkBypass keeps the name "bypassed" only where the solver shows it:
// across the band (its middle and its low edge) the gain comes within
// bypassAgreement of a perfect bypass's. Else a flag where the bypass
// corner lies in the band, and the plainer name "partly bypassed" where
// the solver or the wiring shows part of the lead left: the middle of the
// band falls short (with a note), or the capacitor sits below an
// unbypassed part of the lead. A capacitor straight across the whole lead
// that holds the middle of the band bypasses all of it there, and only
// the band's low edge falls short: "bypass weak at the band's low end"
// (review22 b05's C19 across R16 had been named "partly bypassed").
func (x *figCtx) checkBypass(dev, ck *graph.Part, b bypassSolve) {
	if b.bypassed() {
		return
	}
	midHeld := math.Abs(b.a-b.full) <= bypassAgreement*b.full
	x.st.Title = expandTitle(partlyBypassed, x.st.Family)
	if midHeld && x.acrossWholeLead(dev, ck) {
		x.st.Title = expandTitle(weakBypass, x.st.Family)
	}
	if b.aLo < (1-bypassAgreement)*b.fullLo && b.hasCorner && b.corner > b.lo {
		x.flag("bypass corner %s lies in the band %s–%s: gain falls to %s at %s (%s with a perfect bypass)",
			hz(b.corner), hz(b.lo), hz(b.hi), figure.Plain(b.aLo), hz(b.lo), figure.Plain(b.fullLo))
	}
	if midHeld {
		return
	}
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("named partly bypassed: at %s the gain in circuit is %s, %s %% short of the %s a perfect bypass gives; %s is no bypass at the band",
		hz(b.f), figure.Plain(b.a), figure.Plain(100*(1-b.a/b.full)), figure.Plain(b.full), ck.Ref))
}
