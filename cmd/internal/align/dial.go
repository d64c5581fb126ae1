package align

import (
	"fmt"

	"pare/graph"
	"pare/graph/figure"
	"pare/rules/stages"
)

// A set that declares its band has a dial scale that ends there: the
// tracking points are read off that scale, so they must lie on it, and a
// tuned circuit that cannot reach the scale's ends is worth a warning
// before anyone turns a core.

// bandSlack forgives rounding in a declared band (0.1 %).
const bandSlack = 0.001

// dialPoints are the customary low and high tracking points, at 6 % and
// 91.5 % of a range (docs/references.md §2, common practice: near 600 kHz
// and 1.5 MHz on MW), of the declared band clipped to what the signal tank
// covers (sMin to sMax), so both lie on the dial and the tank reaches them;
// with no band declared, of the tank's own range. of names the range.
func dialPoints(c *graph.Circuit, tankName string, sMin, sMax float64) (lo, hi float64, of string) {
	lo, hi = sMin, sMax
	of = fmt.Sprintf("%s's range %s to %s", tankName, hz(sMin), hz(sMax))
	if b := c.Band; b.Min > 0 && b.Max > b.Min {
		lo, hi = max(b.Min, sMin), min(b.Max, sMax)
		of = fmt.Sprintf("the declared band %s to %s", hz(b.Min), hz(b.Max))
		if lo != b.Min || hi != b.Max {
			of += fmt.Sprintf(" where %s reaches, %s to %s", tankName, hz(lo), hz(hi))
		}
		if lo >= hi {
			lo, hi, of = b.Min, b.Max, fmt.Sprintf("the declared band %s to %s", hz(b.Min), hz(b.Max))
		}
	}
	pts := stages.TrackingPoints(lo, hi)
	return pts[0], pts[2], of
}

// onDial reports whether f lies inside the declared band (true when the
// set declares none).
func onDial(c *graph.Circuit, f float64) bool {
	b := c.Band
	if b.Min <= 0 || b.Max <= b.Min {
		return true
	}
	return f >= b.Min*(1-bandSlack) && f <= b.Max*(1+bandSlack)
}

// coverage warns when, as captured, the signal (aerial/RF) circuit or the
// oscillator does not reach the ends of the declared band (the oscillator
// the band plus the IF). The signal range is the dial ends' when the
// procedure has them, else each signal section's tank.
func (g *Guide) coverage(c *graph.Circuit, sts []stages.Stage) {
	b := c.Band
	if b.Min <= 0 || b.Max <= b.Min {
		return
	}
	if len(g.Ends) == 2 {
		oscGang, sigGang := endGangs(c, sts)
		// The dial ends' signal figures are what the set receives (the
		// oscillator less the IF); the signal circuit's trimmer and core
		// move its own tank, so its reach is judged on that tank's range
		// where a stage solved it.
		sLo, sHi := g.Ends[0].Sig, g.Ends[1].Sig
		if sigGang != nil {
			if name, lo, hi := tankRange(sts, sigGang.Ref); name != "" {
				sLo, sHi = lo, hi
			}
		}
		g.missWarn(c, sigGang, "the signal circuit", sLo, sHi, b.Min, b.Max, "")
		if g.IF > 0 && g.Ends[0].Osc > 0 {
			g.missWarn(c, oscGang, "the oscillator", g.Ends[0].Osc, g.Ends[1].Osc, b.Min+g.IF, b.Max+g.IF, fmt.Sprintf(" (the band plus the IF %s)", hz(g.IF)))
		}
		return
	}
	dist := passiveDistances(c)
	for _, gp := range gangSections(c) {
		if _, signal := dist[hotNet(c, gp)]; !signal {
			continue
		}
		name, lo, hi := tankRange(sts, gp.Ref)
		if name == "" {
			// Say so rather than stay silent: no named tank means no
			// in-circuit range, so the coverage was not checked.
			g.Warnings = append(g.Warnings, fmt.Sprintf("pare could not check whether %s on %s covers the declared band %s to %s: no recognised stage names its tank as captured; check the dial ends with a generator", tankKind(c, sts, gp), gp.Ref, hz(b.Min), hz(b.Max)))
			continue
		}
		// named by the stage it serves: a VFO's tank is its oscillator's,
		// not an aerial circuit (review20 b01)
		g.missWarn(c, gp, fmt.Sprintf("%s %s (%s)", tankKind(c, sts, gp), name, gp.Ref), lo, hi, b.Min, b.Max, "")
	}
}

// missWarn adds the warning when lo..hi misses want lo..hi. With gang
// (the tank's section; nil when not known) the tank is first solved with
// its trimmer and core where alignment can turn them (reach.go): a
// shortfall they make up is an alignment step, not a fault.
func (g *Guide) missWarn(c *graph.Circuit, gang *graph.Part, what string, lo, hi, wLo, wHi float64, note string) {
	var miss []string
	if lo > wLo*(1+bandSlack) {
		miss = append(miss, fmt.Sprintf("the low end %s (%s %%)", hz(wLo), figure.Plain(100*(lo/wLo-1))))
	}
	if hi < wHi*(1-bandSlack) {
		miss = append(miss, fmt.Sprintf("the high end %s (%s %%)", hz(wHi), figure.Plain(100*(1-hi/wHi))))
	}
	if len(miss) == 0 {
		return
	}
	head := fmt.Sprintf("as captured %s tunes %s to %s and falls short of %s of the declared band%s", what, hz(lo), hz(hi), joinAnd(miss), note)
	if gang != nil {
		if r, ok := g.reaches.of(c, gang, lo, hi, wLo, wHi); ok {
			if r.reaches {
				g.Warnings = append(g.Warnings, head+": "+r.words()+", so alignment brings the dial's ends in (trimmer at the top, core at the bottom)")
				return
			}
			g.Warnings = append(g.Warnings, head+": "+r.limitWords()+"; check the coil, the gang and the trimmer, or the band in the netlist")
			return
		}
	}
	g.Warnings = append(g.Warnings, head+": alignment cannot reach that end of the dial; check the coil, the gang and the trimmer, or the band in the netlist")
}

// endGangs are the gang sections of the dial ends' oscillator and signal
// tank (nil where not found).
func endGangs(c *graph.Circuit, sts []stages.Stage) (osc, sig *graph.Part) {
	for _, gp := range gangSections(c) {
		if oscSections(c, sts)[gp] {
			osc = gp
			break
		}
	}
	if osc != nil {
		sig = sigTank(c, osc).gang
	}
	return osc, sig
}

func joinAnd(s []string) string {
	if len(s) == 2 {
		return s[0] + " and " + s[1]
	}
	return s[0]
}

// keepOnDial moves tracking points that lie off the declared band to the
// customary points on it (a repairer reads them off the dial scale), and
// says where pare's own points were.
func (g *Guide) keepOnDial(c *graph.Circuit, lo, hi float64, from string) (float64, float64, string) {
	if onDial(c, lo) && onDial(c, hi) || len(g.Ends) != 2 {
		return lo, hi, from
	}
	nLo, nHi, of := dialPoints(c, "the signal circuit", g.Ends[0].Sig, g.Ends[1].Sig)
	g.Warnings = append(g.Warnings, fmt.Sprintf("pare's tracking points %s and %s (%s) do not both lie on the declared band: the procedure uses the customary points %s and %s instead", hz(lo), hz(hi), from, hz(nLo), hz(nHi)))
	return nLo, nHi, fmt.Sprintf("the customary tracking points at 6 %% and 91.5 %% of %s (common practice, docs/references.md §2)", of)
}
