package note

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph/dc"
	"pare/graph/value"
	"pare/rules/stages"
)

// Meter is the meter the note's voltage chart assumes: a 20 kΩ/V analogue
// multimeter, the common service meter (common practice). The chart gives
// both the voltage and what that meter reads.
const Meter = "20k/V"

// DC is the note's voltage chart, as text.
type DC struct {
	Err     string // set when the operating point was not found
	Meter   string
	Rows    []DCRow
	Caution []string // the live-set caution (graph/safety)
	Notes   []string // oscillators, warnings, figures taken at the bias
	// Warnings are the chart's warnings (a current far from the declared
	// one, a rating exceeded, a reversed electrolytic), in the chart's
	// order: also among Notes, and listed with the figures to check at the
	// note's top, where a repairer reads first.
	Warnings    []string
	Oscillators []string
}

// DCRow is one test point or rail.
type DCRow struct{ Part, Electrode, Net, Volts, Reads string }

// dcFrom fills the chart from the pipeline's operating point.
func dcFrom(r *pipeline.Result) DC {
	if r.DC == nil {
		msg := "not solved"
		if r.DCErr != nil {
			msg = r.DCErr.Error()
		}
		return DC{Err: msg}
	}
	mt, _ := dc.ParseMeter(Meter) // a fixed, valid spec
	ch, err := r.DC.Chart(mt)
	if err != nil {
		return DC{Err: err.Error()}
	}
	// The note's caution block is at its top; the chart repeats only the
	// live-set line of the same source.
	d := DC{Meter: mt.String(), Caution: r.Caution.Readings()[:1]}
	if ch.Leads != "" {
		d.Caution = append(d.Caution, ch.Leads)
	}
	for _, p := range ch.Points {
		reads := Volts(p.Reading)
		switch {
		case p.AC && p.Mains:
			reads = "AC: the mains"
		case p.AC:
			reads = "AC: the rectifier's winding"
		case p.Elsewhere:
			reads = "set elsewhere"
		}
		d.Rows = append(d.Rows, DCRow{p.Ref, p.Label, p.Net, Volts(p.Volts), reads})
	}
	for _, rl := range ch.Rails {
		label := ""
		if e := rl.Estimate; e != nil {
			label = "estimate"
			d.Notes = append(d.Notes, fmt.Sprintf("Rail %s is an estimate, not a declared voltage: %s rectifier on %s%s, %s peak, %s drop in %s, ripple %s p-p at the load current (%s; the formula gives %s).",
				rl.Net, e.Wave, e.Source(), dc.Through(e), Volts(e.Peak), Volts(e.Drop), e.DropIn(), Volts(e.Ripple), e.Method, Volts(e.Formula)))
		}
		d.Rows = append(d.Rows, DCRow{"rail", label, rl.Net, Volts(rl.Volts), "draws " + value.FormatPrec(rl.Amps, value.Ampere, value.Symbol, 3)})
	}
	for _, sp := range ch.Supplies {
		d.Rows = append(d.Rows, DCRow{"supply", "after " + sp.Via, sp.Net, Volts(sp.Volts), Volts(sp.Reading)})
	}
	d.Oscillators = OscillatorNotes(r.Stages, r.DC)
	d.Notes = append(d.Notes, ch.Warnings...)
	d.Warnings = ch.Warnings
	for _, o := range r.Biased {
		d.Notes = append(d.Notes, fmt.Sprintf("%s %s = %.4g %s taken at this operating point (%s).", o.Ref, o.Param, o.Value, o.Unit, o.From))
	}
	if refs := keptBiased(r); len(refs) > 0 {
		d.Notes = append(d.Notes, "reduced.toml writes the figures of "+strings.Join(refs, ", ")+" taken here as the devices' own (marked \"at the operating point\"): the reduced circuit has no supply or bias network to solve them from.")
	}
	return d
}

// keptBiased lists, in the reduced circuit's order, the parts the reduction
// kept whose figures were taken at the operating point: reduced.toml
// carries those figures (pipeline's sayBiased), and the note says so.
func keptBiased(r *pipeline.Result) []string {
	if r.Reduced == nil {
		return nil
	}
	biased := map[string]bool{}
	for _, o := range r.Biased {
		biased[o.Ref] = true
	}
	var refs []string
	for _, p := range r.Reduced.Parts {
		if biased[p.Ref] {
			refs = append(refs, p.Ref)
		}
	}
	return refs
}

// writeDC writes the voltage chart: the DC voltages a repairer measures
// first, under the live-set caution.
//
// chartLead and chartApplies open the chart in both notes; the caution
// lines after them are graph/safety's for the set.
const (
	chartLead    = "These readings are taken with the set working"
	chartApplies = "the caution at the top of this note applies to every one."
)

func writeDC(b *bytes.Buffer, n *Note) {
	d := n.DC
	if d.Err == "" && len(d.Rows) == 0 {
		return // no chart was made (a note assembled by hand)
	}
	b.WriteString("## DC voltage chart\n\n")
	if d.Err != "" {
		fmt.Fprintf(b, "The DC operating point was not found: %s\n\n", mdText(d.Err))
		return
	}
	b.WriteString("**" + chartLead + "**: " + chartApplies)
	for _, l := range d.Caution {
		fmt.Fprintf(b, " %s", mdText(l))
	}
	fmt.Fprintf(b, "\n\nComputed for the whole circuit as captured (`pare dc`); the last column is what a %s reads.\n\n", mdText(d.Meter))
	b.WriteString("| part | electrode | net | DC | meter reads |\n|---|---|---|---:|---:|\n")
	for _, r := range d.Rows {
		fmt.Fprintf(b, "| %s | %s | `%s` | %s | %s |\n", mdText(r.Part), mdText(r.Electrode), mdCode(r.Net), r.Volts, mdText(r.Reads))
	}
	b.WriteString("\n")
	for _, x := range append(append([]string(nil), d.Oscillators...), d.Notes...) {
		fmt.Fprintf(b, "- %s\n", mdText(x))
	}
	if len(d.Oscillators)+len(d.Notes) > 0 {
		b.WriteString("\n")
	}
}

// Volts prints a DC voltage the way a chart does: four figures at most, no
// "-0".
func Volts(v float64) string {
	if math.Abs(v) < 5e-4 {
		return "0 V"
	}
	return fmt.Sprintf("%.4g V", v)
}

// StagesFailed is the oscillator line when the stages could not be found.
func StagesFailed(err error) []string {
	if err == nil || errors.Is(err, stages.ErrSearchLimit) {
		return nil
	}
	return []string{fmt.Sprintf("stages not recognised (%v): no oscillator notes", err)}
}
