package ac

import (
	"bytes"
	"context"
	"math"
	"math/cmplx"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/internal/reftool"
)

// handDeck runs a deck written by hand (not by WriteSpice) that writes its
// table to out.dat, and returns its frequencies and complex outputs.
func handDeck(t *testing.T, bin, path string) ([]float64, [][]complex128) {
	t.Helper()
	deck, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck, 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), spiceTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "-b", "deck.cir")
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("ngspice: %v\n%s", err, stderr.String())
	}
	for _, l := range strings.Split(stderr.String(), "\n") {
		if strings.Contains(l, "Error") || strings.Contains(l, "singular") || strings.Contains(l, "Warning") {
			t.Fatalf("ngspice reported: %s", l)
		}
	}
	data, err := os.ReadFile(filepath.Join(dir, "out.dat"))
	if err != nil {
		t.Fatalf("ngspice wrote no data: %v\n%s", err, stderr.String())
	}
	return parseWrdata(t, data)
}

// TestTappedWindingQ measures each tapped coil of the fixture end to end at
// the centre of its band, where the solver's loss model is exact: its Q
// must be the q asked for (within 1 %), and its impedance ngspice's on the
// hand-written deck tapped-coils.cir (docs/references.md §16).
func TestTappedWindingQ(t *testing.T) {
	const file = "testdata/models/tapped-coils.toml"
	c := load(t, file)
	f0 := math.Sqrt(1.3e6 * 1.6e6) // the band's geometric centre, derived
	cases := []struct {
		net string
		q   float64    // asked for in the netlist
		z   complex128 // ngspice 39 .ac on tapped-coils.cir, |Z| and phase
	}{
		{"a_top", 90, cmplx.Rect(1.159974152785e+03, 1.559685672897)},
		{"b_top", 100, cmplx.Rect(9.062191794921e+02, 1.560796660108)},
		{"c_top", 70, cmplx.Rect(1.691054684281e+03, 1.556511584207)},
		{"d_top", 120, cmplx.Rect(9.062053357554e+03, 1.562463186355)},
	}
	var live []complex128
	if bin := reftool.Lookup(t, reftool.Ngspice); bin != "" {
		_, outs := handDeck(t, bin, "testdata/models/tapped-coils.cir")
		for _, o := range outs {
			live = append(live, o[0])
		}
	}
	for i, tc := range cases {
		z, err := Impedance(c, tc.net, []float64{f0}, Options{})
		if err != nil {
			t.Fatalf("%s: %v", tc.net, err)
		}
		q := imag(z[0]) / real(z[0]) // Q = X/R of the series equivalent, by definition
		if math.Abs(q-tc.q) > 0.01*tc.q {
			t.Errorf("%s: Q %.2f, want %g within 1 %%", tc.net, q, tc.q)
		}
		want := tc.z
		if i < len(live) {
			want = live[i]
		}
		if db, deg := deviation(z[0], want); db > spiceTolDB || deg > spiceTolDeg {
			t.Errorf("%s: Z %v, ngspice %v (%.4f dB, %.3f°)", tc.net, z[0], want, db, deg)
		}
	}
}

// detectorAmplitude runs the hand-written transient deck and returns the
// tank's settled amplitude, (max − min)/2, from its meas lines.
func detectorAmplitude(t *testing.T, bin, path string) float64 {
	t.Helper()
	deck, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck, 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), spiceTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "-b", "deck.cir")
	cmd.Dir = dir
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("ngspice: %v\n%s", err, out)
	}
	vals := map[string]float64{}
	for _, l := range strings.Split(string(out), "\n") {
		f := strings.Fields(l)
		if len(f) >= 3 && f[1] == "=" && (f[0] == "vpk" || f[0] == "vmn") {
			v, err := strconv.ParseFloat(f[2], 64)
			if err != nil {
				t.Fatalf("ngspice meas line %q: %v", l, err)
			}
			vals[f[0]] = v
		}
	}
	if len(vals) != 2 {
		t.Fatalf("ngspice printed no vpk and vmn:\n%s", out)
	}
	return (vals["vpk"] - vals["vmn"]) / 2
}

// TestDetectorLoadsItsTank: the default diode model makes a signal diode
// into a DC load RL a detector of input resistance RL/2 (common practice;
// docs/references.md §17), for a semiconductor diode and for a valve
// double-diode with strapped anodes alike. The tank's voltage at resonance
// must be ngspice's transient result with a stated diode model within
// 0.5 dB.
func TestDetectorLoadsItsTank(t *testing.T) {
	c := load(t, "testdata/models/detector.toml")
	const f = 453.43e3 // the tank's resonance, 1/(2π√(220 µH · 560 pF)), derived
	// ngspice 39 .tran on detector.cir (IS 1e-14, N 1): (22.10031 + 22.75186)/2 V
	// for 100 V peak.
	want := (22.10031 + 22.75186) / 2 / 100
	if bin := reftool.Lookup(t, reftool.Ngspice); bin != "" {
		want = detectorAmplitude(t, bin, "testdata/models/detector.cir") / 100
	}
	for _, pr := range [][2]string{{"src", "t"}, {"src2", "t2"}} {
		h, err := Transfer(c, pr[0], pr[1], []float64{f}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		db := 20 * math.Log10(cmplx.Abs(h[0])/want)
		t.Logf("V(%s)/V(%s): pare %.4f, ngspice %.4f, %.2f dB", pr[1], pr[0], cmplx.Abs(h[0]), want, db)
		if math.Abs(db) > 0.5 {
			t.Errorf("V(%s)/V(%s) %.4f, ngspice %.4f: %.2f dB apart", pr[1], pr[0], cmplx.Abs(h[0]), want, db)
		}
	}
}

// TestNeverAnEmptyPass: a circuit with no declared input is compared by
// its tanks and its amplifying parts' transfers; where there are none the
// comparison is not a pass, whatever the output impedance did. Comparing a
// circuit with itself gives 0 dB (identity), so the count alone decides.
func TestNeverAnEmptyPass(t *testing.T) {
	cases := []struct {
		file   string
		ok     bool
		labels []string // the characteristic quantities expected
	}{
		// The declared output is compared from each tank too (issue 10,
		// item 6: a VFO's output was never compared).
		{"oscillator-only.toml", true, []string{"Z(tank)", "Z(tap)", "V(out)/V(tank)", "V(out)/V(tap)", "V(e)/V(b)"}},
		{"nothing-comparable.toml", false, nil},
	}
	for _, tc := range cases {
		c := load(t, filepath.Join("testdata/models", tc.file))
		rep, err := Compare(c, c, CompareOptions{})
		if err != nil {
			t.Fatalf("%s: %v", tc.file, err)
		}
		if rep.OK != tc.ok || rep.Empty() == tc.ok || rep.Characteristic != len(tc.labels) {
			t.Errorf("%s: OK %v, %d characteristic quantities, want OK %v and %d", tc.file, rep.OK, rep.Characteristic, tc.ok, len(tc.labels))
		}
		got := map[string]bool{}
		for _, p := range rep.Pairs {
			got[p.Label()] = true
		}
		for _, l := range tc.labels {
			if !got[l] {
				t.Errorf("%s: %s not compared (pairs %v)", tc.file, l, rep.Pairs)
			}
		}
		if !tc.ok && !contains(rep.Notes, NothingComparable) {
			t.Errorf("%s: notes %q lack %q", tc.file, rep.Notes, NothingComparable)
		}
	}
}
