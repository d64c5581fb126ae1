package ac

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"math"
	"math/cmplx"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/graph"
)

// The loop gain is checked against ngspice in the time domain, a method
// that shares nothing with the return-ratio sum: the same linear
// small-signal circuit (the elaborated netlist, element for element) is
// kicked by a short current pulse into the control terminal and run as a
// transient. A linear circuit whose loop has a margin above 0 dB must ring
// up, one below must ring down (Barkhausen; Bode's Δ = Δ0(1 − L)), and the
// ring's frequency from its zero crossings must be the natural frequency.

// oscFixtures are the oscillator fixtures of testdata/osc: one per family
// (Hartley, Colpitts, Clapp, tickler or link winding, phase shift, Wien,
// crystal) in valve and transistor form, and pairs that sit just below and
// just above the start-up threshold.
func oscFixtures(t testing.TB) []string {
	t.Helper()
	files, err := filepath.Glob("../../testdata/osc/*.toml")
	if err != nil || len(files) < 18 {
		t.Fatalf("oscillator fixtures: %v, %d files", err, len(files))
	}
	return files
}

// tranRun is one kicked transient: the circuit with ref's transconductance
// scaled by k, run for cycles periods of f.
type tranRun struct {
	ref    string
	k      float64
	f      float64 // Hz: sets the step (1/80 period) and the kick width
	cycles float64
}

// ring is what a transient shows: the growth rate σ (1/s) of the envelope
// of the returned control voltage, and its frequency from zero crossings.
type ring struct{ sigma, f float64 }

func runTran(t *testing.T, bin string, c *graph.Circuit, o Options, r tranRun) ring {
	t.Helper()
	step := 1 / r.f / tranStepsPerPeriod
	tt, v := spiceTran(t, bin, tranDeck(t, c, o, r, looseTol))
	if fixedStep(tt, step) {
		return trapezoidal(measureRing(t, tt, v, 1/r.f), step)
	}
	// A ring growing many nepers a period makes ngspice cut the step even
	// at the loose tolerance: run it at the tight one, whose steps are
	// short enough to read it uncorrected.
	t.Logf("ngspice cut its step %g s: run again at reltol=%s, uncorrected", step, tightTol)
	tt, v = spiceTran(t, bin, tranDeck(t, c, o, r, tightTol))
	return measureRing(t, tt, v, 1/r.f)
}

// The transient's relative tolerance: loose keeps the fixed step (for a
// ring that does not grow or die fast), tight makes ngspice's
// truncation-error control take steps a few times shorter.
const (
	looseTol = "1e-4"
	tightTol = "1e-6"
)

// spiceTran runs a transient deck and returns the probe's samples.
func spiceTran(t *testing.T, bin string, deck []byte) (tt, v []float64) {
	t.Helper()
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck, 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 4*spiceTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "-b", "deck.cir")
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("ngspice: %v\n%s", err, stderr.String())
	}
	for _, l := range strings.Split(stderr.String(), "\n") {
		if strings.Contains(l, "Error") || strings.Contains(l, "singular") {
			t.Fatalf("ngspice reported: %s\ndeck:\n%s", l, deck)
		}
	}
	data, err := os.ReadFile(filepath.Join(dir, "out.dat"))
	if err != nil {
		t.Fatalf("ngspice wrote no data: %v\n%s", err, stderr.String())
	}
	return parseTran(t, data)
}

// trapezoidal undoes the trapezoidal rule's warping of a ring. At a fixed
// step h the rule is the bilinear map of the circuit's poles: a pole s
// rings in the samples as z = (1 + sh/2)/(1 − sh/2) per step (any numerical
// analysis text; the trapezoidal rule on x' = sx). So the measured ring,
// z = e^{(σ+jω)h}, is the pole s = (2/h)(z − 1)/(z + 1) exactly, where the
// raw ring reads ω low by about (ωh)²/12 (0.2 % at 40 steps a period).
func trapezoidal(r ring, h float64) ring {
	z := cmplx.Exp(complex(r.sigma, 2*math.Pi*r.f) * complex(h, 0))
	s := complex(2/h, 0) * (z - 1) / (z + 1)
	return ring{sigma: real(s), f: imag(s) / (2 * math.Pi)}
}

// fixedStep tells whether ngspice kept the step h over the data: the
// correction in trapezoidal is exact only at a fixed step (a step cut by
// ngspice's truncation-error control would be corrected too much).
func fixedStep(tt []float64, h float64) bool {
	off := 0
	for i := 1; i < len(tt); i++ {
		if math.Abs((tt[i]-tt[i-1])/h-1) > 0.01 {
			off++
		}
	}
	return off <= len(tt)/100
}

