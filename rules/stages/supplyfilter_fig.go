package stages

import (
	"fmt"
	"math"
	"sort"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The textbook figures of a supply filter section (handbook formulas, from
// memory; docs/references.md §4, §24): the corner of an RC section, the
// resonance of a choke section, and one section's attenuation.
var (
	byChoke       = figure.ByFormula("f0 = 1/(2π√(LC2))")
	bySmoothRC    = figure.ByFormula("fc = 1/(2πRC2)")
	byAttenRC     = figure.ByFormula("A = √(R² + X_C²)/X_C")
	byRippleRule  = figure.ByFormula("f ripple = 2 × mains (full-wave), 1 × (half-wave)")
	byFeedBandLow = figure.ByFormula("the lowest frequency of the fed stage's band")
	byReactanceC  = figure.ByFormula("X_C = 1/(2πfC)")
)

// calcSmoothing: a supply filter section (supplyfilter.go), its series part
// a resistor or a choke, its shunt capacitor of any kind, the capacitor
// before it (the reservoir, or the section before's) there or not. A match
// the wrong way round, or whose ends do not run from a supply into a
// stage's feed, is none (the pattern's guard drops it). Its class
// (supplyclass.go) says which figures it has: in circuit, the −3 dB corner
// of V(out)/V(in) and the attenuation at the ripple frequency for the main
// filter and a decoupler, and at the fed stage's lowest frequency for a
// decoupler, each with the section's textbook figure beside it; a screen
// feed's DC drop and bypass.
func calcSmoothing(x *figCtx) {
	s := x.part("series")
	if s == nil || s.Kind != graph.Resistor && s.Kind != graph.Inductor {
		return
	}
	in, out, dev, swapped, ok := x.supplyFilterNets(s)
	if !ok {
		return
	}
	c1p, c2p := x.parts("c1"), x.parts("c2")
	if swapped {
		c1p, c2p = c2p, c1p
		x.claimInstead(x.parts("c2"), x.parts("c1"))
	}
	c1, c2 := sumCap(c1p, 1), sumCap(c2p, 1)
	if c2 <= 0 {
		return
	}
	class, fed := x.filterClassOf(in, out, x.partIndex(s))
	x.capRoles(class, in, c1p, c2p)
	if class == mainSmoothing && c1 > 0 && x.rectifierOn(in) {
		// the reservoir is the main filter's own: no other section ends
		// on the rectifier, so the stage holds it
		x.claimInstead(nil, c1p)
	}
	guess := 1 / (2 * math.Pi * s.Value.Max * c2)
	check := figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: guess, Origin: bySmoothRC}
	if s.Kind == graph.Inductor {
		// the corner of the section as loaded, its winding's copper
		// with it: an undamped section's resonance is no corner (a field
		// coil's falls 3 dB well below it)
		check = figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: x.chokeSectionOf(s, c2, in, out).corner(), Origin: byChokeCorner}
	}
	if class == screenFeed {
		// named for its job, not the pattern that found it
		x.st.Topology, x.st.Title = ScreenFeedTopology, screenFeedTitle
	}
	if class == stabiliserFeed {
		x.stabiliserFeed(s, c2, in, out, check)
		return
	}
	if !x.solve {
		x.put(check)
		return
	}
	switch class {
	case screenFeed:
		held := "AC ground"
		if x.bypassReturn(c2p, out) != "" {
			held = "its cathode's AC potential"
		}
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("feeds %s's screen: %s drops the HT to it, %s holds it at %s", dev.Ref, s.Ref, refList(c2p), held))
		x.filterCorner(s, c2, in, out, check)
		x.screenFeedFigures(s, c2p, in, out, dev)
	case mainSmoothing:
		x.checkSmoothing(x.netName(in), x.netName(out))
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("feeds the supply line of %s (%s), so its figure is the ripple's, not one stage's frequency", stagesCount(len(fed)), refList(fed)))
		x.filterInCircuit(s, c2, in, out, nil, check)
		x.chokeFigures(s, c2, in, out)
	default:
		x.checkSmoothing(x.netName(in), x.netName(out))
		if dev == nil {
			port := x.supplyOutlet(out, x.partIndex(s))
			x.st.Notes = append(x.st.Notes, fmt.Sprintf("feeds the supply line that leaves the circuit by %s (%s), no signal path", port.Ref, port.Label))
		} else {
			x.st.Notes = append(x.st.Notes, fmt.Sprintf("feeds %s", dev.Ref))
		}
		x.filterInCircuit(s, c2, in, out, dev, check)
		x.chokeFigures(s, c2, in, out)
	}
}

// screenFeedTitle names a screen feed: the trade's screen feed resistor
// (or dropper) and screen bypass capacitor.
const screenFeedTitle = "Screen feed: dropper resistor and bypass capacitor"

// ScreenFeedTopology is a screen feed's topology: the supply filter
// patterns find it, its wiring says what it is. A sheet draws it at the
// valve whose screen it feeds, not apart with the supply (render.Frame.Apart).
const ScreenFeedTopology = "screen-feed"

