package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
	"pare/graph/value"
)

// The three-point design solved in circuit. The closed form (ThreePoint)
// sees the oscillator tank's own parts; in circuit the grid capacitor, the
// signal injection and the valve put more across the coil, and a design
// exact on paper missed by tens of kilohertz in circuit. So the design is
// iterated on the circuit the walk solves: the closed form is aimed at
// shifted oscillator frequencies until the oscillator the solver finds,
// with the design's coil, padder and trimmer in place, stands exactly IF
// above the signal tank at the three points.

// designParts are the parts of the solver's circuit a design sets: the
// oscillator coil, the padder and the gang section (with what a reduction
// merged into it), the capacitors straight across the section, which the
// design's trimmer replaces, and the section's own span.
type designParts struct {
	coil, padder, gang *graph.Part
	across             []*graph.Part
	gmin, gmax         float64
	coilL              float64 // the coil's inductance as captured
}

// designPartsOf finds them on the oscillator tank osc (reduced) whose
// original gang section is section: the padder a fixed capacitor sharing
// one net with the section, the rest across both of its nets. ok is false
// where there is no padder in series with the section.
func designPartsOf(c *graph.Circuit, osc *tankModel, coilRef string, section *graph.Part) (designParts, bool) {
	d := designParts{coil: c.Part(coilRef), gang: gangSection(osc.caps),
		gmin: section.Capacitance(0), gmax: section.Capacitance(1), coilL: osc.l}
	if d.coil == nil || d.gang == nil || c.Part(d.gang.Ref) == nil {
		return d, false
	}
	shared := func(p *graph.Part) int {
		n := 0
		for _, a := range netsOfPart(p) {
			for _, b := range netsOfPart(d.gang) {
				if a == b {
					n++
				}
			}
		}
		return n
	}
	hot := ""
	for _, n := range netsOfPart(d.gang) {
		if !c.RoleOf(n).IsACGround() {
			hot = n
		}
	}
	for _, p := range osc.caps {
		nets := netsOfPart(p)
		switch {
		case p == d.gang || c.Part(p.Ref) == nil:
		case shared(p) == 2:
			d.across = append(d.across, p)
		case shared(p) == 1 && p.Type != graph.CapVariable && d.padder == nil && slices.Contains(nets, hot) &&
			!c.RoleOf(nets[0]).IsACGround() && !c.RoleOf(nets[len(nets)-1]).IsACGround():
			d.padder = p
		}
	}
	return d, d.padder != nil
}

func netsOfPart(p *graph.Part) []string {
	var out []string
	for _, pin := range p.Pins {
		out = append(out, pin.Net)
	}
	return out
}

// apply is c with the design p in place.
func (d designParts) apply(c *graph.Circuit, p Padding) *graph.Circuit {
	set := map[string]value.Range{
		d.padder.Ref: {Min: p.Padder, Max: p.Padder},
		d.gang.Ref:   {Min: d.gmin + p.Trimmer, Max: d.gmax + p.Trimmer},
	}
	drop := map[string]bool{}
	for _, q := range d.across {
		drop[q.Ref] = true
	}
	out := withPart(c, &graph.Part{})
	out.Parts = nil
	for _, q := range c.Parts {
		if drop[q.Ref] {
			continue
		}
		if q.Ref == d.coil.Ref {
			q = scaledCoil(q, p.L/d.coilL)
		}
		if v, ok := set[q.Ref]; ok {
			q = q.Clone()
			q.Value = v
			if q.Set > 0 {
				q.Set = v.Max
			}
		}
		out.Parts = append(out.Parts, q)
	}
	return out
}

// designIter bounds the iteration; designTol is where it stops: a hertz,
// far below any dial's reading.
const (
	designIter = 20
	designTol  = 1.0
)

// designSettled is the largest in-circuit error a design may keep and be
// called solved in circuit: a tenth of the narrowest loaded bandwidth of a
// broadcast signal tank (about 3 kHz on long waves).
const designSettled = 300.0