// tranDeck writes the elaborated circuit with r.ref's transconductance
// scaled by r.k, a kick into its control terminal, a transient of
// r.cycles periods at a fixed step (the longest ngspice may take; reltol
// sets how much its truncation-error control may shorten it), and the
// returned control voltage written out.
func tranDeck(t *testing.T, c *graph.Circuit, o Options, r tranRun, reltol string) []byte {
	t.Helper()
	nl, err := elaborate(c, o)
	if err != nil {
		t.Fatal(err)
	}
	var src prim
	for i, p := range nl.prims {
		if p.kind == primVCCS && p.ref == r.ref {
			nl.prims[i].v *= r.k
			src = nl.prims[i]
		}
	}
	if src.ref == "" {
		t.Fatalf("%s: no source %s", c.File, r.ref)
	}
	var deck bytes.Buffer
	sw := &spiceWriter{w: bufio.NewWriter(&deck), nodes: spiceNodes(nl.nodes), used: map[string]bool{}}
	sw.line("* %s: kicked transient of the small-signal circuit", oneLine(c.Title))
	for _, p := range nl.prims {
		if p.kind == primRLC {
			// A crystal's motional arm starts with a current in it: a
			// pulse at a terminal hardly reaches a mode of Q 20 000, and
			// the ring would take seconds to rise above the circuit's
			// other, faster-dying modes.
			sw.line("%s", crystalKicked(sw, p))
			continue
		}
		sw.prim(p)
	}
	for _, g := range nl.groups {
		sw.group(g)
	}
	var srcs []loopSource
	for _, p := range nl.prims {
		if p.kind == primVCCS && p.ref == r.ref && p.c == src.c && p.d == src.d {
			srcs = append(srcs, loopSource{gm: p.v, a: p.a, b: p.b})
		}
	}
	// The inputs the loop search holds: none on the device's own nets.
	for i, n := range loopHeld(c, nl, srcs, src.c, src.d) {
		sw.line("Vheld%d %s 0 DC 0", i+1, sw.nodes[n])
	}
	kick := src.c
	if kick == 0 {
		kick = src.a
	}
	period := 1 / r.f
	step := period / tranStepsPerPeriod
	sw.line("Ikick 0 %s PULSE(0 1m 0 %s %s %s 1)", sw.nodes[kick], num(step/4), num(step/4), num(period/20))
	// Only the span measureRing fits is written.
	sw.line(".option method=trap reltol=%s abstol=1e-15 vntol=1e-12", reltol)
	stop := r.cycles * period
	sw.line(".tran %s %s %s %s uic", num(step), num(stop), num(ringFrom*stop), num(step))
	sw.line(".control")
	sw.line("set wr_singlescale")
	sw.line("option numdgt=12")
	sw.line("run")
	probe := "v(" + sw.nodes[src.c] + ")"
	if src.d != 0 {
		probe = fmt.Sprintf("v(%s)-v(%s)", sw.nodes[src.c], sw.nodes[src.d])
	}
	sw.line("let probe = %s", probe)
	sw.line("wrdata out.dat probe")
	sw.line("quit")
	sw.line(".endc")
	sw.line(".end")
	if err := sw.w.Flush(); err != nil {
		t.Fatal(err)
	}
	return deck.Bytes()
}

func parseTran(t *testing.T, data []byte) (tt, v []float64) {
	t.Helper()
	sc := bufio.NewScanner(bytes.NewReader(data))
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) != 2 {
			continue
		}
		a, err1 := strconv.ParseFloat(f[0], 64)
		b, err2 := strconv.ParseFloat(f[1], 64)
		if err1 != nil || err2 != nil {
			continue // the header
		}
		tt, v = append(tt, a), append(v, b)
	}
	if len(tt) < 100 {
		t.Fatalf("transient has %d points", len(tt))
	}
	return tt, v
}

// ringFrom is where in the run the fit begins: over the last 40 %.
const ringFrom = 0.6