// filterInCircuit writes the solver's figures of a supply filter section on
// the circuit as it is, its rail driven; dev is the one stage a decoupler
// feeds (nil for the main filter: no attenuation at one stage's frequency).
func (x *figCtx) filterInCircuit(s *graph.Part, c2 float64, inID, outID int, dev *graph.Part, check figure.Figure) {
	r, transfer, ok := x.filterCorner(s, c2, inID, outID, check)
	if !ok {
		return
	}
	if f, said, ok := x.rippleSource(); ok {
		x.set("f_ripple", figure.Hertz, f, byRippleRule)
		x.attenFigure("atten_ripple", s, c2, f, inID, outID, r, transfer)
		x.st.Notes = append(x.st.Notes, "ripple from the "+said)
		if dev == nil {
			x.humOut(inID, outID, r, f)
		}
	} else {
		x.st.Notes = append(x.st.Notes, "no rectifier with a reservoir in the set: no ripple figure")
	}
	if dev == nil {
		return
	}
	if band := x.w.c.BandOf(dev); band.Min > 0 {
		x.set("f_feed", figure.Hertz, band.Min, byFeedBandLow)
		x.attenFigure("atten_feed", s, c2, band.Min, inID, outID, r, transfer)
	}
}

// filterCorner writes the section's −3 dB corner in circuit, its rail
// driven, with the formula's beside it, and returns the response; ok false
// (the formula's corner written) where the solver cannot drive the rail.
func (x *figCtx) filterCorner(s *graph.Part, c2 float64, inID, outID int, check figure.Figure) (*ac.Response, string, bool) {
	in, out := x.netName(inID), x.netName(outID)
	r, err := x.filterResponse(inID, outID)
	if err != nil {
		x.put(check)
		x.st.Notes = append(x.st.Notes, "the solver could not drive "+in+": the corner is the formula's ("+err.Error()+")")
		return nil, "", false
	}
	transfer := "V(" + out + ")/V(" + in + "), " + in + " driven"
	guess := check.Value
	if s.Kind == graph.Inductor {
		// searched about the section's resonance, where its response
		// turns, whatever the model's corner (the DC level is read a
		// hundredth of it down)
		guess = resonance(s.Inductance(), c2)
	}
	if f, ok := filterCorner(r, guess); ok {
		sv := &figure.Figure{Name: "f_c", Unit: figure.Hertz, Value: f, Origin: figure.BySolver("−3 dB of "+transfer, "")}
		x.putChecked(sv, &check, func() string {
			if s.Kind == graph.Inductor {
				return fmt.Sprintf("the formula takes %s's winding and the capacitor alone with the load as V/I; in circuit what the node feeds loads it as the solver gives it", s.Ref)
			}
			if st := x.stabiliserOn(outID); st != nil {
				return fmt.Sprintf("the formula takes %s and the capacitor alone; in circuit %s's slope resistance across the line sets it", s.Ref, st.Ref)
			}
			return fmt.Sprintf("the formula takes %s and the capacitor alone; in circuit what the node feeds loads it", s.Ref)
		})
	} else {
		x.put(check)
	}
	return r, transfer, true
}

// attenFigure writes the solver's attenuation at f with the section's
// textbook one beside it.
func (x *figCtx) attenFigure(name string, s *graph.Part, c2, f float64, inID, outID int, r *ac.Response, transfer string) {
	db, ok := attenuation(r, f)
	if !ok {
		return
	}
	var check *figure.Figure
	if s.Kind == graph.Inductor {
		k := x.chokeSectionOf(s, c2, inID, outID)
		check = &figure.Figure{Name: name, Unit: figure.Decibel, Value: k.atten(f), Origin: byChokeAtten}
	} else if v, ok := seriesAtten(s, c2, f); ok {
		check = &figure.Figure{Name: name, Unit: figure.Decibel, Value: v, Origin: byAttenRC}
	}
	sv := &figure.Figure{Name: name, Unit: figure.Decibel, Value: db, Origin: figure.BySolver(transfer, hz(f))}
	x.putChecked(sv, check, func() string {
		return fmt.Sprintf("the formula takes %s and the capacitor alone, one section into nothing; in circuit the sections before and what the node feeds change it", s.Ref)
	})
}

// claimInstead makes the stage hold the parts of take instead of those of
// drop: the match bound the pattern's shared capacitor (the one before
// the section) to the section's own, so the stage would claim the
// reservoir and leave its smoothing capacitor to no one.
func (x *figCtx) claimInstead(drop, take []*graph.Part) {
	gone := map[string]bool{}
	for _, p := range drop {
		gone[p.Ref] = true
	}
	parts := x.st.Parts[:0]
	for _, r := range x.st.Parts {
		if !gone[r] {
			parts = append(parts, r)
		}
	}
	for _, p := range take {
		parts = append(parts, p.Ref)
	}
	sort.Strings(parts)
	x.st.Parts = parts
}

// stagesCount reads "1 stage", "2 stages": a note is a sentence.
func stagesCount(n int) string {
	if n == 1 {
		return "1 stage"
	}
	return fmt.Sprintf("%d stages", n)
}
