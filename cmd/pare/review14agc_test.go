package main

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/rules"
)

// The blind review r14b's transistor sets (testdata/review14) take the AGC
// line after the detector's IF filter resistor (b03 R3, b05 R12, from
// det_f into the line's capacitor), with the volume control's track as the
// detector load on that net; neither declares the line, and b03's base
// return (q1_bias) is grounded before the line is, so the line's way to
// the base runs through a bias rail already joined away. The main job must
// tag the line "AGC line" and find the AGC filter as its own RC (10 ms or
// more: common practice, no source, the guard of
// patterns/agc-line-filter.toml), never folded into the IF pi filter, and
// the pi filter holds its own C–R–C only.
func TestReview14AGCAfterIFFilter(t *testing.T) {
	cases := []struct {
		file string
		r, c string   // the AGC filter's resistor and capacitor
		pi   []string // the IF pi filter: its first capacitor (the detector's, shared), then its own parts, sorted
	}{
		{"b03.toml", "R3", "C3", []string{"C10", "C11", "R8"}},
		{"b05.toml", "R12", "C14", []string{"C12", "C13", "R11"}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			po := jobOptions(filepath.Join("..", "..", "testdata", "review14", tc.file), jobConfig{level: rules.LevelSignal})
			po.Until = pipeline.PhaseStages
			job, err := pipeline.Run(po)
			if err != nil {
				t.Fatalf("main job: %v", err)
			}
			if line := railOrNet(job.Reduced, "agc"); line == nil || line.Role != graph.Bias || line.Label != "AGC line" {
				t.Errorf("line agc after the reduction: %+v, want the bias role tagged \"AGC line\"", line)
			}
			var agc, pi []string
			for _, s := range job.Stages {
				switch {
				case s.Topology == "agc-line-filter":
					agc = s.Parts
				case slices.Contains(s.Parts, tc.r):
					t.Errorf("%s (%s) holds the AGC filter's resistor %s: %v", s.Name, s.Topology, tc.r, s.Parts)
				}
				if s.Topology == "rc-pi-filter" {
					pi = s.Parts
				}
			}
			if !slices.Equal(agc, []string{tc.c, tc.r}) {
				t.Errorf("AGC filter %v, want %s and %s", agc, tc.c, tc.r)
			}
			// the first capacitor is shared with the detector and listed there
			if !slices.Equal(pi, tc.pi[1:]) {
				t.Errorf("RC pi filter %v, want its own %v (%s shared)", pi, tc.pi[1:], tc.pi[0])
			}
		})
	}
}

// railOrNet is a net of a reduced circuit by name: a live one, or a rail
// the reduction tied to AC ground (graph.Circuit.Rails).
func railOrNet(c *graph.Circuit, name string) *graph.Net {
	for _, n := range c.Rails {
		if n.Name == name {
			return n
		}
	}
	return c.Net(name)
}

// The tags of the lines the main job grounds name what feeds them: a
// decoupled collector supply by the rail that supplies its current through
// its decoupling resistor (b02's RF transformer cold end, vcc_rf, was
// "AGC line via R2, R1", named after the far end of the base bias
// resistor R1; b05's IFT1 cold end, vcc_mix, was no line at all, its bias
// chain R1-R2 to chassis taken for a divider, and drawn as chassis), and a
// base return the AGC line feeds by the line (b03's q1_bias was "bias via
// R1"). Circuit: the reviewer's, testdata/review14; the feeds are the
// netlists' own (R5 1 kΩ from +9 V against R1 82 kΩ to the base). A rail
// labelled only by its voltage names its lines by that voltage ("+9 V via
// R5"), as the sheet's rail tag reads.
func TestReview14LineTags(t *testing.T) {
	cases := []struct{ file, net, label, fed string }{
		{"review14/b02.toml", "vcc_rf", "+9 V via R5", "vcc"}, // the rail is known by its voltage
		{"review14/b02.toml", "q1_bias", "AGC line via R2", "agc"},
		{"review14/b03.toml", "q1_bias", "AGC line via R2", "agc"},
		{"review14/b03.toml", "vcc_d1", "+9 V via R9", "vcc"},
		{"review14/b05.toml", "vcc_mix", "battery via R30", "batt"},
		{"review14/b05.toml", "q2_bias", "AGC line via R6", "agc"},
		{"review14/b05.toml", "vcc_if", "battery via R31", "batt"},
		{"review13/b03.toml", "agc_if", "AGC line via R2", "agc"},
		{"review13/b05.toml", "vcc_if", "+12 V via R11", "vcc"},
	}
	jobs := map[string]*pipeline.Result{}
	for _, tc := range cases {
		t.Run(tc.file+"/"+tc.net, func(t *testing.T) {
			job := jobs[tc.file]
			if job == nil {
				po := jobOptions(filepath.Join("..", "..", "testdata", tc.file), jobConfig{level: rules.LevelSignal})
				po.Until = pipeline.PhaseReduce
				var err error
				if job, err = pipeline.Run(po); err != nil {
					t.Fatalf("main job: %v", err)
				}
				jobs[tc.file] = job
			}
			n := railOrNet(job.Reduced, tc.net)
			if n == nil || n.Label != tc.label || n.Fed != tc.fed {
				t.Errorf("%s after the reduction: %+v, want %q fed from %s", tc.net, n, tc.label, tc.fed)
			}
		})
	}
}
