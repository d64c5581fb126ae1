package stages

import (
	"testing"

	"pare/graph"
)

// The words for what sits across an oscillator coil follow the stage's
// device, or for a stage of passive parts (the gang's tracking) the
// circuit's devices when they are of one kind; a mixed or device-less
// circuit gets neutral words, never the valve's by default (review20 b02,
// a transistor set, read "the grid capacitor, the injection and the
// valve"). Words: common practice.
func TestAcrossCoilWords(t *testing.T) {
	parse := func(parts string) *graph.Circuit {
		c, err := graph.Parse("t.toml", []byte("band = \"1k..10k\"\ninputs = [\"in\"]\noutputs = [\"out\"]\n[parts]\nR1 = { r = \"1k\", pins = [\"in\", \"out\"] }\n"+parts))
		if err != nil {
			t.Fatal(err)
		}
		return c
	}
	bjt := `Q1 = { bjt = "npn", pins = { b = "in", c = "out", e = "gnd" } }` + "\n"
	valve := `V1 = { valve = "triode", pins = { a = "out", g1 = "in", k = "gnd" } }` + "\n"
	for _, tc := range []struct {
		name, family, parts, want string
	}{
		{"bjt stage", "bjt", "", "the base coupling capacitor, the injection and the transistor"},
		{"valve stage", "valve", "", "the grid capacitor, the injection and the valve"},
		{"passive in a transistor set", "passive", bjt, "the base coupling capacitor, the injection and the transistor"},
		{"passive in a valve set", "passive", valve, "the grid capacitor, the injection and the valve"},
		{"passive in a mixed set", "passive", bjt + valve, "the coupling capacitor, the injection and the device"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := acrossCoil(stageFamily(tc.family, parse(tc.parts))); got != tc.want {
				t.Errorf("%q, want %q", got, tc.want)
			}
		})
	}
}
