package main

import (
	"bytes"
	"flag"
	"fmt"
	"math"
	"math/cmplx"
	"strconv"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/safety"
	"pare/graph/value"
)

type sweepOpts struct {
	from, to  string
	points    int
	csv       bool
	reduced   bool
	level     string
	at        string
	band      string
	impedance bool
	term      termFlag
}

func init() {
	register(&command{
		name:    "sweep",
		args:    "FILE --from NET --to NET [--points N] [--csv] [--reduced] [--at min|mid|max|FRACTION] [--band LO..HI]",
		summary: "print magnitude and phase against frequency, from one net to another",
		detail: `Drives --from with 1 V and prints V(to)/V(from) at --points log-spaced
frequencies: magnitude in dB and phase in degrees, as a table or (--csv) as
comma-separated values. --impedance prints the impedance at --from instead
(magnitude in ohms and dB re 1 Ω, phase). The span is --band, or else the
bands of interest of the signal on --from (the regions that hold it, or the
default band). --reduced sweeps the reduced circuit (--level chooses the
reduction). Gang sections sit at --at: min, mid (the default), max or a
fraction of the travel. --from defaults to the first input, --to to the first
output.

The numbers are those of pare's small-signal models (documented in the
graph/ac package), each transistor and valve taken at the circuit's DC
operating point where the netlist gives only its characteristic (the same
bias the main job and the stage figures use; a part left at the model's
default bias is said on standard error): no overload.

A response too small for double precision (a long ladder's, thousands of
decibels down: the solve's unknowns underflow) has no figure: its row reads
"< -N  unresolved", a bound in dB and no phase, and a line under the table
counts such points. In --csv their magnitude and phase are empty and a
fourth column, below_db, holds the bound (the column is there only when
some point needs it). pare finds such points by solving again with the
source scaled by a power of two, which changes no digit where nothing
underflowed.`,
		bind: typed(func(fs *flag.FlagSet, o *sweepOpts) {
			fs.StringVar(&o.from, "from", "", "driven net (default: the first input; with none declared, the control of the oscillator or of the first active part)")
			fs.StringVar(&o.to, "to", "", "observed net (default: the first output)")
			fs.IntVar(&o.points, "points", 101, "number of log-spaced frequencies")
			fs.BoolVar(&o.csv, "csv", false, "print comma-separated values")
			fs.BoolVar(&o.reduced, "reduced", false, "sweep the reduced circuit")
			fs.StringVar(&o.level, "level", "signal", "reduction level for --reduced: tidy, signal or ideal")
			fs.StringVar(&o.at, "at", "mid", "gang setting: min, mid, max or a fraction 0..1")
			fs.StringVar(&o.band, "band", "", "frequency span, e.g. 400k..2M (default: the bands of --from)")
			fs.BoolVar(&o.impedance, "impedance", false, "print the impedance at --from instead of a transfer")
			o.term = termFlag{}
			fs.Var(o.term, "term", "terminate a net: NET=OHMS to ground (repeatable; ports are open otherwise)")
		}, runSweep),
	})
}

func runSweep(e *env, o *sweepOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare sweep: give exactly one netlist file")
		return exitBad
	}
	if o.points < 2 || o.points > 1000000 {
		fmt.Fprintf(e.stderr, "pare sweep: --points %d: give 2 to 1000000\n", o.points)
		return exitBad
	}
	setting, err := parseAt(o.at)
	if err != nil {
		fmt.Fprintf(e.stderr, "pare sweep: %v\n", err)
		return exitBad
	}
	if o.at == "" {
		setting = ac.Options{VarFrac: 0.5, VarSet: true}
	}
	setting.Terminate = o.term
	path := args[0]
	c, caution, code := circuitFor(e, "sweep", path, o.reduced, o.level)
	if c == nil {
		return code
	}
	sw, msg := sweepSpan(c, path, o)
	if msg != "" {
		fmt.Fprintf(e.stderr, "pare sweep: %s\n", msg)
		return exitBad
	}
	if o.impedance {
		sw.h, sw.lost, err = ac.ImpedanceChecked(c, sw.from, sw.freqs, setting)
	} else {
		sw.h, sw.lost, err = ac.TransferChecked(c, sw.from, sw.to, sw.freqs, setting)
	}
	if err != nil {
		fmt.Fprintf(e.stderr, "pare sweep: %s: %v\n", path, err)
		return exitBad
	}
	var b bytes.Buffer
	if o.csv {
		sweepCSV(&b, sw, o.impedance)
	} else {
		sweepTable(&b, c, path, sw, o)
		fmt.Fprintln(&b, caution.Report(safety.SweepModel))
	}
	if _, err := e.stdout.Write(b.Bytes()); err != nil {
		fmt.Fprintf(e.stderr, "pare sweep: %v\n", err)
		return exitBad
	}
	return exitOK
}