// measureRing fits the envelope (the peak of |v| in each period) over the
// last 40 % of the run by least squares on its logarithm, and counts the
// upward zero crossings (linearly interpolated) over the same span.
func measureRing(t *testing.T, tt, v []float64, period float64) ring {
	t.Helper()
	t0 := tt[len(tt)-1] * ringFrom
	var sx, sy, sxx, sxy, n float64
	var first, last float64
	crossings := 0
	peak, winEnd := 0.0, t0+period
	for i := 1; i < len(tt); i++ {
		if tt[i] < t0 {
			continue
		}
		if tt[i] >= winEnd {
			if peak > 0 {
				x, y := winEnd-period/2, math.Log(peak)
				sx, sy, sxx, sxy, n = sx+x, sy+y, sxx+x*x, sxy+x*y, n+1
			}
			peak, winEnd = 0, winEnd+period
		}
		peak = math.Max(peak, math.Abs(v[i]))
		if v[i-1] < 0 && v[i] >= 0 {
			tc := tt[i-1] + (tt[i]-tt[i-1])*(-v[i-1])/(v[i]-v[i-1])
			if crossings == 0 {
				first = tc
			}
			last = tc
			crossings++
		}
	}
	if n < 3 || crossings < 3 {
		t.Fatalf("transient too short to measure: %v periods, %d crossings", n, crossings)
	}
	return ring{sigma: (n*sxy - sx*sy) / (n*sxx - sx*sx), f: float64(crossings-1) / (last - first)}
}

// cyclesFor is how long to run so that growth or decay at σ shows clearly
// over the other modes the kick set ringing: about six nepers, within 60 and
// 1500 periods (a slower ring is still measured closely: one mode, fitted
// over hundreds of periods).
func cyclesFor(sigma, f float64) float64 {
	c := 6 / (math.Abs(sigma) / f)
	return math.Max(60, math.Min(1500, c))
}

// crystalKicked writes a crystal's motional arm as sw.prim does, with an
// initial current of 1 mA in its inductance.
func crystalKicked(sw *spiceWriter, p prim) string {
	var b bytes.Buffer
	inner := &spiceWriter{w: bufio.NewWriter(&b), nodes: sw.nodes, used: sw.used, inner: sw.inner}
	inner.prim(p)
	inner.w.Flush()
	sw.inner = inner.inner
	lines := strings.Split(strings.TrimSpace(b.String()), "\n")
	for i, l := range lines {
		if strings.HasPrefix(l, "L") {
			lines[i] = l + " IC=1m"
		}
	}
	return strings.Join(lines, "\n")
}

func TestLoopGainAgainstNgspiceTransient(t *testing.T) {
	if testing.Short() {
		t.Skip("a few minutes of transients")
	}
	bin := needNgspice(t)
	for _, file := range oscFixtures(t) {
		c := load(t, file)
		for _, p := range c.Parts {
			if p.Kind != graph.Valve && p.Kind != graph.BJT && p.Kind != graph.FET {
				continue
			}
			name := filepath.Base(file) + "/" + p.Ref
			// Each run loads its own copy, so parallel runs share no circuit
			// (a circuit's connection index is built on first use), and
			// ngspice, single-threaded, keeps both cores busy.
			t.Run(name, func(t *testing.T) {
				t.Parallel()
				c := load(t, file)
				// the low end of any dial; a loop so far below 0 dB there
				// that its pole lies beyond the search (a converter that
				// does not start anywhere) at the high end
				gang := 1.0
				if far(t, c, p.Ref, gang) {
					gang = 0
				}
				checkLoopTran(t, bin, c, p.Ref, gang)
			})
		}
	}
}

// far tells whether ref's loop at gang setting gang has a 0° crossing
// whose natural frequency the pole search does not reach.
func far(t *testing.T, c *graph.Circuit, ref string, gang float64) bool {
	o := Options{VarFrac: gang, VarSet: true}
	loop, err := FindLoop(c, ref, LoopOptions{Options: o})
	if err != nil || loop.F == 0 {
		return false
	}
	ls, err := newLoopSystem(c, ref, o)
	if err != nil {
		t.Fatal(err)
	}
	_, err = ls.pole(loop.F, 1)
	return err != nil
}

