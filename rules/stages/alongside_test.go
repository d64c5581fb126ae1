package stages

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// A trimmer marked keep = true across a gang section stays a part of its
// own after the reduction; the tank it tunes is still the coil with both
// capacitances across it, and the gang section is still in the stage.
func TestKeptTrimmerCountsInTank(t *testing.T) {
	const src = `title = "kept trimmer across a gang section (invented)"
band = "530k..1.6M"
inputs = ["aer"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
T1 = { windings = { p = "40u", s = "230u" }, k = 0.3, pins = { p1 = "aer", p2 = "gnd", s1 = "tank", s2 = "gnd" }, q = 80 }
TC1 = { c = "5p..50p", set = "31p", pins = ["tank", "gnd"], keep = true }
VC1 = { c = "12p..365p", pins = ["tank", "gnd"], gang = "tune" }
C1 = { c = "10n", pins = ["tank", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "pentode", pins = { a = "out", g1 = "g", g2 = "ht", g3 = "gnd", k = "gnd" }, gm = "2m", ra = "1M" }
R2 = { r = "10k", pins = ["ht", "out"] }
`
	for _, keep := range []bool{true, false} {
		text := src
		if !keep {
			text = strings.Replace(src, ", keep = true", "", 1)
		}
		c, err := graph.Parse("kept.toml", []byte(text))
		if err != nil {
			t.Fatal(err)
		}
		r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
		if err != nil {
			t.Fatal(err)
		}
		st := stageOf(find(t, r, Options{ACGround: log.ACGround}), "tuned-winding")
		if st == nil {
			t.Fatalf("keep=%v: no tuned winding", keep)
		}
		if keep && strings.Join(st.Parts, " ") != "T1 TC1 VC1" {
			t.Errorf("keep=%v: parts %v, want T1 TC1 VC1 (the gang section stays in the stage)", keep, st.Parts)
		}
		// Capacitors in parallel add (docs/references.md §4): 12p+31p ..
		// 365p+31p across the coil, and the formula cross-check
		// f = 1/(2π√(LC)) with L = 230 µH (§1): 527.4 kHz .. 1.600 MHz.
		for _, w := range []struct {
			key  string
			want float64
		}{{"c_min_f", 43e-12}, {"c_max_f", 396e-12}, {"f_formula_min_hz", 527.36e3}, {"f_formula_max_hz", 1.6004e6}} {
			got, ok := st.Figures.Lookup(w.key)
			if !ok || math.Abs(got/w.want-1) > 1e-3 {
				t.Errorf("keep=%v: %s = %.4g (present %v), want %.4g", keep, w.key, got, ok, w.want)
			}
		}
	}
}