// inCircuitDesign is a three-point design solved in circuit: the design,
// the signal frequencies where it tracks exactly (as solved with it in
// place) and the largest in-circuit error left there.
type inCircuitDesign struct {
	p        Padding
	pts      [3]float64
	residual float64
	// closed is the largest in-circuit error of the closed form aimed at
	// the points themselves (the first step): what it alone would miss by.
	closed float64
}

// solveDesign iterates the closed form on the circuit c (quiet; signal
// tank sn, oscillator on) until the oscillator stands IF above the signal
// tank at the three signal frequencies pts. sigAt guesses the signal
// tank's frequency at a gang setting. ok is false where a setting or a
// tank is not found or the closed form has no solution.
func solveDesign(tp trackPairs, d designParts, pts [3]float64, ifHz float64, sigAt func(float64) float64) (inCircuitDesign, bool) {
	sn, on := tp.sn, tp.on
	var th, cg, target [3]float64
	for i, f := range pts {
		t, ok := settingFor(tp.rs, sn, on, f, sigAt)
		if !ok {
			return inCircuitDesign{}, false
		}
		th[i], cg[i], target[i] = t, d.gmin+t*(d.gmax-d.gmin), f+ifHz
	}
	var out inCircuitDesign
	aim := target
	var lastAim, lastFo [3]float64
	closed := -1.0
	for range designIter {
		p, err := threePointAt(cg, aim)
		if err != nil {
			return inCircuitDesign{}, false
		}
		pairWith := designPair(tp, d, p)
		out = inCircuitDesign{p: p}
		for i := range th {
			fs, fo, ok := pairWith(th[i], pts[i], p.OscillatorAt(cg[i]))
			if !ok {
				return inCircuitDesign{}, false
			}
			e := fo - (fs + ifHz)
			out.pts[i], out.residual = fs, math.Max(out.residual, math.Abs(e))
			aim[i], lastAim[i], lastFo[i] = nextAim(aim[i], fo, fs+ifHz, lastAim[i], lastFo[i]), aim[i], fo
		}
		if closed < 0 {
			closed = out.residual
		}
		if out.residual < designTol {
			break
		}
	}
	out.closed = closed
	return out, true
}

// designPair solves the signal tank and the oscillator with design p in
// place, as the tracking walk does: the oscillator where its device's loop
// runs when the walk found one, else its tank's peak.
func designPair(tp trackPairs, d designParts, p Padding) func(th, gs, gosc float64) (fs, fo float64, ok bool) {
	withDesign := ac.NewResponses(d.apply(tp.c, p))
	if tp.dev == "" {
		return func(th, gs, gosc float64) (float64, float64, bool) {
			return pairAt(withDesign, tp.sn, tp.on, th, gs, gosc)
		}
	}
	lp := ac.NewLoops(d.apply(tp.live, p))
	return func(th, gs, gosc float64) (float64, float64, bool) {
		fs, fp, ok := pairAt(withDesign, tp.sn, tp.on, th, gs, gosc)
		if !ok {
			return 0, 0, false
		}
		fo, ok := loopAt(lp, tp.dev, th, fp)
		return fs, fo, ok
	}
}

// nextAim is the next oscillator frequency to aim the closed form at for
// one point: a secant step through the last two aims and the in-circuit
// frequencies they gave (want the one sought), or the first step, the aim
// scaled by how far the circuit stood from it.
func nextAim(aim, fo, want, lastAim, lastFo float64) float64 {
	if lastAim > 0 && fo != lastFo {
		return aim + (want-fo)*(aim-lastAim)/(fo-lastFo)
	}
	return aim * want / fo
}

// settingRefine is the bisection steps of settingFor: 2⁻²⁴ of the travel
// moves a broadcast signal tank by well under a hertz.
const settingRefine = 24

