package main

import (
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/graph/ac"
	"pare/graph/safety"
	"pare/graph/value"
	"pare/rules"
)

type verifyOpts struct {
	level  string
	json   bool
	tolDB  float64
	tolDeg float64
	steps  bool
	check  bool
	at     string
	points int
	term   termFlag
}

func init() {
	register(&command{
		name:    "verify",
		args:    "FILE [--level tidy|signal|ideal] [--json] [--tol-db 0.5] [--tol-deg 5] [--steps] [--check=false] [--at min|mid|max|FRACTION]",
		summary: "prove by AC analysis that the reduction keeps the signal behaviour",
		detail: `Reduces the circuit, then sweeps the original and the reduced circuit over
the bands of interest and prints, per pair, the worst deviation in dB and
degrees and the frequency where it occurs: the transfer from each declared
input to each output, each region's input to its output, and the impedance at
each input and port. A transfer is judged over its input's bands, an impedance
over its net's. Each band is swept at --points log-spaced frequencies and
refined around every peak of the responses and of the deviation.

Gang sections are checked at minimum, mid travel and maximum unless --at picks
one setting (min, mid, max or a fraction of the travel, 0 to 1).

The reduction judged is the main job's: each step proven against the circuit
before it, unsound steps refused (they are listed) and left out, so verify's
verdict is the main job's. --check=false judges the reduction with every step
applied unproven instead.

--steps compares the circuit with the original after every rewrite step and
prints one line per step with its worst pair (dB, degrees, frequency); the
engine refuses a step that breaks the tolerance, and verify names the first
such step. Exit status 1 when a pair is out of tolerance, under --steps a step
was refused, or the circuit cannot be solved (a floating net: "cannot be
solved: ..."); 2 for bad input or usage.

A group of nets reached only through ports (a mains primary on its ports) is
held at 0 V as an undriven source; --term on a port net models it otherwise.

The comparison is of the small-signal models only (documented in pare's
graph/ac package): it says nothing about DC conditions or safety.`,
		bind: typed(func(fs *flag.FlagSet, o *verifyOpts) {
			fs.StringVar(&o.level, "level", "signal", "reduction level: tidy, signal or ideal")
			fs.BoolVar(&o.json, "json", false, "print the report as JSON")
			finiteVar(fs, &o.tolDB, "tol-db", ac.DefaultTolDB, "tolerance on magnitude, dB")
			finiteVar(fs, &o.tolDeg, "tol-deg", ac.DefaultTolDeg, "tolerance on phase, degrees")
			fs.BoolVar(&o.check, "check", true, "prove each step against the circuit before it, as the main job does (false: judge the reduction with every step applied)")
			fs.BoolVar(&o.steps, "steps", false, "check after every rewrite step, print each step's worst deviation and name the first that breaks the tolerance")
			fs.StringVar(&o.at, "at", "", "gang setting: min, mid, max or a fraction 0..1 (default: all three)")
			fs.IntVar(&o.points, "points", 100, "log-spaced points per band before refinement")
			o.term = termFlag{}
			fs.Var(o.term, "term", "terminate a net: NET=OHMS to ground (repeatable; ports are open otherwise)")
		}, runVerify),
	})
}

// refusedStep is a rewrite step the comparison refused.
type refusedStep struct {
	N       int      `json:"n"`
	Rule    string   `json:"rule"`
	Refs    []string `json:"refs,omitempty"`
	Refused string   `json:"refused"`
}

// verifyJSON is the --json shape: the comparison report, plus the refused
// steps under --steps.
type verifyJSON struct {
	Pairs   []ac.Pair       `json:"pairs"`
	TolDB   float64         `json:"tolerance_db"`
	TolDeg  float64         `json:"tolerance_deg"`
	OK      bool            `json:"ok"`
	Notes   []string        `json:"notes,omitempty"`
	Level   string          `json:"level"`
	Refused []refusedStep   `json:"refused_steps,omitempty"`
	Error   string          `json:"error,omitempty"` // why nothing could be compared
	Steps   []pipeline.Step `json:"steps,omitempty"` // under --steps: the worst pair after each step
}

