// Package pipeline runs pare's one job: load a netlist, check it, reduce it
// (each step optionally proven by AC analysis), compare the reduced circuit
// with the original, recognise the stages and lay out the sheets. Every
// subcommand asks it for the phases it needs and prints from the one Result
// it returns, so the sheet `pare draw` writes and the sheet the main job
// writes are made by the same code from the same values.
//
// The pipeline never prints and never writes files; the commands do. Its
// errors carry the phase they come from, so each command can word them as
// it always has.
package pipeline

import (
	"context"
	"errors"
	"fmt"
	"path/filepath"
	"runtime/pprof"
	"sort"

	"pare/cmd/internal/align"
	"pare/graph"
	"pare/graph/ac"
	"pare/graph/dc"
	"pare/graph/safety"
	"pare/render"
	"pare/rules"
	"pare/rules/stages"
)

// Phase is one step of the pipeline, in the order they run.
type Phase int

// Phases. Options.Until names the last one to run; each runs only after
// every phase before it.
const (
	PhaseLoad   Phase = iota + 1 // read and parse the netlist
	PhaseCheck                   // transcription warnings (graph.Check)
	PhaseBias                    // the DC operating point, and the small-signal figures taken at it
	PhaseReduce                  // the rewrite rules, with the step checks asked for
	PhaseVerify                  // the AC comparison of the reduced circuit with the original
	PhaseStages                  // stage recognition on the reduced circuit
	PhaseSheets                  // sheets laid out and drawn as SVG
)

var phaseNames = [...]string{PhaseLoad: "load", PhaseCheck: "check", PhaseBias: "bias",
	PhaseReduce: "reduce",
	PhaseVerify: "verify", PhaseStages: "stages", PhaseSheets: "sheets"}

func (p Phase) String() string {
	if p > 0 && int(p) < len(phaseNames) {
		return phaseNames[p]
	}
	return fmt.Sprintf("Phase(%d)", int(p))
}

// StepCheck says how each tentative rewrite step is proven.
type StepCheck int

// Step checks. The zero value proves each step against the circuit before
// it: every command that shows a reduction (the main job, `stages`,
// `reduce`, `verify`, `draw`, `dc`, `sweep --reduced`) then works on the
// same reduced circuit, the one whose unsound steps were refused, so the
// figures `stages` prints are the main job's and `verify` judges what the
// main job judged. Only an explicit choice gives another reduction.
const (
	// AgainstPrevious compares the circuit after a step with the one
	// before it and refuses the step when they differ beyond tolerance
	// (the default).
	AgainstPrevious StepCheck = iota
	// AgainstOriginal compares the circuit after each step with the
	// original, so small changes cannot add up unseen, and keeps the worst
	// pair of every step (`verify --steps`).
	AgainstOriginal
	// NoStepCheck applies every step the rules offer (`--no-verify`,
	// `reduce --check=false`): a reduction nobody proved.
	NoStepCheck
)

