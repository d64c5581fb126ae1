package stages

import (
	"fmt"
	"math"
	"math/cmplx"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
	"pare/graph/value"
)

// Names checked against behaviour: a pattern's name claims a property (a
// bypass, a tuned load, a smoothing filter); the claim stands
// only where the solver (or, for smoothing, the circuit) shows it. Where
// it fails the stage takes the plainer name and a note says why.

// tunedMinQ is the least in-circuit Q of a load that makes an amplifier
// "tuned": 2 (common practice, no source: below it the peak is a broad
// hump, as an audio transformer with a top-cut capacitor gives, and no
// one aligns it).
const tunedMinQ = 2

// followerMinGain is the gain below which a follower's note says what
// loads it: 0.7, about 3 dB down (common practice, no source: a cathode or
// emitter follower into a light load gives 0.8 to 0.99).
const followerMinGain = 0.7

// plainerTitles are the names a stage takes when its claim fails.
var plainerTitles = map[string]string{
	"tuned":  "Transformer-coupled amplifier, common {common} ({family})",
	"smooth": "Supply decoupling filter",
}

// checkTuned keeps "tuned" where the load's in-circuit peak has a Q worth
// the name (tunedMinQ); t is the load tank as solved.
func (x *figCtx) checkTuned(t tankPeaks, ok bool) {
	if !x.solve {
		return
	}
	q := math.NaN()
	if ok && len(t.q) > 0 {
		q = t.q[len(t.q)/2]
	}
	switch {
	case !ok:
		x.rename("tuned", "named transformer-coupled: the solver finds no peak in the load's impedance near its formula resonance")
	case math.IsNaN(q) || q < tunedMinQ:
		x.rename("tuned", fmt.Sprintf("named transformer-coupled: the load's peak in circuit has a Q of %s, below the %d a tuned stage has",
			qText(q), tunedMinQ))
	}
}

// confirmTank: a stage named a tuned circuit (group "tuned": a tuned
// winding, an LC tank) is one only if it behaves as one in circuit, a peak
// in the impedance across its coil near its formula resonance, with a Q
// of tankMinQ or more. A winding with only its trimmer across it, when a
// padder and gang section tune it too, shows no peak near the trimmer's
// resonance: it is part of a larger tank, not a tank. A capacitor across
// an output transformer's primary (a top cut) has the shape of a tuned
// winding, but the loudspeaker reflected into the primary damps the pair
// to a Q well below 1. Such a stage is dropped (solveFigures), its parts
// left to the stage that holds them. Without the solver nothing is judged.
func (x *figCtx) confirmTank(coil string) {
	if !x.solve || x.st.group != "tuned" {
		return
	}
	x.st.unconfirmed = x.tankDoubt(coil)
}

// tankDoubt says why the tank last solved (resonanceFigure) is not borne
// out as a tuned circuit in circuit, "" when it is: no peak near its
// formula resonance, a loaded Q under tankMinQ, or a peak far from every
// band the set declares.
func (x *figCtx) tankDoubt(coil string) string {
	q := math.NaN()
	if x.tankOK && len(x.tank.q) > 0 {
		q = x.tank.q[len(x.tank.q)/2]
	}
	switch {
	case !x.tankOK:
		return "no peak in the impedance across " + coil + " near its formula resonance"
	case math.IsNaN(q) || q < tankMinQ:
		return fmt.Sprintf("the peak across %s has a Q of %s in circuit, below the %d a tuned circuit has", coil, qText(q), tankMinQ)
	case !nearAnyBand(x.w.c, x.tank.f):
		return fmt.Sprintf("the peak across %s lies at %s in circuit, far from every band and named frequency the set declares: not one of its tuned circuits", coil, hzText(x.tank.f[0]))
	}
	return ""
}

// doubtTank: in a stage that is not itself named a tuned circuit (a
// detector, a mixer) a tank the solver does not bear out keeps the
// stage, but its resonance and loaded Q are no figures of the circuit:
// they are dropped and a note says the tank was not confirmed and why: a
// winding that conducting diodes damp to a Q under tankMinQ has no
// resonance to quote, and a false one is worse than none.
func (x *figCtx) doubtTank(coil string) {
	if !x.solve || x.st.group == "tuned" {
		return
	}
	why := x.tankDoubt(coil)
	if why == "" {
		return
	}
	x.dropFigures("f", "q_loaded")
	x.st.Notes = append(x.st.Notes, "tank "+coil+" not confirmed in circuit, so no resonance figure: "+why)
}

// tankBandSpan is how far outside every declared band and named
// frequency a tank may resonate and still be one of the set's tuned
// circuits: a factor of five covers an oscillator above a band (a
// superhet's runs at most about 2.4 times a medium-wave band's bottom)
// and an IF below it (common practice, no source). A link winding with a
// few picofarads across it (a neutralising capacitor) peaks tens of
// times above the IF and tunes nothing.
const tankBandSpan = 5

// nearAnyBand says whether every frequency in fs lies within tankBandSpan
// of the set's band, a region's band or a named frequency; true when the
// set declares none.
func nearAnyBand(c *graph.Circuit, fs []float64) bool {
	var spans []value.Range
	if c.Band.Max > 0 {
		spans = append(spans, c.Band)
	}
	for _, r := range c.Regions {
		if r.Band.Max > 0 {
			spans = append(spans, r.Band)
		}
	}
	for _, f := range c.Freqs {
		spans = append(spans, value.Range{Min: f, Max: f})
	}
	if len(spans) == 0 {
		return true
	}
	for _, f := range fs {
		near := false
		for _, b := range spans {
			if f >= b.Min/tankBandSpan && f <= b.Max*tankBandSpan {
				near = true
			}
		}
		if !near {
			return false
		}
	}
	return true
}

