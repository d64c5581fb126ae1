package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"path/filepath"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/value"
	"pare/render"
	"pare/rules"
	"pare/rules/stages"
)

type drawOpts struct {
	out     string
	view    string
	symbols string
	focus   string
	level   string
}

func init() {
	register(&command{
		name:    "draw",
		args:    "FILE -o OUT.svg [--view reduced|full|faded] [--symbols iec|ieee] [--focus REF,...] [--level tidy|signal|ideal]",
		summary: "draw the signal-path sheet of a netlist as SVG",
		detail: `Draws one sheet: the reduced circuit (the default), the full original
circuit, or the original with the parts the reduction removed faded and the
parts it merged marked with the part they went into. Stages pare recognises
are framed and titled with their key figures. Signal runs left to right;
grounds and rails are drawn as local symbols at each pin.

--symbols chooses IEC 60617 (rectangle resistor, the default) or IEEE 315
(zig-zag resistor). --focus and --level are passed to the reduction (see
'pare help reduce'). A reduced sheet is a small-signal diagram only, not a
wiring diagram. The file is written whole or not at all.`,
		flags: func(fs *flag.FlagSet) any {
			o := &drawOpts{}
			fs.StringVar(&o.out, "o", "", "write the SVG to this file (- for standard output)")
			fs.StringVar(&o.view, "view", "reduced", "what to draw: reduced, full or faded")
			fs.StringVar(&o.symbols, "symbols", "iec", "symbol style: iec (IEC 60617) or ieee (IEEE 315)")
			fs.StringVar(&o.focus, "focus", "", "comma-separated refs or net names: reduce only the stage(s) around them")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce: tidy, signal or ideal")
			return o
		},
		run: runDraw,
	})
}

const drawUsage = "usage: pare draw FILE -o OUT.svg [--view reduced|full|faded] [--symbols iec|ieee] [--focus REF,...] [--level tidy|signal|ideal]"

func runDraw(e *env, opts any, args []string) int {
	o := opts.(*drawOpts)
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare draw: give exactly one netlist file")
		fmt.Fprintln(e.stderr, drawUsage)
		return exitBad
	}
	if o.out == "" {
		fmt.Fprintln(e.stderr, "pare draw: no output file: give -o OUT.svg (or -o - for standard output)")
		return exitBad
	}
	view, err := render.ParseView(o.view)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare draw: --view: %v\n", err)
		return exitBad
	}
	style, err := render.ParseStyle(o.symbols)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare draw: --symbols: %v\n", err)
		return exitBad
	}
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare draw: --level: %v\n", err)
		return exitBad
	}
	path := args[0]
	c, ok := loadCircuit(e, path)
	if !ok {
		return exitBad
	}
	ro := rules.Options{Level: lvl, Focus: splitRefs(o.focus)}
	sheet, err := drawSheet(c, path, view, ro)
	if err != nil {
		printErrors(e, "pare draw", path, err)
		return exitBad
	}
	cfg := render.Config{Style: style}
	if err := writeOutput(e, o.out, func(w io.Writer) error { return cfg.Fprint(w, sheet) }); err != nil {
		fmt.Fprintf(e.stderr, "pare draw: %s: %v\n", o.out, err)
		return exitBad
	}
	return exitOK
}

// drawSheet reduces the circuit (except for a full view without focus, which
// needs nothing but the circuit), finds its stages and fills the sheet.
func drawSheet(c *graph.Circuit, path string, view render.View, ro rules.Options) (*render.Sheet, error) {
	title := c.Title
	if title == "" {
		title = filepath.Base(path)
	}
	reduced, log, err := rules.Reduce(c, ro)
	if err != nil {
		return nil, err
	}
	found, err := stages.Find(reduced, stages.Options{Full: c, ACGround: log.ACGround})
	if err != nil && !errors.Is(err, stages.ErrSearchLimit) {
		return nil, fmt.Errorf("recognising stages: %w", err)
	}
	s := &render.Sheet{Title: title, View: view, Caution: drawCaution, Furniture: sheetFurniture(c, found, ro.Level)}
	switch view {
	case render.Reduced:
		s.Circuit = reduced
		s.Frames = stageFrames(found, reduced, nil)
	case render.Full:
		s.Circuit = c
		s.Frames = stageFrames(found, reduced, c)
	case render.Faded:
		s.Circuit = c
		s.Faded, s.Merged = fadedAndMerged(c, reduced)
		s.Frames = stageFrames(found, reduced, c)
	}
	return s, nil
}

// drawCaution is the sheet's one-line caution; the renderer adds
// "small-signal only" to reduced views.
const drawCaution = "Caution: mains and valve HT can kill; capacitors stay charged and the chassis may be live. " +
	"Use an isolation transformer and follow local codes and licensed practice."

// fadedAndMerged compares the original with the reduced circuit through the
// reduced parts' origins: an original part no reduced part stands for was
// removed (faded); one that a reduced part of another ref stands for was
// merged into it.
func fadedAndMerged(orig, reduced *graph.Circuit) (map[string]bool, map[string]string) {
	kept := map[string]bool{}
	merged := map[string]string{}
	for _, rp := range reduced.Parts {
		for _, o := range rp.Origins() {
			kept[o] = true
			if o != rp.Ref {
				merged[o] = rp.Ref
			}
		}
	}
	faded := map[string]bool{}
	for _, p := range orig.Parts {
		if !kept[p.Ref] {
			faded[p.Ref] = true
		}
	}
	return faded, merged
}

