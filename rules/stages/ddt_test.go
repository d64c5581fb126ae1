package stages

import (
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/figure"
	"pare/rules"
)

// findDetectorFixture finds the stages of a fixture of testdata/detectors.
func findDetectorFixture(t *testing.T, name string) []Stage {
	t.Helper()
	_, st := findFixture(t, "detectors", name)
	return st
}

// findFixture reduces testdata/DIR/NAME and finds its stages as the main
// job does: the original beside it, with its DC operating point, which it
// returns too.
func findFixture(t *testing.T, dir, name string) (*dc.Point, []Stage) {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", dir, name))
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	op, err := dc.Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	return op, find(t, r, Options{Full: c, ACGround: log.ACGround, DC: op})
}

// A double-diode-triode (review15 a03, review13 a03): the diodes returned
// to the triode's bypassed cathode are the detector, the triode an audio
// amplifier in circuit, and the stages run in signal order: detector,
// volume control, grid coupling, triode. Before, the diode and the triode
// were "V2a stage" and "V2b stage", and the walk through the cathode put
// the triode before the volume control and coupling that feed its grid.
// A second diode fed from the IF anode with its load to chassis is the
// delayed AGC diode; its delay is the cathode bias, about 1–2 V in such a
// valve (common practice, from memory), here a little under 1 V.
func TestDoubleDiodeTriode(t *testing.T) {
	cases := []struct {
		file             string
		detector, triode string
		feed             []string // volume control, grid coupling capacitor
		agc              []string // the AGC diode stage's parts; nil: none
		delayed          bool     // the detector's load to chassis: the bias delays it
	}{
		{"ddt-cathode-return.toml", "V2a", "V2b", []string{"RV1", "C10"}, []string{"C8", "R5"}, false},
		{"ddt-chassis-load.toml", "V2a", "V2b", []string{"RV1", "C10"}, nil, true},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			st := findDetectorFixture(t, tc.file)
			det, tri := holding(st, tc.detector), holding(st, tc.triode)
			if det == nil || det.Topology != "diode-detector-bypassed-return" {
				t.Fatalf("%s not in a detector: %s", tc.detector, topologies(st))
			}
			if tri == nil || tri.Topology != "amp-common-bypassed-diode-return" || !strings.HasPrefix(tri.Title, "Audio amplifier") {
				t.Fatalf("%s not an audio amplifier: %s", tc.triode, topologies(st))
			}
			if g, ok := tri.Figures.Get("gain"); !ok || g.Origin.Source != figure.Solver || math.Abs(g.Value) <= 1 {
				t.Errorf("%s's gain %v is not the solver's above 1", tc.triode, g)
			}
			_, hasDelay := det.Figures.Get("delay")
			if hasDelay != tc.delayed {
				t.Errorf("detector delay figure present %v, want %v: %v", hasDelay, tc.delayed, det.Figures)
			}
			at := func(s *Stage) int { return slices.IndexFunc(st, func(x Stage) bool { return x.Name == s.Name }) }
			prev := at(det)
			for _, ref := range append(tc.feed, tc.triode) {
				s := holding(st, ref)
				if s == nil || at(s) <= prev {
					t.Errorf("%s out of signal order: %s", ref, topologies(st))
					break
				}
				prev = at(s)
			}
			if tc.agc == nil {
				return
			}
			agc := holding(st, tc.agc[0])
			if agc == nil || agc.Topology != "agc-diode-delayed" || !slices.Equal(agc.Parts, tc.agc) {
				t.Fatalf("no delayed AGC diode of %v: %s", tc.agc, topologies(st))
			}
			if d, ok := agc.Figures.Get("delay"); !ok || d.Value < 0.5 || d.Value > 3 {
				t.Errorf("AGC delay %v, want 0.5–3 V", d)
			}
		})
	}
}
