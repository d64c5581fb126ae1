// Command pare reduces a valve or transistor circuit, captured as a TOML
// netlist, to its small-signal path: it explains every step, proves by AC
// analysis that the signal behaviour is kept, names the stages with their
// figures and draws the signal-path sheet for repair notes.
//
// Usage:
//
//	pare FILE.toml [-o DIR]       the whole job: reduced netlist, sheets, notes.md
//	pare COMMAND [flags] FILE...  one step; `pare help` lists the commands
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"sort"
	"strings"
	"sync/atomic"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/internal/esc"
)

// version is the release this build reports; bumped by hand at release.
const version = "0.1.0"

// Exit codes, the same for every command.
const (
	exitOK    = 0 // done, nothing to report
	exitFound = 1 // warnings (check --strict) or a failed verification
	exitBad   = 2 // bad input or usage
	// exitInternal is a failure of pare itself (a result that does not load
	// back, a rule that broke): never the input's fault.
	exitInternal = 3
)

// command is one subcommand. Each lives in its own file and registers itself
// in init, so the list of commands is the set of files, and `pare help`
// prints them sorted.
type command struct {
	name    string
	args    string // argument synopsis for help
	summary string // one line
	detail  string // paragraph for `pare help NAME`
	// bind defines the command's flags on fs and returns the command bound
	// to the options they fill (see typed).
	bind func(fs *flag.FlagSet) func(e *env, args []string) int
}

// typed binds a command's own options type: flags defines the flags on a
// fresh options value, run gets that value once they are parsed. Each
// command keeps its options typed from the flag to the run.
func typed[O any](flags func(fs *flag.FlagSet, o *O), run func(e *env, o *O, args []string) int) func(*flag.FlagSet) func(*env, []string) int {
	return func(fs *flag.FlagSet) func(*env, []string) int {
		o := new(O)
		if flags != nil {
			flags(fs, o)
		}
		return func(e *env, args []string) int { return run(e, o, args) }
	}
}

var commands = map[string]*command{}

func register(c *command) {
	if _, dup := commands[c.name]; dup {
		panic("pare: command registered twice: " + c.name) // programming error, not user input
	}
	commands[c.name] = c
}

// env is what a command may touch: its output streams. Commands never call
// os.Exit themselves, so tests can run them in-process.
type env struct {
	stdout io.Writer
	stderr io.Writer
	// switches are the --switch settings of this invocation: every
	// pipeline run of the command turns those switches (e.pipeline).
	switches []pipeline.SwitchSetting
}

// pipeline runs the one pipeline with this invocation's switch settings.
func (e *env) pipeline(o pipeline.Options) (*pipeline.Result, error) {
	o.Switches = e.switches
	o.Loaded = loaded
	return pipeline.Run(o)
}

func main() {
	tuneCollector()
	stop := startProfile()
	stopMem := startMemProfile()
	code := run(os.Args[1:], os.Stdout, os.Stderr)
	stopMem()
	stop()
	os.Exit(code)
}

// tuneCollector lets the heap grow to five times what is live before the
// collector runs (GOGC 400), unless the user set GOGC: one run is a short
// batch whose live heap is tens of megabytes, and at the default the
// collector's preemption of the solver's inner loops cost the main job on
// the flagship a quarter of its CPU (3.0 s against 2.3 s, same output).
// A soft limit of 256 MiB brings the collector back to a quicker pace on
// whole sets: the proven reduction of a 5,020-part bank peaked at 727 MB
// under a limit of 1 GiB and at 262 MB under this one, for the same CPU
// time (68.9 s against 68.5 s; docs/performance.md).
//
// Under that limit the collector is off while the file loads (loaded turns
// it on): loading builds the decoder's tables and the key positions, all
// garbage once the circuit is made, and collecting while they grow marked
// them twice over, some 90 ms of CPU in the 0.8 s of `pare sweep` on the
// 10,000-section ladder (docs/performance.md, "Loading, and `pare sweep`
// against ngspice"). The limit still holds: near it the collector runs
// whatever the percentage says.
func tuneCollector() {
	if _, set := os.LookupEnv("GOGC"); set {
		return
	}
	if _, set := os.LookupEnv("GOMEMLIMIT"); set {
		debug.SetGCPercent(400)
		return
	}
	debug.SetMemoryLimit(256 << 20)
	debug.SetGCPercent(-1)
	collectorOff.Store(true)
}

// collectorOff is set while tuneCollector keeps the collector off for the load.
var collectorOff atomic.Bool

// loaded turns the collector on at GOGC 400 once a file is loaded (the
// first of a batch's files: the rest load with it on).
func loaded() {
	if collectorOff.CompareAndSwap(true, false) {
		debug.SetGCPercent(400)
	}
}

// run executes one pare invocation and returns its exit code.
func run(args []string, stdout, stderr io.Writer) int {
	// Everything a command prints goes through the terminal escaper: a
	// title or label with an escape sequence or an RTL override is shown,
	// not obeyed.
	tout, terr := esc.NewTerminalWriter(stdout), esc.NewTerminalWriter(stderr)
	defer tout.Flush()
	defer terr.Flush()
	return dispatch(args, tout, terr)
}

