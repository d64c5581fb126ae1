package align

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules/stages"
)

// solveRow solves row i: its frequency, the gang (turned for the peak on an
// RF row, as the repairer tunes the set to the generator; where the gang
// does not tune the row's path, set where the tank that reads the dial
// resonates at it: dialgang.go), the level that
// gives the reference, and the gain to the next point of its band.
func solveRow(c *graph.Circuit, sts []stages.Stage, pts []point, rows []Injection, i int, g *Guide) (Injection, error) {
	p := pts[i]
	in := Injection{Net: p.net, Where: p.where, Band: p.band, Gang: 0.5}
	in.RefNet, in.RefLevel, in.RefWhat = reference(c, sts, pts, rows, i, g.det)
	if in.RefNet == "" {
		return in, fmt.Errorf("no output declared to refer the level to")
	}
	in.Freq = rowFreq(c, p.band, g)
	if p.unmodelled != "" {
		return in, fmt.Errorf("%s", p.unmodelled)
	}
	if in.RefLevel == 0 {
		return in, fmt.Errorf("not computed: its level is referred to the row at %s, which pare could not compute", in.RefNet)
	}
	sc, broken := c, []string(nil)
	if p.band == "RF" {
		sc, broken = loopsBroken(c, sts)
		in.Broken = broken
		if in.Gang, in.Tuned = peakGang(sc, p.net, tuneNet(sc, sts, p.net, in.RefNet), in.Freq); !in.Tuned {
			in.Gang = 0.5
			g.dialGang(sc, sts, &in)
		}
	}
	h, err := g.response(sc, in.Net, in.RefNet, in.Freq, in.Gang)
	if err != nil {
		return in, err
	}
	if h == 0 || math.IsNaN(h) || math.IsInf(h, 0) {
		return in, fmt.Errorf("not computed: nothing reaches %s from here in the small-signal circuit", in.RefNet)
	}
	in.Level = in.RefLevel / h
	in.GainTo = gainTarget(pts, i, in.RefNet)
	if in.Gain, err = g.response(sc, in.Net, in.GainTo, in.Freq, in.Gang); err != nil {
		return in, err
	}
	if len(broken) > 0 {
		closed, err := g.response(c, in.Net, in.GainTo, in.Freq, in.Gang)
		if err != nil {
			return in, err
		}
		if math.Abs(closed/in.Gain-1) > loopShift {
			in.GainNote = loopNote(broken, closed)
		}
	}
	if note := halvesNote(sc, pts, i, in); note != "" {
		in.GainNote = joinNote(in.GainNote, note)
	}
	switch {
	case p.mixer && conversionGm(c, p.net):
		in.GainNote = "at the IF, with the valve's gm taken as its conversion conductance (docs/devices.md): the RF rows take this gain for its conversion gain (an estimate)"
	case p.mixer:
		in.GainNote = "at the IF, as an IF amplifier; its conversion gain (RF in, IF out) is no small-signal quantity: the RF rows take it as a quarter of this gain (an estimate)"
	}
	if in.Why = implausible(in); in.Why != "" && in.Level > maxGenVolts && in.Gain < 1 {
		if why := feedbackCancels(sc, sts, in); why != "" {
			in.Why = why
		}
	}
	if in.Why == "" {
		in.BelowFloor = in.Level < genFloor
		in.Caveat = caveats(sc, in, g.AGC)
		if len(broken) > 0 && !in.BelowFloor && in.GainNote == "" {
			in.GainNote = levelLoopNote(broken)
		}
	}
	return in, nil
}

// Bounds of a believable row (common practice, no source): a signal
// generator gives a few volts at most, and no single stage of a receiver
// gains 100 dB.
const (
	maxGenVolts = 10.0
	maxGain     = 1e5
)

// implausible says why a row's numbers cannot be met on the bench. A
// level past what a generator gives is either the reference asking more
// than this point can be driven to give (the stage gains, by the solver:
// the row then says what a generator's volt here does give) or, where the
// solver shows next to nothing passing on, a capture whose bias or wiring
// is at fault.
func implausible(in Injection) string {
	switch {
	case in.Gain == 0 || math.IsNaN(in.Gain) || math.IsInf(in.Gain, 0):
		return fmt.Sprintf("no figure: nothing reaches %s from here in the small-signal circuit", in.GainTo)
	case in.Gain > maxGain:
		return fmt.Sprintf("no figure: the gain to %s would be ×%.3g, not finite on a real set: a tuned circuit in the capture has no loss (give its coil a q)", in.GainTo, in.Gain)
	case in.Level > maxGenVolts && in.Gain >= 1:
		return fmt.Sprintf("no figure: the reference (%s) would take %s here, more than a generator gives, though the stage gains ×%.3g to %s (AC solver): it asks more than the stages after this point deliver from a generator; 1 V here gives %s at %s",
			in.RefWhat, volts(in.Level), in.Gain, in.GainTo, volts(in.RefLevel/in.Level), in.RefNet)
	case in.Level > maxGenVolts:
		to := ""
		if in.GainTo != in.RefNet {
			to = fmt.Sprintf(" and ×%.3g to %s", in.Gain, in.GainTo)
		}
		return fmt.Sprintf("no figure: the reference (%s) would take %s here, more than a generator gives: the solver passes only ×%.3g from here to %s%s, next to nothing as captured (see pare dc for the bias)",
			in.RefWhat, volts(in.Level), in.RefLevel/in.Level, in.RefNet, to)
	}
	return ""
}