// sweep is what one sweep drives, observes and measures.
type sweep struct {
	from, to string
	chosen   []string // what pare chose for a net the file does not declare, said before the table
	freqs    []float64
	h        []complex128
	lost     []ac.Beyond // points whose figure is beyond the solve's resolution
}

// anyLost tells whether some point is beyond the solve's resolution.
func (sw *sweep) anyLost() bool {
	for _, l := range sw.lost {
		if l.Lost {
			return true
		}
	}
	return false
}

// belowDB is a lost point's bound as printed: whole decibels, rounded up
// so that it stays a bound.
func belowDB(l ac.Beyond) string {
	return strconv.FormatFloat(math.Ceil(l.BelowDB), 'f', 0, 64)
}

// sweepSpan picks the nets (the first input and output unless given) and
// the frequencies: --band, or the bands of the driven net. A non-empty
// message says what is missing.
func sweepSpan(c *graph.Circuit, path string, o *sweepOpts) (*sweep, string) {
	sw := &sweep{from: o.from, to: o.to}
	if sw.from == "" && len(c.Inputs) > 0 {
		sw.from = c.Inputs[0]
	} else if sw.from == "" {
		// No input declared: drive the oscillator's or the first active
		// part's control (graph.InferredInput), and say so.
		net, p, why := graph.InferredInput(c)
		if net == "" {
			return nil, path + " declares no inputs and has no active part to drive: give --from NET"
		}
		sw.from = net
		sw.chosen = append(sw.chosen, fmt.Sprintf("no input declared: driving %s, the control of %s (%s)", net, p.Ref, why))
	}
	if sw.to == "" && !o.impedance && len(c.Outputs) > 0 {
		sw.to = c.Outputs[0]
	} else if sw.to == "" && !o.impedance {
		sw.to = graph.FarthestNet(c, sw.from)
		if sw.to == "" {
			return nil, path + " declares no outputs: give --to NET"
		}
		sw.chosen = append(sw.chosen, "no output declared: observing "+sw.to+", the signal net farthest from "+sw.from)
	}
	for _, end := range []struct{ flag, net string }{{"--from", sw.from}, {"--to", sw.to}} {
		// Ground is the reference: the voltage there is zero by definition,
		// and a transfer to it printed -Inf dB.
		if end.net != "" && c.Net(end.net) != nil && c.RoleOf(end.net) == graph.Ground {
			return nil, fmt.Sprintf("%s %s: %s is the ground net, AC ground by definition (the reference of every voltage); give a signal net", end.flag, end.net, end.net)
		}
	}
	var band value.Range
	if o.band != "" {
		var err error
		band, err = value.ParseRange(o.band, value.Hertz)
		if err != nil || band.Min <= 0 || band.Max <= band.Min {
			return nil, fmt.Sprintf("--band %q: give LOW..HIGH in hertz, e.g. 400k..2M", o.band)
		}
	} else {
		if c.Net(sw.from) == nil {
			return nil, fmt.Sprintf("%s: no net %q", path, sw.from)
		}
		for i, b := range ac.BandsOf(c, sw.from) {
			if i == 0 || b.Min < band.Min {
				band.Min = b.Min
			}
			if b.Max > band.Max {
				band.Max = b.Max
			}
		}
		if band.Min <= 0 {
			return nil, path + " has no band for " + sw.from + ": give --band"
		}
	}
	sw.freqs = make([]float64, o.points)
	for i := range sw.freqs {
		sw.freqs[i] = band.Min * math.Pow(band.Max/band.Min, float64(i)/float64(o.points-1))
	}
	return sw, ""
}

