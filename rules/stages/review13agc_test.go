package stages

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
	"pare/rules"
)

// The second blind review of session 13 wrote transistor sets whose AGC
// line runs from the detector to the first IF stage's base return
// (testdata/review13 at the repository's top): b03 takes it after the IF
// filter (R10 from det_f into C12), b05 straight off the detector's load
// (R12 into C37, with a standing-bias resistor R13 from the decoupled IF
// rail); in both the diode's anode is on the load, so the line goes
// negative on a carrier. The -agc-bias variants declare the line
// role = "bias". The AGC filter is an RC low-pass from the detector's
// output into the line with a time constant of 10 ms to a few seconds
// (common practice, no source; the guard of patterns/agc-line-filter.toml):
// it must be found as one, never lumped into an IF filter or called a
// supply decoupling filter, and the reduction must tag the line as the AGC
// line, not as a supply line fed from the rail through R13.
func TestReview13AGCFilterAndLine(t *testing.T) {
	cases := []struct {
		file      string
		r, c      string   // the AGC filter's resistor and capacitor
		line      string   // the AGC line
		notSupply []string // parts no supply filter may hold
		smoothing []string // parts the set's own smoothing filter holds
	}{
		{"b03.toml", "R10", "C12", "agc", []string{"C12", "C2", "R2"}, nil},
		{"b03-agc-bias.toml", "R10", "C12", "agc", []string{"C12", "C2", "R2"}, nil},
		{"b05.toml", "R12", "C37", "agc", []string{"C37", "C9", "R13", "R6"}, []string{"C30", "C31", "R34"}},
		{"b05-agc-bias.toml", "R12", "C37", "agc", []string{"C37", "C9", "R13", "R6"}, []string{"C30", "C31", "R34"}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review13", tc.file))
			if err != nil {
				t.Fatal(err)
			}
			red, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
			if err != nil {
				t.Fatalf("reduce: %v", err)
			}
			line := reducedNet(red, tc.line)
			if line == nil || line.Role != graph.Bias || line.Label != "AGC line" {
				t.Errorf("line %s after the reduction: %+v, want the bias role tagged \"AGC line\"", tc.line, line)
			}
			st := find(t, red, Options{Full: c, ACGround: log.ACGround})
			agc := stageOf(st, "agc-line-filter")
			if agc == nil || !slices.Equal(agc.Parts, []string{tc.c, tc.r}) {
				t.Fatalf("no AGC filter of %s and %s: %s", tc.r, tc.c, topologies(st))
			}
			tau, ok := agc.Figures.Get("tau")
			if !ok || tau.Value < 0.01 {
				t.Errorf("AGC filter tau %+v: want the solver's, 10 ms or more", tau)
			}
			// the rail a standing-bias resistor brings into the AGC line is
			// still a supply: its own smoothing filter stays one
			if tc.smoothing != nil && !holdsAll(st, "smoothing-filter", tc.smoothing) {
				t.Errorf("no smoothing filter holds %v: %s", tc.smoothing, topologies(st))
			}
			for _, s := range st {
				if s.Topology != "agc-line-filter" && slices.Contains(s.Parts, tc.r) {
					t.Errorf("%s (%s) holds the AGC filter's resistor %s: %v", s.Name, s.Topology, tc.r, s.Parts)
				}
				if s.Supply {
					for _, p := range tc.notSupply {
						if slices.Contains(s.Parts, p) {
							t.Errorf("supply stage %s (%s) holds %s, on the AGC line: %v", s.Name, s.Title, p, s.Parts)
						}
					}
				}
			}
		})
	}
}

// holdsAll tells whether a stage of the topology holds every one of refs.
func holdsAll(st []Stage, topology string, refs []string) bool {
	for _, s := range st {
		if s.Topology != topology {
			continue
		}
		all := true
		for _, r := range refs {
			all = all && slices.Contains(s.Parts, r)
		}
		if all {
			return true
		}
	}
	return false
}

// reducedNet is a net of a reduced circuit by name: a live one, or a rail
// the reduction tied to AC ground (graph.Circuit.Rails).
func reducedNet(c *graph.Circuit, name string) *graph.Net {
	for _, n := range c.Rails {
		if n.Name == name {
			return n
		}
	}
	return c.Net(name)
}
