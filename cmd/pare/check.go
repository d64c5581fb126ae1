package main

import (
	"flag"
	"fmt"

	"pare/cmd/internal/pipeline"
	"pare/graph"
)

type checkOpts struct{ strict, quiet bool }

func init() {
	register(&command{
		name:    "check",
		args:    "[--strict] FILE...",
		summary: "load netlists and warn about likely transcription mistakes",
		detail: `Loads each file, reports every syntax and model error as file:line:col, then
looks for the mistakes people make copying a paper diagram: a net with one
connection, an unconnected terminal, a cathode/emitter/source going nowhere,
a value far outside its kind's usual range, a gang with one member, a port
that no part uses. Prints one summary line per file.`,
		bind: typed(func(fs *flag.FlagSet, o *checkOpts) {
			fs.BoolVar(&o.strict, "strict", false, "exit 1 when there are warnings")
			fs.BoolVar(&o.quiet, "quiet", false, "print the summary lines only")
		}, runCheck),
	})
}

func runCheck(e *env, o *checkOpts, args []string) int {
	if len(args) == 0 {
		fmt.Fprintln(e.stderr, "pare check: no files given")
		return exitBad
	}
	code := exitOK
	for _, path := range args {
		res, err := e.pipeline(pipeline.Options{Path: path, Until: pipeline.PhaseCheck})
		if loadFailed(e, path, err) {
			code = exitBad
			continue
		}
		c, warnings := res.Circuit, res.Warnings
		if !o.quiet {
			for _, w := range warnings {
				fmt.Fprintf(e.stdout, "%s: warning: %s\n", w.Pos, w.Msg)
			}
			for _, n := range res.Notes {
				fmt.Fprintf(e.stdout, "%s: note: %s\n", n.Pos, n.Msg)
			}
		}
		fmt.Fprintf(e.stdout, "%s: %s\n", path, graph.Summary(c, len(warnings)))
		if o.strict && len(warnings) > 0 && code == exitOK {
			code = exitFound
		}
	}
	return code
}
