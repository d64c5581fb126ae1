package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"math"
	"path/filepath"
	"strings"

	"pare/cmd/internal/align"
	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/graph/ac"
	"pare/graph/value"
	"pare/internal/outfile"
	"pare/render"
	"pare/rules"
	"pare/rules/stages"
)

type runOpts struct {
	out      string
	level    string
	symbols  string
	tolDB    float64
	tolDeg   float64
	noVerify bool
	page     string
}

func init() {
	register(&command{
		name:    mainJob,
		args:    "[-o DIR] [--level L] [--symbols iec|ieee] [--page auto|A4|A3|letter|none] [--tol-db X] [--tol-deg X] [--no-verify] FILE_OR_DIR...",
		summary: "the whole job: reduce, verify, recognise stages, draw the sheets, write the repair note",
		detail: `Loads FILE and prints its transcription warnings, reduces it to its small-signal
path (every step checked by AC analysis; a step that changes the signal is
refused), compares the original with the reduced circuit by AC analysis,
recognises the stages, and writes into DIR (default: FILE without .toml, plus
.pare): reduced.toml, reduced.svg, faded.svg and notes.md, a repair note that
embeds the sheets, and notes.html, the same note as one page with the sheets
inline (prints one sheet per page). --page fits the sheets to paper (see
'pare help draw'): reduced-1.svg, reduced-2.svg ..., faded-1.svg ... By
default (--page auto) a view that fits one A3 page with its text 2.5 mm high
stays one sheet, and a longer one flows into rows on A3 pages; --page none
keeps every view one sheet. Everything is made in memory first; on bad input nothing is
written. Exit 0 when the reduction was verified, 1 when the verification
failed or compared nothing (the files are still written, and the note says so),
2 on bad input, 3 on an internal error. The folder DIR is replaced whole, in
one step; a folder holding files pare did not write is refused.
'pare FILE' is the same as 'pare run FILE'.

Given several files, or a folder (every .toml under it), it runs the job on
each set, as many at a time as there are cores, each into its own pack
(SET.pare beside the file, or DIR/SET.pare with -o), and writes an index of
all packs, index.md and index.html, into DIR (or the folder the inputs have
in common). A set that fails never stops the others; the exit status is the
worst of all sets. The printed reports come in the order of the inputs,
whatever order the sets finish in; on a terminal a progress line counts them.`,
		bind: typed(func(fs *flag.FlagSet, o *runOpts) {
			fs.StringVar(&o.out, "o", "", "write the results into this directory")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce: tidy, signal or ideal")
			fs.StringVar(&o.symbols, "symbols", "iec", "symbol style of the sheets: iec (IEC 60617) or ieee (IEEE 315)")
			finiteVar(fs, &o.tolDB, "tol-db", 0, "verification tolerance in dB (0: the default 0.5 dB)")
			finiteVar(fs, &o.tolDeg, "tol-deg", 0, "verification tolerance in degrees (0: the default 5°)")
			fs.BoolVar(&o.noVerify, "no-verify", false, "skip the AC checks of each step and of the result")
			fs.StringVar(&o.page, "page", autoPage, pageHelp)
		}, runMain),
	})
}

// The files the main job writes, in the order they are written: the note
// last, since it links to the others.
const (
	fileReducedNetlist = "reduced.toml"
	fileReducedSheet   = "reduced.svg"
	fileFadedSheet     = "faded.svg"
	fileNote           = "notes.md"
	fileNoteHTML       = "notes.html" // the same note, sheets inline, for a browser and for print
)

// jobConfig is the main job's settings after the flags have been checked.
type jobConfig struct {
	level    rules.Level
	style    render.Style
	symbols  string // the style's standard, for the note
	compare  ac.CompareOptions
	noVerify bool
	paging   paging // the paper the sheets go on, or none
}

// outFile is one result file, complete in memory before anything is written.
type outFile struct {
	name string
	data []byte
}