// Options says what to run. The zero value of Until runs every phase.
type Options struct {
	Path  string // the netlist file
	Until Phase  // last phase to run; 0 means PhaseSheets
	// Positions sets switches (by ref) to a position other than the
	// netlist's, as if the set's knob were turned before the run: the
	// alignment of another band of a wavechange switch.
	Positions map[string]int
	// Switches turns switches to a position for this run (switches.go),
	// in place of the netlist's set.
	Switches []SwitchSetting
	// BandSets names, once the stages are found, the switch settings of
	// the other bands a later step will ask BandRun for (align.BandSets):
	// their runs start then, beside the drawing (bands.go).
	BandSets func(*graph.Circuit, []stages.Stage) []map[string]int
	// Loaded, when set, is called once the file is read, loaded or
	// refused, before any other phase: the command's moment to change
	// what suits loading (the collector, cmd/pare/main.go) back.
	Loaded func()
	// CircuitOnly says the command reads nothing of the result but the
	// circuit the bias phase leaves and its caution (pare sweep and pare
	// spice of the original): the check's warnings and notes are not
	// worked out (the check only reads the circuit, and for a set with no
	// input it searches for an oscillator's loop), and the operating point
	// is solved only when it can fill a figure in (dc.Fills); Result.DC
	// stays nil otherwise.
	CircuitOnly bool

	// Reduction.
	Level       rules.Level
	Focus       []string
	BypassRatio float64   // 0: rules.DefaultRatio
	StepCheck   StepCheck // zero: AgainstPrevious
	// wholeSteps proves each step on the whole circuit instead of the
	// groups it touched (local.go); tests set it to show both agree.
	wholeSteps bool
	// blockSteps solves each step proof's responses on their whole blocks
	// instead of the pieces the voltages read depend on
	// (ac.CompareOptions.ReadPieces); tests set it to show both agree.
	blockSteps bool

	// Verify runs the final comparison in PhaseVerify; Compare sets its
	// tolerances, sweep density and device settings, and those of the
	// step checks.
	Verify  bool
	Compare ac.CompareOptions

	// Stage recognition: extra patterns and the search budget (0: the
	// default).
	PatternDir string
	StageLimit int

	// Sheets to draw in PhaseSheets, in this order, in this symbol style.
	Views []render.View
	Style render.Style
	// Page is the paper the sheets are cut into rows and pages for; nil
	// draws each view as one sheet as wide as its drawing.
	Page *render.Paper
	// Fit, with Page nil, is the paper a view is cut onto when it is too
	// big for one sheet (FitWidths); a view that fits stays one sheet as
	// wide as its drawing. Nil with Page nil: always one sheet.
	Fit *render.Paper
}

// FitWidths is how long a view may be and stay one sheet under
// Options.Fit: printed with its text render.MinTextMM high, no wider than
// one of Fit's pages and no taller. A longer one flows into rows on Fit's
// pages, so every sheet a job writes prints at that text height on its
// paper: a single row of a section of a set (a frequency changer at
// 0.5–0.7 m on A3 at that scale) printed on one page was text under 2 mm,
// too small to read at the bench.
const FitWidths = 1

// Error is a failure of one phase. Its message is the underlying error's,
// unchanged, so a command prints what it printed before the pipeline
// existed; errors.As still finds a graph.ErrorList inside.
type Error struct {
	Phase Phase
	View  render.View // the sheet that failed, for PhaseSheets
	Err   error
}

func (e *Error) Error() string { return e.Err.Error() }
func (e *Error) Unwrap() error { return e.Err }

// Result is everything the pipeline made of one netlist. Fields of phases
// that did not run are zero.
type Result struct {
	opts  Options             // what the run was asked (BandRun reruns with them)
	bands map[string]*bandRun // the other bands' runs started beside the drawing
	// reaches are the alignment's reach searches on Circuit, shared by the
	// sheets' marks and the note's guide (AlignReaches).
	reaches *align.Reaches
	Path    string
	Title   string // the netlist's title, or its file name
	Circuit *graph.Circuit
	// Caution is chosen from the original circuit, before any reduction
	// takes its supplies and heaters away.
	Caution  safety.Caution
	Warnings graph.ErrorList
	// Notes are what the check found worth saying that is no mistake (a
	// circuit that makes its own signal needs no input): they do not fail
	// `check --strict`.
	Notes graph.ErrorList
	// base is the circuit the small-signal work starts from (acBase);
	// reservoirNotes say which estimated reservoirs it made supplies.
	base           *graph.Circuit
	reservoirNotes []string
	// Retuned are the declared bands a switch setting moved to the tanks
	// it switches in (graph.RetuneBands): the proof sweeps those.
	Retuned []graph.Retuned

	Level   rules.Level
	Reduced *graph.Circuit
	Log     *rules.Log
	// Steps holds, under AgainstOriginal, the comparison after each step
	// in log order; StepErr the first step comparison that could not run.
	Steps   []Step
	StepErr error

	// Verified is set when the final comparison ran; Report is its
	// outcome, or CompareErr why it could not be made.
	Verified   bool
	Compare    ac.CompareOptions
	Report     *ac.Report
	CompareErr error

	// DC is the operating point of the circuit as written, or DCErr why it
	// was not found (it runs before the reduction). Biased lists the
	// small-signal figures the AC model takes at that operating point
	// because the netlist gave a characteristic instead (dc.Point.Biased);
	// Circuit then carries them.
	DC     *dc.Point
	DCErr  error
	Biased []dc.Origin

	Stages []stages.Stage
	// StagesLimit is set when the stage search ran out of budget: the
	// stages found so far are sound, the list may be short.
	StagesLimit string

	Sheets []Sheet
}

