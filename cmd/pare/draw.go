package main

import (
	"errors"
	"flag"
	"fmt"
	"io"

	"pare/cmd/internal/pipeline"
	"pare/render"
	"pare/rules"
)

type drawOpts struct {
	out     string
	view    string
	symbols string
	focus   string
	level   string
	page    string
}

func init() {
	register(&command{
		name:    "draw",
		args:    "FILE -o OUT.svg [--view reduced|full|faded] [--symbols iec|ieee] [--page auto|A4|A3|letter|none] [--focus REF,...] [--level tidy|signal|ideal]",
		summary: "draw the signal-path sheet of a netlist as SVG",
		detail: `Draws one sheet: the reduced circuit (the default), the full original
circuit, or the original with the parts the reduction removed faded and the
parts it merged marked with the part they went into. Stages pare recognises
are framed and titled with their key figures. Signal runs left to right;
grounds and rails are drawn as local symbols at each pin.

--symbols chooses IEC 60617 (rectangle resistor, the default) or IEEE 315
(zig-zag resistor). --focus and --level are passed to the reduction (see
'pare help reduce'). A reduced sheet is a small-signal diagram only, not a
wiring diagram. The file is written whole or not at all.

--page fits the sheet to paper (landscape) with text at least 2.5 mm high:
the stages flow into rows, with a pair of labelled off-row connectors where a
net runs on in the next row, and the rows onto further sheets, each with a
title block and the caution. The pages go to OUT-1.svg, OUT-2.svg ...
By default (--page auto) a sheet that fits one A3 page at that text height
stays one sheet in OUT.svg, and a longer one flows into rows on A3 pages;
standard output (-o -) takes a drawing of one page only. --page none always
draws one long sheet.`,
		bind: typed(func(fs *flag.FlagSet, o *drawOpts) {
			fs.StringVar(&o.out, "o", "", "write the SVG to this file (- for standard output)")
			fs.StringVar(&o.view, "view", "reduced", "what to draw: reduced, full or faded")
			fs.StringVar(&o.symbols, "symbols", "iec", "symbol style: iec (IEC 60617) or ieee (IEEE 315)")
			fs.StringVar(&o.focus, "focus", "", "comma-separated refs or net names: reduce only the stage(s) around them")
			fs.StringVar(&o.level, "level", "signal", "how far to reduce: tidy, signal or ideal")
			fs.StringVar(&o.page, "page", autoPage, pageHelp)
		}, runDraw),
	})
}

const drawUsage = "usage: pare draw FILE -o OUT.svg [--view reduced|full|faded] [--symbols iec|ieee] [--page auto|A4|A3|letter|none] [--focus REF,...] [--level tidy|signal|ideal]"

func runDraw(e *env, o *drawOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare draw: give exactly one netlist file")
		fmt.Fprintln(e.stderr, drawUsage)
		return exitBad
	}
	if o.out == "" {
		fmt.Fprintln(e.stderr, "pare draw: no output file: give -o OUT.svg (or -o - for standard output)")
		return exitBad
	}
	view, style, lvl, paper, err := drawSettings(o)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare draw: %v\n", err)
		return exitBad
	}
	path := args[0]
	if !checkOutput(e, "pare draw", o.out, path) {
		return exitBad
	}
	res, err := e.pipeline(pipeline.Options{Path: path, Level: lvl, Focus: splitRefs(o.focus),
		Views: []render.View{view}, Style: style, Page: paper.page, Fit: paper.fit})
	if loadFailed(e, path, err) {
		return exitBad
	}
	var pe *pipeline.Error
	switch {
	case errors.As(err, &pe) && pe.Phase == pipeline.PhaseSheets:
		fmt.Fprintf(e.stderr, "pare draw: %s: %v\n", o.out, err)
		return exitBad
	case errors.As(err, &pe) && pe.Phase == pipeline.PhaseStages:
		return reportErr(e, "pare draw", path, fmt.Errorf("recognising stages: %w", err))
	case err != nil:
		return reportErr(e, "pare draw", path, err)
	}
	noteSmallText(e, "pare draw", res.Sheets)
	if res.SheetFor(view).Paper != nil {
		if err := writePages(e, o.out, path, res.SheetFor(view).Pages); err != nil {
			fmt.Fprintf(e.stderr, "pare draw: %v\n", err)
			return exitBad
		}
		return exitOK
	}
	svg := res.SheetFor(view).SVG
	if err := writeOutput(e, o.out, func(w io.Writer) error { _, err := w.Write(svg); return err }, path); err != nil {
		fmt.Fprintf(e.stderr, "pare draw: %s: %v\n", o.out, err)
		return exitBad
	}
	return exitOK
}

// drawSettings reads the flags that say what to draw and how.
func drawSettings(o *drawOpts) (render.View, render.Style, rules.Level, paging, error) {
	view, err := render.ParseView(o.view)
	if err != nil {
		return view, 0, 0, paging{}, fmt.Errorf("--view: %w", err)
	}
	style, err := render.ParseStyle(o.symbols)
	if err != nil {
		return view, style, 0, paging{}, fmt.Errorf("--symbols: %w", err)
	}
	lvl, err := rules.ParseLevel(o.level)
	if err != nil {
		return view, style, lvl, paging{}, fmt.Errorf("--level: %w", err)
	}
	paper, err := parsePage(o.page)
	return view, style, lvl, paper, err
}
