package align

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/figure"
	"pare/rules/stages"
)

// trackLimit is the tracking error above which a set is said not to
// track: 2 % of the IF, inside the IF pass-band, the line `pare stages`
// flags as well (common practice, no source).
const trackLimit = 0.02

// tank is one ganged tuned circuit as the bench sees it: the gang section,
// the trimmer across it, the padder in series (oscillator only) and the
// coil.
type tank struct {
	gang, trimmer, padder, coil *graph.Part
	aerial                      bool // a signal tank whose coil is on the aerial input
}

// trackingSteps adds the oscillator and aerial/RF tracking (common
// practice) of a mixer that carries the tracking figures: oscillator
// trimmer at the high tracking point, padder or oscillator core at the low
// one, repeated until both hold; then the aerial trimmer and core at the
// same two points. It returns why it could not, or "".
func (g *Guide) trackingSteps(c *graph.Circuit, mix *stages.Stage) string {
	osc := oscTank(c, mix)
	if osc.gang == nil {
		return mix.Name + " has no ganged tuning capacitor among its parts"
	}
	g.ends(c, mix)
	lo, hi, from, why := g.trackPoints(c, mix)
	if why != "" {
		return why
	}
	lo, hi, from = g.keepOnDial(c, lo, hi, from)
	g.reachWarn(lo, hi)
	g.trackWarnings(mix, osc)
	g.trackSteps(c, osc, lo, hi, from)
	return ""
}

// trackSteps adds the tracking steps proper at the low and high tracking
// points lo and hi (dial frequencies; from says where they come from).
func (g *Guide) trackSteps(c *graph.Circuit, osc tank, lo, hi float64, from string) {
	g.aerialInto = "the aerial socket through a dummy aerial (common practice)"
	if len(c.Inputs) > 0 {
		g.aerialInto = fmt.Sprintf("the aerial input (net %s) through a dummy aerial (common practice)", c.Inputs[0])
	}
	osc.trimmer = g.bandTrimmer(c, osc)
	first := len(g.Steps)
	g.addEnd(osc.trimmer, "oscillator trimmer", "oscillator", hi, from, "no oscillator trimmer is captured on "+osc.gang.Ref+": the high end of the dial cannot be set")
	g.addEnd(lowSetter(osc), "", "oscillator", lo, from, lowMissing(osc))
	if len(g.Steps)-first == 2 {
		g.Repeat = append(g.Repeat, "repeat the two oscillator steps until both hold: each pulls the other (common practice)")
	}
	for _, t := range sigTanks(c, osc.gang) {
		t.trimmer = g.bandTrimmer(c, t)
		word := "aerial"
		if !t.aerial {
			word = "RF"
		}
		first = len(g.Steps)
		g.addEnd(t.trimmer, word+" trimmer", "aerial/RF", hi, from, "no "+word+" trimmer is captured on "+t.gang.Ref+": its tuned circuit cannot be peaked at the high end")
		g.addEnd(coreOf(t.coil), "", "aerial/RF", lo, from, rfLowMissing(t))
		if len(g.Steps)-first == 2 {
			g.Repeat = append(g.Repeat, "repeat the two aerial/RF steps on "+t.gang.Ref+" ("+word+" trimmer and core) until both peak (common practice)")
		}
	}
}

// addEnd adds one tracking step: p at the dial frequency f, or the warning
// when p is nil.
func (g *Guide) addEnd(p *graph.Part, word, phase string, f float64, from, missing string) {
	if p == nil {
		g.Warnings = append(g.Warnings, missing)
		return
	}
	what := word + " " + p.Ref
	if word == "" {
		what = describe(p)
	}
	watch := "tune the set to the generator and turn " + p.Ref + " for the loudest output"
	if phase == "oscillator" {
		watch = fmt.Sprintf("set the dial to %s and turn %s until the generator is heard there at its loudest (the oscillator is then at %s)",
			hz(f), p.Ref, hz(f+g.IF))
		if word == "" {
			watch = fmt.Sprintf("set the dial to %s, then rock the gang through the signal while turning %s, for the loudest output at that dial reading (oscillator at %s)",
				hz(f), p.Ref, hz(f+g.IF))
		}
	} else if word == "" {
		watch = "rock the gang through the signal while turning " + p.Ref + ", for the loudest output"
	}
	g.Steps = append(g.Steps, Step{Phase: phase, Part: p.Ref, What: what, Freq: f, Dial: f, Osc: f + g.IF, Into: g.aerialInto, Watch: watch, From: from})
}

func describe(p *graph.Part) string {
	if p.Kind == graph.Capacitor {
		return "padder " + p.Ref
	}
	return "core of " + p.Ref
}

// ends records the dial ends from the oscillator and signal ranges (the
// guide's coverage warns when they miss the declared band).
func (g *Guide) ends(c *graph.Circuit, mix *stages.Stage) {
	osc, ok1 := mix.Figures.Get("osc_f")
	sig, ok2 := mix.Figures.Get("sig_f")
	if !ok1 || !ok2 || osc.Range == nil || sig.Range == nil {
		return
	}
	g.Ends = []End{
		{Where: "gang fully meshed (low end)", Sig: sig.Range.Min, Osc: osc.Range.Min},
		{Where: "gang fully open (high end)", Sig: sig.Range.Max, Osc: osc.Range.Max},
	}
}

