package pipeline

import (
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/value"
	"pare/rules"
	"pare/rules/stages"
)

// ReducedNetlist is the reduced circuit as a netlist file, marked at its top
// as a reduction so nobody mistakes it for the set's wiring. It is loaded
// back, and compared, before it is handed out: a reduced netlist that does
// not load as the same circuit is a bug in pare, not in the input, and the
// user gets a message, not a broken file.
func (r *Result) ReducedNetlist() ([]byte, error) {
	// Marshal proves the text loads back as the reduced circuit; if not,
	// that is pare's bug (graph.ErrWriter), not the input's.
	d := annotated(r.Reduced, r.Level)
	readerValues(d)
	readerBands(d)
	sayBiased(d, r.Biased)
	saySwitches(d, r.Circuit, r.opts.Switches)
	sayCaution(d, r.Caution)
	_, split := r.withDividersApart(r.withSupplyReturns(r.Reduced), stageFrames(r.Stages, r.Reduced, nil))
	r.sayDrawnApart(d, split)
	return graph.Marshal(d)
}

// reducedMark opens the line that marks a netlist as pare's reduction.
const reducedMark = " Reduced by pare (level "

// annotated marks the reduced netlist as such above its first key.
func annotated(c *graph.Circuit, lvl rules.Level) *graph.Circuit {
	d := c.Clone()
	if d.Comments == nil {
		d.Comments = map[string]graph.Comment{}
	}
	first := "title"
	if d.Title == "" {
		first = "parts"
		if d.Note != "" {
			first = "note"
		} else if d.Band.Max > 0 {
			first = "band"
		}
	}
	cm := d.Comments[first]
	marker := reducedMark + lvl.String() + "): small-signal equivalent only, not a wiring diagram."
	var above []string
	for _, a := range cm.Above {
		if !isHeader(a) {
			above = append(above, a)
		}
	}
	cm.Above = append([]string{marker}, above...)
	d.Comments[first] = cm
	keepDetectorRd(d)
	return d
}

// readerDigits is how many significant figures a merged part's value is
// written with: what a reader can buy or measure (an E192 value carries
// three, a 0.1 % bridge four), as the IEC 60062 code writes it ("325R1").
// The reduced circuit the figures come from keeps full precision; the file
// solves within half a part in a thousand of it (common practice: well
// inside any part's tolerance).
const readerDigits = 4

// readerValues rounds the values pare computed (parts merged from others,
// From set) to readerDigits: a parallel pair of 330R and 22k is 325R1, not
// "325R12315270936". A part the user captured keeps the value as written.
func readerValues(c *graph.Circuit) {
	for i, p := range c.Parts {
		if len(p.From) == 0 || p.Value.Max == 0 {
			continue
		}
		q := p.Clone()
		q.Value.Min, q.Value.Max = roundSig(p.Value.Min), roundSig(p.Value.Max)
		for k := range q.Windings {
			q.Windings[k].L = roundSig(q.Windings[k].L)
		}
		c.Parts[i] = q
	}
}

// readerBands writes the bands to readerDigits significant figures,
// rounded outwards: a band a switch retuned is worked out from its tanks
// ("150.47687044591k..289.097764478464k" for the club receiver on LW),
// and a band the file sweeps must hold the band the proof swept (a
// verification of the file then covers the proof's band and a hair more).
// A band typed by the user has no more figures and is written as it was.
func readerBands(c *graph.Circuit) {
	out := func(b value.Range) value.Range {
		return value.Range{Min: roundOut(b.Min, false), Max: roundOut(b.Max, true)}
	}
	c.Band = out(c.Band)
	for i, rg := range c.Regions {
		if b := out(rg.Band); b != rg.Band {
			q := *rg
			q.Band = b
			c.Regions[i] = &q
		}
	}
}

