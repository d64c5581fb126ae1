package stages

import (
	"math"
	"slices"
	"testing"
)

// A tuned amplifier into a transformer tuned on both sides headlines its
// gain to the secondary (the next stage's input) at that gain's peak, and
// the load's tuned frequency is where the peak lies: the primary's voltage
// of a near-critically coupled pair has humps either side of the centre.
// Check values: ngspice on testdata/club-if/if_stage.cir (the club
// receiver's V3 with T6 by hand): V(if2_g)/V(if1_g) peaks at 331.69 at
// 469.77 kHz; the anode's own peak is 415.6 at 467.24 kHz, which the stage
// must not headline.
func TestTunedAmplifierGainToSecondary(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	var amp *Stage
	for i := range st {
		if st[i].Topology == "amp-tuned" && slices.Contains(st[i].Parts, "T6") {
			amp = &st[i]
		}
	}
	if amp == nil {
		t.Fatalf("no tuned amplifier on T6: %s", topologies(st))
	}
	for _, c := range []struct {
		name      string
		want, tol float64
	}{
		{"gain", 331.69, 0.01 * 331.69}, // ngspice if_stage.cir, 1 %
		{"load_f", 469.77e3, 500},       // ngspice if_stage.cir, 0.1 %
	} {
		f, ok := amp.Figures.Get(c.name)
		if !ok {
			t.Errorf("%s: no figure", c.name)
			continue
		}
		if math.Abs(f.Value-c.want) > c.tol {
			t.Errorf("%s = %g, want %g ± %g (ngspice if_stage.cir)", c.name, f.Value, c.want, c.tol)
		}
	}
}