// trackWarnings says when the oscillator cannot track: its error beyond
// 2 % of the IF, or beyond half the signal tank's loaded bandwidth where
// the stage solved it (track_bw: the station then lies outside that tank's
// −3 dB band).
func (g *Guide) trackWarnings(mix *stages.Stage, osc tank) {
	e, ok := mix.Figures.Get("track_err_max")
	if !ok || g.IF <= 0 {
		return
	}
	limit, line := trackLimit*g.IF, "2 % of the IF, common practice"
	if bw, ok := mix.Figures.Get("track_bw"); ok && bw.Value > 0 && bw.Value/2 < limit {
		limit, line = bw.Value/2, fmt.Sprintf("half the signal tank's loaded bandwidth of %s there, in circuit: the station lies outside its −3 dB band", hz(bw.Value))
	}
	if math.Abs(e.Value) <= limit {
		return
	}
	at := ""
	if e.At != nil {
		at = " at " + hz(e.At.Value)
	}
	if osc.padder == nil {
		g.Warnings = append(g.Warnings, fmt.Sprintf("this oscillator has no padder and pare's tracking error is %s%s, above %s (%s): it cannot track over the dial, whatever the trimmers", hz(e.Value), at, hz(limit), line))
		return
	}
	cure := fmt.Sprintf("the two-point alignment should bring it in; if it does not, check the padder %s's value", osc.padder.Ref)
	if lowSetter(osc) == nil {
		// Only the high end can be set: saying the alignment brings the
		// error in would contradict the low-end step's own warning.
		cure = fmt.Sprintf("alignment cannot bring it in, as only the high end can be set (the padder %s is fixed and no core is captured): after aligning, read the dial error near the low end and check %s's value", osc.padder.Ref, osc.padder.Ref)
	}
	g.Warnings = append(g.Warnings, fmt.Sprintf("the set mistracks: pare's tracking error for the parts as captured is %s%s, above %s (%s): %s", hz(e.Value), at, hz(limit), line, cure))
}

// lowSetter is what sets the oscillator's low end: an adjustable padder,
// else the coil's core.
func lowSetter(t tank) *graph.Part {
	if t.padder != nil && t.padder.Type == graph.CapTrimmer {
		return t.padder
	}
	return coreOf(t.coil)
}

func coreOf(p *graph.Part) *graph.Part {
	if p != nil && len(p.Adjust) > 0 {
		return p
	}
	return nil
}

func lowMissing(t tank) string {
	coil := "the oscillator coil"
	if t.coil != nil {
		coil = t.coil.Ref
	}
	if t.padder != nil {
		return fmt.Sprintf("the low end cannot be set: the padder %s is fixed and no adjustable core is captured on %s (add adjust = \"core\" if it has one): if the low end is off, check %s's value", t.padder.Ref, coil, t.padder.Ref)
	}
	return fmt.Sprintf("the low end cannot be set: no padder and no adjustable core is captured on %s", coil)
}

func rfLowMissing(t tank) string {
	if t.coil == nil {
		return "no aerial coil found on " + t.gang.Ref + ": the low end of the aerial circuit cannot be peaked"
	}
	if !t.aerial {
		return fmt.Sprintf("no adjustable core is captured on the RF coil %s: the low end of %s's tuned circuit cannot be peaked (add adjust = \"core\" if it has one)", t.coil.Ref, t.gang.Ref)
	}
	return fmt.Sprintf("no adjustable core is captured on the aerial coil %s: on a ferrite rod the low end is peaked by sliding the winding along the rod (common practice); add adjust = \"core\" if the coil has a core", t.coil.Ref)
}

func hz(v float64) string { return figure.Format(v, figure.Hertz, figure.Text) }

func hzList(vs []float64) string { return figure.Points(vs, figure.Hertz, figure.Text) }

// bandTrimmer is the trimmer to turn on tank t: of the trimmers on its
// gang section's net, its coil's or its padder's, one the wavechange
// switch puts in circuit with this band only (g.band) before one that is
// in circuit on every band; else the tank's own.
func (g *Guide) bandTrimmer(c *graph.Circuit, t tank) *graph.Part {
	if t.trimmer != nil && g.band[t.trimmer.Ref] || len(g.band) == 0 || t.gang == nil {
		return t.trimmer
	}
	nets := []string{hotNet(c, t.gang)}
	for _, p := range []*graph.Part{t.coil, t.padder} {
		if p != nil {
			nets = append(nets, netsOf(p)...)
		}
	}
	for _, p := range trimmersOn(c, nets) {
		if p != t.padder && g.band[p.Ref] {
			return p
		}
	}
	return t.trimmer
}

// aerialReach is how many passive parts may stand in series between the
// aerial input and the aerial coil: an isolating capacitor (an AC/DC set
// keeps the live chassis off the aerial so), a series resistor, an IF trap.
const aerialReach = 2

// fedFromAerial tells whether coil is fed from the aerial input net in
// through passive two-terminal parts alone (at most aerialReach of them,
// never through AC ground): its tank is the aerial circuit, whose trimmer
// is the aerial trimmer; a coil fed from a device (an RF stage) is an RF
// coil.
func fedFromAerial(c *graph.Circuit, coil *graph.Part, in string) bool {
	target := netsOf(coil)
	seen := map[string]bool{in: true}
	frontier := []string{in}
	for hop := 0; hop <= aerialReach && len(frontier) > 0; hop++ {
		var next []string
		for _, n := range frontier {
			if slices.Contains(target, n) {
				return true
			}
			for _, p := range c.Parts {
				if len(p.Pins) != 2 || !passiveSeries(p) {
					continue
				}
				for i, pin := range p.Pins {
					o := p.Pins[1-i].Net
					if pin.Net == n && !seen[o] && !c.RoleOf(o).IsACGround() {
						seen[o] = true
						next = append(next, o)
					}
				}
			}
		}
		frontier = next
	}
	return false
}

func passiveSeries(p *graph.Part) bool {
	return p.Kind == graph.Capacitor || p.Kind == graph.Resistor || p.Kind == graph.Inductor
}