// reportUnsolvable reports a comparison that could not run. A stated
// termination naming no net is bad usage (exit 2); anything else (a
// floating net, a singular system) is a finding about a valid netlist,
// reported like a failed verification with exit 1, as the main job does.
func reportUnsolvable(e *env, path string, lvl rules.Level, cmp ac.CompareOptions, asJSON bool, caution string, err error) int {
	var list graph.ErrorList
	if errors.As(err, &list) {
		return reportErr(e, "pare verify", path, err)
	}
	msg := "cannot be solved: " + err.Error()
	if asJSON {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(verifyJSON{Pairs: []ac.Pair{}, TolDB: cmp.TolDB, TolDeg: cmp.TolDeg, Level: lvl.String(), Error: msg}); err != nil {
			fmt.Fprintf(e.stderr, "pare verify: %v\n", err)
			return exitBad
		}
		return exitFound
	}
	fmt.Fprintf(e.stdout, "%s: reduction at level %s against the original, tolerance %g dB, %g°\n", path, lvl, cmp.TolDB, cmp.TolDeg)
	fmt.Fprintf(e.stdout, "FAILED: the circuit %s\n", msg)
	fmt.Fprintln(e.stdout, caution)
	return exitFound
}

func runVerify(e *env, o *verifyOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare verify: give exactly one netlist file")
		return exitBad
	}
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare verify: %v\n", err)
		return exitBad
	}
	if !(o.tolDB > 0) || !(o.tolDeg > 0) {
		fmt.Fprintln(e.stderr, "pare verify: --tol-db and --tol-deg must be positive")
		return exitBad
	}
	if o.points < 2 || o.points > 100000 {
		fmt.Fprintf(e.stderr, "pare verify: --points %d: give 2 to 100000\n", o.points)
		return exitBad
	}
	setting, err := parseAt(o.at)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare verify: %v\n", err)
		return exitBad
	}
	path := args[0]
	setting.Terminate = o.term
	cmp := ac.CompareOptions{TolDB: o.tolDB, TolDeg: o.tolDeg, Points: o.points, Options: setting}
	po := pipeline.Options{Path: path, Until: pipeline.PhaseVerify, Level: lvl, Verify: true, Compare: cmp}
	switch {
	case o.steps:
		// Each step is judged against the original, not only against the
		// step before it, so small changes cannot add up unseen.
		po.StepCheck = pipeline.AgainstOriginal
	case !o.check:
		po.StepCheck = pipeline.NoStepCheck
	}
	res, err := e.pipeline(po)
	if loadFailed(e, path, err) {
		return exitBad
	}
	if err != nil {
		return reportReduceError(e, "verify", path, err)
	}
	caution := res.Caution.Report(safety.Comparison)
	if res.StepErr != nil {
		return reportUnsolvable(e, path, lvl, cmp, o.json, caution, res.StepErr)
	}
	if res.CompareErr != nil {
		return reportUnsolvable(e, path, lvl, cmp, o.json, caution, res.CompareErr)
	}
	return reportVerify(e, res, o, caution)
}

// reportVerify prints the comparison, with the refused steps and under
// --steps the per-step table, and returns 1 when it failed.
func reportVerify(e *env, res *pipeline.Result, o *verifyOpts, caution string) int {
	rep := res.Report
	var refused []refusedStep
	for _, s := range res.Log.Steps {
		if s.Refused != "" {
			refused = append(refused, refusedStep{N: s.N, Rule: s.Rule, Refs: s.Refs, Refused: s.Refused})
		}
	}
	// Nothing compared is not a pass: an output on a rail, or no ports,
	// proves nothing about the reduction.
	rails := note.RailOutputs(res.Circuit)
	code := exitOK
	// Under --steps a refused step is a step that broke the tolerance
	// against the original: the unchecked reduction fails. Otherwise a
	// refused step is the per-step proof at work, as in the main job: the
	// reduction judged is the one without it, and the verdict is the main
	// job's.
	if !rep.OK || o.steps && len(refused) > 0 || len(rep.Pairs) == 0 || len(rails) > 0 {
		code = exitFound
	}
	if o.json {
		out := verifyJSON{Pairs: rep.Pairs, TolDB: rep.TolDB, TolDeg: rep.TolDeg, OK: code == exitOK,
			Notes: rep.Notes, Level: res.Level.String(), Refused: refused, Steps: res.Steps}
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(out); err != nil {
			fmt.Fprintf(e.stderr, "pare verify: %v\n", err)
			return exitBad
		}
		return code
	}
	printVerify(e.stdout, res.Path, res.Level, rep, refused, o.steps, res.Steps, caution)
	for _, n := range rails {
		fmt.Fprintf(e.stdout, "NOT VERIFIED: output %s is a %s net, AC ground for the signal: nothing there can be compared\n", n, res.Circuit.RoleOf(n))
	}
	return code
}

