package align_test

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// TestPentagridTrimmersOnTheirTanks: an AC/DC set with its chassis labelled
// as the mains neutral (review21 a05, a blind reviewer's circuit, invented
// values) had its aerial coil and IF cans taken for mains transformers, the
// pentagrid converter for a lone oscillator, and the alignment backwards:
// the "oscillator" steps turned the aerial trimmer TC1 and T1's core, the
// "aerial/RF" step the oscillator trimmer TC2, the IF went "into the mixer's
// grid (V2 g1)" and T3 got no step. The right adjusters are the capture's
// own (its notes: TC1 "aerial trimmer", T1 "aerial coil", TC2 "oscillator
// trimmer", T2 "oscillator coil", T3/T4 the IF cans), in the trade's order
// (common practice); the IF goes into the converter's signal grid g4. The
// variant is review20 a05 (the same class, another capture) with its
// chassis labelled the same way and a mains-neutral port on it.
func TestPentagridTrimmersOnTheirTanks(t *testing.T) {
	src, err := os.ReadFile(review20("a05"))
	if err != nil {
		t.Fatal(err)
	}
	variant := strings.Replace(string(src), `label = "chassis (live)"`, `label = "chassis (mains neutral!)"`, 1)
	variant = strings.Replace(variant, "[parts]\n", "[parts]\nP9 = { port = \"230 V mains, neutral: to chassis\", pins = [\"gnd\"] }\n", 1)
	vpath := filepath.Join(t.TempDir(), "a05-mains-neutral.toml")
	if err := os.WriteFile(vpath, []byte(variant), 0o644); err != nil {
		t.Fatal(err)
	}
	want := map[string][]string{"IF": {"T3", "T4"}, "oscillator": {"T2", "TC2"}, "aerial/RF": {"T1", "TC1"}}
	for _, path := range []string{filepath.Join("..", "..", "..", "testdata", "review21", "a05.toml"), vpath} {
		t.Run(filepath.Base(path), func(t *testing.T) {
			_, g := build(t, path)
			got := map[string][]string{}
			for _, s := range g.Steps {
				if !slices.Contains(got[s.Phase], s.Part) {
					got[s.Phase] = append(got[s.Phase], s.Part)
				}
				if s.Phase == "IF" && !strings.Contains(s.Into, "V1 g4") {
					t.Errorf("step %d: IF into %q, want the converter's signal grid V1 g4", s.N, s.Into)
				}
			}
			for phase, parts := range want {
				slices.Sort(got[phase])
				if !slices.Equal(got[phase], parts) {
					t.Errorf("%s steps turn %v, want %v", phase, got[phase], parts)
				}
			}
			for _, w := range g.Warnings {
				if strings.Contains(w, "mistracks by") {
					t.Errorf("warning %q: the converter's own tanks track within about 14 kHz (the reviewer's ngspice, spice/a/results-phase2.txt)", w)
				}
			}
		})
	}
}
