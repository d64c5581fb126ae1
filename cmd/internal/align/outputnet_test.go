package align_test

import (
	"path/filepath"
	"strings"
	"testing"
)

// TestIFReadPastTheInjection: review19 b02's capture declares its output
// at the mixer's base (mix_b), where the IF generator also goes; the IF
// step said to inject at mix_b and watch mix_b, and the injection table
// "1 V at mix_b gives 1 V at mix_b, ×1". The IF is read where the
// mixer's IF can passes it on (T3's link winding, if_out), as the trade
// reads an IF stage's output (common practice).
func TestIFReadPastTheInjection(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "review19", "b02.toml"))
	for _, s := range g.Steps {
		if s.Phase == "IF" && !strings.Contains(s.Watch, "if_out") {
			t.Errorf("IF step %d watches %q, want the IF at if_out", s.N, s.Watch)
		}
	}
	for _, in := range g.Inject {
		if in.Net == in.RefNet {
			t.Errorf("injection at %s read at the same net (%s)", in.Net, in.RefWhat)
		}
	}
}
