package stages

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// Oscillator frequencies from the loop. An oscillator runs where its loop
// phase is 0°, in circuit, with every load on the network (ac.FindLoop);
// that is the solver's figure. A pattern's formula for an RC oscillator
// (f = 1/(2πRC√6), f = 1/(2π√(R1R2C1C2))) assumes sections unloaded by the
// device on either side and stays beside it as the named cross-check, with
// words for why the two part.

// loopOrigin is the origin of a frequency read from the loop.
var loopOrigin = figure.BySolver("loop gain, 0° of loop phase", "")

// loopFreq is the loop's oscillation frequency as a figure: one value
// when the loop runs at one frequency, the range over the gang otherwise;
// ok is false when no setting has a 0° crossing.
func loopFreq(name, label string, l Loop) (figure.Figure, bool) {
	fMin, fMax, _, _, ok := l.Range()
	if !ok {
		return figure.Figure{}, false
	}
	o := loopOrigin
	f := figure.Figure{Name: name, Label: label, Unit: figure.Hertz, Origin: o}
	if len(l.Settings) > 1 && fMax/fMin-1 > 1e-4 {
		f.Origin.At = "every gang setting"
		f.Range = &value.Range{Min: fMin, Max: fMax}
	} else {
		f.Origin.At = "in circuit"
		f.Value = fMin
	}
	return f, true
}

// withCheck returns f with c (a formula's figure of the same quantity) as
// its cross-check, and why when they part by more than CheckAgreement.
func withCheck(f figure.Figure, c figure.Figure, why string) figure.Figure {
	if !c.Finite() {
		return f
	}
	c.Name, c.Label, c.Check, c.Why = f.Name, "", nil, ""
	f.Check = &c
	if f.CheckDiffers() {
		f.Why = why
	}
	return f
}

// loopFrequencyFigure makes an oscillator stage's headline frequency f the
// loop's, where the loop has a 0° crossing: the loop is where the stage
// runs, with every load on it. A formula-only f becomes its check. On an
// oscillator, a tank's own resonance in circuit (the solver's, but without
// the device's loop) moves to a second figure, "tank alone", beside the
// loop's, so a sheet, the title block and the note lead with the frequency
// the bench counter reads; an oscillator with no f at all (one found by
// its loop) gets the loop's. Other stages' solver figures stay: a mixer's
// f may be its signal tuning, not its oscillator's.
func loopFrequencyFigure(st *Stage, l Loop) {
	old, ok := st.Figures.Get("f")
	switch {
	case ok && old.Unit == figure.Hertz && old.Origin.Source == figure.Formula:
		f, ok := loopFreq("f", old.Label, l)
		if !ok {
			return
		}
		why := fmt.Sprintf("the formula takes the network unloaded; in circuit the loop's phase is 0° at %s, with %s's input and output loading the network", hzText(f.Value), l.Device)
		if f.Range != nil {
			why = fmt.Sprintf("the formula takes the network unloaded; in circuit %s's input and output load it", l.Device)
		}
		st.Figures.Put(withCheck(f, old, why))
	case st.group != "oscillator" || ok && (old.Unit != figure.Hertz || old.Origin.Name == loopOrigin.Name):
	case ok:
		tankAlone(st, old, l)
	default:
		if _, has := st.Figures.Get("osc_f"); has {
			return
		}
		if f, ok := loopFreq("f", "f", l); ok && loopRuns(l) {
			insertFigure(st, 0, f)
		}
	}
}

// tankAlone makes the loop's frequency an oscillator's f, with its tank's
// own resonance in circuit (tank, the solver's) the figure beside it.
func tankAlone(st *Stage, tank figure.Figure, l Loop) {
	f, ok := loopFreq("f", "f", l)
	if !ok || !loopRuns(l) {
		return
	}
	if tank.Check != nil {
		// the tank's formula checks the loop's f as it checks a mixer's
		// oscillator range (mixerFigures), and stays on the tank's own
		f = withCheck(f, *tank.Check, "the tank alone, by its formula, leaves out what the device and its loads put across it: the loop runs where its phase is 0° in circuit")
		ck := *tank.Check
		ck.Name = tankAloneName
		tank.Check = &ck
	}
	tank.Name, tank.Label = tankAloneName, tankAloneLabel
	if _, has := st.Figures.Get("f"); has {
		st.Figures.Put(f)
	} else {
		insertFigure(st, 0, f)
	}
	insertFigure(st, figureIndexOf(st, "f")+1, tank)
}

