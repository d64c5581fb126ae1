package stages

import (
	"path/filepath"
	"strings"
	"testing"
)

// A mixer heptode fed by a separate triode oscillator has no oscillator
// loop of its own (common practice: the triode oscillates, the heptode
// only mixes), so pare must not say it "does not oscillate"; the triode's
// own loop still runs and keeps its figures (the reviewer's c1, ngspice
// 42 .tran of its oscillator puts it at 995.4 kHz–2.3526 MHz).
func TestInjectedMixerHasNoLoopOfItsOwn(t *testing.T) {
	_, sts := reduceFixture(t, filepath.Join("..", "..", "..", "testdata", "good", "review-align-c1-valve-superhet.toml"))
	mixers, oscs := 0, 0
	for _, s := range sts {
		for _, f := range s.Flags {
			if strings.Contains(f, "does not oscillate") {
				t.Errorf("%s (%s) flagged %q", s.Name, s.Topology, f)
			}
		}
		if s.Topology == "mixer-grid-injected" {
			mixers++
			if len(s.Loop) > 0 {
				t.Errorf("%s: a loop round the mixer valve %s", s.Name, s.Loop[0].Device)
			}
		}
		for _, l := range s.Loop {
			if fMin, fMax, _, _, ok := l.Range(); ok && l.Device == "V1a" {
				oscs++
				// ngspice 42 .tran (review of issue 16): 995.4 kHz and 2.3526 MHz
				if !within(fMin, 995.4e3, 0.01) || !within(fMax, 2.3526e6, 0.01) {
					t.Errorf("V1a loop %g–%g Hz, ngspice 995.4k–2.3526M", fMin, fMax)
				}
			}
		}
	}
	if mixers != 1 || oscs != 1 {
		t.Fatalf("want one injected mixer and the V1a oscillator, got %d and %d", mixers, oscs)
	}
}