// Run runs the phases up to o.Until. On an error the result holds what the
// phases before the failing one made (the warnings of a circuit that does
// not reduce, say).
func Run(o Options) (*Result, error) {
	until := o.Until
	if until == 0 {
		until = PhaseSheets
	}
	r := &Result{Path: o.Path, Level: o.Level, Compare: o.Compare, opts: o, reaches: align.NewReaches()}
	c, err := graph.LoadFile(o.Path)
	if o.Loaded != nil {
		o.Loaded()
	}
	if err != nil {
		return r, &Error{Phase: PhaseLoad, Err: err}
	}
	was := setAt(c)
	if err := setPositions(c, o.Positions); err != nil {
		return r, &Error{Phase: PhaseLoad, Err: err}
	}
	if err := applySwitches(c, o.Path, o.Switches); err != nil {
		return r, &Error{Phase: PhaseLoad, Err: err}
	}
	r.Retuned = c.RetuneBands(was)
	r.Circuit, r.Title, r.Caution = c, c.Title, safety.For(c)
	if r.Title == "" {
		r.Title = filepath.Base(o.Path)
	}
	phases := []struct {
		p  Phase
		fn func(*Result, Options) error
	}{
		{PhaseCheck, (*Result).check},
		{PhaseBias, (*Result).bias},
		{PhaseReduce, (*Result).reduce},
		{PhaseVerify, (*Result).verify},
		{PhaseStages, (*Result).recognise},
		{PhaseStages, (*Result).startBands},
		{PhaseSheets, (*Result).drawSheets},
	}
	for _, ph := range phases {
		if ph.p > until {
			break
		}
		if err := runPhase(ph.p, ph.fn, r, o); err != nil {
			return r, err
		}
	}
	return r, nil
}

// runPhase runs one phase with its name as a profiler label, which the
// goroutines it starts inherit: a CPU profile (PARE_CPUPROFILE) of the
// main job then tells the final proof's solves from the step proofs'
// (`go tool pprof -tagfocus phase=verify`), which run the same code on
// worker goroutines whose stacks do not say who started them.
func runPhase(p Phase, fn func(*Result, Options) error, r *Result, o Options) error {
	var err error
	pprof.Do(context.Background(), pprof.Labels("phase", p.String()), func(context.Context) {
		err = fn(r, o)
	})
	return err
}

func (r *Result) check(o Options) error {
	if o.CircuitOnly {
		return nil
	}
	r.Warnings = graph.Check(r.Circuit)
	r.Warnings = append(r.Warnings, undrivenWarnings(r.Circuit)...)
	r.Warnings.Sort()
	r.Notes = append(r.Notes, graph.CheckNotes(r.Circuit)...)
	r.weighNoInput()
	return nil
}

// bias solves the DC operating point before anything small-signal runs, so
// the one AC model takes a device's figures at its computed bias where the
// netlist gives only its characteristic. A circuit whose operating point is
// not found is used as written (the AC model's defaults apply, and `pare
// dc` says why); one that gives every figure is not touched.
func (r *Result) bias(o Options) error {
	if o.CircuitOnly && !dc.Fills(r.Circuit) {
		// Nothing to take at the bias: on the 10,000-section RC ladder
		// the solve was a twentieth of `pare sweep`.
		return nil
	}
	r.DC, r.DCErr = dc.Solve(r.Circuit)
	if r.DCErr != nil {
		r.warnUnsolved()
		return nil
	}
	if ws := r.labelWarnings(); len(ws) > 0 {
		r.Warnings = append(r.Warnings, ws...)
		r.Warnings.Sort()
	}
	if biased, filled := r.DC.Biased(); len(filled) > 0 {
		r.Circuit, r.Biased = biased, filled
	}
	return nil
}

