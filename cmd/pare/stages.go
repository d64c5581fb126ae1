package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"regexp"
	"strings"

	"pare/graph"
	"pare/rules"
	"pare/rules/stages"
)

type stagesOpts struct {
	json     bool
	patterns string
	level    string
	limit    int
}

func init() {
	register(&command{
		name:    "stages",
		args:    "FILE [--json] [--patterns DIR] [--level tidy|signal|ideal] [--limit N]",
		summary: "name the stages of a circuit by their topology and compute the figures a repairer checks",
		detail: `Reduces the circuit (at --level, default signal), then finds every stage
topology of the pattern library in the reduced circuit: oscillators, amplifiers,
mixers, tuned circuits, detectors, couplings, and on the original circuit the
power supply. Stages are named S1, S2, … in signal order from the circuit's
inputs; a stage inside another (the tank of an oscillator) is named after it,
S2.1. In a circuit with a part called S1, S2… (a switch) they are named ST1,
ST2, … instead. A resistor to AC ground joins the stage it loads. Each stage comes with its figures (resonances and tuning ranges, IF,
image, tracking, time constants, mid-band gain) and with flags for figures a
repairer would question. Parts in no stage are listed with the reason.

--patterns DIR adds the pattern files (*.toml) in DIR to the built-in library;
a file with the id of a built-in pattern replaces it (docs/patterns.md).
--json prints {"stages": [...]} with figures in SI base units.`,
		flags: func(fs *flag.FlagSet) any {
			o := &stagesOpts{}
			fs.BoolVar(&o.json, "json", false, "print the stages as JSON, figures in SI base units")
			fs.StringVar(&o.patterns, "patterns", "", "directory of extra pattern files (*.toml)")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce before matching: tidy, signal or ideal")
			fs.IntVar(&o.limit, "limit", stages.DefaultLimit, "search steps before the matcher gives up")
			return o
		},
		run: runStages,
	})
}

// stagesCaution goes with every stage list: it is read beside the set.
const stagesCaution = "Figures are small-signal values from the reduced circuit, not DC voltages. Valve sets carry lethal HT and may have a live chassis; " +
	"capacitors stay charged after switch-off. Use an isolation transformer and follow local codes and licensed practice."

// supplyHeading separates the supply stages, found on the full circuit,
// from the signal stages of the reduced one.
const supplyHeading = "Supply stages (found on the full circuit; the reduction removes them from the signal path):"

// reasonUnmatched is what a part in no stage is told; reasonLoneShunt a
// resistor to AC ground that no stage touches (one that does joins it).
const (
	reasonUnmatched = "not part of a known topology"
	reasonLoneShunt = "resistor to AC ground (grid leak, load or return) beside no stage"
)

type stagesJSON struct {
	Title     string          `json:"title,omitempty"`
	Level     string          `json:"level"`
	Stages    []stages.Stage  `json:"stages"`
	Unmatched []unmatchedJSON `json:"unmatched"`
	Warning   string          `json:"warning,omitempty"`
	Caution   string          `json:"caution"`
}

type unmatchedJSON struct {
	Ref    string `json:"ref"`
	Reason string `json:"reason"`
}

func runStages(e *env, opts any, args []string) int {
	o := opts.(*stagesOpts)
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare stages: give exactly one netlist file")
		fmt.Fprintln(e.stderr, "usage: pare stages FILE [--json] [--patterns DIR] [--level tidy|signal|ideal]")
		return exitBad
	}
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare stages: %v\n", err)
		return exitBad
	}
	if o.limit <= 0 {
		fmt.Fprintf(e.stderr, "pare stages: --limit %d: give a positive number of search steps\n", o.limit)
		return exitBad
	}
	path := args[0]
	c, ok := loadCircuit(e, path)
	if !ok {
		return exitBad
	}
	reduced, log, err := rules.Reduce(c, rules.Options{Level: lvl})
	if err != nil {
		printErrors(e, "pare stages", path, err)
		return exitBad
	}
	found, err := stages.Find(reduced, stages.Options{PatternDir: o.patterns, Full: c, ACGround: log.ACGround, Limit: o.limit})
	warning := ""
	if err != nil {
		if !errors.Is(err, stages.ErrSearchLimit) {
			printErrors(e, "pare stages", o.patterns, err)
			return exitBad
		}
		warning = err.Error()
	}
	var unmatched []unmatchedJSON
	acg := map[string]bool{}
	for _, n := range log.ACGround {
		acg[n] = true
	}
	for _, ref := range stages.Unmatched(reduced, found) {
		reason := reasonUnmatched
		if p := reduced.Part(ref); p != nil && p.Kind == graph.Resistor && len(p.Pins) == 2 {
			g0 := acg[p.Pins[0].Net] || reduced.RoleOf(p.Pins[0].Net).IsACGround()
			g1 := acg[p.Pins[1].Net] || reduced.RoleOf(p.Pins[1].Net).IsACGround()
			if g0 != g1 {
				reason = reasonLoneShunt
			}
		}
		unmatched = append(unmatched, unmatchedJSON{Ref: ref, Reason: reason})
	}
	code := exitOK
	if warning != "" {
		fmt.Fprintf(e.stderr, "pare stages: %s: %s; the stages below are those found so far\n", path, warning)
		code = exitFound
	}
	if o.json {
		out := stagesJSON{Title: c.Title, Level: lvl.String(), Stages: found, Unmatched: unmatched, Warning: warning, Caution: stagesCaution}
		if out.Stages == nil {
			out.Stages = []stages.Stage{}
		}
		if out.Unmatched == nil {
			out.Unmatched = []unmatchedJSON{}
		}
		err := writeOutput(e, "-", func(w io.Writer) error {
			enc := json.NewEncoder(w)
			enc.SetIndent("", "  ")
			return enc.Encode(out)
		})
		if err != nil {
			fmt.Fprintf(e.stderr, "pare stages: %v\n", err)
			return exitBad
		}
		return code
	}
	err = writeOutput(e, "-", func(w io.Writer) error {
		printStages(w, path, c, lvl, found, unmatched)
		return nil
	})
	if err != nil {
		fmt.Fprintf(e.stderr, "pare stages: %v\n", err)
		return exitBad
	}
	return code
}

