package graph

import (
	"math"
	"path/filepath"
	"strings"
	"testing"
)

// A band switch turned away from the netlist's position moves the declared
// band to the range the coil it switches in tunes with the gang, fully
// meshed to fully open; a switch left where the netlist sets it moves
// nothing. Check values: handbook formula f = 1/(2π√(LC)) on the fixture's
// coils (L1 230 µH, L2 2 mH) with the gang's 12 pF and 365 pF, the only
// capacitance across the coil (C1 goes to the undriven input side).
func TestRetuneBandsFollowsTheSwitchedTank(t *testing.T) {
	f := func(l, c float64) float64 { return 1 / (2 * math.Pi * math.Sqrt(l*c)) }
	cases := []struct {
		name     string
		from, to int
		lo, hi   float64 // 0: the declared band stays
	}{
		{"turned to LW", 1, 2, f(2e-3, 365e-12), f(2e-3, 12e-12)},
		{"left on MW", 1, 1, 0, 0},
	}
	for _, tc := range cases {
		c, err := LoadFile(filepath.Join("..", "rules", "stages", "testdata", "band-switch.toml"))
		if err != nil {
			t.Fatal(err)
		}
		declared := c.Band
		c.Part("S1").Set = float64(tc.to)
		got := c.RetuneBands(map[string]int{"S1": tc.from})
		if tc.lo == 0 {
			if got != nil || c.Band != declared {
				t.Errorf("%s: retuned %v, band %v; want the declared %v untouched", tc.name, got, c.Band, declared)
			}
			continue
		}
		if len(got) != 1 || math.Abs(c.Band.Min/tc.lo-1) > 1e-3 || math.Abs(c.Band.Max/tc.hi-1) > 1e-3 {
			t.Fatalf("%s: band %v (retuned %v), want %.4g–%.4g Hz", tc.name, c.Band, got, tc.lo, tc.hi)
		}
		if s := got[0].String(); !strings.Contains(s, "S1 turned") || !strings.Contains(s, "L2 tunes") || !strings.Contains(s, "instead of the declared 530 kHz–1.6 MHz") {
			t.Errorf("%s: note %q does not say what moved and why", tc.name, s)
		}
	}
}