// loopOscFigures gives an oscillator found by its loop alone the loop's
// frequency, with the resonance of the tank its feedback transformer
// tunes (its sub-stage, nil when none) beside it: without them its frame
// on a sheet carried no frequency at all.
func loopOscFigures(st *Stage, l Loop, tank *Stage) {
	if t, ok := tankTuning(tank); ok && t.Origin.Source == figure.Solver {
		if _, has := st.Figures.Get("f"); !has {
			tankAlone(st, t, l)
			return
		}
	}
	loopFrequencyFigure(st, l)
}

// tankTuning is a tank stage's resonance figure, if it has one.
func tankTuning(tank *Stage) (figure.Figure, bool) {
	if tank == nil {
		return figure.Figure{}, false
	}
	t, ok := tank.Figures.Get("f")
	return t, ok && t.Unit == figure.Hertz
}

// loopRuns tells whether a loop starts somewhere on the dial: only then
// is its 0° frequency where the stage runs (a loop short of 0 dB, or with
// its winding turned over, crosses 0° where nothing oscillates; its flag
// says so, and the tank's own figure stays the stage's f).
func loopRuns(l Loop) bool {
	_, _, _, mMax, ok := l.Range()
	return ok && mMax >= 0
}

// tankAloneName and tankAloneLabel name an oscillator's tank resonance in
// circuit without its loop (the device's gain taken out): the cross-check
// beside the loop's frequency, and what a loop's pull is measured from.
const (
	tankAloneName  = "f_tank"
	tankAloneLabel = "tank alone"
)

// figureIndexOf is the place of the figure of the given name, -1 if none.
func figureIndexOf(st *Stage, name string) int {
	return slices.IndexFunc(st.Figures, func(f figure.Figure) bool { return f.Name == name })
}

// insertFigure puts f at place i of the stage's figures, with its rank
// beside it: the stage's figures are sorted before the loops are solved,
// so a figure the loop adds goes where the one order puts it by hand.
func insertFigure(st *Stage, i int, f figure.Figure) {
	if !f.Finite() || i < 0 || i > len(st.Figures) {
		return
	}
	if len(st.figRanks) == len(st.Figures) {
		r := figRank{tier: 0, index: figureIndex(f.Name, f.Unit)}
		st.figRanks = slices.Insert(slices.Clone(st.figRanks), i, r)
	}
	st.Figures = slices.Insert(slices.Clone(st.Figures), i, f)
}

// mixerFigures gives a mixer found by its loop the oscillator's range from
// the loop (0° of loop phase in circuit, across the gang), the IF its
// output is tuned to (that stage's own in-circuit resonance), and the
// signal range it receives with high-side injection (signal = oscillator −
// IF). The oscillator's formula cross-check is the tank's f = 1/(2π√(LC))
// of the tuned winding the feedback goes through (tank), when a stage
// names it.
func mixerFigures(c *graph.Circuit, st *Stage, l Loop, ifStage, tank *Stage) {
	osc, ok := loopFreq("osc_f", "osc f", l)
	if !ok {
		return
	}
	fif := c.Freqs["if"]
	var oscCheck *figure.Figure
	if tank != nil {
		if t, ok := tank.Figures.Get("f"); ok && t.Check != nil {
			oscCheck = t.Check
			osc = withCheck(osc, *t.Check, "the tank alone, by its formula, leaves out what the device and its loads put across it: the loop runs where its phase is 0° in circuit")
		}
	}
	st.Figures.Put(osc)
	st.Figures.Put(ifFigure(fif))
	// ifStage nil: the mixer's own pattern named its IF transformer (ift_f).
	if ft, ok := ifTuning(ifStage); ok {
		ft.Name, ft.Label = "ift_f", "IF transformer f"
		if ft.Check != nil {
			ck := *ft.Check
			ck.Name = "ift_f"
			ft.Check = &ck
		}
		st.Figures.Put(ft)
	}
	lo, hi := osc.Value, osc.Value
	if osc.Range != nil {
		lo, hi = osc.Range.Min, osc.Range.Max
	}
	if lo <= fif {
		return
	}
	sig := figure.Figure{Name: "sig_f", Label: "sig f", Unit: figure.Hertz, Origin: figure.BySolver("loop gain, 0° of loop phase, less the IF", osc.Origin.At)}
	if osc.Range != nil {
		sig.Range = &value.Range{Min: lo - fif, Max: hi - fif}
	} else {
		sig.Value = lo - fif
	}
	if oscCheck != nil {
		ck := figure.Figure{Unit: figure.Hertz, Origin: figure.ByFormula("fsig = fosc − IF")}
		if r := oscCheck.Range; r != nil {
			ck.Range = &value.Range{Min: r.Min - fif, Max: r.Max - fif}
		} else {
			ck.Value = oscCheck.Value - fif
		}
		sig = withCheck(sig, ck, "it follows the oscillator's own difference from its tank's formula")
	}
	st.Figures.Put(sig)
	// The image is the signal plus twice the IF: the oscillator plus the IF.
	img := figure.Figure{Name: "image_f", Label: "image f", Unit: figure.Hertz, Origin: figure.BySolver("loop gain, 0° of loop phase, plus the IF", osc.Origin.At)}
	if osc.Range != nil {
		img.Range = &value.Range{Min: lo + fif, Max: hi + fif}
	} else {
		img.Value = lo + fif
	}
	if oscCheck != nil {
		ck := figure.Figure{Unit: figure.Hertz, Origin: figure.ByFormula("fimage = fosc + IF")}
		if r := oscCheck.Range; r != nil {
			ck.Range = &value.Range{Min: r.Min + fif, Max: r.Max + fif}
		} else {
			ck.Value = oscCheck.Value + fif
		}
		img = withCheck(img, ck, "it follows the oscillator's own difference from its tank's formula")
	}
	st.Figures.Put(img)
	putTankAlone(st, tank) // last: a frame's two figures stay the ranges
}