// settingFor is the gang setting where the signal tank stands at f in
// circuit: bisection over the travel, the signal frequency falling as the
// gang closes.
func settingFor(c *ac.Responses, sn, on tankNets, f float64, sigAt func(float64) float64) (float64, bool) {
	lo, hi := 0.0, 1.0
	for range settingRefine {
		mid := (lo + hi) / 2
		fs, ok := tankAt(c, sn, mid, sigAt(mid))
		if !ok {
			return 0, false
		}
		if fs > f {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2, true
}

// byDesignInC is where the in-circuit design comes from.
var byDesignInC = figure.BySolver("three-point design iterated in circuit: oscillator coil, padder and the capacitance across the gang section set until fosc = fsig + IF, each the peak of |Z| across its coil, at 6 %, 49 % and 91.5 % of the signal range in circuit", "the three gang settings of those points")

// designInCircuit replaces the suggested design's figures (the closed
// form's, kept beside each as its check) with the design solved in
// circuit, and says in a note what the closed form alone would miss by
// there. The signal range is the walk's (sv); section is the oscillator's
// gang section in the original circuit.
func (x *figCtx) designInCircuit(osc *tankModel, oc coilEnds, section *graph.Part, sig *tankModel, ifHz float64, sv trackWalk) {
	tp, ok := x.trackPair(osc)
	if !ok {
		return
	}
	d, ok := designPartsOf(tp.c, osc, oc.ref, section)
	if !ok {
		return
	}
	// the signal tank's guess: its formula scaled to the walk's two ends
	r0, r1 := sv.fs[0]/sig.f(0), sv.fs[1]/sig.f(1)
	sigAt := func(th float64) float64 { return sig.f(th) * (r0 + th*(r1-r0)) }
	des, ok := solveDesign(tp, d, TrackingPoints(sv.fs[1], sv.fs[0]), ifHz, sigAt)
	if !ok {
		return
	}
	if des.residual > designSettled {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("suggested design: the closed form on the oscillator tank's own parts, checked in circuit at %s, misses by up to %s there; pare's iteration in circuit did not settle (%s left after %d steps: what else sits across this tank is not a trimmer across the gang), so the closed form's values stand, unconfirmed",
			hzList(des.pts[:]), hz(des.closed), hz(des.residual), designIter))
		return
	}
	for _, f := range []struct {
		name string
		unit figure.Unit
		v    float64
	}{{"pad_c", figure.Farad, des.p.Padder}, {"pad_trim", figure.Farad, des.p.Trimmer}, {"pad_l", figure.Henry, des.p.L}} {
		check, _ := x.get(f.name)
		x.putChecked(&figure.Figure{Name: f.name, Unit: f.unit, Value: f.v, Origin: byDesignInC}, &check, nil)
	}
	x.put(figure.Figure{Name: "track_f", Unit: figure.Hertz, Points: des.pts[:], Origin: byDesignInC})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("suggested design: solved in circuit, it tracks within %s at %s; the closed form on the oscillator tank's own parts, aimed at the same points, would miss by up to %s in circuit (what %s put across the coil)",
		hz(des.residual), hzList(des.pts[:]), hz(des.closed), acrossCoil(stageFamily(x.st.Family, x.w.c))))
}

// acrossCoil names what an oscillator's device and its coupling put
// across its coil, in the words of the device's kind: a transistor has a
// base and its coupling capacitor, not a grid capacitor. A family that is
// no device's gets the neutral words.
func acrossCoil(family string) string {
	switch family {
	case "valve":
		return "the grid capacitor, the injection and the valve"
	case "bjt":
		return "the base coupling capacitor, the injection and the transistor"
	case "fet":
		return "the gate capacitor, the injection and the FET"
	}
	return "the coupling capacitor, the injection and the device"
}

// stageFamily is a stage's device family, or for a stage of passive parts
// (the gang's tracking, holding no device) the family of the circuit's
// amplifying devices when they are all of one kind: a transistor set's
// tracking note read "the grid capacitor … and the valve" (review20 b02).
func stageFamily(family string, c *graph.Circuit) string {
	if family != "passive" && family != "" {
		return family
	}
	found := ""
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		f := deviceFamily(p)
		if f == "passive" {
			continue
		}
		if found != "" && found != f {
			return ""
		}
		found = f
	}
	return found
}

// scaledCoil is coil with its inductance times k: a tapped coil's sections
// (its windings) each scaled, so the tap stays where it is.
func scaledCoil(coil *graph.Part, k float64) *graph.Part {
	q := coil.Clone()
	q.Value = value.Range{Min: q.Value.Min * k, Max: q.Value.Max * k}
	for i := range q.Windings {
		q.Windings[i].L *= k
	}
	return q
}