// dispatch picks the command and runs it.
func dispatch(args []string, stdout, stderr io.Writer) int {
	e := &env{stdout: stdout, stderr: stderr}
	if len(args) == 0 {
		usage(stderr)
		return exitBad
	}
	switch args[0] {
	case "--version", "-version", "version":
		fmt.Fprintf(stdout, "pare %s\n", version)
		return exitOK
	case "help", "--help", "-h", "-help":
		if len(args) > 1 {
			if c, ok := commands[args[1]]; ok {
				commandHelp(stdout, c)
				return exitOK
			}
			fmt.Fprintf(stderr, "pare: no command %q\n", args[1])
			return exitBad
		}
		usage(stdout)
		return exitOK
	}
	name, rest := args[0], args[1:]
	c, ok := commands[name]
	if !ok {
		if name == "" {
			fmt.Fprintln(stderr, "pare: empty command: give a command or a netlist file (run 'pare help')")
			return exitBad
		}
		// "pare -o DIR FILE", "pare --no-verify FILE": flags of the whole
		// job before its files, read by the main job's own flag set.
		if strings.HasPrefix(name, "-") || strings.HasSuffix(name, ".toml") || fileExists(name) || isDir(name) {
			// `pare FILE_OR_DIR...`: the main job.
			c, rest = commands[mainJob], args
		} else {
			fmt.Fprintf(stderr, "pare: unknown command %q%s\n", name, suggestCommand(name))
			fmt.Fprintln(stderr, "run 'pare help' for the list of commands")
			return exitBad
		}
	}
	if c == nil {
		fmt.Fprintf(stderr, "pare: %s: the whole job is not built into this version\n", name)
		return exitBad
	}
	fs := flag.NewFlagSet("pare "+c.name, flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	runBound := c.bind(fs)
	switchFlagOn(fs, c, &e.switches)
	pos, err := parseInterleaved(fs, rest)
	if errors.Is(err, flag.ErrHelp) {
		commandHelp(stdout, c)
		return exitOK
	}
	if err != nil {
		fmt.Fprintf(stderr, "pare %s: %v\n", c.name, err)
		fmt.Fprintf(stderr, "usage: pare %s %s (see 'pare help %s')\n", c.name, c.args, c.name)
		return exitBad
	}
	return runBound(e, pos)
}

// mainJob is the name the whole-job command registers under; `pare FILE`
// runs it.
const mainJob = "run"

// parseInterleaved lets flags stand before or after file names
// (`pare reduce FILE -o OUT`), which the flag package alone does not.
// A lone "--" ends the flags.
func parseInterleaved(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			return nil, err
		}
		args = fs.Args()
		if len(args) == 0 {
			return pos, nil
		}
		if args[0] == "--" {
			return append(pos, args[1:]...), nil
		}
		pos = append(pos, args[0])
		args = args[1:]
	}
}

func usage(w io.Writer) {
	fmt.Fprintln(w, "pare: reduce a circuit netlist to its small-signal path, verify it, name its stages, draw it")
	fmt.Fprintln(w)
	fmt.Fprintln(w, "usage:")
	fmt.Fprintln(w, "  pare FILE.toml [-o DIR]     the whole job: reduce, verify, recognise, draw, write notes")
	fmt.Fprintln(w, "  pare COMMAND [flags] ARGS   one step")
	fmt.Fprintln(w)
	fmt.Fprintln(w, "commands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-8s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, "exit codes: 0 fine, 1 warnings (with --strict) or failed verification, 2 bad input or usage, 3 internal error")
	fmt.Fprintln(w, "'pare help COMMAND' or 'pare COMMAND --help' shows a command's flags; 'pare --version' the version.")
}

func commandHelp(w io.Writer, c *command) {
	fmt.Fprintf(w, "usage: pare %s %s\n\n%s\n", c.name, c.args, c.summary)
	if c.detail != "" {
		fmt.Fprintf(w, "\n%s\n", strings.TrimSpace(c.detail))
	}
	fs := flag.NewFlagSet(c.name, flag.ContinueOnError)
	c.bind(fs)
	switchFlagOn(fs, c, new([]pipeline.SwitchSetting))
	has := false
	fs.VisitAll(func(*flag.Flag) { has = true })
	if has {
		fmt.Fprintln(w, "\nflags:")
		fs.SetOutput(w)
		fs.VisitAll(func(f *flag.Flag) {
			def := ""
			if f.DefValue != "" && f.DefValue != "false" {
				def = fmt.Sprintf(" (default %s)", f.DefValue)
			}
			dash := "--"
			if len(f.Name) == 1 {
				dash = "-" // -o reads as the short option it is
			}
			fmt.Fprintf(w, "  %-14s %s%s\n", dash+f.Name, f.Usage, def)
		})
	}
}

func suggestCommand(name string) string {
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		if strings.HasPrefix(n, name) {
			return fmt.Sprintf(" (did you mean %q?)", n)
		}
	}
	if s := graph.Suggest(name, names); s != "" {
		return fmt.Sprintf(" (did you mean %q?)", s)
	}
	return ""
}

func isDir(p string) bool {
	st, err := os.Stat(p)
	return err == nil && st.IsDir()
}

func fileExists(p string) bool {
	st, err := os.Stat(p)
	return err == nil && !st.IsDir()
}
