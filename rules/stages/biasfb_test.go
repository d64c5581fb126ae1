package stages

import (
	"math"
	"testing"
)

// Overall feedback into an emitter through a series DC-blocking capacitor
// is the same class as feedback through the resistor alone: review21 b04's
// Q1 (R6 2k2 from the speaker, C13 47 µF into the top of R4 100 Ω, R5 with
// C3 the bypassed part) had been "Q1 stage", its emitter network an "RC
// low-pass section" and C13 a "Coupling capacitor". The solver's feedback
// in dB is checked against the handbook's 20·log10(1 + |A|·β), β = Ru/(Ru +
// Rf) (feedback amplifier, from memory; docs/references.md §38). The
// variant is an invented preamplifier into a transformer output stage.
func TestOverallFeedbackThroughDCBlock(t *testing.T) {
	for _, tc := range []struct{ dir, file string }{
		{"review21", "b04.toml"},
		{"feedback", "series-blocked.toml"},
	} {
		t.Run(tc.file, func(t *testing.T) {
			_, sts := findFixture(t, tc.dir, tc.file)
			var amp *Stage
			for i := range sts {
				switch sts[i].Topology {
				case "amp-common-feedback":
					amp = &sts[i]
				case "rc-low-pass", "coupling-capacitor":
					if contains(sts[i].Parts, "R4") || contains(sts[i].Parts, "C9") || contains(sts[i].Parts, "C13") {
						t.Errorf("%s %q holds %v: the feedback stage's parts framed apart", sts[i].Name, sts[i].Title, sts[i].Parts)
					}
				}
			}
			if amp == nil {
				t.Fatalf("no amplifier with overall feedback: %s", topologies(sts))
			}
			for _, want := range []string{"Q1", "R4", "R5", "R6"} {
				if !contains(amp.Parts, want) {
					t.Errorf("%s lacks %s: %v", amp.Name, want, amp.Parts)
				}
			}
			n, ok := amp.Figures.Get("nfb")
			if !ok || n.Check == nil || n.Value <= 0 {
				t.Fatalf("no feedback in dB with its check: %v", amp.Figures)
			}
			if d := math.Abs(n.Value - n.Check.Value); d > 0.5 {
				t.Errorf("feedback %.2f dB against the handbook's %.2f dB", n.Value, n.Check.Value)
			}
		})
	}
}
