package align

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/rules/stages"
)

// A trimmer sets the high end of the dial and a core or padder the low end
// (common practice): the trade aligns them near the band's ends, about
// 600 kHz and 1400 kHz on MW. A set that mistracks may still cross exact
// tracking at two points bunched together in one half of the dial; those
// crossings are accidents of its faults, and aligning there leaves the
// ends as wrong as before. So the set's own crossings are used only when
// it tracks and they straddle the dial, one in each outer third.

// outerShare is how far in from each end of the dial a crossing may lie
// and still count as near that end: a third of the dial (pare's choice;
// the customary points lie at 6 % and 91.5 %, docs/references.md §2).
const outerShare = 1.0 / 3

// trackPoints are the low and high tracking frequencies: where the set as
// captured tracks exactly (track_fit) when it tracks and those points lie
// near the dial's ends, else the outer points of pare's suggested
// three-point design (track_f), else the customary points of the band,
// with a warning saying why the set's own crossings were not used.
func (g *Guide) trackPoints(c *graph.Circuit, mix *stages.Stage) (lo, hi float64, from, why string) {
	fit, _ := mix.Figures.Get("track_fit")
	n := len(fit.Points)
	if n >= 2 {
		lo, hi = fit.Points[0], fit.Points[n-1]
		bad := g.crossingsFault(c, mix, lo, hi)
		if bad == "" {
			return lo, hi, fmt.Sprintf("%s: %s %s", mix.Name, fit.Label, hzList(fit.Points)), ""
		}
		g.Warnings = append(g.Warnings, fmt.Sprintf("as captured the set tracks exactly at %s, but %s: a trimmer sets the high end of the dial and a core or padder the low end, so the procedure aligns near the ends instead (common practice)", hzList(fit.Points), bad))
	} else {
		as := "nowhere on the dial"
		if n == 1 {
			as = "at " + hz(fit.Points[0]) + " only"
		}
		g.Warnings = append(g.Warnings, fmt.Sprintf("as captured the set tracks exactly %s: the procedure aligns at the customary points of pare's suggested three-point design instead", as))
	}
	sug, okS := mix.Figures.Get("track_f")
	if okS && len(sug.Points) >= 2 {
		return sug.Points[0], sug.Points[len(sug.Points)-1], fmt.Sprintf("%s: %s, %s %s", mix.Name, sug.Group, sug.Label, hzList(sug.Points)), ""
	}
	if len(g.Ends) != 2 {
		return 0, 0, "", mix.Name + ": pare found no tracking points for this oscillator: the gang's sections could not be paired"
	}
	lo, hi, of := dialPoints(c, "the signal circuit", g.Ends[0].Sig, g.Ends[1].Sig)
	return lo, hi, fmt.Sprintf("the customary tracking points at 6 %% and 91.5 %% of %s (common practice, docs/references.md §2)", of), ""
}

// crossingsFault says why the crossings lo and hi are no alignment points:
// the set mistracks, or they do not lie one in each outer third of the
// dial (the declared band where the signal circuit reaches it, else the
// signal circuit's range). "" when they serve.
func (g *Guide) crossingsFault(c *graph.Circuit, mix *stages.Stage, lo, hi float64) string {
	if e, ok := mix.Figures.Get("track_err_max"); ok && g.IF > 0 && math.Abs(e.Value) > trackLimit*g.IF {
		return fmt.Sprintf("it mistracks (error %s, above 2 %% of the IF), so they are where its faults happen to cross", hz(e.Value))
	}
	if len(g.Ends) != 2 {
		return ""
	}
	dLo, dHi := g.Ends[0].Sig, g.Ends[1].Sig
	if b := c.Band; b.Min > 0 && b.Max > b.Min && max(b.Min, dLo) < min(b.Max, dHi) {
		dLo, dHi = max(b.Min, dLo), min(b.Max, dHi)
	}
	span := dHi - dLo
	if span <= 0 || (lo <= dLo+outerShare*span && hi >= dHi-outerShare*span) {
		return ""
	}
	return fmt.Sprintf("they do not lie one near each end of the dial %s to %s", hz(dLo), hz(dHi))
}

// reachWarn says when the signal circuit as captured cannot reach a
// tracking point (lo below its low end or hi above its high end): the
// step there cannot be done until the tuned circuit is put right.
func (g *Guide) reachWarn(lo, hi float64) {
	if len(g.Ends) != 2 {
		return
	}
	sLo, sHi := g.Ends[0].Sig, g.Ends[1].Sig
	var miss []string
	if lo < sLo*(1-bandSlack) {
		miss = append(miss, "the low point "+hz(lo))
	}
	if hi > sHi*(1+bandSlack) {
		miss = append(miss, "the high point "+hz(hi))
	}
	if len(miss) > 0 {
		g.Warnings = append(g.Warnings, fmt.Sprintf("as captured the set tunes %s to %s and cannot reach %s: bring the coil, gang and trimmer into range before aligning there", hz(sLo), hz(sHi), joinAnd(miss)))
	}
}
