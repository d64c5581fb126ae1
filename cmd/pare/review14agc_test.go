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
