package main

import (
	"errors"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/value"
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
}

func init() {
	register(&command{
		name:    mainJob,
		args:    "[-o DIR] [--level L] [--symbols iec|ieee] [--tol-db X] [--tol-deg X] [--no-verify] FILE",
		summary: "the whole job: reduce, verify, recognise stages, draw the sheets, write the repair note",
		detail: `Loads FILE and prints its transcription warnings, reduces it to its small-signal
path (every step checked by AC analysis; a step that changes the signal is
refused), compares the original with the reduced circuit by AC analysis,
recognises the stages, and writes into DIR (default: FILE without .toml, plus
.pare): reduced.toml, reduced.svg, faded.svg and notes.md, a repair note that
embeds the sheets. Everything is made in memory first; on bad input nothing is
written. Exit 0 when the reduction was verified, 1 when the verification
failed (the files are still written, and the note says so), 2 on bad input.
'pare FILE' is the same as 'pare run FILE'.`,
		flags: func(fs *flag.FlagSet) any {
			o := &runOpts{}
			fs.StringVar(&o.out, "o", "", "write the results into this directory")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce: tidy, signal or ideal")
			fs.StringVar(&o.symbols, "symbols", "iec", "symbol style of the sheets: iec (IEC 60617) or ieee (IEEE 315)")
			fs.Float64Var(&o.tolDB, "tol-db", 0, "verification tolerance in dB (0: the default 0.5 dB)")
			fs.Float64Var(&o.tolDeg, "tol-deg", 0, "verification tolerance in degrees (0: the default 5°)")
			fs.BoolVar(&o.noVerify, "no-verify", false, "skip the AC checks of each step and of the result")
			return o
		},
		run: runMain,
	})
}

// The files the main job writes, in the order they are written: the note
// last, since it links to the others.
const (
	fileReducedNetlist = "reduced.toml"
	fileReducedSheet   = "reduced.svg"
	fileFadedSheet     = "faded.svg"
	fileNote           = "notes.md"
)

// jobConfig is the main job's settings after the flags have been checked.
type jobConfig struct {
	level    rules.Level
	style    render.Style
	symbols  string // the style's standard, for the note
	compare  ac.CompareOptions
	noVerify bool
}

// outFile is one result file, complete in memory before anything is written.
type outFile struct {
	name string
	data []byte
}

// jobResult is what the main job made of one netlist.
type jobResult struct {
	files   []outFile
	verify  noteVerify
	summary []string // lines for stdout
}

func runMain(e *env, opts any, args []string) int {
	o := opts.(*runOpts)
	if len(args) != 1 {
		fmt.Fprintf(e.stderr, "pare %s: give exactly one netlist file\n", mainJob)
		return exitBad
	}
	cfg, err := configure(o)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	path := args[0]
	dir := o.out
	if dir == "" {
		dir = defaultOutDir(path)
	}
	if err := checkOutDir(path, dir); err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	c, ok := loadCircuit(e, path)
	if !ok {
		return exitBad
	}
	warnings := graph.Check(c)
	for _, w := range warnings {
		fmt.Fprintf(e.stderr, "%s: warning: %s\n", w.Pos, w.Msg)
	}
	res, err := mainJobOn(c, path, warnings, cfg)
	if err != nil {
		printErrors(e, "pare "+mainJob, path, err)
		return exitBad
	}
	names, err := writeResults(dir, res.files)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare %s: %v\n", mainJob, err)
		return exitBad
	}
	for _, l := range res.summary {
		fmt.Fprintln(e.stdout, l)
	}
	fmt.Fprintf(e.stdout, "wrote %s: %s\n", filepath.Clean(dir)+string(filepath.Separator), strings.Join(names, ", "))
	if res.verify.failed() {
		return exitFound
	}
	return exitOK
}