// jobResult is what the main job made of one netlist.
type jobResult struct {
	files   []outFile
	verify  note.Verify
	summary []string // lines for stdout
	// before and after count the parts and nets, for the batch index
	before, after note.PartCount
}

func runMain(e *env, o *runOpts, args []string) int {
	if len(args) == 0 {
		fmt.Fprintf(e.stderr, "pare %s: give exactly one netlist file, or several files and folders\n", mainJob)
		return exitBad
	}
	cfg, err := configure(o)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	if len(args) > 1 || isDir(args[0]) {
		return runBatch(e, o.out, cfg, args)
	}
	path := args[0]
	dir := o.out
	if dir == "" {
		dir = defaultOutDir(path)
	}
	code, _ := oneJob(e, path, dir, cfg)
	return code
}

// pack is what the batch index says about one set.
type pack struct {
	path, dir string
	title     string
	before    note.PartCount
	after     note.PartCount
	stages    int
	verdict   string // the verification summary line
	code      int
}

// oneJob runs the main job on one netlist into dir, printing as the main
// job always has, and returns its exit code and what the index needs.
func oneJob(e *env, path, dir string, cfg jobConfig) (int, pack) {
	pk := pack{path: path, dir: dir, title: filepath.Base(path)}
	if err := checkOutDir(path, dir); err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		pk.code = exitBad
		return exitBad, pk
	}
	pr, err := e.pipeline(jobOptions(path, cfg))
	if loadFailed(e, path, err) {
		pk.code = exitBad
		return exitBad, pk
	}
	pk.title = pr.Title
	for _, w := range pr.Warnings {
		fmt.Fprintf(e.stderr, "%s: warning: %s\n", w.Pos, w.Msg)
	}
	var res *jobResult
	if err == nil {
		noteSmallText(e, "pare "+mainJob, pr.Sheets)
		res, err = mainJobOn(pr, cfg)
	}
	if err != nil {
		code := reportErr(e, "pare "+mainJob, path, jobError(err))
		pk.code = code
		return code, pk
	}
	names, err := writeResults(dir, path, res.files)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		pk.code = exitBad
		return exitBad, pk
	}
	for _, l := range res.summary {
		fmt.Fprintln(e.stdout, l)
	}
	fmt.Fprintf(e.stdout, "wrote %s: %s\n", filepath.Clean(dir)+string(filepath.Separator), strings.Join(names, ", "))
	pk.before, pk.after, pk.stages = res.before, res.after, len(pr.Stages)
	pk.verdict = res.summary[len(res.summary)-1]
	if pr.StagesLimit != "" {
		pk.verdict = res.summary[len(res.summary)-2]
	}
	if res.verify.Failed() {
		pk.code = exitFound
		return exitFound, pk
	}
	return exitOK, pk
}

// jobOptions is the whole pipeline as the main job runs it: every step
// proven against the one before it, the result against the original, and
// the reduced and faded sheets drawn.
func jobOptions(path string, cfg jobConfig) pipeline.Options {
	po := pipeline.Options{Path: path, Level: cfg.level, Verify: !cfg.noVerify, Compare: cfg.compare,
		Views: []render.View{render.Reduced, render.Faded}, Style: cfg.style, Page: cfg.paging.page, Fit: cfg.paging.fit,
		BandSets: align.BandSets}
	if cfg.noVerify {
		po.StepCheck = pipeline.NoStepCheck
	}
	return po
}

// jobError words a pipeline failure the way the main job always has: which
// step of the job failed.
func jobError(err error) error {
	var pe *pipeline.Error
	if !errors.As(err, &pe) {
		return err
	}
	switch pe.Phase {
	case pipeline.PhaseReduce:
		return fmt.Errorf("reducing: %w", err)
	case pipeline.PhaseStages:
		return fmt.Errorf("recognising stages: %w", err)
	case pipeline.PhaseSheets:
		return fmt.Errorf("drawing the %s sheet: %w", pe.View, err)
	}
	return err
}