// hiddenFigures are the working values a table leaves to --json: the
// capacitance and inductance that go into a resonance, the Qs behind kc.
var hiddenFigures = map[string]bool{
	"c_f": true, "c_min_f": true, "c_max_f": true, "l_h": true, "l1_h": true, "l2_h": true, "m_h": true,
	"q1": true, "q2": true, "k_ratio": true, "gain_db": true,
}

func printStages(w io.Writer, path string, c *graph.Circuit, lvl rules.Level, found []stages.Stage, unmatched []unmatchedJSON) {
	title := c.Title
	if title == "" {
		title = path
	}
	fmt.Fprintf(w, "%s: %d stage(s), reduced at level %s\n\n", title, len(found), lvl)
	if len(found) > 0 {
		nameW, topoW := len("stage"), len("topology")
		for _, s := range found {
			nameW = max(nameW, len(s.Name))
			topoW = max(topoW, len(s.Topology))
		}
		fmt.Fprintf(w, "%-*s  %-*s  %s\n", nameW, "stage", topoW, "topology", "title / parts")
		supplyShown := false
		for _, s := range found {
			if s.Supply && !supplyShown {
				// Supply stages come last (Find orders them so); the
				// heading keeps them apart from the signal path.
				supplyShown = true
				fmt.Fprintf(w, "\n%s\n", supplyHeading)
			}
			fmt.Fprintf(w, "%-*s  %-*s  %s\n", nameW, s.Name, topoW, s.Topology, s.Title)
			pad := strings.Repeat(" ", nameW+topoW+4)
			fmt.Fprintf(w, "%sparts: %s\n", pad, strings.Join(s.Parts, " "))
			for _, line := range wrap(figureLine(s.Figures), 96-len(pad)) {
				fmt.Fprintf(w, "%s%s\n", pad, line)
			}
			if len(s.Contains) > 0 {
				fmt.Fprintf(w, "%scontains: %s\n", pad, strings.Join(s.Contains, ", "))
			}
			for _, f := range s.Flags {
				fmt.Fprintf(w, "%s! %s\n", pad, f)
			}
			for _, n := range s.Notes {
				for _, line := range wrap(n, 96-len(pad)) {
					fmt.Fprintf(w, "%s%s\n", pad, line)
				}
			}
		}
	}
	if len(unmatched) > 0 {
		if len(found) > 0 {
			fmt.Fprintln(w)
		}
		for _, u := range unmatched {
			fmt.Fprintf(w, "%s: %s\n", u.Ref, u.Reason)
		}
	}
	fmt.Fprintf(w, "\n%s\n", stagesCaution)
}

// figureLine prints a stage's figures on one line, a min/max pair as one
// range ("osc f 1 MHz–2.07 MHz"), the tracking error with where it occurs
// as one item, the three exact-tracking points as one item.
func figureLine(figs map[string]float64) string {
	var out []string
	done := map[string]bool{}
	for _, k := range stages.KeyFigures(figs) {
		if done[k] || hiddenFigures[lastFigure(k)] {
			continue
		}
		if item, ok := joinedFigure(figs, k, done); ok {
			out = append(out, item)
			continue
		}
		if strings.Contains(k, "_max_") {
			if _, ok := figs[strings.Replace(k, "_max_", "_min_", 1)]; ok {
				continue // printed with its minimum
			}
		}
		if strings.Contains(k, "_min_") {
			hi := strings.Replace(k, "_min_", "_max_", 1)
			if v, ok := figs[hi]; ok {
				done[hi] = true
				label := figureWords(strings.Replace(k, "_min_", "_", 1))
				out = append(out, label+" "+stages.FigureText(k, figs[k])+"–"+stages.FigureText(hi, v))
				continue
			}
		}
		out = append(out, figureWords(k)+" "+stages.FigureText(k, figs[k]))
	}
	return strings.Join(out, ", ")
}

