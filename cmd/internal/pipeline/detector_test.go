package pipeline

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
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
// 1/(2π·547k·100p) = 2.91 kHz, under the 3 kHz the detector check asks;
// there a 5 kHz tone deeper than 1/√(1 + (5/2.91)²) = 50 % is clipped
// diagonally (handbook formula, from memory).
// Failed before: the note printed "r load 354 kΩ" while the solver used
// 547k, with no ratio and no clipping flag.
func TestDetectorLoadFigures(t *testing.T) {
	res, err := stagesRun("../../../testdata/good/review-ifstrip.toml")
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
		for _, w := range []string{"AC/DC load ratio 0.65", "below 3 kHz", "deeper than 50 % is clipped diagonally"} {
			if !strings.Contains(flags, w) {
				t.Errorf("%s: no flag with %q in %q", st.Name, w, flags)
			}
		}
		return
	}
	t.Fatal("no detector stage with a load figure")
}

// TestAudioCouplingJudgedOnAudio: at level ideal, shorting the portable's
// 10 µF audio coupling capacitor C6 is judged on the audio band past the
// detector (|Xc| = 159 Ω at 100 Hz against about 2.8 kΩ, derived from
// 1/(2πfC)), not on the IF the detector leaks. Failed before: the step was
// refused for a 0.85 dB change of that leak at 445 kHz (issue 10, item 6).
func TestAudioCouplingJudgedOnAudio(t *testing.T) {
	res, err := Run(Options{Path: "../../../testdata/good/review-portable.toml", Until: PhaseReduce, Level: rules.LevelIdeal})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range res.Log.Steps {
		if len(s.Refs) == 1 && s.Refs[0] == "C6" {
			if s.Refused != "" {
				t.Errorf("step %d %s (C6) refused: %s", s.N, s.Rule, s.Refused)
			}
			return
		}
	}
	t.Error("no step on C6 at level ideal")
}

// TestReducedNetlistKeepsDetectorRd: the reduced netlist, loaded alone,
// solves its detector as the reduced circuit does: V2's rd is written from
// the wiring's DC load, 547k/2 = 273.5k (rd = Rdc/2, docs/devices.md; the
// reviewer's ngspice deck ifs_273.5k.cir uses the same), not from the
// reduced file's own DC paths, where the grounded AGC line would give
// 176.8k.
func TestReducedNetlistKeepsDetectorRd(t *testing.T) {
	res, err := Run(Options{Path: "../../../testdata/good/review-ifstrip.toml", Until: PhaseReduce, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	text, err := res.ReducedNetlist()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "reduced.toml")
	if err := os.WriteFile(path, text, 0o644); err != nil {
		t.Fatal(err)
	}
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if rd, _ := c.Part("V2").Param("rd"); math.Abs(rd-273.5e3) > 1 {
		t.Errorf("V2 rd in the reduced netlist %g Ω, want 273.5 kΩ", rd)
	}
}