// writeResults replaces dir with a folder holding exactly these files,
// in one step (outfile.WriteDir): a failure or a kill at any moment leaves
// the previous results whole, or no folder when there was none.
func writeResults(dir, input string, files []outFile) ([]string, error) {
	list := make([]outfile.File, len(files))
	names := make([]string, len(files))
	for i, f := range files {
		list[i] = outfile.File{Name: f.name, Data: f.data}
		names[i] = f.name
	}
	// a previous run on other paper may have drawn more or fewer pages
	if err := outfile.WriteDirLike(dir, list, []string{pagedReducedSheets, pagedFadedSheets}, input); err != nil {
		return nil, err
	}
	return names, nil
}

func configure(o *runOpts) (jobConfig, error) {
	var cfg jobConfig
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		return cfg, fmt.Errorf("--level: %w", err)
	}
	cfg.level = lvl
	switch strings.ToLower(o.symbols) {
	case "iec":
		cfg.style, cfg.symbols = render.IEC, "IEC 60617"
	case "ieee":
		cfg.style, cfg.symbols = render.IEEE, "IEEE 315"
	default:
		return cfg, fmt.Errorf("--symbols: %q is not a symbol style (iec or ieee)", o.symbols)
	}
	for _, t := range []struct {
		name string
		v    float64
	}{{"--tol-db", o.tolDB}, {"--tol-deg", o.tolDeg}} {
		if t.v < 0 || math.IsNaN(t.v) || math.IsInf(t.v, 0) {
			return cfg, fmt.Errorf("%s: %v is not a tolerance (a number ≥ 0; 0 picks the default)", t.name, t.v)
		}
	}
	cfg.compare = ac.CompareOptions{TolDB: o.tolDB, TolDeg: o.tolDeg}
	cfg.noVerify = o.noVerify
	cfg.paging, err = parsePage(o.page)
	return cfg, err
}

// defaultOutDir is FILE without .toml plus .pare: examples/set.toml ->
// examples/set.pare.
func defaultOutDir(path string) string {
	return strings.TrimSuffix(path, ".toml") + ".pare"
}

// mainJobOn turns the pipeline's result into the job's files, in memory,
// and the summary it prints. It never touches the disk.
func mainJobOn(pr *pipeline.Result, cfg jobConfig) (*jobResult, error) {
	netlist, err := pr.ReducedNetlist()
	if err != nil {
		return nil, err
	}
	redFiles, redEntries := sheetFiles(pr.SheetFor(render.Reduced), fileReducedSheet, note.Sheet{
		View: note.ViewReduced, Alt: "Reduced signal path of " + pr.Title,
		Caption: "Reduced view, small-signal only: the parts that shape the signal, framed by stage."})
	fadedFiles, fadedEntries := sheetFiles(pr.SheetFor(render.Faded), fileFadedSheet, note.Sheet{
		View: note.ViewFaded, Alt: "Original circuit of " + pr.Title + " with the removed parts faded",
		Caption: "Faded view: the whole original circuit; parts the reduction removed are faded, merged parts are marked with the part they went into."})
	sheets := append(redFiles, fadedFiles...)
	m := note.Meta{Version: version, Symbols: cfg.symbols, VerifySkipped: "--no-verify",
		Sheets: append(redEntries, fadedEntries...)}
	n := note.FromResult(pr, m)
	var md bytes.Buffer
	if err := note.Write(&md, n); err != nil {
		return nil, fmt.Errorf("writing the note: %w", err)
	}
	var page bytes.Buffer
	svgs := map[string][]byte{}
	for _, f := range sheets {
		svgs[f.name] = f.data
	}
	if err := note.WriteHTML(&page, n, svgs); err != nil {
		return nil, fmt.Errorf("writing the HTML note: %w", err)
	}
	res := &jobResult{
		verify: n.Verify,
		files: append(append([]outFile{{fileReducedNetlist, netlist}}, sheets...),
			outFile{fileNote, md.Bytes()}, outFile{fileNoteHTML, page.Bytes()}),
	}
	res.summary = summaryLines(pr.Path, n, pr.Log, pr.Stages, res.verify)
	res.before, res.after = n.Before, n.After
	if pr.StagesLimit != "" {
		// The stages found so far are sound; the note says the list may be
		// short rather than dropping what was found.
		res.summary = append(res.summary, "stages: search stopped early: "+pr.StagesLimit)
	}
	return res, nil
}

