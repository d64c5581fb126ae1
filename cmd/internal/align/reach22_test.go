package align

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

func review22(t *testing.T, name string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "..", "testdata", "review22", name+".toml"))
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// The trimmer and the core applied together are solved as the reviewer's
// deck solves them: review22 a02 (TC1 27 pF, T1's secondary 229 µH
// +5.5 %) peaks at 529.9 kHz with the gang full and 1.674 MHz with it
// least, a05 (TC1 28 pF, 214 µH +7.2 %) at 538.7 kHz and 1.681 MHz
// (reviewer A's ngspice on testdata/review22/spice/a/c02_align.cir and
// c05_align.cir, max of |V(rf_g)|). 0.5 %: the deck keeps the winding's
// loss resistance fixed as its inductance moves, pare refers it to Q.
func TestCoreAndTrimmerAgainstNgspice(t *testing.T) {
	for _, tc := range []struct {
		name         string
		trim, k      float64
		wantLo, want float64
	}{
		{"a02", 27e-12, 1.055, 529.9e3, 1.674e6},
		{"a05", 28e-12, 1.072, 538.7e3, 1.681e6},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := review22(t, tc.name)
			m := withCore(c, c.Part("T1"), tc.k)
			m.Part("TC1").Set = tc.trim
			lo, hi, ok := tankEndPeaks(m, "rf_g", 540e3, 1.65e6)
			if !ok || math.Abs(lo-tc.wantLo) > 0.005*tc.wantLo || math.Abs(hi-tc.want) > 0.005*tc.want {
				t.Errorf("peaks %.0f Hz to %.0f Hz (ok %v), ngspice %.0f to %.0f", lo, hi, ok, tc.wantLo, tc.want)
			}
		})
	}
}

// Before saying alignment cannot reach the band, the trimmer and the core
// are searched together: review22 a02 and a05 fall short of the low end
// with TC1 at its least and every core setting, but the reviewer's
// ngspice covers the band with TC1 at 27 pF and T1 +5.5 % (a02), 28 pF
// and +7.2 % (a05). pare's pair must cover the band, solved with both, and
// the reviewer's deck with pare's pair put in must cover it too: the
// decks testdata/review22/spice/a/c02_pair.cir and c05_pair.cir (the
// reviewer's align decks with pare's pair) peak at 529.955 kHz to
// 1.6507375 MHz (a02) and 540.010 kHz to 1.6506 MHz (a05), ngspice-39,
// linear steps of 5 Hz (low end) and 12.5 Hz (top). The pair is the alignment's own end point (core at the
// bottom, trimmer at the top, repeated): the ends on the band's ends.
func TestReachSearchesTrimmerAndCore(t *testing.T) {
	for _, tc := range []struct {
		name             string
		lo, hi, wLo, wHi float64
		trim, k          float64 // pare's pair as put in the decks
		ngLo, ngHi       float64 // the decks' peaks with that pair
	}{
		{"a02", 542.2e3, 1.657e6, 530e3, 1.65e6, 28.2574e-12, 1.0511689, 529.955e3, 1.6507375e6},
		{"a05", 555e3, 1.66e6, 540e3, 1.65e6, 29.8978e-12, 1.0618930, 540.010e3, 1.6506e6},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := review22(t, tc.name)
			r, ok := reachOf(c, c.Part("VC1a"), tc.lo, tc.hi, tc.wLo, tc.wHi)
			if !ok || !r.reaches || r.found == nil {
				t.Fatalf("%+v ok %v: want reached by TC1 and T1's core together", r, ok)
			}
			f := r.found
			t.Logf("TC1 %.6g pF, k %.7f: %.1f Hz to %.1f Hz", f.t*1e12, f.k, f.lo, f.hi)
			if f.lo > tc.wLo*(1+bandSlack) || f.hi < tc.wHi*(1-bandSlack) || f.k < 1-coreSpan || f.k > 1+coreSpan {
				t.Errorf("pair does not cover %.0f..%.0f within the core's travel", tc.wLo, tc.wHi)
			}
			if math.Abs(f.t-tc.trim) > 0.001e-12 || math.Abs(f.k-tc.k) > 1e-6 {
				t.Fatalf("pair moved from the decks' (%.6g pF, %.7f): run the decks again", tc.trim*1e12, tc.k)
			}
			if math.Abs(f.lo-tc.ngLo) > 0.001*tc.ngLo || math.Abs(f.hi-tc.ngHi) > 0.001*tc.ngHi {
				t.Errorf("solved %.0f..%.0f Hz, ngspice %.0f..%.0f", f.lo, f.hi, tc.ngLo, tc.ngHi)
			}
		})
	}
}

// A trimmer whose range stops short of the pair is searched and found
// wanting: review22 a02 with TC1 5–7 pF (variant) cannot bring the low end
// to 530 kHz with T1's core within ±10 % (at 7 pF the low end is above
// 530 kHz·√1.1: the case pare now says "cannot reach" for, with why).
func TestReachSaysWhyNot(t *testing.T) {
	c := review22(t, "a02")
	tc1 := c.Part("TC1")
	tc1.Value.Max, tc1.Set = 7e-12, 6e-12
	lo, hi, ok := tankEndPeaks(c, "rf_g", 560e3, 1.7e6)
	if !ok {
		t.Fatal("tank not solved")
	}
	r, ok := reachOf(c, c.Part("VC1a"), lo, hi, 530e3, 1.65e6)
	if !ok || r.reaches || !r.searched || !r.top.ok {
		t.Fatalf("%+v ok %v: want searched and not reached", r, ok)
	}
	if w := r.limitWords(); !strings.Contains(w, "no pair of settings of TC1 (5 pF to 7 pF)") {
		t.Errorf("words: %s", w)
	}
}
