package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"

	"pare/graph"
	"pare/graph/dc"
)

// runReadings compares measured readings with the chart and ranks the
// single faults that best explain them.
func runReadings(e *env, pt *dc.Point, o *dcOpts, caution []string) int {
	rd, err := dc.LoadReadings(o.readings, pt.Circuit)
	if err != nil {
		var list graph.ErrorList
		if errors.As(err, &list) {
			printErrors(e, "pare dc", o.readings, err)
		} else {
			fmt.Fprintf(e.stderr, "pare dc: %v\n", err)
		}
		return exitBad
	}
	if o.top < 1 {
		fmt.Fprintf(e.stderr, "pare dc: --top %d: give 1 or more\n", o.top)
		return exitBad
	}
	dg, err := pt.Rank(rd)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare dc: %v\n", err)
		return exitBad
	}
	if o.json {
		if len(dg.Ranked) > o.top {
			dg.Ranked = dg.Ranked[:o.top]
		}
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(map[string]any{"diagnosis": dg, "tolerance": rd.Tolerance, "caution": caution}); err != nil {
			fmt.Fprintf(e.stderr, "pare dc: %v\n", err)
			return exitBad
		}
		return exitOK
	}
	writeDiagnosis(e.stdout, rd, dg, o.top, caution, len(pt.Oscillators()) > 0)
	return exitOK
}

func writeDiagnosis(w io.Writer, rd *dc.Readings, dg *dc.Diagnosis, top int, caution []string, osc bool) {
	state, chart := "", ""
	if osc {
		state, chart = "; oscillators "+oscState(rd), "; the chart is with the oscillators stopped"
	}
	fmt.Fprintf(w, "%s: %d readings, tolerance ±%.3g %%; meter %s%s\n", rd.File, len(rd.List), 100*rd.Tolerance, rd.Meter, state)
	for _, l := range caution {
		fmt.Fprintf(w, "  %s\n", l)
	}
	fmt.Fprintf(w, "\nreadings against the chart (same meter%s)\n", chart)
	outside := 0
	for _, r := range dg.Readings {
		flag := "ok"
		switch {
		case r.Outside:
			flag = "OUTSIDE"
			outside++
		case r.NotCompared:
			flag = "oscillator running: not compared (" + oscExpect(r.Oscillator) + ")"
		case r.AsStopped:
			flag = "ok, but as with " + r.Oscillator.Ref + " stopped: is it running?"
		}
		fmt.Fprintf(w, "  %-12s %10s   expected %10s   %-7s  %s\n", r.Key, volts(r.Volts), volts(r.Expected), r.Meter.Short(), flag)
	}
	if outside == 0 {
		fmt.Fprintln(w, "\nevery reading compared is within tolerance of the chart: no fault shows at these test points")
		return
	}
	writeCandidates(w, dg, top, outside)
	if dg.Next != "" && len(dg.Ranked) > 1 {
		fmt.Fprintf(w, "\nnext reading: %s separates the first two; your meter (%s) would read %s if %s, %s if %s\n", dg.Next,
			dg.NextMeter.Short(), volts(dg.NextA), dg.Ranked[0].Fault, volts(dg.NextB), dg.Ranked[1].Fault)
	}
	for _, f := range dg.Unsolved {
		fmt.Fprintf(w, "  (%s: the faulty circuit does not settle; not ranked)\n", f)
	}
}

func writeCandidates(w io.Writer, dg *dc.Diagnosis, top, outside int) {
	fmt.Fprintln(w, "\nlikely single faults, best first (misfit in tolerance bands, squared and summed)")
	if len(dg.Ranked) > 0 && (len(dg.Ranked[0].Explains) < outside || len(dg.Ranked[0].Contradicts) > 0) {
		// Say so rather than let the first line read as a diagnosis.
		fmt.Fprintln(w, "  no single fault of the dictionary explains every reading: more than one fault, a value or")
		fmt.Fprintln(w, "  connection captured wrong, or a reading mistaken; the first candidates below fit least badly")
	}
	for i, c := range dg.Ranked {
		if i == top {
			break
		}
		fmt.Fprintf(w, "  %d. %-24s misfit %-9.3g explains %d of %d off the chart: %s; contradicts %s\n", i+1, c.Fault, c.Score,
			len(c.Explains), outside, list(c.Explains), list(c.Contradicts))
	}
}

func list(keys []string) string {
	if len(keys) == 0 {
		return "none"
	}
	return strings.Join(keys, ", ")
}

func oscState(rd *dc.Readings) string {
	if rd.Stopped {
		return "stopped"
	}
	return "running (the default)"
}

// oscExpect words the way a running oscillator moves an electrode: a
// grid or gate goes more negative (an n-channel FET, a valve), a base
// lower (NPN); the electrodes the DC laws give no direction for move with
// the oscillation's amplitude.
func oscExpect(s *dc.Shift) string {
	what := "moves with the oscillation"
	grid := s.Pin == "g" || s.Pin == "g1"
	switch {
	case s.Dir < 0 && grid:
		what = "expected more negative"
	case s.Dir > 0 && grid:
		what = "expected more positive"
	case s.Dir < 0:
		what = "expected lower"
	case s.Dir > 0:
		what = "expected higher"
	}
	return s.Ref + "." + s.Pin + " " + what
}
