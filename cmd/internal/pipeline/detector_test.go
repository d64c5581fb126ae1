package pipeline

import (
	"math"
	"strings"
	"testing"

	"pare/rules"
)

// TestDetectorLoadFigures: the detector's DC load printed is the one the
// solver's rd rests on, the AC load beside it, and their ratio flagged when
// deep modulation clips (issue 10, item 9). review-ifstrip.toml: DC load
// 47k + 500k = 547k (R5 and the volume control; the AGC branch returns no
// DC), audio load 547k ∥ 1M (R6 to the AGC line, at AC ground through C9)
// = 353.6k, both derived from the netlist by hand; ratio 0.6465, below the
// 0.8 peak modulation a broadcast detector should follow (common practice:
// the depth followed without clipping is about Rac/Rdc); corner
// 1/(2π·547k·100p) = 2.91 kHz, under the 3 kHz the detector check asks.
// Failed before: the note printed "r load 354 kΩ" while the solver used
// 547k, with no ratio and no clipping flag.
func TestDetectorLoadFigures(t *testing.T) {
	res, err := Run(Options{Path: "../../../testdata/good/review-ifstrip.toml", Until: PhaseStages, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]float64{"r_load": 547e3, "r_load_ac": 1 / (1/547e3 + 1/1e6), "ac_dc_ratio": 1 / (1 + 547e3/1e6),
		"f_c": 1 / (2 * math.Pi * 547e3 * 100e-12)}
	for _, st := range res.Stages {
		if _, ok := st.Figures.Get("r_load"); !ok {
			continue
		}
		for name, v := range want {
			f, ok := st.Figures.Get(name)
			if !ok || math.Abs(f.Value-v) > 1e-3*v {
				t.Errorf("%s: %s = %v (present %v), want %.4g", st.Name, name, f.Value, ok, v)
			}
		}
		flags := strings.Join(st.Flags, "\n")
		for _, w := range []string{"AC/DC load ratio 0.65", "below 3 kHz"} {
			if !strings.Contains(flags, w) {
				t.Errorf("%s: no flag with %q in %q", st.Name, w, flags)
			}
		}
		return
	}
	t.Fatal("no detector stage with a load figure")
}