// printSteps prints one line per checked step: its worst deviation from the
// original and whether the engine kept it.
func printSteps(w io.Writer, checks []pipeline.Step, tolDB, tolDeg float64) {
	if len(checks) == 0 {
		fmt.Fprintln(w, "no rewrite step to check")
		return
	}
	fmt.Fprintf(w, "after each step, the worst pair against the original (%d step(s) checked):\n", len(checks))
	refW, labelW := 0, 0
	for _, ck := range checks {
		refW = max(refW, len(strings.Join(ck.Refs, ",")))
		if ck.Worst != nil {
			labelW = max(labelW, len(ck.Worst.Label()))
		}
	}
	refW = min(refW, 24)
	worstN, worstScore := 0, -1.0
	for _, ck := range checks {
		refs := strings.Join(ck.Refs, ",")
		if len(refs) > refW {
			refs = refs[:refW-1] + "…"
		}
		verdict := "kept"
		if !ck.OK {
			verdict = "REFUSED"
		}
		if ck.Worst == nil {
			fmt.Fprintf(w, "  %3d  %-16s %-*s  nothing compared  %s\n", ck.N, ck.Rule, refW, refs, verdict)
			continue
		}
		p := *ck.Worst
		where := ac.FormatHz(p.AtHz)
		if p.Setting != "" {
			where += ", gang at " + p.Setting
		}
		if p.Error != "" {
			fmt.Fprintf(w, "  %3d  %-16s %-*s  %-*s  %s  %s\n", ck.N, ck.Rule, refW, refs, labelW, p.Label(), p.Error, verdict)
		} else {
			fmt.Fprintf(w, "  %3d  %-16s %-*s  %-*s  %8.3f dB %7.2f°  at %s  %s\n", ck.N, ck.Rule, refW, refs, labelW, p.Label(), p.MaxDB, p.MaxDeg, where, verdict)
		}
		if ck.OK {
			if s := math.Max(p.MaxDB/tolDB, p.MaxDeg/tolDeg); s > worstScore {
				worstN, worstScore = ck.N, s
			}
		}
	}
	if worstScore >= 0 {
		fmt.Fprintf(w, "closest to the tolerance among the kept steps: step %d\n", worstN)
	}
}

func printVerify(w io.Writer, path string, lvl rules.Level, rep *ac.Report, refused []refusedStep, steps bool, checks []pipeline.Step, caution string) {
	fmt.Fprintf(w, "%s: reduction at level %s against the original, tolerance %g dB, %g°\n", path, lvl, rep.TolDB, rep.TolDeg)
	width := 0
	for _, p := range rep.Pairs {
		width = max(width, len(p.Label()))
	}
	bad := 0
	for _, p := range rep.Pairs {
		verdict := "ok"
		if !p.Within(rep.TolDB, rep.TolDeg) {
			verdict = "OUT OF TOLERANCE"
			bad++
		}
		if p.Error != "" {
			fmt.Fprintf(w, "  %-*s  %s  %s\n", width, p.Label(), p.Error, verdict)
			continue
		}
		where := ac.FormatHz(p.AtHz)
		if p.Setting != "" {
			where += ", gang at " + p.Setting
		}
		fmt.Fprintf(w, "  %-*s  %8.3f dB %7.2f°  at %s  %s\n", width, p.Label(), p.MaxDB, p.MaxDeg, where, verdict)
	}
	for _, n := range rep.Notes {
		fmt.Fprintf(w, "  note: %s\n", n)
	}
	if !steps {
		for _, s := range refused {
			fmt.Fprintf(w, "refused: step %d, %s (%s): %s\n", s.N, s.Rule, strings.Join(s.Refs, ", "), s.Refused)
		}
		if len(refused) > 0 {
			fmt.Fprintf(w, "the per-step proof refused %d step(s); the pairs above are for the reduction without them, the one every command shows\n", len(refused))
		}
	}
	if steps {
		printSteps(w, checks, rep.TolDB, rep.TolDeg)
		if len(refused) == 0 {
			fmt.Fprintln(w, "every rewrite step kept the signal behaviour within tolerance")
		} else {
			first := refused[0]
			fmt.Fprintf(w, "first step to break the tolerance: step %d, %s (%s): %s\n", first.N, first.Rule, strings.Join(first.Refs, ", "), first.Refused)
			for _, s := range refused[1:] {
				fmt.Fprintf(w, "also refused: step %d, %s (%s): %s\n", s.N, s.Rule, strings.Join(s.Refs, ", "), s.Refused)
			}
			fmt.Fprintf(w, "the engine refused %d step(s); the pairs above are for the reduction without them\n", len(refused))
		}
	}
	switch {
	case bad > 0:
		fmt.Fprintf(w, "FAILED: %d of %d pair(s) out of tolerance\n", bad, len(rep.Pairs))
	case steps && len(refused) > 0:
		fmt.Fprintln(w, "FAILED: the unchecked reduction breaks the tolerance (see the refused steps)")
	case rep.Empty():
		fmt.Fprintln(w, "FAILED: "+ac.NothingComparable)
	default:
		fmt.Fprintf(w, "ok: all %d pair(s) within tolerance\n", len(rep.Pairs))
	}
	fmt.Fprintln(w, caution)
}

