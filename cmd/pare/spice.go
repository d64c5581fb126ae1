package main

import (
	"flag"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"pare/graph/ac"
	"pare/graph/value"
)

type spiceOpts struct {
	out     string
	reduced bool
	level   string
	from    string
	at      string
	ppd     int
	band    string
	term    termFlag
}

func init() {
	register(&command{
		name:    "spice",
		args:    "FILE [--reduced] [-o OUT.cir] [--from NET] [--at min|mid|max|FRACTION] [--per-decade N]",
		summary: "write the small-signal circuit as a SPICE deck for a simulator",
		detail: `Writes a SPICE-compatible deck of the small-signal circuit pare solves:
R, L and C elements, K cards for coupled windings, G elements for the
transconductances of valves, transistors and FETs, a 1 V AC source on --from
(default: the first input), an .ac card over the circuit's bands, and a
.control block that runs the sweep and writes the magnitude and phase
(radians) of every output with wrdata into OUT.dat (pare-ac.dat on stdout).
Run it with 'ngspice -b OUT.cir'. --reduced writes the reduced circuit
(--level chooses the reduction). Node names are the net names, lower-cased
with other characters replaced; the deck lists every renaming.

The sweep has at least 101 points: a band narrower than an octave is swept
linearly (.ac lin), a wider one logarithmically (.ac dec) at --per-decade or
at the density that gives 101 points, whichever is more.

It is a small-signal model: no bias, no supplies, nothing about DC or safety.`,
		bind: typed(func(fs *flag.FlagSet, o *spiceOpts) {
			fs.StringVar(&o.out, "o", "-", "write the deck to this file (- for stdout)")
			fs.BoolVar(&o.reduced, "reduced", false, "write the reduced circuit")
			fs.StringVar(&o.level, "level", "signal", "reduction level for --reduced: tidy, signal or ideal")
			fs.StringVar(&o.from, "from", "", "net driven by the AC source (default: the first input; with none declared, the control of the oscillator or of the first active part)")
			fs.StringVar(&o.at, "at", "mid", "gang setting: min, mid, max or a fraction 0..1")
			fs.IntVar(&o.ppd, "per-decade", 50, "sweep points per decade (at least 101 points in all; linear below an octave)")
			fs.StringVar(&o.band, "band", "", "sweep span, e.g. 400k..2M (default: the circuit's full band)")
			o.term = termFlag{}
			fs.Var(o.term, "term", "terminate a net: NET=OHMS to ground (repeatable; ports are open otherwise)")
		}, runSpice),
	})
}

func runSpice(e *env, o *spiceOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare spice: give exactly one netlist file")
		return exitBad
	}
	if o.ppd < 1 || o.ppd > 10000 {
		fmt.Fprintf(e.stderr, "pare spice: --per-decade %d: give 1 to 10000\n", o.ppd)
		return exitBad
	}
	setting, err := parseAt(o.at)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare spice: %v\n", err)
		return exitBad
	}
	if o.at == "" {
		setting = ac.Options{VarFrac: 0.5, VarSet: true}
	}
	setting.Terminate = o.term
	so := ac.SpiceOptions{Options: setting, Input: o.from, PointsPerDecade: o.ppd, DataFile: dataFileFor(o.out)}
	if o.band != "" {
		b, err := value.ParseRange(o.band, value.Hertz)
		if err != nil || b.Min <= 0 || b.Max <= b.Min {
			fmt.Fprintf(e.stderr, "pare spice: --band %q: give LOW..HIGH in hertz, e.g. 400k..2M\n", o.band)
			return exitBad
		}
		so.Band = b
	}
	path := args[0]
	if !checkOutput(e, "pare spice", o.out, path) {
		return exitBad
	}
	c, _, code := circuitFor(e, "spice", path, o.reduced, o.level)
	if c == nil {
		return code
	}
	if err := writeOutput(e, o.out, func(w io.Writer) error { return ac.WriteSpice(w, c, so) }, path); err != nil {
		fmt.Fprintf(e.stderr, "pare spice: %s: %v\n", path, err)
		return exitBad
	}
	return exitOK
}

// dataFileFor names the table the deck's control block writes: beside the
// deck, OUT.dat for OUT.cir. ngspice runs in the deck's folder in the usual
// `ngspice -b OUT.cir`, so the bare file name is used.
func dataFileFor(out string) string {
	if out == "" || out == "-" {
		return "pare-ac.dat"
	}
	base := filepath.Base(out)
	base = strings.TrimSuffix(base, filepath.Ext(base))
	name := strings.Map(func(r rune) rune {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '_', r == '-', r == '.':
			return r
		}
		return '_'
	}, base)
	if name == "" {
		name = "pare-ac"
	}
	return name + ".dat"
}
