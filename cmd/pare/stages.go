package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph/figure"
	"pare/graph/safety"
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
--json prints {"stages": [...]} with figures in SI base units and, under the
same keys, where each came from (formula, solver or netlist).`,
		bind: typed(func(fs *flag.FlagSet, o *stagesOpts) {
			fs.BoolVar(&o.json, "json", false, "print the stages as JSON, figures in SI base units")
			fs.StringVar(&o.patterns, "patterns", "", "directory of extra pattern files (*.toml)")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce before matching: tidy, signal or ideal")
			fs.IntVar(&o.limit, "limit", stages.DefaultLimit, "search steps before the matcher gives up")
		}, runStages),
	})
}

// supplyHeading separates the supply stages, found on the full circuit,
// from the signal stages of the reduced one.
const supplyHeading = "Supply stages (found on the full circuit; the reduction removes them from the signal path):"

type stagesJSON struct {
	Title     string               `json:"title,omitempty"`
	Level     string               `json:"level"`
	Stages    []stages.Stage       `json:"stages"`
	Unmatched []pipeline.Unmatched `json:"unmatched"`
	Warning   string               `json:"warning,omitempty"`
	Caution   string               `json:"caution"`
}

func runStages(e *env, o *stagesOpts, args []string) int {
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
	res, err := e.pipeline(pipeline.Options{Path: path, Until: pipeline.PhaseStages, Level: lvl,
		PatternDir: o.patterns, StageLimit: o.limit})
	if loadFailed(e, path, err) {
		return exitBad
	}
	var pe *pipeline.Error
	if errors.As(err, &pe) && pe.Phase == pipeline.PhaseStages {
		printErrors(e, "pare stages", o.patterns, err) // a pattern file is at fault
		return exitBad
	} else if err != nil {
		return reportErr(e, "pare stages", path, err)
	}
	unmatched := res.Unmatched()
	caution := res.Caution.Report(safety.StageFigures)
	code := exitOK
	if res.StagesLimit != "" {
		fmt.Fprintf(e.stderr, "pare stages: %s: %s; the stages below are those found so far\n", path, res.StagesLimit)
		code = exitFound
	}
	if o.json {
		if err := printStagesJSON(e, res, unmatched, caution); err != nil {
			fmt.Fprintf(e.stderr, "pare stages: %v\n", err)
			return exitBad
		}
		return code
	}
	err = writeOutput(e, "-", func(w io.Writer) error {
		printStages(w, res, unmatched, caution)
		return nil
	})
	if err != nil {
		fmt.Fprintf(e.stderr, "pare stages: %v\n", err)
		return exitBad
	}
	return code
}

// printStagesJSON prints {"stages": [...]} with figures in SI base units.
func printStagesJSON(e *env, res *pipeline.Result, unmatched []pipeline.Unmatched, caution string) error {
	out := stagesJSON{Title: res.Circuit.Title, Level: res.Level.String(), Stages: res.Stages, Unmatched: unmatched,
		Warning: res.StagesLimit, Caution: caution}
	if out.Stages == nil {
		out.Stages = []stages.Stage{}
	}
	if out.Unmatched == nil {
		out.Unmatched = []pipeline.Unmatched{}
	}
	return writeOutput(e, "-", func(w io.Writer) error {
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(out)
	})
}

func printStages(w io.Writer, res *pipeline.Result, unmatched []pipeline.Unmatched, caution string) {
	found, lvl := res.Stages, res.Level
	title := res.Circuit.Title
	if title == "" {
		title = res.Path // the path as given, not its base name as on a sheet
	}
	fmt.Fprintf(w, "%s: %s, reduced at level %s\n\n", title, stageCount(found), lvl)
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
			for _, line := range wrap(figure.Line(s.Figures, figure.Text), 96-len(pad)) {
				fmt.Fprintf(w, "%s%s\n", pad, line)
			}
			for _, c := range figure.Checks(s.Figures, figure.Text) {
				for i, line := range wrapWords(c, 96-len(pad)-len(checkMark)) {
					mark := checkMark
					if i > 0 {
						mark = strings.Repeat(" ", len(checkMark))
					}
					fmt.Fprintf(w, "%s%s%s\n", pad, mark, line)
				}
			}
			for _, l := range s.Loop {
				for _, line := range wrap(stages.LoopLine(l), 96-len(pad)) {
					fmt.Fprintf(w, "%s%s\n", pad, line)
				}
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
	fmt.Fprintf(w, "\n%s\n", caution)
}

// wrapWords breaks prose at spaces so no line runs past width.
func wrapWords(s string, width int) []string {
	var lines []string
	cur := ""
	for _, word := range strings.Fields(s) {
		switch {
		case cur == "":
			cur = word
		case len(cur)+1+len(word) > width:
			lines = append(lines, cur)
			cur = word
		default:
			cur += " " + word
		}
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// checkMark starts a figure's formula cross-check under the figures.
const checkMark = "≈ "

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

// stageCount words how many stages were found the way the main job's
// summary does: the stages in the signal chain, and, when some hold
// stages of their own (a tank inside an oscillator), how many in all, so
// the two reports of one set give the same number.
func stageCount(found []stages.Stage) string {
	top := 0
	for _, s := range found {
		if !strings.Contains(s.Name, ".") {
			top++
		}
	}
	if top == len(found) {
		return fmt.Sprintf("%d stage(s)", top)
	}
	return fmt.Sprintf("%d stage(s), %d with the stages inside them", top, len(found))
}
