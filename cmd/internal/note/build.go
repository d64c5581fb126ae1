package note

import (
	"path/filepath"
	"slices"
	"sort"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
	"pare/graph/value"
	"pare/rules"
	"pare/rules/stages"
)

// Meta is what the note says that the pipeline does not know: the program
// version, the symbol standard's name, the sheet files beside the note,
// and why the verification was skipped when it was.
type Meta struct {
	Version       string
	Symbols       string // "IEC 60617" or "IEEE 315"
	Sheets        []Sheet
	VerifySkipped string // e.g. "--no-verify"; used when the comparison did not run
}

// FromResult fills a note from the pipeline's result, which must have run
// through PhaseStages.
func FromResult(r *pipeline.Result, m Meta) *Note {
	c, reduced, log := r.Circuit, r.Reduced, r.Log
	faded, _ := pipeline.FadedAndMerged(c, reduced)
	n := &Note{
		Title: r.Title, Source: filepath.Base(r.Path), Version: m.Version,
		Level: r.Level.String(), Symbols: m.Symbols,
		CircuitNote: c.Note,
		Furniture:   append(bandLine(c), pipeline.Furniture(c, r.Stages, r.Level)...),
		Warnings:    warningLines(r.Warnings),
		Sheets:      m.Sheets,
		Before:      PartCount{len(c.Parts), len(c.Nets)},
		After:       PartCount{len(reduced.Parts), len(reduced.Nets)},
		Removed:     sortedKeys(faded),
		Merged:      mergesOf(c, reduced),
		Drawn:       mergesOf(c, r.ReducedDrawn()),
		ACGround:    sortedCopy(log.ACGround),
		Gangs:       gangsOf(log.Gangs),
		Stages:      noteStages(r.Stages),
		StagesLimit: r.StagesLimit,
		Steps:       noteSteps(log.Steps),
		NearMisses:  noteSteps(log.Declined),
		Verify:      Verify{Skipped: m.VerifySkipped},
		Caution:     Caution{Heading: r.Caution.Heading, Lines: r.Caution.Lines, Basis: r.Caution.Basis()},
	}
	n.PartNotes, n.RemovedNotes = partNotes(c, reduced)
	if r.Verified {
		n.Verify = VerifyOf(r.Report, r.CompareErr, r.Compare)
		n.Verify.Rails = RailOutputs(r.Circuit)
	}
	n.DC = dcFrom(r)
	if r.Stages != nil {
		n.Align = r.AlignReaches().Build(r.Title, r.Circuit, r.Stages, r.Caution)
		n.Align.AddBands(r.Circuit, r.Stages, r.BandRun)
		n.Align.AddPresets(r.Circuit, r.DC, r.Stages)
		n.AlignMarks = alignMarks(n.Align, r.MarkedOn)
		n.OtherBands = otherBands(r)
	}
	return n
}

// VerifyOf turns the comparison into what the note and the summary say.
func VerifyOf(rep *ac.Report, err error, o ac.CompareOptions) Verify {
	v := Verify{TolDB: o.TolDB, TolDeg: o.TolDeg}
	if v.TolDB == 0 {
		v.TolDB = ac.DefaultTolDB // restated for the message
	}
	if v.TolDeg == 0 {
		v.TolDeg = ac.DefaultTolDeg
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
	v.Empty = rep.Empty()
	v.Notes = rep.Notes
	for _, p := range rep.Pairs {
		v.Pairs = append(v.Pairs, Pair{From: p.From, To: p.To, What: p.What, MaxDB: p.MaxDB, MaxDeg: p.MaxDeg,
			AtHz: p.AtHz, Setting: p.Setting, Error: p.Error, Bands: p.Bands})
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
// the original parts it stands for.
func mergesOf(orig, reduced *graph.Circuit) []Merge {
	var out []Merge
	for _, rp := range reduced.Parts {
		// Deduplicated: a netlist may name a part twice in from, or the
		// part itself ("RV1 stands for RV1, RV1" helps nobody).
		from := slices.Compact(sortedCopy(rp.Origins()))
		if len(from) == 0 || (len(from) == 1 && from[0] == rp.Ref) {
			continue
		}
		var inOrig []string
		for _, o := range from {
			if orig.Part(o) != nil {
				inOrig = append(inOrig, o)
			}
		}
		if len(inOrig) > 0 {
			out = append(out, Merge{Into: rp.Ref, From: sortedCopy(inOrig)})
		}
	}
	return out // reduced.Parts is sorted by ref, so this is too
}

func noteStages(found []stages.Stage) []Stage {
	out := make([]Stage, len(found))
	for i, s := range found {
		out[i] = Stage{
			Name: s.Name, Title: s.Title, Topology: s.Topology, Family: s.Family,
			Parts: s.Parts, Flags: s.Flags, Contains: s.Contains,
			Figures: figure.Line(s.Figures, figure.Text), // the same line `pare stages` prints
			Checks:  figure.Checks(s.Figures, figure.Text),
			Notes:   s.Notes,
		}
		if out[i].Figures == "" {
			// An oscillator found by its loop has its frequency in the
			// loop, not among its figures: the table showed "–" for it.
			out[i].Figures = loopLines(s.Loop)
		}
	}
	return out
}

// loopLines are a stage's loops as `pare stages` words them, one after
// another.
func loopLines(ls []stages.Loop) string {
	var out []string
	for _, l := range ls {
		out = append(out, stages.LoopLine(l))
	}
	return strings.Join(out, "; ")
}

func noteSteps(steps []rules.Step) []Step {
	out := make([]Step, len(steps))
	for i, s := range steps {
		// Refs and Where run in parallel: the parts concerned, each with
		// the place it was written (a part pare made has no place).
		var where []Place
		for j, ref := range s.Refs {
			at := ""
			if j < len(s.Where) && s.Where[j].IsValid() {
				at = shortPos(s.Where[j])
			}
			where = append(where, Place{Ref: ref, At: at})
		}
		out[i] = Step{
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

func gangsOf(g map[string][]string) []Gang {
	names := make([]string, 0, len(g))
	for k := range g {
		names = append(names, k)
	}
	sort.Strings(names)
	out := make([]Gang, len(names))
	for i, k := range names {
		out[i] = Gang{Name: k, Parts: sortedCopy(g[k])}
	}
	return out
}

func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func sortedCopy(s []string) []string {
	out := append([]string(nil), s...)
	sort.Strings(out)
	return out
}

// RailOutputs lists the declared outputs on a net that is AC ground by its
// role (a supply, heater or bias rail; ground is refused at load): the
// comparison skips them, so a reduction with such an output is never
// reported as verified.
func RailOutputs(c *graph.Circuit) []string {
	var out []string
	for _, n := range c.Outputs {
		if c.RoleOf(n).IsACGround() {
			out = append(out, n)
		}
	}
	return out
}
