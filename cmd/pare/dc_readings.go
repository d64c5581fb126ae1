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
	writeDiagnosis(e.stdout, rd, dg, o.top, caution)
	return exitOK
}

func writeDiagnosis(w io.Writer, rd *dc.Readings, dg *dc.Diagnosis, top int, caution []string) {
	fmt.Fprintf(w, "%s: %d readings, tolerance ±%.3g %%; meter %s\n", rd.File, len(rd.List), 100*rd.Tolerance, rd.Meter)
	for _, l := range caution {
		fmt.Fprintf(w, "  %s\n", l)
	}
	fmt.Fprintln(w, "\nreadings against the chart (same meter)")
	outside := 0
	for _, r := range dg.Readings {
		flag := "ok"
		if r.Outside {
			flag = "OUTSIDE"
			outside++
		}
		fmt.Fprintf(w, "  %-12s %10s   expected %10s   %-7s  %s\n", r.Key, volts(r.Volts), volts(r.Expected), flag, r.Meter.Short())
	}
	if outside == 0 {
		fmt.Fprintln(w, "\nevery reading is within tolerance of the chart: no fault shows at these test points")
		return
	}
	fmt.Fprintln(w, "\nlikely single faults, best first (misfit in tolerance bands, squared and summed)")
	if len(dg.Ranked) > 0 && len(dg.Ranked[0].Explains) < len(rd.List) {
		// Say so rather than let the first line read as a diagnosis.
		fmt.Fprintln(w, "  no single fault of the dictionary explains every reading: more than one fault, a value or")
		fmt.Fprintln(w, "  connection captured wrong, or a reading mistaken; the first candidates below fit least badly")
	}
	for i, c := range dg.Ranked {
		if i == top {
			break
		}
		which := strings.Join(c.Explains, ", ")
		if which == "" {
			which = "none"
		}
		fmt.Fprintf(w, "  %d. %-24s misfit %-9.3g explains %d of %d: %s\n", i+1, c.Fault, c.Score,
			len(c.Explains), len(rd.List), which)
	}
	if dg.Next != "" && len(dg.Ranked) > 1 {
		fmt.Fprintf(w, "\nnext reading: %s separates the first two: %s if %s, %s if %s\n", dg.Next,
			volts(dg.NextA), dg.Ranked[0].Fault, volts(dg.NextB), dg.Ranked[1].Fault)
	}
	for _, f := range dg.Unsolved {
		fmt.Fprintf(w, "  (%s: the faulty circuit does not settle; not ranked)\n", f)
	}
}
