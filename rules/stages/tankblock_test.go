package stages

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

// An oscillator's "tank alone" is the resonance of every capacitor in the
// tank's loop, a DC block in series with the Colpitts divider too, and a
// declared input on a net of that loop does not short part of it: else the
// loop reads as pulled by loading off a tank that is not its own.
// Check values: the series-capacitor formula 1/Ceff = 1/C1 + 1/C2 + 1/Cb
// plus the tuning across the coil (handbook formula) gives 2.663–3.079 MHz
// for L1 10 µH, C4 1 nF, C5 470 pF, C6 1 nF, VC1+TC1 25–115 pF; the blind
// reviewer's ngspice transient of the same circuit (their deck c01.cir,
// VC1 at 100 pF and 10 pF) oscillates at 2.673 and 3.088 MHz.
func TestTankAloneCountsSeriesBlock(t *testing.T) {
	cases := []struct {
		name   string
		inputs []string // nil: as the file declares (the emitter tap)
	}{
		{"input on the emitter tap", nil},
		{"input past the buffer", []string{"q3_b"}},
	}
	const formulaLo, formulaHi = 2.6627e6, 3.0785e6 // handbook, worked by hand
	const spiceLo, spiceHi = 2.673e6, 3.088e6       // reviewer's ngspice, c01.cir
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			st := blockedColpitts(t, tc.inputs)
			if st == nil {
				t.Fatal("no blocked Colpitts found")
			}
			tank, ok := st.Figures.Get("f_tank")
			if !ok || tank.Range == nil || tank.Check == nil || tank.Check.Range == nil {
				t.Fatalf("tank alone %+v (%v): want the solver's range with its formula", tank, ok)
			}
			for _, p := range []struct {
				what           string
				got, want, tol float64
			}{
				{"formula low", tank.Check.Range.Min, formulaLo, 0.001},
				{"formula high", tank.Check.Range.Max, formulaHi, 0.001},
				{"tank alone low", tank.Range.Min, spiceLo, 0.01},
				{"tank alone high", tank.Range.Max, spiceHi, 0.01},
			} {
				if math.Abs(p.got/p.want-1) > p.tol {
					t.Errorf("%s %s, want within %.1f %% of %s", p.what, hzText(p.got), 100*p.tol, hzText(p.want))
				}
			}
			for _, f := range st.Flags {
				if strings.Contains(f, "pulled") {
					t.Errorf("flag %q: the loop runs at its own tank's frequency", f)
				}
			}
		})
	}
}

// blockedColpitts is review20 b01's blocked Colpitts stage, with the
// circuit's declared inputs replaced by inputs when they are given; nil when
// no such stage is found.
func blockedColpitts(t *testing.T, inputs []string) *Stage {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/review20/b01.toml")
	if err != nil {
		t.Fatal(err)
	}
	if inputs != nil {
		c.Inputs = inputs
	}
	return stageOf(findReduced(t, c), "colpitts-common-tap-blocked")
}