// Response is |V(out)/V(in)| with in driven by an ideal source at f hertz,
// the gang at frac of its travel: the AC solver on the whole circuit.
func Response(c *graph.Circuit, in, out string, f, frac float64) (float64, error) {
	r, err := ac.NewTransfer(c, in, out, ac.Options{VarFrac: frac, VarSet: true})
	if err != nil {
		return 0, err
	}
	v, err := r.At(f)
	return cmplx.Abs(v), err
}

// response is Response, from the guide's shared responses where c is the
// circuit they are of (the same digits: ac.Responses), else afresh (a
// circuit with its oscillators' loops broken).
func (g *Guide) response(c *graph.Circuit, in, out string, f, frac float64) (float64, error) {
	if g.solved == nil || c != g.of {
		return Response(c, in, out, f, frac)
	}
	r, err := g.solved.Transfer(in, out, ac.Options{VarFrac: frac, VarSet: true})
	if err != nil {
		return 0, err
	}
	v, err := r.At(f)
	return cmplx.Abs(v), err
}

// gainTarget is the next point toward the output in the same band (an RF
// row's band ends at the mixer), else the reference net; the other half of
// a parallel pair (point.halves) is no next point.
func gainTarget(pts []point, i int, ref string) string {
	for j := i + 1; j < len(pts); j++ {
		if pts[i].halves != "" && pts[j].halves == pts[i].halves {
			continue
		}
		if pts[j].band == pts[i].band || (pts[i].band == "RF" && pts[j].mixer) {
			return pts[j].net
		}
	}
	return ref
}

// rowFreq is the generator frequency of a band: the audio tone, the set's
// IF, or for RF the high tracking point (the first oscillator step's dial);
// a superhet without tracking steps the customary high tracking point of
// its band (docs/references.md §2), anything else the band's geometric
// centre.
func rowFreq(c *graph.Circuit, band string, g *Guide) float64 {
	switch band {
	case "audio":
		return audioHz
	case "IF":
		return g.IF
	}
	for _, s := range g.Steps {
		if s.Dial > 0 {
			return s.Dial
		}
	}
	b := c.Band
	if b.Min <= 0 {
		b = c.FullBand()
	}
	if g.IF > 0 && b.Min > 0 {
		return stages.TrackingPoints(b.Min, b.Max)[2]
	}
	return math.Sqrt(b.Min * b.Max)
}

// peakGang turns the gang for the largest response at f: a scan of the
// travel, then a golden-section search around the best point. tuned is
// false when the gang does not tune the path at f (the response varies by
// less than tunedRatio over the travel: a path that no ganged tank is on,
// as from an oscillator's buffer onwards); the setting then says nothing
// about the dial (review20 b01 read "gang 2 % of the way" at 2.828 MHz,
// where the VFO's own tank stands at about 55 %).
func peakGang(c *graph.Circuit, in, out string, f float64) (th float64, tuned bool) {
	mag := func(th float64) float64 {
		v, err := Response(c, in, out, f, th)
		if err != nil {
			return 0
		}
		return v
	}
	const scan = 40
	best, bestV, leastV := 0.0, -1.0, math.Inf(1)
	for k := 0; k <= scan; k++ {
		th := float64(k) / scan
		v := mag(th)
		if v > bestV {
			best, bestV = th, v
		}
		leastV = math.Min(leastV, v)
	}
	if !(bestV > tunedRatio*leastV) {
		return best, false
	}
	lo, hi := math.Max(0, best-1.0/scan), math.Min(1, best+1.0/scan)
	const phi = 0.6180339887498949
	a, b := hi-phi*(hi-lo), lo+phi*(hi-lo)
	fa, fb := mag(a), mag(b)
	for range 40 {
		if fa > fb {
			hi, b, fb = b, a, fa
			a = hi - phi*(hi-lo)
			fa = mag(a)
		} else {
			lo, a, fa = a, b, fb
			b = lo + phi*(hi-lo)
			fb = mag(b)
		}
	}
	return (lo + hi) / 2, true
}

// tunedRatio is how much a tuned path's response must rise from its least
// to its peak over the gang's travel to call the gang the thing that tunes
// it: 3 dB, a tank's own −3 dB width (common practice).
const tunedRatio = math.Sqrt2

func db(v float64) float64 { return 20 * math.Log10(v) }

// joinNote puts b after a, "; " between them where both are set.
func joinNote(a, b string) string {
	if a == "" {
		return b
	}
	return a + "; " + b
}
