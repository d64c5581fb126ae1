package ac

import (
	"math"
	"math/cmplx"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"testing"

	"pare/internal/reftool"
)

// TestLiftLoopAgainstNgspice: a loop broken at a part's lifted end, its
// net loaded by the current that end draws, is the loop a bench
// measurement with an exact replica load reads. Check values: ngspice
// .ac on the hand-written small-signal deck beside the fixture (the
// lifted end driven by a 1 V source, its net loaded through an F source
// by that source's own current), the 0° crossing and |T| there read by
// its `meas` lines (docs/references.md §48). With ngspice at hand the
// deck is run again and must still give the recorded figures.
func TestLiftLoopAgainstNgspice(t *testing.T) {
	cases := []struct {
		file, deck, dev string
		lift            Lift
		f, db           float64 // the deck's f0 (Hz) and 20·log10(t0)
	}{
		// testdata/wien/valve-lamp.cir: f0 = 1052.330 Hz, t0 = 1.748854 (+4.855 dB)
		{"valve-lamp.toml", "valve-lamp.cir", "V1", Lift{Part: "C1", Net: "a2"}, 1052.330, 4.855071},
	}
	bin := reftool.Lookup(t, reftool.Ngspice)
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c := load(t, "../../testdata/wien/"+tc.file)
			l, err := FindLoop(c, tc.dev, LoopOptions{From: 100, To: 1e4, Lift: &tc.lift})
			if err != nil || len(l.Crossings) != 1 {
				t.Fatalf("loop broken at %v: %+v, %v; want one 0° crossing", tc.lift, l, err)
			}
			if math.Abs(l.F/tc.f-1) > 1e-4 || math.Abs(l.MarginDB-tc.db) > 0.01 {
				t.Errorf("pare %.3f Hz %+.4f dB; ngspice %.3f Hz %+.4f dB", l.F, l.MarginDB, tc.f, tc.db)
			}
			if bin == "" {
				return
			}
			f, db := runLiftDeck(t, bin, "../../testdata/wien/"+tc.deck)
			if math.Abs(f/tc.f-1) > 1e-5 || math.Abs(db-tc.db) > 1e-4 {
				t.Errorf("the deck now gives %.3f Hz %+.5f dB, recorded %.3f Hz %+.5f dB", f, db, tc.f, tc.db)
			}
		})
	}
}

var measLine = regexp.MustCompile(`(?m)^(f0|tdb)\s+=\s+(\S+)`)

// runLiftDeck runs a loop deck and reads its f0 and tdb.
func runLiftDeck(t *testing.T, bin, deck string) (f, db float64) {
	t.Helper()
	abs, err := filepath.Abs(deck)
	if err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "-b", abs)
	cmd.Dir = t.TempDir()
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("ngspice %s: %v\n%s", deck, err, out)
	}
	got := map[string]float64{}
	for _, m := range measLine.FindAllStringSubmatch(string(out), -1) {
		if v, err := strconv.ParseFloat(m[2], 64); err == nil {
			got[m[1]] = v
		}
	}
	if len(got) != 2 {
		t.Fatalf("ngspice %s: no f0 and tdb in\n%s", deck, out)
	}
	return got["f0"], got["tdb"]
}

// TestLiftRefused: a break that names no lifted resistor or capacitor end
// is an error with the reason, never a panic or a loop.
func TestLiftRefused(t *testing.T) {
	c := load(t, "../../testdata/wien/valve-lamp.toml")
	for _, lift := range []Lift{
		{Part: "C1", Net: "g1"},  // C1 runs a2–wm
		{Part: "R2", Net: "gnd"}, // ground: nothing to break
		{Part: "V1", Net: "a1"},  // a device, not a two-pin part
		{Part: "CX", Net: "a2"},  // no such part
		{Part: "C1", Net: "nowhere"},
	} {
		if l, err := FindLoop(c, "V1", LoopOptions{Lift: &lift}); err == nil {
			t.Errorf("lift %v: %+v, want an error", lift, l)
		}
	}
}

// TestBreaksShareTheNaturalFrequency: wherever a loop is broken (a
// device's controlled source whole, its control electrode alone, a lifted
// part's end), 1 − T is the circuit's determinant over the broken one's,
// so T = 1 at the same natural frequency s = σ + jω (derived from the
// matrix determinant lemma; Bode's Δ = Δ0·(1 − T)). Each break's pole,
// found by Newton's method from its own 0° crossing, must agree. The
// fixtures' margins are small: a Wien loop far above 0 dB (valve-lamp's
// +4.9 dB) has its poles on the real axis, a growth with no ring to find.
func TestBreaksShareTheNaturalFrequency(t *testing.T) {
	cases := []struct {
		file, dev string
		lift      Lift
	}{
		{"../../testdata/osc/wien-valve.toml", "V1", Lift{Part: "R1", Net: "a2"}},
		{"../../testdata/osc/wien-bjt.toml", "Q1", Lift{Part: "R1", Net: "c2"}},
		{"../../testdata/osc/phase-shift-valve.toml", "V1", Lift{Part: "C1", Net: "a"}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c := load(t, tc.file)
			nl, err := elaborate(c, Options{})
			if err != nil {
				t.Fatal(err)
			}
			whole, err1 := loopSystemOf(c, nl, tc.dev, false)
			control, err2 := loopSystemOf(c, nl, tc.dev, true)
			lifted, err3 := liftSystemOf(c, nl, tc.lift)
			if err1 != nil || err2 != nil || err3 != nil {
				t.Fatalf("systems: %v %v %v", err1, err2, err3)
			}
			var poles []complex128
			for _, ls := range []*loopSystem{whole, control, lifted} {
				l, err := ls.find(LoopOptions{From: 10, To: 1e6})
				if err != nil || l.F == 0 {
					t.Fatalf("no 0° crossing: %+v %v", l, err)
				}
				p, err := ls.pole(l.F, 1)
				if err != nil {
					t.Fatal(err)
				}
				poles = append(poles, p)
			}
			for _, p := range poles[1:] {
				if cmplx.Abs(p-poles[0]) > 1e-6*cmplx.Abs(poles[0]) {
					t.Errorf("poles %v: the breaks disagree", poles)
				}
			}
		})
	}
}
