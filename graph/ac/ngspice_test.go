package ac

import (
	"bufio"
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"pare/graph"
	"pare/internal/reftool"
)

// ngspice is the independent reference: the deck WriteSpice writes is run by
// ngspice (Debian package ngspice) and pare's own solver must agree at every
// sweep point to better than 0.01 dB and 0.1°.
const (
	spiceTolDB  = 0.01
	spiceTolDeg = 0.1
	// spiceTimeout bounds one ngspice run.
	spiceTimeout = 30 * time.Second
)

// acLine is the deck's .ac card.
func acLine(deck string) string {
	for _, l := range strings.Split(deck, "\n") {
		if strings.HasPrefix(l, ".ac ") {
			return l
		}
	}
	return ""
}

// needNgspice returns the path of ngspice, or skips the test; with
// PARE_REQUIRE_NGSPICE=1 (set by .ci/run) a missing ngspice fails it.
func needNgspice(t testing.TB) string {
	t.Helper()
	return reftool.Find(t, reftool.Ngspice)
}

// spiceRun writes c's deck, runs ngspice in batch mode and returns the
// frequencies and, per output, the complex response ngspice computed.
func spiceRun(t testing.TB, bin string, c *graph.Circuit, o SpiceOptions) ([]float64, [][]complex128) {
	t.Helper()
	dir := t.TempDir()
	o.DataFile = "out.dat"
	var deck bytes.Buffer
	if err := WriteSpice(&deck, c, o); err != nil {
		t.Fatalf("WriteSpice: %v", err)
	}
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	// Every deck here runs in well under a second; one that takes longer is
	// a sweep card gone wrong (a narrow band at a few points per decade made
	// ngspice-39 run for minutes), and the test fails instead of hanging.
	ctx, cancel := context.WithTimeout(context.Background(), spiceTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "-b", "deck.cir")
	cmd.Dir = dir
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		if errors.Is(ctx.Err(), context.DeadlineExceeded) {
			t.Fatalf("ngspice did not finish within %v: the deck's sweep card is %q", spiceTimeout, acLine(deck.String()))
		}
		t.Fatalf("ngspice: %v\n%s", err, stderr.String())
	}
	// ngspice exits 0 on errors inside .control and on singular matrices
	// (docs/references.md §15): look at stderr.
	for _, l := range strings.Split(stderr.String(), "\n") {
		if strings.Contains(l, "Error") || strings.Contains(l, "singular") || strings.Contains(l, "Warning") {
			t.Fatalf("ngspice reported: %s\ndeck:\n%s", l, deck.String())
		}
	}
	data, err := os.ReadFile(filepath.Join(dir, "out.dat"))
	if err != nil {
		t.Fatalf("ngspice wrote no data: %v\n%s", err, stderr.String())
	}
	return parseWrdata(t, data)
}

// parseWrdata reads a wr_singlescale/wr_vecnames table: frequency, then
// magnitude and phase (radians) per output.
func parseWrdata(t testing.TB, data []byte) ([]float64, [][]complex128) {
	t.Helper()
	sc := bufio.NewScanner(bytes.NewReader(data))
	var freqs []float64
	var outs [][]complex128
	header := true
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 0 {
			continue
		}
		if header {
			header = false
			outs = make([][]complex128, (len(f)-1)/2)
			continue
		}
		if len(f) != 1+2*len(outs) {
			t.Fatalf("wrdata row has %d columns, want %d", len(f), 1+2*len(outs))
		}
		v := make([]float64, len(f))
		for i, s := range f {
			x, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatalf("wrdata: %v", err)
			}
			v[i] = x
		}
		freqs = append(freqs, v[0])
		for k := range outs {
			outs[k] = append(outs[k], cmplx.Rect(v[1+2*k], v[2+2*k]))
		}
	}
	if len(freqs) == 0 {
		t.Fatal("wrdata table is empty")
	}
	return freqs, outs
}

// deviation returns the dB and degree differences between two responses.
func deviation(a, b complex128) (dB, deg float64) {
	dB = math.Abs(20 * math.Log10(cmplx.Abs(a)/cmplx.Abs(b)))
	deg = phaseDiff(b, a)
	return
}

type spiceCase struct {
	name string
	c    *graph.Circuit
	o    SpiceOptions
}

func exampleFiles(t testing.TB) []string {
	files, _ := filepath.Glob("../../examples/*.toml")
	sort.Strings(files)
	return files
}

func load(t testing.TB, path string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return c
}

