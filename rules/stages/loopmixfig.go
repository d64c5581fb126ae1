package stages

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph/figure"
	"pare/graph/value"
)

// A self-oscillating mixer a pattern names (one device that oscillates and
// mixes: a feedback winding in its collector, a link into its emitter)
// runs, like a separate oscillator, where its loop's phase is 0° with the
// gain above 0 dB, in circuit, at each gang setting: the frequency a
// counter on the oscillator coil reads. The pattern's calc solved the
// oscillator tank's own resonance in circuit with the device quiet; that
// stays beside the loop's as "tank alone", the cross-check, as on an
// oscillator (tankAlone), and the tank's formula stays the check of both.

// mixerTankAlone names a self-oscillating mixer's oscillator tank
// resonance in circuit without its loop.
const (
	mixerTankAlone      = "osc_f_tank"
	mixerTankAloneLabel = "osc tank alone"
)

// mixerLoopFigures makes the loop's frequency a pattern-found mixer's
// osc_f where its loop starts, with the tank's own resonance beside it,
// and moves the signal and image ranges (oscillator ∓ IF) onto the loop's
// frequency. A loop that never reaches 0 dB leaves the tank's figures:
// its 0° crossing is where nothing runs (loopRuns), and its flag says so.
func mixerLoopFigures(st *Stage, l Loop, band value.Range) {
	tank, ok := st.Figures.Get("osc_f")
	if !ok || tank.Unit != figure.Hertz || tank.Origin.Name == loopOrigin.Name || !loopRuns(l) {
		return
	}
	osc, ok := loopFreq("osc_f", tank.Label, l)
	if !ok {
		return
	}
	if osc.Range == nil && tank.Range != nil {
		// the mixer's ranges stay ranges, one point wide without a gang
		osc.Range, osc.Value = &value.Range{Min: osc.Value, Max: osc.Value}, 0
	}
	if tank.Check != nil {
		osc = withCheck(osc, *tank.Check, "the tank alone, by its formula, leaves out what the device and its loads put across it: the loop runs where its phase is 0° in circuit")
		ck := *tank.Check
		ck.Name = mixerTankAlone
		tank.Check = &ck
	}
	tank.Name, tank.Label = mixerTankAlone, mixerTankAloneLabel
	st.Figures.Put(osc)
	// after the signal range, so a frame's two figures stay the ranges a
	// repairer checks first (osc f, sig f)
	at := max(figureIndexOf(st, "osc_f"), figureIndexOf(st, "sig_f")) + 1
	insertFigure(st, at, tank)
	fif, ok := st.Figures.Get("if")
	if !ok || !(fif.Value > 0) {
		return
	}
	moveByIF(st, "sig_f", osc, -fif.Value, "loop gain, 0° of loop phase, less the IF")
	moveByIF(st, "image_f", osc, fif.Value, "loop gain, 0° of loop phase, plus the IF")
	// the band the set covers is the loop's range less the IF
	st.Flags = slices.DeleteFunc(st.Flags, func(f string) bool { return strings.HasPrefix(f, coveragePrefix) })
	lo, hi := osc.Value, osc.Value
	if osc.Range != nil {
		lo, hi = osc.Range.Min, osc.Range.Max
	}
	if f := coverageFlag(band, lo, hi, fif.Value); f != "" {
		st.Flags = append(st.Flags, f)
	}
}

// moveByIF sets the named range (sig_f, image_f) to the loop's oscillator
// range shifted by d, keeping its formula check, and its why when the two
// now part.
func moveByIF(st *Stage, name string, osc figure.Figure, d float64, how string) {
	f, ok := st.Figures.Get(name)
	if !ok {
		return
	}
	lo, hi := osc.Value, osc.Value
	if osc.Range != nil {
		lo, hi = osc.Range.Min, osc.Range.Max
	}
	if lo+d <= 0 {
		return
	}
	f.Origin = figure.BySolver(how, osc.Origin.At)
	if f.Range != nil {
		f.Range = &value.Range{Min: lo + d, Max: hi + d}
	} else {
		f.Value = lo + d
	}
	f.Why = ""
	if f.CheckDiffers() {
		f.Why = fmt.Sprintf("from the oscillator's range in circuit, %s", osc.Why)
		if osc.Why == "" {
			f.Why = "it follows the oscillator's loop, which the tank's formula leaves out"
		}
	}
	st.Figures.Put(f)
}

// putTankAlone gives a loop-found mixer the in-circuit resonance of the
// tank its feedback goes through (a stage that names it, nil when none)
// as its oscillator's tank alone, beside the loop's osc f.
func putTankAlone(st *Stage, tank *Stage) {
	t, ok := tankTuning(tank)
	if !ok || t.Origin.Source != figure.Solver {
		return
	}
	t.Name, t.Label = mixerTankAlone, mixerTankAloneLabel
	if t.Check != nil {
		ck := *t.Check
		ck.Name = mixerTankAlone
		t.Check = &ck
	}
	st.Figures.Put(t)
}

// coverageFlag says when the oscillator's range omin–omax, less the IF,
// misses the declared band: 1 % short of a band edge is within what the
// trimmers set. "" when it covers it, or no band is declared.
func coverageFlag(b value.Range, omin, omax, ifHz float64) string {
	smin, smax := omin-ifHz, omax-ifHz
	if b.Max <= 0 || smin <= b.Min*1.01 && smax >= b.Max*0.99 {
		return ""
	}
	return fmt.Sprintf("%s%s–%s: with the IF %s the set tunes %s–%s, not the whole band %s–%s", coveragePrefix,
		hz(omin), hz(omax), hz(ifHz), hz(smin), hz(smax), hz(b.Min), hz(b.Max))
}

// coveragePrefix opens the coverage flag, so the loop's range can put its
// own in place of the tank's (mixerLoopFigures).
const coveragePrefix = "oscillator covers "