// joinedFigure prints figures that only make sense together as one item:
// the worst tracking error and the dial frequency where it occurs ("track
// err max -7.708 kHz at 1.6 MHz"), and the three frequencies where a
// three-point padding tracks exactly. It marks the keys it used in done.
func joinedFigure(figs map[string]float64, k string, done map[string]bool) (string, bool) {
	base, ok := strings.CutSuffix(k, "track_err_max_hz")
	if !ok {
		base, ok = strings.CutSuffix(k, "track_err_at_hz")
	}
	if ok {
		maxK, atK := base+"track_err_max_hz", base+"track_err_at_hz"
		v, hasMax := figs[maxK]
		at, hasAt := figs[atK]
		done[maxK], done[atK] = true, true
		switch {
		case hasMax && hasAt:
			return "track err max " + stages.FigureText(maxK, v) + " at " + stages.FigureText(atK, at), true
		case hasMax:
			return "track err max " + stages.FigureText(maxK, v), true
		}
		return "", true // where the error peaks, without the error, says nothing
	}
	// The three-point padding is a design pare proposes, not the fitted
	// set: its parts and its exact points go in one item that says so, so a
	// repairer does not take them for the set's values and "correct" a good
	// padder.
	for _, member := range suggestedKeys {
		base, ok := strings.CutSuffix(k, member)
		if !ok {
			continue
		}
		var parts, at []string
		for _, p := range []struct{ key, word string }{{"pad_c_f", "padder"}, {"pad_l_h", "coil"}, {"pad_trim_f", "trimmer"}} {
			if v, has := figs[base+p.key]; has {
				parts = append(parts, p.word+" "+stages.FigureText(base+p.key, v))
			}
			done[base+p.key] = true
		}
		for _, n := range []string{"1", "2", "3"} {
			key := base + "track_f" + n + "_hz"
			if v, has := figs[key]; has {
				at = append(at, stages.FigureText(key, v))
			}
			done[key] = true
		}
		if len(at) > 0 {
			parts = append(parts, "exact at "+andList(at))
		}
		item := "suggested 3-point design: " + strings.Join(parts, ", ")
		if fit := fittedItem(figs, base, done); fit != "" {
			item = fit + ", " + item // what the set does before what pare proposes
		}
		return item, true
	}
	if m := fittedKey.FindStringSubmatch(k); m != nil {
		return fittedItem(figs, m[1], done), true
	}
	return "", false
}

// fittedItem is "fitted set tracks exactly at …" for the figures with the
// given prefix, "" when there are none; it marks the keys it used in done.
func fittedItem(figs map[string]float64, base string, done map[string]bool) string {
	var at []string
	for n := 1; ; n++ {
		key := fmt.Sprintf("%strack_fit%d_hz", base, n)
		v, has := figs[key]
		if !has {
			break
		}
		if !done[key] {
			at = append(at, stages.FigureText(key, v))
		}
		done[key] = true
	}
	if len(at) == 0 {
		return ""
	}
	return "fitted set tracks exactly at " + andList(at)
}

// suggestedKeys are the figures of a suggested three-point padding design
// (rules/stages tracking); any of them starts the joined item.
var suggestedKeys = []string{"track_f1_hz", "track_f2_hz", "track_f3_hz", "pad_c_f", "pad_l_h", "pad_trim_f"}

// fittedKey matches the points where the fitted set tracks exactly.
var fittedKey = regexp.MustCompile(`^(.*)track_fit\d+_hz$`)

// andList joins items as prose: "a", "a and b", "a, b and c".
func andList(items []string) string {
	if len(items) < 2 {
		return strings.Join(items, "")
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}

// figureWords is the label figureLine prints before a figure's value: the
// trade's words where stages has them (stages.FigureName), else the key
// spelt plainly (figureLabel).
func figureWords(key string) string {
	if w, ok := stages.FigureName(key); ok {
		return w
	}
	return figureLabel(key)
}

// wrap breaks a figure line after commas so no line runs past width.
func wrap(s string, width int) []string {
	if s == "" {
		return nil
	}
	var lines []string
	cur := ""
	for _, part := range strings.Split(s, ", ") {
		switch {
		case cur == "":
			cur = part
		case len(cur)+2+len(part) > width:
			lines = append(lines, cur+",")
			cur = part
		default:
			cur += ", " + part
		}
	}
	return append(lines, cur)
}

// lastFigure strips a calc prefix ("osc_c_min_f" → "c_min_f") so the hidden
// working values are hidden whatever stage they belong to.
func lastFigure(k string) string {
	for _, base := range []string{"c_min_f", "c_max_f", "c_f", "l1_h", "l2_h", "l_h", "m_h"} {
		if k == base || strings.HasSuffix(k, "_"+base) && !strings.HasPrefix(k, "pad_") {
			return base
		}
	}
	return k
}
