package layout

import (
	"strings"
	"testing"

	"pare/render/check"
)

// TestTankBridgeClearOfTheBlockAbove: a tuned circuit stacked under another
// part in its column (the mixer's anode bypass over its oscillator tank)
// stands far enough down that the wire joining the tank across its top and
// the wire leaving the part above run two grid steps apart: one step apart
// two unrelated wires read as one (render/check's reader; common practice:
// unrelated wires are kept well apart).
func TestTankBridgeClearOfTheBlockAbove(t *testing.T) {
	for _, untangle := range []bool{false, true} {
		res, err := Layout(parse(t, paddedMixer), Options{Untangle: untangle})
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range check.Measure(&res.Geom).Beside {
			if strings.Contains(p, "tank") || strings.Contains(p, "pad") {
				t.Errorf("untangle %v: %s", untangle, p)
			}
		}
	}
}
