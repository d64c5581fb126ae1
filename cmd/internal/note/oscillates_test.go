package note

import (
	"testing"

	"pare/rules/stages"
)

// TestOscillatesByTopology: a separately injected mixer's title names the
// oscillator but its device runs none (review18 a02: the chart's note said
// the triode-hexode's signal grid "reads more negative" when running);
// oscillators and self-oscillating mixers do.
func TestOscillatesByTopology(t *testing.T) {
	cases := []struct {
		topology, title string
		want            bool
	}{
		{"mixer-grid-injected", "Mixer, oscillator injected on a further grid (valve)", false},
		{"mixer-common-injected-tapped", "Mixer, oscillator injected on the emitter, collector on a tap of the IF winding (BJT)", false},
		{"self-oscillating-mixer", "Self-oscillating mixer (valve)", true},
		{"hartley-common-tap", "Hartley oscillator, cathode tap (valve)", true},
		{"amp-tuned", "IF amplifier: tuned amplifier, common emitter (BJT)", false},
	}
	for _, tc := range cases {
		if got := oscillates(stages.Stage{Topology: tc.topology, Title: tc.title}); got != tc.want {
			t.Errorf("%s %q: oscillates %v, want %v", tc.topology, tc.title, got, tc.want)
		}
	}
}
