package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"sort"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph/safety"
	"pare/rules"
)

type reduceOpts struct {
	out   string
	level string
	focus string
	ratio float64
	json  bool
	check bool
}

func init() {
	register(&command{
		name:    "reduce",
		args:    "FILE [-o OUT.toml] [--level tidy|signal|ideal] [--focus REF,...] [--ratio 0.1] [--json] [--check=false]",
		summary: "reduce a netlist to its small-signal path, logging every step with its reason",
		detail: `Applies the reduction rules to a fixpoint and prints the log: one line per
step with the rule, the parts concerned (file:line) and the justification with
its numbers, then near misses and the part and net counts before and after.

Levels: tidy merges series/parallel parts, sets switches and prunes dangling
parts only; signal (the default) also treats rails as AC ground, grounds
bypassed nets, drops DC-only feeds and static electrodes and opens RF chokes;
ideal also shorts coupling capacitors and opens chokes that at least match
what they shunt. --focus keeps only the stage(s) around the named parts or
nets; nets crossing the cut become ports. --ratio sets the factor a reactance
must be below (bypass) or above (choke) the impedance it works against.
Each step is proven as the main job proves it: the circuit is compared by AC
analysis before and after it, and a step that changes the signal behaviour is
refused, so this is the reduction every other command shows. --check=false
applies every step unproven (faster, and not what the other commands use).

-o writes the reduced netlist (itself a valid input); the input file is never
changed. The reduced circuit is a small-signal equivalent only: it is not a
wiring diagram and says nothing about DC voltages.

` + ruleTableHelp(),
		bind: typed(func(fs *flag.FlagSet, o *reduceOpts) {
			fs.StringVar(&o.out, "o", "", "write the reduced netlist to this file")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce: tidy, signal or ideal")
			fs.StringVar(&o.focus, "focus", "", "comma-separated refs or net names: reduce only the stage(s) around them")
			finiteVar(fs, &o.ratio, "ratio", rules.DefaultRatio, "bypass ratio: |Xc| ≤ ratio·|Z| makes a bypass")
			fs.BoolVar(&o.json, "json", false, "print the log and the reduced netlist as JSON")
			fs.BoolVar(&o.check, "check", true, "verify each step by AC analysis and refuse steps that change the signal (false: apply every step unproven)")
		}, runReduce),
	})
}

// ruleTableHelp lists the rule table, in the order the rules are tried, for
// `pare help reduce`: the help is generated from the table itself, so it
// cannot drift from what the engine does.
func ruleTableHelp() string {
	var b strings.Builder
	b.WriteString("Rules, in the order they are tried on every sweep:\n")
	for _, r := range rules.Table() {
		fmt.Fprintf(&b, "  %-16s %-6s %s\n", r.Name, r.Level, r.Purpose)
	}
	return b.String()
}

func runReduce(e *env, o *reduceOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare reduce: give exactly one netlist file")
		fmt.Fprintln(e.stderr, "usage: pare reduce FILE [-o OUT.toml] [--level tidy|signal|ideal] [--focus REF,...] [--ratio 0.1] [--json] [--check=false]")
		return exitBad
	}
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare reduce: %v\n", err)
		return exitBad
	}
	if !(o.ratio > 0 && o.ratio < 1) {
		fmt.Fprintf(e.stderr, "pare reduce: --ratio %g: give a factor above 0 and below 1 (0.1 means ten times)\n", o.ratio)
		return exitBad
	}
	path := args[0]
	if !checkOutput(e, "pare reduce", o.out, path) {
		return exitBad
	}
	po := pipeline.Options{Path: path, Until: pipeline.PhaseReduce, Level: lvl, BypassRatio: o.ratio}
	if o.focus != "" {
		if po.Focus = splitRefs(o.focus); len(po.Focus) == 0 {
			// Said before the netlist is read, as it always was: a flag
			// that names nothing is a usage error whatever the file holds.
			if _, err := e.pipeline(pipeline.Options{Path: path, Until: pipeline.PhaseLoad}); loadFailed(e, path, err) {
				return exitBad
			}
			fmt.Fprintln(e.stderr, "pare reduce: --focus names nothing")
			return exitBad
		}
	}
	if !o.check {
		po.StepCheck = pipeline.NoStepCheck
	}
	res, err := e.pipeline(po)
	if loadFailed(e, path, err) {
		return exitBad
	}
	if err != nil {
		return reportErr(e, "pare reduce", path, err)
	}
	netlist, err := res.ReducedNetlist()
	if err != nil {
		return reportErr(e, "pare reduce", path, err)
	}
	if o.out != "" {
		if err := writeOutput(e, o.out, func(w io.Writer) error { _, err := w.Write(netlist); return err }, path); err != nil {
			fmt.Fprintf(e.stderr, "pare reduce: writing %s: %v\n", o.out, err)
			return exitBad
		}
	}
	caution := res.Caution.Report(safety.ReduceLog)
	if o.json {
		if err := writeReduceJSON(e.stdout, res.Log, string(netlist), caution); err != nil {
			fmt.Fprintf(e.stderr, "pare reduce: %v\n", err)
			return exitBad
		}
		return exitOK
	}
	printReduceLog(e.stdout, path, res.Log, o.out, caution)
	return exitOK
}