// checkLoopTran runs the circuit as drawn and twice more with the part's
// transconductance scaled to put pare's loop gain 0.3 dB below and above
// 0 dB. L is linear in the source's gm (the return ratio of one source),
// so the scaled runs test pare's margin to ±0.3 dB and, ringing at nearly
// constant amplitude, its 0°-phase frequency.
func checkLoopTran(t *testing.T, bin string, c *graph.Circuit, ref string, gang float64) {
	o := Options{VarFrac: gang, VarSet: true}
	loop, err := FindLoop(c, ref, LoopOptions{Options: o})
	if err != nil {
		t.Fatal(err)
	}
	if loop.F == 0 {
		t.Skipf("%s: no 0° crossing: no oscillator loop", ref)
	}
	ls, err := newLoopSystem(c, ref, o)
	if err != nil {
		t.Fatal(err)
	}
	// As drawn: the sign of growth, its rate against pare's pole.
	pole, err := ls.pole(loop.F, 1)
	if err != nil {
		t.Fatal(err)
	}
	fp := imag(pole) / (2 * math.Pi)
	got := runTran(t, bin, c, o, tranRun{ref: ref, k: 1, f: fp, cycles: cyclesFor(real(pole), fp)})
	t.Logf("as drawn: pare margin %+.2f dB at %.6g Hz, pole σ %.4g/s at %.6g Hz; ngspice σ %.4g/s at %.6g Hz",
		loop.MarginDB, loop.F, real(pole), fp, got.sigma, got.f)
	if (got.sigma > 0) != (loop.MarginDB > 0) {
		t.Errorf("pare says margin %+.2f dB but ngspice's ring has σ = %.4g/s", loop.MarginDB, got.sigma)
	}
	// ngspice's σ within 10 % of pare's pole, or 2e-4 of ω for a ring
	// too slow to fit closely; its frequency within 0.5 % of the pole's.
	if d := math.Abs(got.sigma - real(pole)); d > 0.1*math.Abs(real(pole))+2e-4*imag(pole) {
		t.Errorf("growth rate: ngspice %.4g/s, pare's pole %.4g/s", got.sigma, real(pole))
	}
	if d := math.Abs(got.f/fp - 1); d > 0.005 {
		t.Errorf("ring frequency: ngspice %.6g Hz, pare's pole %.6g Hz (%.2f %%)", got.f, fp, 100*d)
	}
	// At the threshold: 0.3 dB below pare's 0 dB, 0.3 and 0.6 dB above.
	var fs []float64
	for _, delta := range []float64{-0.3, 0.3, 0.6} {
		k := math.Pow(10, (delta-loop.MarginDB)/20)
		pk, err := ls.pole(loop.F, k)
		if err != nil {
			t.Fatal(err)
		}
		run := tranRun{ref: ref, k: k, f: loop.F, cycles: cyclesFor(real(pk), loop.F)}
		got := runTran(t, bin, c, o, run)
		t.Logf("loop at %+.1f dB: ngspice σ %.4g/s (pare's pole %.4g/s) at %.6g Hz (pare's pole %.6g Hz)",
			delta, got.sigma, real(pk), got.f, imag(pk)/(2*math.Pi))
		// A ring that changes by under 1 % over the fitted span (a crystal
		// at 1 MHz: 7/s over 1.5 ms) is not judged for its sign.
		if nepers := math.Abs(real(pk)) * 0.4 * run.cycles / loop.F; nepers < 0.01 {
			t.Logf("  at %+.1f dB the ring changes by %.3g nepers over the fit: too slow to judge its sign", delta, nepers)
		} else if (got.sigma > 0) != (delta > 0) {
			t.Errorf("loop gain %+.1f dB by pare, but ngspice's ring has σ = %.4g/s", delta, got.sigma)
		}
		if delta < 0 {
			// A dying ring need not be the slowest to die: another of the
			// circuit's modes may outlast it, so only its sign is judged.
			continue
		}
		fs = append(fs, got.f)
		if d := math.Abs(got.f/(imag(pk)/(2*math.Pi)) - 1); d > 0.003 {
			t.Errorf("at %+.1f dB ngspice rings at %.6g Hz, pare's pole at %.6g Hz", delta, got.f, imag(pk)/(2*math.Pi))
		}
	}
	// Done means: within 1 % of pare's 0°-phase frequency. A ring at
	// |L| = 1 runs exactly there; the growing rings at +0.3 and +0.6 dB,
	// each the circuit's dominant mode, extrapolate linearly to 0 dB.
	mean := 2*fs[0] - fs[1]
	t.Logf("ngspice at 0 dB (from +0.3 and +0.6 dB): %.6g Hz; pare %.6g Hz (%+.3f %%)", mean, loop.F, 100*(mean/loop.F-1))
	if d := math.Abs(mean/loop.F - 1); d > 0.01 {
		t.Errorf("ngspice rings at %.6g Hz at the threshold, pare's 0° frequency is %.6g Hz (%.2f %%)", mean, loop.F, 100*d)
	}
}

// tranStepsPerPeriod sets the transient's fixed step. The trapezoidal rule
// maps jω to a slightly warped frequency, (ω·h)²/12 low: 0.2 % at 40 steps,
// undone by trapezoidal.
var tranStepsPerPeriod = 40.0