// sweepCSV prints the sweep as comma-separated values. Where some point is
// beyond the solve's resolution a fourth column, below_db, holds its bound
// (its magnitude and phase are left empty), and is empty on the others; a
// sweep resolved throughout has the three columns only.
func sweepCSV(b *bytes.Buffer, sw *sweep, impedance bool) {
	head := "freq_hz,mag_db,phase_deg"
	if impedance {
		head = "freq_hz,mag_ohm,phase_deg"
	}
	lost := sw.anyLost()
	if lost {
		head += ",below_db"
	}
	fmt.Fprintln(b, head)
	for i, f := range sw.freqs {
		if lost && sw.lost[i].Lost {
			fmt.Fprintf(b, "%s,,,%s\n", g(f, 9), belowDB(sw.lost[i]))
			continue
		}
		m := cmplx.Abs(sw.h[i])
		if !impedance {
			m = dB(sw.h[i])
		}
		tail := "\n"
		if lost {
			tail = ",\n"
		}
		fmt.Fprintf(b, "%s,%s,%s%s", g(f, 9), g(m, 9), g(phaseDeg(sw.h[i]), 7), tail)
	}
}

func sweepTable(b *bytes.Buffer, c *graph.Circuit, path string, sw *sweep, o *sweepOpts) {
	what := "V(" + sw.to + ")/V(" + sw.from + ")"
	if o.impedance {
		what = "Z(" + sw.from + ")"
	}
	circuit := "original circuit"
	if o.reduced {
		circuit = "reduced circuit (level " + o.level + ")"
	}
	gang := ""
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type == graph.CapVariable {
			gang = ", gang at " + atLabel(o.at)
			break
		}
	}
	fmt.Fprintf(b, "%s: %s, %s%s\n", path, what, circuit, gang)
	for _, l := range sw.chosen {
		fmt.Fprintln(b, l)
	}
	if o.impedance {
		fmt.Fprintf(b, "%14s  %14s  %10s  %10s\n", "frequency", "|Z|", "dB re 1 Ω", "phase °")
		for i, f := range sw.freqs {
			if sw.lost[i].Lost {
				fmt.Fprintf(b, "%14s  %14s  %10s  %10s\n", ac.FormatHz(f), "unresolved", "< "+belowDB(sw.lost[i]), "")
				continue
			}
			fmt.Fprintf(b, "%14s  %14s  %10.3f  %10.2f\n", ac.FormatHz(f), value.Format(cmplx.Abs(sw.h[i]), value.Ohm, value.Symbol), dB(sw.h[i]), phaseDeg(sw.h[i]))
		}
		lostNote(b, sw)
		return
	}
	fmt.Fprintf(b, "%14s  %10s  %10s\n", "frequency", "dB", "phase °")
	for i, f := range sw.freqs {
		if sw.lost[i].Lost {
			fmt.Fprintf(b, "%14s  %10s  %10s\n", ac.FormatHz(f), "< "+belowDB(sw.lost[i]), "unresolved")
			continue
		}
		fmt.Fprintf(b, "%14s  %10.3f  %10.2f\n", ac.FormatHz(f), dB(sw.h[i]), phaseDeg(sw.h[i]))
	}
	lostNote(b, sw)
}

// lostNote says, under a table with points beyond the solve's resolution,
// what their rows mean.
func lostNote(b *bytes.Buffer, sw *sweep) {
	n := 0
	for _, l := range sw.lost {
		if l.Lost {
			n++
		}
	}
	if n == 0 {
		return
	}
	fmt.Fprintf(b, "%d of %d points are beyond the solver's resolution: the response there is too small for double precision (the solve underflows), so no magnitude or phase is given, only a bound (\"< -N\": below -N dB)\n", n, len(sw.freqs))
}

func atLabel(s string) string {
	if s == "" {
		return "mid"
	}
	return s
}

func dB(v complex128) float64 {
	m := cmplx.Abs(v)
	if m == 0 {
		return math.Inf(-1)
	}
	return 20 * math.Log10(m)
}

func phaseDeg(v complex128) float64 {
	if v == 0 {
		return 0
	}
	return cmplx.Phase(v) * 180 / math.Pi
}

func g(v float64, digits int) string {
	switch {
	case math.IsInf(v, -1):
		return "-inf"
	case math.IsInf(v, 1):
		return "inf"
	}
	return strconv.FormatFloat(v, 'g', digits, 64)
}