// ifTuning is the tuning of an IF stage, if there is one: a single-tuned
// winding's f, or a double-tuned can's primary f1 (the winding on the
// mixer's output, peaked as an aligner peaks it with the secondary's
// coupling out, calcDoubleTuned), which is what the mixer's own pattern
// gives as ift_f.
func ifTuning(ifStage *Stage) (figure.Figure, bool) {
	if ifStage == nil {
		return figure.Figure{}, false
	}
	if f, ok := ifStage.Figures.Get("f"); ok {
		return f, true
	}
	return ifStage.Figures.Get("f1")
}

// ifFigure is the declared IF as a mixer's figure: a loop-found mixer
// carries it whether its loop runs or not, so the alignment finds the
// mixer and its tracking.
func ifFigure(fif float64) figure.Figure {
	return figure.Figure{Name: "if", Label: "IF", Unit: figure.Hertz, Value: fif, Origin: figure.FromNetlist("[freqs] if")}
}

// formulaOff is how far outside an oscillator's loop range a sub-stage's
// formula-only frequency may lie and still be shown: 10 %, beyond any
// trimmer's or core's reach (common practice, no source).
const formulaOff = 0.1

// dropContradicted removes the formula-only frequency of a tuned sub-stage
// of an oscillator when it lies outside the loop's range: a winding with
// its trimmer alone, by f = 1/(2π√(LC)), without the gang section and the
// padder that also tune it, is not where the oscillator runs, and a figure
// the solver's range contradicts must not stand as the winding's
// frequency. A note says what the formula gave and why it is not shown.
func dropContradicted(out []Stage) {
	byName := map[string]int{}
	for i := range out {
		byName[out[i].Name] = i
	}
	for i := range out {
		fMin, fMax, ok := loopSpan(out[i].Loop)
		if !ok {
			continue
		}
		for _, sub := range out[i].Contains {
			j, in := byName[sub]
			if !in {
				continue
			}
			st := &out[j]
			k := slices.IndexFunc(st.Figures, func(f figure.Figure) bool { return f.Name == "f" })
			if k < 0 || st.Figures[k].Origin.Source != figure.Formula || st.Figures[k].Range != nil {
				continue
			}
			f := st.Figures[k].Value
			if f >= fMin*(1-formulaOff) && f <= fMax*(1+formulaOff) {
				continue
			}
			st.Figures = slices.Delete(slices.Clone(st.Figures), k, k+1)
			if k < len(st.figRanks) {
				st.figRanks = slices.Delete(slices.Clone(st.figRanks), k, k+1)
			}
			st.Notes = append(st.Notes, fmt.Sprintf("f by the formula alone, %s, takes these parts without what else tunes them (a gang section, a padder); %s's loop runs at %s, so it is not shown",
				hzText(f), out[i].Name, spanText(fMin, fMax)))
		}
	}
}

// loopSpan is the lowest and highest frequency of a stage's loops that
// have a 0° crossing.
func loopSpan(ls []Loop) (lo, hi float64, ok bool) {
	for _, l := range ls {
		fMin, fMax, _, _, has := l.Range()
		if !has {
			continue
		}
		if !ok {
			lo, hi, ok = fMin, fMax, true
			continue
		}
		lo, hi = min(lo, fMin), max(hi, fMax)
	}
	return lo, hi, ok
}

func spanText(lo, hi float64) string {
	if hi/lo-1 < 1e-4 {
		return hzText(lo)
	}
	return hzText(lo) + "–" + hzText(hi)
}