func printReduceLog(w io.Writer, path string, log *rules.Log, out, caution string) {
	fmt.Fprintf(w, "%s: reduction at level %s\n", path, log.Level)
	for _, s := range log.Steps {
		fmt.Fprintln(w, s.String())
	}
	if len(log.Declined) > 0 {
		fmt.Fprintln(w, "kept (near misses):")
		for _, s := range log.Declined {
			fmt.Fprintln(w, s.String())
		}
	}
	if len(log.Gangs) > 0 {
		names := make([]string, 0, len(log.Gangs))
		for g := range log.Gangs {
			names = append(names, g)
		}
		sort.Strings(names)
		for _, g := range names {
			fmt.Fprintf(w, "gang %s: %s (mechanically linked; the link is not drawn)\n", g, strings.Join(log.Gangs[g], ", "))
		}
	}
	var fired []string
	for _, h := range log.Hits {
		if h.N > 0 {
			fired = append(fired, fmt.Sprintf("%s %d", h.Rule, h.N))
		}
	}
	if len(fired) > 0 {
		fmt.Fprintf(w, "rules fired: %s\n", strings.Join(fired, ", "))
	}
	refused := len(log.Steps) - log.Applied()
	fmt.Fprintf(w, "parts %d → %d, nets %d → %d, %d step(s)", log.Before.Parts, log.After.Parts, log.Before.Nets, log.After.Nets, log.Applied())
	if refused > 0 {
		fmt.Fprintf(w, ", %d refused", refused)
	}
	fmt.Fprintln(w)
	if out != "" {
		fmt.Fprintf(w, "reduced netlist written to %s\n", out)
	}
	fmt.Fprintln(w, caution)
}

// stepJSON is a step with the places of its parts as file:line strings,
// parallel to refs (Step keeps graph.Pos out of its own JSON).
type stepJSON struct {
	rules.Step
	At []string `json:"at,omitempty"`
}

func stepsJSON(steps []rules.Step) []stepJSON {
	out := make([]stepJSON, 0, len(steps))
	for _, s := range steps {
		j := stepJSON{Step: s}
		for _, p := range s.Where {
			j.At = append(j.At, p.Short())
		}
		out = append(out, j)
	}
	return out
}

type reduceJSON struct {
	Level    string              `json:"level"`
	Steps    []stepJSON          `json:"steps"`
	Declined []stepJSON          `json:"declined"`
	Before   countJSON           `json:"before"`
	After    countJSON           `json:"after"`
	ACGround []string            `json:"ac_ground"`
	Gangs    map[string][]string `json:"gangs"`
	Hits     []rules.Hit         `json:"hits"`
	Caution  string              `json:"caution"`
	Circuit  string              `json:"circuit"`
}

type countJSON struct {
	Parts int `json:"parts"`
	Nets  int `json:"nets"`
}

func writeReduceJSON(w io.Writer, log *rules.Log, netlist, caution string) error {
	j := reduceJSON{
		Level: log.Level.String(), Steps: stepsJSON(log.Steps), Declined: stepsJSON(log.Declined),
		Before:   countJSON{log.Before.Parts, log.Before.Nets},
		After:    countJSON{log.After.Parts, log.After.Nets},
		ACGround: log.ACGround, Gangs: log.Gangs, Hits: log.Hits, Caution: caution, Circuit: netlist,
	}
	if j.ACGround == nil {
		j.ACGround = []string{}
	}
	if j.Gangs == nil {
		j.Gangs = map[string][]string{}
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(j)
}
