package stages

import (
	"math"
	"strings"
	"testing"

	"pare/graph/dc"
	"pare/graph/figure"
)

// The output stage of a whole set shows its gain to the loudspeaker, the
// class-A power estimate and its anode dissipation at the operating point
// against pmax (blind review 17, item 6: the output stage had none).
//   - gain: ngspice .ac on testdata/output/club-output.cir, |V(spk)/V(op_g)|
//     at 632.46 Hz = 0.88519 (each winding's declared copper in series);
//   - anode dissipation: ngspice .op on testdata/output/club-dc.cir (the
//     reviewer's DC deck with the laws of docs/dc.md, the reservoir at the
//     274.2 V pare estimates from the mains), (Vht − Va)/300 Ω · (Va − Vk)
//     = 7.1138 W against V7's pmax 9 W;
//   - class-A estimate: handbook P = ½·Ia²·n²·Z with Ia = 30.13 mA from the
//     same deck and n²·Z = 7 kΩ: 3.177 W.
//
// Above 100 % of pmax the stage is flagged (common practice). docs/references.md §26.
func TestOutputStagePowerFigures(t *testing.T) {
	for _, tc := range []struct {
		pmax float64
		flag bool
	}{{9, false}, {6, true}} {
		full, reduced, log := reduceExample(t, "club-receiver.toml")
		full.Part("V7").Params["pmax"] = tc.pmax
		op, err := dc.Solve(full)
		if err != nil {
			t.Fatal(err)
		}
		var out *Stage
		found := find(t, reduced, Options{Full: full, ACGround: log.ACGround, DC: op})
		for i := range found {
			if found[i].Topology == "output-transformer" {
				out = &found[i]
			}
		}
		if out == nil {
			t.Fatal("no output stage")
		}
		for _, want := range []struct {
			name string
			v    float64
			tol  float64
			src  figure.Source
		}{
			{"gain", 0.88519, 0.005, figure.Solver},
			{"p_anode", 7.1138, 0.005, figure.Solver},
			{"p_out_class_a", 3.177, 0.01, figure.Formula},
			{"p_max", tc.pmax, 1e-9, figure.Netlist},
		} {
			f, ok := out.Figures.Get(want.name)
			if !ok || math.Abs(f.Value/want.v-1) > want.tol || f.Origin.Source != want.src {
				t.Errorf("pmax %v: %s = %v (present %v, origin %v), want %v", tc.pmax, want.name, f.Value, ok, f.Origin, want.v)
			}
		}
		flagged := strings.Contains(strings.Join(out.Flags, "\n"), "V7 anode dissipation 7.11 W is 119 % of its 6 W rating")
		if flagged != tc.flag {
			t.Errorf("pmax %v: flags %q, want the over-rating flag %v", tc.pmax, out.Flags, tc.flag)
		}
	}
}
