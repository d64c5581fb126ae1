package main

import (
	"bytes"
	"flag"
	"fmt"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/internal/outfile"
)

type fmtOpts struct {
	check bool
	out   string
}

func init() {
	register(&command{
		name:    "fmt",
		args:    "[--check] [-o OUT] FILE",
		summary: "rewrite a netlist in the canonical layout",
		detail: `Rewrites FILE in place in the canonical layout: top-level keys first, then
[freqs], [regions], [nets] and [parts], one entry per line, sorted, values in
the IEC 60062 letter code. Comments above entries and after them are kept.
With --check nothing is written; the exit code is 1 when FILE is not in
canonical form.`,
		bind: typed(func(fs *flag.FlagSet, o *fmtOpts) {
			fs.BoolVar(&o.check, "check", false, "only report whether the file is canonical")
			fs.StringVar(&o.out, "o", "", "write to this file instead (- for stdout)")
		}, runFmt),
	})
}

func runFmt(e *env, o *fmtOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare fmt: give exactly one file")
		return exitBad
	}
	path := args[0]
	res, err := pipeline.Run(pipeline.Options{Path: path, Until: pipeline.PhaseLoad, Loaded: loaded})
	if loadFailed(e, path, err) {
		return exitBad
	}
	// Marshal proves the text loads back as the same circuit: fmt never
	// replaces a netlist with one pare itself would refuse.
	text, err := graph.Marshal(res.Circuit)
	if err != nil {
		return internalError(e, "pare fmt", err)
	}
	old, err := readInput(path)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare fmt: %v\n", err)
		return exitBad
	}
	if o.check {
		if !bytes.Equal(old, text) {
			fmt.Fprintf(e.stdout, "%s: not in canonical layout (run 'pare fmt %s')\n", path, path)
			return exitFound
		}
		return exitOK
	}
	if o.out == "-" {
		e.stdout.Write(text)
		return exitOK
	}
	if o.out == "" {
		// In place: the input is the output. A link is followed to the
		// netlist it names; a read-only netlist is refused.
		if bytes.Equal(old, text) {
			return exitOK
		}
		if err := outfile.WriteFile(path, text); err != nil {
			fmt.Fprintf(e.stderr, "pare fmt: %v\n", err)
			return exitBad
		}
		return exitOK
	}
	if err := outfile.WriteFile(o.out, text, path); err != nil {
		fmt.Fprintf(e.stderr, "pare fmt: %v\n", err)
		return exitBad
	}
	return exitOK
}