// termFlag collects --term NET=OHMS: a stated termination on a port or any
// other net, a resistance to ground (0 is a short). Ports are open otherwise.
type termFlag map[string]float64

func (t termFlag) String() string {
	names := make([]string, 0, len(t))
	for n := range t {
		names = append(names, n)
	}
	sort.Strings(names)
	var parts []string
	for _, n := range names {
		parts = append(parts, n+"="+value.Format(t[n], value.Ohm, value.Code))
	}
	return strings.Join(parts, ",")
}

func (t termFlag) Set(s string) error {
	net, ohms, ok := strings.Cut(s, "=")
	if !ok || net == "" {
		return fmt.Errorf("write a termination as NET=OHMS, e.g. aerial=75 or if_out=1M")
	}
	r, err := value.Parse(ohms, value.Ohm)
	if err != nil || r < 0 {
		return fmt.Errorf("termination %q: give a resistance such as 75, 600R or 1M", s)
	}
	t[net] = r
	return nil
}

// parseAt reads a gang setting: min, mid, max or a fraction of the travel.
// The empty string leaves the choice to the command (all three for verify,
// mid for sweeps).
func parseAt(s string) (ac.Options, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "":
		return ac.Options{}, nil
	case "min":
		return ac.Options{VarFrac: 0, VarSet: true}, nil
	case "mid":
		return ac.Options{VarFrac: 0.5, VarSet: true}, nil
	case "max":
		return ac.Options{VarFrac: 1, VarSet: true}, nil
	}
	f, err := strconv.ParseFloat(s, 64)
	if err != nil || !(f >= 0 && f <= 1) { // written so that NaN fails too
		return ac.Options{}, fmt.Errorf("--at %q: give min, mid, max or a fraction of the travel from 0 to 1", s)
	}
	return ac.Options{VarFrac: f, VarSet: true}, nil
}

// reportReduceError prints a reduction's failure the way a load failure
// is printed, and returns the exit code for bad input.
func reportReduceError(e *env, cmd, path string, err error) int {
	return reportErr(e, "pare "+cmd, path, err)
}

// circuitFor loads a file, takes the small-signal figures the netlist
// leaves open at its DC operating point (the same bias the main job, the
// reduction and the stage figures use) and reduces it when asked: the
// circuit sweep and spice work on, with the caution of the original set.
// A part left at the device model's default bias is said on standard
// error.
func circuitFor(e *env, cmd, path string, reduced bool, level string) (*graph.Circuit, safety.Caution, int) {
	// The original circuit is all the caller reads; the reduction also
	// reads the operating point (the rails a rectifier gives, acBase).
	po := pipeline.Options{Path: path, Until: pipeline.PhaseBias, CircuitOnly: !reduced}
	if reduced {
		lvl, err := rules.ParseLevel(level)
		if err != nil {
			// Said after the file loads, as it always was.
			if _, err := e.pipeline(pipeline.Options{Path: path, Until: pipeline.PhaseLoad}); loadFailed(e, path, err) {
				return nil, safety.Caution{}, exitBad
			}
			fmt.Fprintf(e.stderr, "pare %s: %v\n", cmd, err)
			return nil, safety.Caution{}, exitBad
		}
		po.Until, po.Level = pipeline.PhaseReduce, lvl
	}
	res, err := e.pipeline(po)
	if loadFailed(e, path, err) {
		return nil, safety.Caution{}, exitBad
	}
	if err != nil {
		return nil, safety.Caution{}, reportReduceError(e, cmd, path, err)
	}
	c := res.Circuit
	if reduced {
		c = res.Reduced
	}
	if msg := res.BiasNote(c); msg != "" {
		fmt.Fprintf(e.stderr, "pare %s: %s: %s\n", cmd, path, msg)
	}
	return c, res.Caution, exitOK
}
