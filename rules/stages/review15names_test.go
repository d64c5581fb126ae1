package stages

import (
	"math"
	"testing"
)

// review15 b01: a Clapp VFO whose variable series capacitor sits on the
// base side and whose coil's far end is at chassis was named "Colpitts
// oscillator, emitter tap" with c eff 320 pF, the tuning capacitor left out
// (blind review r15b). It is a Clapp: the formula's range now moves with
// the gang beside the solver's. The reviewer's ngspice transient of the
// original (testdata/review15/spice/b01_tran_*.cir, nonlinear transistor)
// oscillates at 2.0027 MHz (VC1 at 120 pF) and 4.2539 MHz (at 10 pF).
func TestReview15ClappVFO(t *testing.T) {
	c := reviewCircuit(t, "review15", "b01.toml")
	stages := findBiased(t, c)
	s := stageOf(stages, "clapp-coil-grounded")
	if s == nil {
		t.Fatalf("no Clapp; found %s", topologies(stages))
	}
	f, ok := s.Figures.Get("f")
	if !ok || f.Range == nil {
		t.Fatalf("no resonance range: %v", s.Figures)
	}
	// the tank's resonance in circuit against the oscillation: within 0.6 %
	// (the oscillation sits a little off the loaded tank's peak)
	for _, w := range []struct{ got, want float64 }{{f.Range.Min, 2.0027e6}, {f.Range.Max, 4.2539e6}} {
		if math.Abs(w.got-w.want) > 0.006*w.want {
			t.Errorf("resonance %.5g Hz, ngspice oscillates at %.5g Hz", w.got, w.want)
		}
	}
	if f.Check == nil || f.Check.Range == nil || math.Abs(f.Check.Range.Max-f.Range.Max) > 0.02*f.Range.Max {
		t.Errorf("the formula's cross-check %+v is not a range within 2 %% of the solver's %v", f.Check, f.Range)
	}
}
