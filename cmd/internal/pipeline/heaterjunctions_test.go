package pipeline

import (
	"path/filepath"
	"testing"

	"pare/render"
	"pare/rules"
)

// TestHeaterJunctionTags: on the full and faded sheets each junction of an
// AC/DC set's series heater chain is named by what it joins, in the order
// the netlist's comment gives for review21 a05 (dropper R22, V4, V5, V1,
// V2, V3, dial lamp LP1 with shunt R23); review20 a05's own labels already
// say where each junction sits and stay as written; the circuit the
// pipeline holds keeps the user's labels.
func TestHeaterJunctionTags(t *testing.T) {
	cases := []struct {
		file, h1 string // h1: the user's label of net h1
		want     map[string]string
	}{
		{"review21/a05.toml", "heater chain", map[string]string{
			"h1": "htr R22→V4",
			"h3": "htr V5→V1",
			"h5": "htr V2→V3",
			"h6": "htr V3→LP1,R23",
		}},
		{"review20/a05.toml", "heater chain V4-V5", map[string]string{
			"h0": "heater chain after R22",
			"h1": "heater chain V4-V5",
			"h5": "heater chain V3-LP1",
		}},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			res, err := Run(Options{Path: filepath.Join("..", "..", "..", "testdata", tc.file), Until: PhaseStages, Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			for _, v := range []render.View{render.Faded, render.Full} {
				c := res.Sheet(v).Circuit
				for net, want := range tc.want {
					if n := c.Net(net); n == nil || n.Label != want {
						t.Errorf("%v sheet: net %s labelled %+v, want %q", v, net, n, want)
					}
				}
			}
			if n := res.Circuit.Net("h1"); n == nil || n.Label != tc.h1 {
				t.Errorf("the pipeline's circuit lost the user's label for h1: %+v", n)
			}
		})
	}
}
