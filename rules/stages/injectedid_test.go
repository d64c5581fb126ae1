package stages

import (
	"strings"
	"testing"
)

// TestInjectedMixersByID: every built-in mixer pattern whose title says
// its oscillator is injected (a separate oscillator feeds it) is an
// injected mixer by its id, and no other is, so no loop is searched round
// its device and no "does not oscillate" flag is raised on it.
func TestInjectedMixersByID(t *testing.T) {
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, p := range lib.Patterns {
		if p.Group != "mixer" {
			continue
		}
		says := strings.Contains(p.Title, "injected")
		if says {
			n++
		}
		if says != injectedMixer(p.ID) {
			t.Errorf("pattern %s (%q): title says injected %v, injectedMixer %v", p.ID, p.Title, says, injectedMixer(p.ID))
		}
	}
	if n < 3 {
		t.Errorf("%d injected mixer patterns, want at least the grid, common and tapped ones", n)
	}
}