// writeResults writes each file atomically into dir, creating dir when it is
// missing. When a write fails in a directory this run created, the files
// already written and the directory are removed again, so a failed run never
// leaves a half-filled new directory behind.
func writeResults(dir string, files []outFile) ([]string, error) {
	_, statErr := os.Stat(dir)
	created := errors.Is(statErr, os.ErrNotExist)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var names []string
	for _, f := range files {
		if err := writeFileAtomic(filepath.Join(dir, f.name), f.data); err != nil {
			if created {
				for _, n := range names {
					os.Remove(filepath.Join(dir, n))
				}
				os.Remove(dir) // only succeeds when empty: nothing of anyone else's goes
			}
			return nil, fmt.Errorf("writing %s: %w", filepath.Join(dir, f.name), err)
		}
		names = append(names, f.name)
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
	return cfg, nil
}

// defaultOutDir is FILE without .toml plus .pare: examples/set.toml ->
// examples/set.pare.
func defaultOutDir(path string) string {
	return strings.TrimSuffix(path, ".toml") + ".pare"
}

// checkOutDir refuses an output directory that is a file, and one where a
// result file would overwrite the input netlist.
func checkOutDir(input, dir string) error {
	if st, err := os.Stat(dir); err == nil && !st.IsDir() {
		return fmt.Errorf("output %s exists and is not a directory", dir)
	}
	in, err := os.Stat(input)
	if err != nil {
		return nil // loadCircuit reports the missing input with its own message
	}
	for _, name := range []string{fileReducedNetlist, fileReducedSheet, fileFadedSheet, fileNote} {
		if st, err := os.Stat(filepath.Join(dir, name)); err == nil && os.SameFile(in, st) {
			return fmt.Errorf("output %s would overwrite the input netlist; choose another directory with -o", filepath.Join(dir, name))
		}
	}
	return nil
}

// mainJobOn runs the whole job on a loaded circuit and returns every result
// file in memory. It never modifies c and never touches the disk.
func mainJobOn(c *graph.Circuit, path string, warnings graph.ErrorList, cfg jobConfig) (*jobResult, error) {
	ro := rules.Options{Level: cfg.level}
	if !cfg.noVerify {
		cmp := cfg.compare
		ro.Check = func(before, after *graph.Circuit, _ *rules.Step) error { return cmp.Check(before, after) }
	}
	// Reduce promises not to touch its input; the clone keeps the original
	// pristine for the comparison and the faded sheet even if it slipped.
	reduced, log, err := rules.Reduce(c.Clone(), ro)
	if err != nil {
		return nil, fmt.Errorf("reducing: %w", err)
	}
	if log == nil {
		log = &rules.Log{}
	}

	res := &jobResult{}
	if cfg.noVerify {
		res.verify = noteVerify{Skipped: "--no-verify"}
	} else {
		rep, err := ac.Compare(c, reduced, cfg.compare)
		res.verify = verifyOf(rep, err, cfg.compare)
	}

	found, err := stages.Find(reduced, stages.Options{Full: c, ACGround: log.ACGround})
	stagesLimit := ""
	if errors.Is(err, stages.ErrSearchLimit) {
		// The stages found so far are sound; the note says the list may be
		// short rather than dropping what was found.
		stagesLimit = err.Error()
		res.summary = append(res.summary, "stages: search stopped early: "+stagesLimit)
	} else if err != nil {
		return nil, fmt.Errorf("recognising stages: %w", err)
	}

	var netlist strings.Builder
	// Written as `pare reduce` writes it: marked at the top as a reduction.
	if err := graph.Write(&netlist, annotated(reduced, cfg.level)); err != nil {
		return nil, fmt.Errorf("writing the reduced netlist: %w", err)
	}
	// A reduced netlist that does not load back is a bug in pare, not in the
	// input; catch it here rather than hand the user a broken file. %v, not
	// %w: the positions point into the generated file, not the user's.
	if _, err := graph.Parse(fileReducedNetlist, []byte(netlist.String())); err != nil {
		return nil, fmt.Errorf("internal error, please report: the reduced netlist does not load back: %v", err)
	}

	// The sheets are filled the same way `pare draw` fills them, so the
	// main job's sheets and a drawn view agree.
	faded, mergedInto := fadedAndMerged(c, reduced)
	furniture := sheetFurniture(c, found, cfg.level)
	title := c.Title
	if title == "" {
		title = filepath.Base(path)
	}
	rcfg := render.Config{Style: cfg.style}
	reducedSheet := &render.Sheet{
		Circuit: reduced, Title: title, View: render.Reduced,
		Frames: stageFrames(found, reduced, nil), Caution: sheetCaution, Furniture: furniture,
	}
	fadedSheet := &render.Sheet{
		Circuit: c, Title: title, View: render.Faded,
		Faded: faded, Merged: mergedInto,
		Frames: stageFrames(found, reduced, c), Caution: sheetCaution, Furniture: furniture,
	}
	var redSVG, fadedSVG strings.Builder
	if err := rcfg.Fprint(&redSVG, reducedSheet); err != nil {
		return nil, fmt.Errorf("drawing the reduced sheet: %w", err)
	}
	if err := rcfg.Fprint(&fadedSVG, fadedSheet); err != nil {
		return nil, fmt.Errorf("drawing the faded sheet: %w", err)
	}

	n := &note{
		Title: title, Source: filepath.Base(path), Version: version,
		Level: cfg.level.String(), Symbols: cfg.symbols,
		CircuitNote: c.Note, Furniture: append(bandLine(c), furniture...),
		Warnings: warningLines(warnings),
		Sheets: []noteSheet{
			{File: fileReducedSheet, Alt: "Reduced signal path of " + title,
				Caption: "Reduced view, small-signal only: the parts that shape the signal, framed by stage."},
			{File: fileFadedSheet, Alt: "Original circuit of " + title + " with the removed parts faded",
				Caption: "Faded view: the whole original circuit; parts the reduction removed are faded, merged parts are marked with the part they went into."},
		},
		Before:      partCount{len(c.Parts), len(c.Nets)},
		After:       partCount{len(reduced.Parts), len(reduced.Nets)},
		Removed:     sortedKeys(faded),
		Merged:      mergesOf(c, reduced),
		ACGround:    sortedCopy(log.ACGround),
		Gangs:       gangsOf(log.Gangs),
		Stages:      noteStages(found),
		StagesLimit: stagesLimit,
		Steps:       noteSteps(log.Steps),
		NearMisses:  noteSteps(log.Declined),
		Verify:      res.verify,
	}
	var md strings.Builder
	if err := writeNote(&md, n); err != nil {
		return nil, fmt.Errorf("writing the note: %w", err)
	}

	res.files = []outFile{
		{fileReducedNetlist, []byte(netlist.String())},
		{fileReducedSheet, []byte(redSVG.String())},
		{fileFadedSheet, []byte(fadedSVG.String())},
		{fileNote, []byte(md.String())},
	}
	res.summary = append(summaryLines(path, n, log, found, res.verify), res.summary...)
	return res, nil
}

// verifyOf turns the comparison into what the note and the summary say.
func verifyOf(rep *ac.Report, err error, o ac.CompareOptions) noteVerify {
	v := noteVerify{TolDB: o.TolDB, TolDeg: o.TolDeg}
	if v.TolDB == 0 {
		v.TolDB = 0.5 // the ac package's default, restated for the message
	}
	if v.TolDeg == 0 {
		v.TolDeg = 5
	}
	if err != nil {
		v.Err = err.Error()
		return v
	}
	if rep == nil {
		v.Err = "the comparison returned no report"
		return v
	}
	if rep.TolDB > 0 {
		v.TolDB = rep.TolDB
	}
	if rep.TolDeg > 0 {
		v.TolDeg = rep.TolDeg
	}
	v.OK = rep.OK
	v.Notes = rep.Notes
	for _, p := range rep.Pairs {
		v.Pairs = append(v.Pairs, notePair{From: p.From, To: p.To, What: p.What, MaxDB: p.MaxDB, MaxDeg: p.MaxDeg,
			AtHz: p.AtHz, Setting: p.Setting, Error: p.Error})
	}
	return v
}

// bandLine is the note's first header line; the sheets print the band in
// their title block.
func bandLine(c *graph.Circuit) []string {
	if c.Band.Max <= 0 {
		return nil
	}
	return []string{"Band " + value.FormatRange(c.Band, value.Hertz, value.Symbol)}
}

// mergesOf lists each reduced part that stands for more than itself, with
// the original parts it stands for, for the note.
func mergesOf(orig, reduced *graph.Circuit) []noteMerge {
	var out []noteMerge
	for _, rp := range reduced.Parts {
		from := rp.Origins()
		if len(from) == 1 && from[0] == rp.Ref {
			continue
		}
		var inOrig []string
		for _, o := range from {
			if orig.Part(o) != nil {
				inOrig = append(inOrig, o)
			}
		}
		if len(inOrig) > 0 {
			out = append(out, noteMerge{Into: rp.Ref, From: sortedCopy(inOrig)})
		}
	}
	return out // reduced.Parts is sorted by ref, so this is too
}

func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func noteStages(found []stages.Stage) []noteStage {
	out := make([]noteStage, len(found))
	for i, s := range found {
		ns := noteStage{
			Name: s.Name, Title: s.Title, Topology: s.Topology, Family: s.Family,
			Parts: s.Parts, Flags: s.Flags, Contains: s.Contains,
			Figures: figureLine(s.Figures), // the same line `pare stages` prints
		}
		out[i] = ns
	}
	return out
}

func noteSteps(steps []rules.Step) []noteStep {
	out := make([]noteStep, len(steps))
	for i, s := range steps {
		// Refs and Where run in parallel: the parts concerned, each with
		// the place it was written (a part pare made has no place).
		var where []notePlace
		for j, ref := range s.Refs {
			at := ""
			if j < len(s.Where) && s.Where[j].IsValid() {
				at = shortPos(s.Where[j])
			}
			where = append(where, notePlace{Ref: ref, At: at})
		}
		out[i] = noteStep{
			N: s.N, Rule: s.Rule, Removed: s.Removed, Merged: s.Merged, Result: s.Result,
			Joined: s.Joined, Grounded: s.Grounded, Pins: s.Pins, Added: s.Added, Dropped: s.Dropped,
			Why: s.Why, Refused: s.Refused, Where: where,
		}
	}
	return out
}

// shortPos prints file:line with the file's base name, so the note reads the
// same wherever pare was run from.
func shortPos(p graph.Pos) string {
	if p.File != "" {
		p.File = filepath.Base(p.File)
	}
	return p.Short()
}

func warningLines(ws graph.ErrorList) []string {
	out := make([]string, len(ws))
	for i, w := range ws {
		p := w.Pos
		if p.File != "" {
			p.File = filepath.Base(p.File)
		}
		out[i] = p.String() + ": " + w.Msg
	}
	return out
}

func gangsOf(g map[string][]string) []noteGang {
	names := make([]string, 0, len(g))
	for k := range g {
		names = append(names, k)
	}
	sort.Strings(names)
	out := make([]noteGang, len(names))
	for i, k := range names {
		out[i] = noteGang{Name: k, Parts: sortedCopy(g[k])}
	}
	return out
}

func sortedCopy(s []string) []string {
	out := append([]string(nil), s...)
	sort.Strings(out)
	return out
}

// summaryLines is what the main job prints: the counts, the stages, the
// verification with its worst deviation.
func summaryLines(path string, n *note, log *rules.Log, found []stages.Stage, v noteVerify) []string {
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

func verifySummary(v noteVerify) string {
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
	tol := fmt.Sprintf("tolerance %s dB / %s°", num(v.TolDB), num(v.TolDeg))
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
		return fmt.Sprintf("verification: %s, %s could not be solved: %s; %s", verdict, p.label(), p.Error, tol)
	}
	return fmt.Sprintf("verification: %s, worst %s dB / %s° (%s at %s); %s", verdict, num(p.MaxDB), num(p.MaxDeg),
		p.label(), value.Format(p.AtHz, value.Hertz, value.Symbol), tol)
}
