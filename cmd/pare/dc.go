package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math"
	"strings"

	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/graph/dc"
	"pare/graph/value"
	"pare/rules"
)

type dcOpts struct {
	meter    string
	json     bool
	readings string
	top      int
}

func init() {
	register(&command{
		name:    "dc",
		args:    "FILE [--meter ideal|20k/V|20k/V@250|10M] [--readings FILE.toml [--top N]] [--json]",
		summary: "the DC operating point as a voltage chart; rank faults from measured readings",
		detail: `Computes the DC operating point of the whole circuit as captured (valves
by the three-halves-power law, diodes, transistors and FETs by their laws,
windings as their DC resistance, capacitors open; docs/dc.md) and prints
the voltage at every test point (anode, screen, cathode, grid, base,
collector, emitter, gate, drain, source, each rail), the electrode and rail
currents, the power in each resistor, and warnings: a resistor over its
watts, a capacitor over its rating, a reversed electrolytic, a valve over its
anode dissipation (pmax).

--meter says what the readings are taken with: an analogue meter loads a
grid or screen feed (20k/V on the lowest range above the reading, or
20k/V@250 on one range), an electronic one by its input resistance (10M).
The chart shows the voltage and, beside it, what that meter would read.

--readings FILE.toml compares measured readings with the chart and ranks
the single faults that best explain them all (docs/dc.md has the format).

A circuit whose operating point does not settle is reported with the nets
that kept moving, exit 2.`,
		bind: typed(func(fs *flag.FlagSet, o *dcOpts) {
			fs.StringVar(&o.meter, "meter", "ideal", "the voltmeter: ideal, 20k/V, 20k/V@250 or 10M")
			fs.BoolVar(&o.json, "json", false, "print the chart as JSON, SI base units")
			fs.StringVar(&o.readings, "readings", "", "measured readings (TOML) to rank likely faults")
			fs.IntVar(&o.top, "top", 5, "how many fault candidates to print with --readings")
		}, runDC),
	})
}

func runDC(e *env, o *dcOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare dc: give exactly one netlist file")
		return exitBad
	}
	mt, err := dc.ParseMeter(o.meter)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare dc: --meter: %v\n", err)
		return exitBad
	}
	// Stages name the oscillators; the chart stands without them if the
	// reduction or the recognition fails (oscillatorNotes says so).
	res, err := e.pipeline(pipeline.Options{Path: args[0], Until: pipeline.PhaseStages, Level: rules.LevelSignal})
	if loadFailed(e, args[0], err) {
		return exitBad
	}
	stagesErr := err
	caution := res.Caution.Readings()
	// The pipeline solved the circuit as written, before the reduction.
	pt := res.DC
	if res.DCErr != nil || pt == nil {
		fmt.Fprintf(e.stderr, "pare dc: %v\n", res.DCErr)
		return exitBad
	}
	if stagesErr == nil {
		pt.AddOscillators(note.StageOscillators(res.Stages))
	}
	if o.readings != "" {
		return runReadings(e, pt, o, caution)
	}
	ch, err := pt.Chart(mt)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare dc: %s: %v\n", args[0], err)
		return exitBad
	}
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(map[string]any{"chart": ch, "origins": pt.Origins, "method": pt.Method, "caution": caution}); err != nil {
			return exitBad
		}
		return exitOK
	}
	osc := note.StagesFailed(stagesErr)
	if osc == nil {
		osc = note.OscillatorNotes(res.Stages, pt)
	}
	writeChart(e.stdout, args[0], pt, ch, caution, osc)
	return exitOK
}