// roundOut is v to readerDigits significant figures, rounded up or down.
func roundOut(v float64, up bool) float64 {
	r := roundSig(v)
	if v <= 0 || math.IsInf(v, 0) || math.IsNaN(v) || (up && r >= v) || (!up && r <= v) {
		return r
	}
	step := math.Pow(10, math.Floor(math.Log10(v))-(readerDigits-1))
	if up {
		return roundSig(r + step)
	}
	return roundSig(r - step)
}

// roundSig is v to readerDigits significant figures.
func roundSig(v float64) float64 {
	if v == 0 || math.IsInf(v, 0) || math.IsNaN(v) {
		return v
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', readerDigits, 64), 64)
	return r
}

// keepDetectorRd writes each detector's rd, as the reduced circuit solves
// it from the original wiring's DC load, into the netlist as the diode's
// own: the file alone would take the load from its own DC paths, where a
// grounded AGC line looks like a DC return (graph/ac.KeepDetectorLoads).
func keepDetectorRd(c *graph.Circuit) {
	for i, p := range c.Parts {
		rd, ok := ac.KeptDetectorRd(c, p)
		if !ok {
			continue
		}
		q := p.Clone()
		if q.Params == nil {
			q.Params = map[string]float64{}
		}
		// Six significant digits: the file stays readable and solves within
		// a part per million of the reduced circuit.
		q.Params["rd"], _ = strconv.ParseFloat(strconv.FormatFloat(rd, 'g', 6, 64), 64)
		c.Parts[i] = q
		key := "parts." + p.Ref
		cm := c.Comments[key]
		if cm.After == "" {
			cm.After = " rd from the detector's DC load in the set as wired"
		}
		c.Comments[key] = cm
	}
}

// Unmatched is a part of the reduced circuit in no stage, with the reason.
type Unmatched struct {
	Ref    string `json:"ref"`
	Reason string `json:"reason"`
}

// What a part in no stage is told; a resistor to AC ground that no stage
// touches gets the second reason (one that does joins the stage).
const (
	ReasonUnmatched = "not part of a known topology"
	ReasonLoneShunt = "resistor to AC ground (grid leak, load or return) beside no stage"
)

// Unmatched lists the reduced circuit's parts that no stage took, in ref
// order.
func (r *Result) Unmatched() []Unmatched {
	var out []Unmatched
	acg := map[string]bool{}
	for _, n := range r.Log.ACGround {
		acg[n] = true
	}
	reduced := r.Reduced
	for _, ref := range stages.Unmatched(reduced, r.Stages) {
		reason := ReasonUnmatched
		if p := reduced.Part(ref); p != nil && p.Kind == graph.Resistor && len(p.Pins) == 2 {
			g0 := acg[p.Pins[0].Net] || reduced.RoleOf(p.Pins[0].Net).IsACGround()
			g1 := acg[p.Pins[1].Net] || reduced.RoleOf(p.Pins[1].Net).IsACGround()
			if g0 != g1 {
				reason = ReasonLoneShunt
			}
		}
		out = append(out, Unmatched{Ref: ref, Reason: reason})
	}
	return out
}

// sayDrawnApart tells, beside each merged resistor the reduced sheet draws
// as its members (withDividersApart: feeds from different lines), which
// members the sheet shows with their own values: review22 b02's sheet
// drew R2 22k and R4 330R where the netlist held R4 325R1, and a reader
// holding both took one for a mistake.
func (r *Result) sayDrawnApart(c *graph.Circuit, split map[string][]string) {
	refs := slices.Sorted(maps.Keys(split))
	for _, ref := range refs {
		var each []string
		for _, m := range split[ref] {
			if o := r.Circuit.Part(m); o != nil {
				each = append(each, m+" "+value.Format(o.Value.Max, value.Ohm, value.Code))
			}
		}
		if len(each) < 2 || c.Part(ref) == nil {
			continue
		}
		key := "parts." + ref
		cm := c.Comments[key]
		said := " the reduced sheet draws it as " + strings.Join(each[:len(each)-1], ", ") + " and " + each[len(each)-1] + ", each to its own return"
		if cm.After != "" {
			said = cm.After + ";" + said
		}
		cm.After = said
		c.Comments[key] = cm
	}
}