// summaryLines is what the main job prints: the counts, the stages, the
// verification with its worst deviation.
func summaryLines(path string, n *note.Note, log *rules.Log, found []stages.Stage, v note.Verify) []string {
	refused := 0
	for _, s := range log.Steps {
		if s.Refused != "" {
			refused++
		}
	}
	lines := []string{fmt.Sprintf("%s: %d parts, %d nets → %d parts, %d nets (level %s, %d steps applied, %d refused)",
		path, n.Before.Parts, n.Before.Nets, n.After.Parts, n.After.Nets, n.Level, len(log.Steps)-refused, refused)}
	// Top-level stages only, each with the names of its sub-stages: the
	// note's table has the rest.
	sub := map[string]bool{}
	for _, s := range found {
		for _, c := range s.Contains {
			sub[c] = true
		}
	}
	var names []string
	for _, s := range found {
		if sub[s.Name] {
			continue
		}
		t := s.Name + " " + s.Title
		if len(s.Contains) > 0 {
			t += " (with " + strings.Join(s.Contains, ", ") + ")"
		}
		names = append(names, t)
	}
	// A summary is read on a terminal: past a screenful of stages, name the
	// first few and send the reader to the note.
	const shown = 8
	switch {
	case len(names) == 0:
		lines = append(lines, "stages: none recognised")
	case len(names) > shown:
		lines = append(lines, fmt.Sprintf("stages: %s; … %d stages in all, listed in notes.md", strings.Join(names[:shown], "; "), len(names)))
	default:
		lines = append(lines, "stages: "+strings.Join(names, "; "))
	}
	lines = append(lines, verifySummary(v))
	return lines
}

func verifySummary(v note.Verify) string {
	switch {
	case v.Skipped != "":
		return "verification: not run (" + v.Skipped + ")"
	case v.Err != "":
		return "verification: FAILED, could not compare: " + v.Err
	}
	verdict := "ok"
	if !v.OK {
		verdict = "FAILED"
	}
	tol := fmt.Sprintf("tolerance %s dB / %s°", note.Num(v.TolDB), note.Num(v.TolDeg))
	if len(v.Rails) > 0 {
		return "verification: NOT VERIFIED, output " + strings.Join(v.Rails, ", ") + " on a rail cannot be compared; " + tol
	}
	if len(v.Pairs) == 0 {
		return "verification: " + verdict + ", no port pair compared; " + tol
	}
	// The worst pair is the one closest to (or furthest past) its tolerance.
	worst, score := 0, -1.0
	for i, p := range v.Pairs {
		s := math.Max(p.MaxDB/v.TolDB, p.MaxDeg/v.TolDeg)
		if p.Error != "" {
			s = math.Inf(1)
		}
		if s > score {
			worst, score = i, s
		}
	}
	p := v.Pairs[worst]
	if p.Error != "" {
		return fmt.Sprintf("verification: %s, %s could not be solved: %s; %s", verdict, p.Label(), p.Error, tol)
	}
	return fmt.Sprintf("verification: %s, worst %s dB / %s° (%s at %s); %s", verdict, note.Num(p.MaxDB), note.Num(p.MaxDeg),
		p.Label(), value.Format(p.AtHz, value.Hertz, value.Symbol), tol)
}