// writeChart prints the chart under the caution of the circuit's class
// (graph/safety), which opens with the live-set line: the readings a chart
// invites are taken on a set that is switched on.
func writeChart(w io.Writer, path string, pt *dc.Point, ch *dc.Chart, caution, osc []string) {
	fmt.Fprintf(w, "%s: DC operating point (%s); readings for: %s\n", path, pt.Method, ch.Meter)
	for _, l := range caution {
		fmt.Fprintf(w, "  %s\n", l)
	}
	if ch.Leads != "" {
		fmt.Fprintf(w, "  %s\n", ch.Leads)
	}
	fmt.Fprintln(w, "\ntest points")
	for _, tp := range ch.Points {
		line := fmt.Sprintf("  %-6s %-11s %-12s %10s", tp.Ref, tp.Label, tp.Net, volts(tp.Volts))
		switch {
		case tp.AC && tp.Mains:
			line += "   AC: the mains"
		case tp.AC:
			line += "   AC: the rectifier's winding"
		case tp.Elsewhere:
			line += "   set elsewhere"
		case !ch.Meter.IsIdeal():
			line += fmt.Sprintf("   meter reads %s", volts(tp.Reading))
		}
		fmt.Fprintln(w, strings.TrimRight(line, " "))
	}
	writeSupply(w, ch)
	if len(ch.Currents) > 0 {
		fmt.Fprintln(w, "\ncurrents")
		for _, c := range ch.Currents {
			fmt.Fprintf(w, "  %-6s %-18s %s\n", c.Ref, c.What, amps(c.Amps))
		}
	}
	if len(ch.Resistors) > 0 {
		fmt.Fprintln(w, "\nresistor dissipation")
		for _, h := range ch.Resistors {
			rating := "rating not given"
			if h.Rating > 0 {
				rating = fmt.Sprintf("rated %.3g W", h.Rating)
			}
			note := ""
			if h.Note != "" {
				note = "   " + h.Note
			}
			fmt.Fprintf(w, "  %-6s %10s   %s%s\n", h.Ref, watts(h.Watts), rating, note)
		}
	}
	if len(ch.Warnings) > 0 {
		fmt.Fprintln(w, "\nwarnings")
		for _, x := range ch.Warnings {
			fmt.Fprintf(w, "  %s\n", x)
		}
	}
	if len(osc) > 0 {
		fmt.Fprintln(w, "\noscillators")
		for _, x := range osc {
			fmt.Fprintf(w, "  %s\n", x)
		}
	}
	fmt.Fprintln(w, "\nlaw parameters (where each came from)")
	for _, o := range pt.Origins {
		fmt.Fprintf(w, "  %-6s %-5s %-12s %s\n", o.Ref, o.Param, fmt.Sprintf("%.4g %s", o.Value, o.Unit), o.From)
	}
	if _, biased := pt.Biased(); len(biased) > 0 {
		fmt.Fprintln(w, "\nsmall-signal figures taken at this operating point (not given in the netlist)")
		for _, o := range biased {
			fmt.Fprintf(w, "  %-6s %-5s %-12s %s\n", o.Ref, o.Param, fmt.Sprintf("%.4g %s", o.Value, o.Unit), o.From)
		}
	}
}

// writeSupply prints the rails and the supply test points after them.
func writeSupply(w io.Writer, ch *dc.Chart) {
	if len(ch.Rails) > 0 {
		fmt.Fprintln(w, "\nrails")
		for _, r := range ch.Rails {
			fmt.Fprintf(w, "  %-12s %10s   draws %s\n", r.Net, volts(r.Volts), amps(r.Amps))
			if e := r.Estimate; e != nil {
				fmt.Fprintf(w, "  %-12s estimate: %s rectifier on %s%s, %s peak, %s drop, ripple %s p-p\n  %-12s method: %s\n  %-12s cross-check: the conduction-angle formula gives %s\n",
					"", e.Wave, e.Source(), dc.Through(e), volts(e.Peak), volts(e.Drop), volts(e.Ripple), "", e.Method, "", volts(e.Formula))
			}
		}
	}
	if len(ch.Supplies) > 0 {
		fmt.Fprintln(w, "\nsupply test points")
		for _, sp := range ch.Supplies {
			line := fmt.Sprintf("  %-12s %10s   after %s from %s, decoupled by %s", sp.Net, volts(sp.Volts), sp.Via, sp.From, sp.Cap)
			if !ch.Meter.IsIdeal() {
				line += fmt.Sprintf("; meter reads %s", volts(sp.Reading))
			}
			fmt.Fprintln(w, line)
		}
	}
}

// volts prints a DC voltage the way a chart does: four figures at most,
// no "-0".
func volts(v float64) string {
	if math.Abs(v) < 5e-4 {
		return "0 V"
	}
	return fmt.Sprintf("%.4g V", v)
}

func amps(a float64) string {
	if math.Abs(a) < 1e-12 {
		return "0 A"
	}
	return value.FormatPrec(a, value.Ampere, value.Symbol, 3)
}

func watts(p float64) string {
	switch {
	case math.Abs(p) < 1e-6:
		return "0 W"
	case math.Abs(p) < 1:
		return fmt.Sprintf("%.3g mW", p*1e3)
	}
	return fmt.Sprintf("%.3g W", p)
}