// casesFor makes one deck per input of a circuit (its declared inputs and
// each region's input), recording every output it declares.
func casesFor(name string, c *graph.Circuit) []spiceCase {
	var outs []string
	add := func(n string) {
		for _, o := range outs {
			if o == n {
				return
			}
		}
		if n != "" {
			outs = append(outs, n)
		}
	}
	for _, o := range c.Outputs {
		add(o)
	}
	for _, r := range c.Regions {
		add(r.Output)
	}
	var cases []spiceCase
	seen := map[string]bool{}
	ins := append([]string(nil), c.Inputs...)
	for _, r := range c.Regions {
		ins = append(ins, r.Input)
	}
	for _, in := range ins {
		if in == "" || seen[in] {
			continue
		}
		seen[in] = true
		var o []string
		for _, out := range outs {
			if out != in {
				o = append(o, out)
			}
		}
		if len(o) == 0 {
			continue
		}
		cases = append(cases, spiceCase{name: name + ":" + in, c: c, o: SpiceOptions{Input: in, Outputs: o, PointsPerDecade: 200}})
	}
	return cases
}

func referenceCases(t testing.TB) []spiceCase {
	var cases []spiceCase
	fixtures, _ := filepath.Glob("testdata/*.toml")
	sort.Strings(fixtures)
	for _, f := range append(fixtures, exampleFiles(t)...) {
		cases = append(cases, casesFor(filepath.Base(f), load(t, f))...)
	}
	// Gang sections at the ends of their travel, and a port termination.
	hx := load(t, "testdata/hartley-xtal.toml")
	for _, frac := range []float64{0, 1} {
		cases = append(cases, spiceCase{name: fmt.Sprintf("hartley-xtal.toml:gang %g", frac), c: hx,
			o: SpiceOptions{Options: Options{VarFrac: frac, VarSet: true}, PointsPerDecade: 200}})
	}
	ct := load(t, "testdata/centre-tap.toml")
	cases = append(cases, spiceCase{name: "centre-tap.toml:terminated", c: ct,
		o: SpiceOptions{Options: Options{Terminate: map[string]float64{"s_top": 600}}, PointsPerDecade: 100}})
	return append(cases, reducedCases(t)...)
}

func TestAgainstNgspice(t *testing.T) {
	bin := needNgspice(t)
	cases := referenceCases(t)
	if len(cases) < 10 {
		t.Fatalf("only %d reference circuits, want at least 10", len(cases))
	}
	worstDB, worstDeg := 0.0, 0.0
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			freqs, ref := spiceRun(t, bin, tc.c, tc.o)
			in := tc.o.Input
			if in == "" {
				in = tc.c.Inputs[0]
			}
			outs := tc.o.Outputs
			if outs == nil {
				outs = tc.c.Outputs
			}
			got, err := transferMany(tc.c, in, outs, freqs, tc.o.Options)
			if err != nil {
				t.Fatal(err)
			}
			for k, out := range outs {
				for i, f := range freqs {
					d, p := deviation(got[k][i], ref[k][i])
					worstDB, worstDeg = math.Max(worstDB, d), math.Max(worstDeg, p)
					if d > spiceTolDB || p > spiceTolDeg {
						t.Errorf("%s→%s at %.6g Hz: pare %v, ngspice %v: %.4g dB, %.4g°", in, out, f, got[k][i], ref[k][i], d, p)
						return
					}
				}
			}
		})
	}
	t.Logf("%d decks; worst disagreement with ngspice over all points: %.3g dB, %.3g°", len(cases), worstDB, worstDeg)
}

// A band narrower than an octave (a 10.7 MHz discriminator swept over
// 10.6–10.8 MHz) is swept linearly at 101 points or more: at 50 points per
// decade a logarithmic card asks for 0.4 points, and ngspice-39 then ran
// for minutes. The deck must finish within spiceTimeout, give at least 101
// rows spanning the band, and agree with pare at every row (ngspice is the
// reference, 0.01 dB and 0.1°).
func TestNarrowBandDeckAgainstNgspice(t *testing.T) {
	bin := needNgspice(t)
	c := load(t, "testdata/fm-discriminator.toml")
	o := SpiceOptions{PointsPerDecade: 50}
	freqs, ref := spiceRun(t, bin, c, o)
	if len(freqs) < MinSpicePoints {
		t.Fatalf("%d rows, want at least %d", len(freqs), MinSpicePoints)
	}
	if freqs[0] != 10.6e6 || math.Abs(freqs[len(freqs)-1]-10.8e6) > 1 {
		t.Errorf("sweep spans %g..%g Hz, want the band 10.6–10.8 MHz", freqs[0], freqs[len(freqs)-1])
	}
	got, err := transferMany(c, c.Inputs[0], c.Outputs, freqs, o.Options)
	if err != nil {
		t.Fatal(err)
	}
	for i, f := range freqs {
		if d, p := deviation(got[0][i], ref[0][i]); d > spiceTolDB || p > spiceTolDeg {
			t.Fatalf("at %.7g Hz: pare %v, ngspice %v: %.4g dB, %.4g°", f, got[0][i], ref[0][i], d, p)
		}
	}
}