// stageFrames makes one frame per top-level stage (sub-stages would draw
// frames inside frames). On a sheet of the original circuit (full not nil) a
// frame holds the original parts its reduced parts stand for.
func stageFrames(found []stages.Stage, reduced, full *graph.Circuit) []render.Frame {
	sub := map[string]bool{}
	for _, s := range found {
		for _, c := range s.Contains {
			sub[c] = true
		}
	}
	var frames []render.Frame
	for _, s := range found {
		if sub[s.Name] {
			continue
		}
		set := map[string]bool{}
		for _, ref := range s.Parts {
			rp := reduced.Part(ref)
			switch {
			case full == nil && rp != nil:
				set[ref] = true
			case full != nil && rp != nil:
				for _, o := range rp.Origins() {
					if full.Part(o) != nil {
						set[o] = true
					}
				}
			case full != nil && full.Part(ref) != nil:
				set[ref] = true
			}
		}
		if len(set) == 0 {
			continue
		}
		parts := make([]string, 0, len(set))
		for ref := range set {
			parts = append(parts, ref)
		}
		sort.Strings(parts)
		frames = append(frames, render.Frame{Title: s.Name + " " + s.Title, Subtitle: frameFigures(s.Figures, 2), Parts: parts})
	}
	return frames
}

// frameFigures prints up to n figures for a frame's second line: the ones a
// repairer checks first (oscillator and signal range, resonance, IF,
// bandwidth, gain, then time constants), with a min/max pair shown as one
// range ("osc f 1.004–2.063 MHz").
func frameFigures(figs map[string]float64, n int) string {
	type entry struct {
		rank int
		name string
		key  string
		text string
	}
	var list []entry
	keys := make([]string, 0, len(figs))
	for k := range figs {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		base, unit := splitFigure(k)
		if strings.HasSuffix(base, "_max") {
			if _, paired := figs[strings.TrimSuffix(base, "_max")+"_min"+unit]; paired {
				continue // shown with its _min
			}
		}
		text := stages.FigureText(k, figs[k])
		name := base
		if lo, ok := strings.CutSuffix(base, "_min"); ok {
			// Only a min with its max is a range; a lone min (the gain
			// needed to oscillate) keeps its own name.
			if hi, paired := figs[lo+"_max"+unit]; paired {
				name = lo
				text = stages.FigureText(k, figs[k]) + "–" + stages.FigureText(k, hi)
			}
		}
		list = append(list, entry{figureRank(name), name, name + unit, text})
	}
	sort.SliceStable(list, func(i, j int) bool { return list[i].rank < list[j].rank })
	seen := map[string]bool{}
	kept := list[:0]
	for _, e := range list {
		if !seen[e.name] { // gain and gain_db say the same thing once
			seen[e.name] = true
			kept = append(kept, e)
		}
	}
	list = kept
	if len(list) > n {
		list = list[:n]
	}
	out := make([]string, len(list))
	for i, e := range list {
		label := strings.ReplaceAll(e.name, "_", " ")
		if w, ok := stages.FigureName(e.key); ok {
			label = w // the same words as pare stages prints
		}
		out[i] = label + " " + e.text
	}
	return strings.Join(out, ", ")
}

// frameFigureOrder lists figure names (without unit suffix) in the order a
// repairer looks for them on a stage (common practice).
var frameFigureOrder = []string{"osc_f", "sig_f", "f", "f1", "if", "ift_f", "bw", "gain", "gain_unloaded", "load_f", "tau", "f_c", "c"}

func figureRank(name string) int {
	for i, n := range frameFigureOrder {
		if n == name {
			return i
		}
	}
	return len(frameFigureOrder)
}

// splitFigure parts a figure key into its name and its unit suffix.
func splitFigure(k string) (string, string) {
	for _, unit := range []string{"_hz", "_s", "_ohm", "_f", "_h", "_v", "_db"} {
		if strings.HasSuffix(k, unit) {
			return strings.TrimSuffix(k, unit), unit
		}
	}
	return k, ""
}

// sheetFurniture is the sheet's information block: band, regions, named
// frequencies, tuning ranges and the reduction level.
func sheetFurniture(c *graph.Circuit, found []stages.Stage, lvl rules.Level) []string {
	var lines []string
	for _, r := range c.Regions {
		if r.Band.Max > 0 {
			lines = append(lines, "Region "+r.Name+": "+value.FormatRange(r.Band, value.Hertz, value.Symbol))
		}
	}
	names := make([]string, 0, len(c.Freqs))
	for k := range c.Freqs {
		names = append(names, k)
	}
	sort.Strings(names)
	for _, k := range names {
		label := k
		if strings.EqualFold(k, "if") {
			label = "IF"
		}
		lines = append(lines, label+" "+value.Format(c.Freqs[k], value.Hertz, value.Symbol))
	}
	for _, s := range found {
		lo, okLo := s.Figures["f_min_hz"]
		hi, okHi := s.Figures["f_max_hz"]
		if okLo && okHi && hi > lo {
			lines = append(lines, "Tuning "+s.Name+": "+value.FormatRange(value.Range{Min: lo, Max: hi}, value.Hertz, value.Symbol))
		}
	}
	// A reduced sheet holds for one setting of each switch only (the
	// reduction replaces a switch by the contacts closed in its set
	// position), so the sheet says which.
	for _, p := range c.Parts {
		if p.Kind == graph.Switch {
			lines = append(lines, fmt.Sprintf("Switch %s at position %d of %d", p.Ref, int(p.Set), len(p.Closes)))
		}
	}
	return append(lines, "Reduction level "+lvl.String())
}