// tankMinQ is the least loaded Q of a tank named a tuned circuit: below 1
// its −3 dB bandwidth is wider than its centre frequency, so it selects
// nothing (common practice, no source). It is lower than tunedMinQ, the
// tuned amplifier's, because a tank inside an oscillator is solved with
// the device quiet, its input damping the tank that the running loop
// makes up for (a tickler oscillator's base winding shows Q 1.8 so).
const tankMinQ = 1

func qText(q float64) string {
	if math.IsNaN(q) {
		return "less than 0.5 (no −3 dB points either side)"
	}
	return figure.Plain(q)
}

// checkFollower: a follower is named by its topology (output electrode at
// AC ground, the signal taken from the common one), whatever its gain; a
// gain well below 1 comes from what it drives, and the note says what
// that is in circuit, so the figure is read with its load.
func (x *figCtx) checkFollower(p *graph.Part) {
	g, ok := x.get("gain")
	if !x.solve || !ok || g.Origin.Source != figure.Solver || g.Value >= followerMinGain {
		return
	}
	_, out := x.gainNets("follower")
	band := x.w.c.BandOf(p)
	if out == "" || band.Min <= 0 || band.Max <= 0 {
		return
	}
	f := math.Sqrt(band.Min * band.Max)
	z, ok := impedanceAt(without(x.solverCircuit(), p.Ref), out, f)
	if !ok {
		return
	}
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("a follower with a gain of %s in circuit: at %s its %s drives %s, the load pulls it below 1",
		figure.Plain(g.Value), hz(f), electrodeWord(p), figure.Format(cmplx.Abs(z), figure.Ohm, figure.Text)))
}

// checkSmoothing keeps "smoothing" where a power rectifier
// (isPowerRectifier, the walk the ripple note's rectifier is found by) sits
// on either of the filter's nets, or charges one through a surge resistor
// (rectifierOn). A battery set's decoupling has none; a
// mains set's decoupler takes a line a section before it has smoothed, and
// says so, naming the rectifier its ripple note names, so the two notes
// tell one story.
func (x *figCtx) checkSmoothing(nets ...string) {
	for _, name := range nets {
		id, ok := x.w.netID[name]
		if !ok || id == groundNet {
			continue
		}
		if x.rectifierOn(id) {
			return
		}
	}
	x.capAsDecoupling()
	if _, refs := x.rectWave(); len(refs) > 0 {
		what := "the rectifier " + refList(refs) + " is" // one part: a double-diode valve, a bridge block
		if len(refs) > 1 {
			what = "the rectifiers " + refList(refs) + " are"
		}
		x.rename("smooth", fmt.Sprintf("named a decoupling filter: %s not on its nets, it takes the supply after a section before it, so it filters a supply, it does not smooth one", what))
		return
	}
	x.rename("smooth", "named a decoupling filter: no rectifier feeds it, so it filters a supply, it does not smooth one")
}

// capAsDecoupling words a filter named a decoupling filter by what its
// capacitor does there: "c decoupling (C4)", not "c smoothing (C4)" on a
// stage whose next line says it does not smooth (review19 a04).
func (x *figCtx) capAsDecoupling() {
	for i, f := range x.st.Figures {
		if f.Name == "c_smoothing" {
			f.Name = "c_decoupling"
			f.Label = strings.Replace(f.Label, "c smoothing", "c decoupling", 1)
			x.st.Figures[i] = f
		}
	}
}

// isValveDiode tells a rectifier valve from an amplifying one: it has no
// control grid.
func isValveDiode(p *graph.Part) bool {
	for _, pin := range p.Pins {
		if pin.Name == "g" || pin.Name == "g1" {
			return false
		}
	}
	return true
}

// rename gives the stage its plainer name and says why in its notes.
func (x *figCtx) rename(claim, why string) {
	x.st.Title = expandTitle(plainerTitles[claim], x.st.Family)
	x.st.Notes = append(x.st.Notes, why)
}

// pairBandwidth is a coupled pair's −3 dB band as the solver gives it
// in circuit: 1 A into the primary's hot end (as the anode or collector
// feeds it), the secondary's hot end read, every device quiet and all the
// pair's loads in; the band's outer edges, so an over-coupled pair's dip
// between its humps does not cut it short. ok is false where the solver
// cannot say. Its humps are found inside the band (pairpass.go).
func (x *figCtx) pairBandwidth(prim, sec string, f0 float64) (passband, bool) {
	if !x.solve || prim == "" || sec == "" || !(f0 > 0) {
		return passband{}, false
	}
	r, err := ac.NewTransimpedance(quiet(x.solverCircuit()), prim, sec, gangMid.options())
	if err != nil {
		return passband{}, false
	}
	lo, hi := f0/1.5, f0*1.5
	_, top, ok := peakOf(r, lo, hi)
	if !ok {
		return passband{}, false
	}
	level := top / math.Sqrt2
	const n = 200
	first, last := -1, -1
	fs := make([]float64, n)
	for i := range fs {
		fs[i] = lo * math.Pow(hi/lo, float64(i)/(n-1))
		if magnitude(r, fs[i]) >= level {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	if first <= 0 || last < 0 || last >= n-1 {
		return passband{}, false
	}
	f1, ok1 := crossing(r, level, fs[first], fs[first-1])
	f2, ok2 := crossing(r, level, fs[last], fs[last+1])
	if !ok1 || !ok2 {
		return passband{}, false
	}
	humps, dip := humpsIn(r, f1, f2)
	return passband{lo: f1, hi: f2, humps: humps, dipDB: dip}, true
}