// reduce is the one call of the rewrite engine in pare's commands.
func (r *Result) reduce(o Options) error {
	// The detectors' DC loads are the wiring's, not the reduced circuit's
	// (an AGC line grounded for the signal carries no DC): taken once here,
	// kept by every clone, so each step and the stage figures solve the
	// detector the original has.
	ac.KeepDetectorLoads(r.Circuit)
	ro := rules.Options{Level: o.Level, Focus: o.Focus, BypassRatio: o.BypassRatio}
	if o.StepCheck != NoStepCheck {
		ro.CheckStep = r.stepChecker(o.StepCheck, o.wholeSteps)
	}
	// Reduce promises not to touch its input; the clone keeps the original
	// pristine for the comparison and the faded sheet even if it slipped.
	reduced, log, err := rules.Reduce(r.acBase().Clone(), ro)
	if err != nil {
		return &Error{Phase: PhaseReduce, Err: err}
	}
	if log == nil {
		log = &rules.Log{Level: o.Level}
	}
	r.Reduced, r.Log = reduced, log
	numberSteps(r.Steps, log.Steps)
	return nil
}

func (r *Result) verify(o Options) error {
	if !o.Verify {
		return nil
	}
	r.Verified = true
	r.Report, r.CompareErr = r.compare(r.acBase(), r.Reduced, nil)
	if r.Report != nil {
		for _, t := range r.Retuned {
			r.Report.Notes = append(r.Report.Notes, t.String())
		}
		r.Report.Notes = append(r.Report.Notes, r.reservoirNotes...)
	}
	return nil
}

// recognise is the one call of the stage finder in pare's commands.
func (r *Result) recognise(o Options) error {
	var op *dc.Point // an operating point that was not found gives no figures
	if r.DCErr == nil {
		op = r.DC
	}
	found, err := stages.Find(r.Reduced, stages.Options{
		PatternDir: o.PatternDir, Full: r.Circuit, ACGround: r.Log.ACGround, Limit: o.StageLimit, DC: op})
	if errors.Is(err, stages.ErrSearchLimit) {
		r.StagesLimit = err.Error()
	} else if err != nil {
		return &Error{Phase: PhaseStages, Err: err}
	}
	r.Stages = found
	return nil
}

// compare is the one call of the AC comparison in pare's commands: the
// final proof and every step check go through it. The step checks against
// the previous circuit lend it their memo of solved responses and, since
// only their verdict counts, leave the deviation's rounding unrefined
// (ac.CompareOptions.AboveRounding) and solve each response on the piece
// of the circuit it reads (ac.CompareOptions.ReadPieces), so a response the
// step cannot reach is found in the memo; the final proof solves afresh on
// whole blocks and searches every peak.
func (r *Result) compare(orig, reduced *graph.Circuit, memo *ac.Memo) (*ac.Report, error) {
	o := r.Compare
	o.Memo = memo
	o.AboveRounding = memo != nil
	o.ReadPieces = memo != nil && !r.opts.blockSteps
	return ac.Compare(orig, reduced, o)
}

// setAt records each switch's position as the netlist sets it.
func setAt(c *graph.Circuit) map[string]int {
	out := map[string]int{}
	for _, p := range c.Parts {
		if p.Kind == graph.Switch {
			out[p.Ref] = int(p.Set)
		}
	}
	return out
}

// setPositions turns each named switch to its position.
func setPositions(c *graph.Circuit, pos map[string]int) error {
	refs := make([]string, 0, len(pos))
	for ref := range pos {
		refs = append(refs, ref)
	}
	sort.Strings(refs)
	for _, ref := range refs {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Switch || pos[ref] < 1 || pos[ref] > len(p.Closes) {
			return fmt.Errorf("%s: no switch with a position %d", ref, pos[ref])
		}
		p.Set = float64(pos[ref])
	}
	return nil
}
