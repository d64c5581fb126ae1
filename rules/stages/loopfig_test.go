package stages

import (
	"math"
	"testing"

	"pare/graph"
	"pare/graph/figure"
)

// An RC oscillator's frequency is the loop's 0° frequency in circuit, with
// the pattern's formula as its check; a mixer found by its loop has its
// oscillator, IF can and signal range from the solver. The loop frequencies
// themselves are checked against kicked ngspice transients in graph/ac
// (TestExampleLoopsAgainstNgspiceTransient runs these two fixtures).
func TestLoopFrequencyFigures(t *testing.T) {
	t.Run("phase-shift-partial-bypass", func(t *testing.T) {
		st := loopFixtureStage(t, "testdata/phase-shift-partial-bypass.toml", "rc-phase-shift-degenerated")
		f, ok := st.Figures.Get("f")
		if !ok || f.Origin.Source != figure.Solver || f.Check == nil {
			t.Fatalf("f %+v: want the solver's, with its formula check", f)
		}
		if f.Value != st.Loop[0].Settings[0].F {
			t.Errorf("f %g, the loop's 0° frequency %g", f.Value, st.Loop[0].Settings[0].F)
		}
		// derived from f = 1/(2πRC√6), R = 10 kΩ, C = 10 nF: 649.747 Hz
		if math.Abs(f.Check.Value-649.747) > 0.01 {
			t.Errorf("check %g, want 649.747 Hz", f.Check.Value)
		}
		if f.Why == "" {
			t.Errorf("%s in circuit against %s by formula: no words for why", hzText(f.Value), hzText(f.Check.Value))
		}
	})
	t.Run("converter-link", func(t *testing.T) {
		st := loopFixtureStage(t, "testdata/converter-link.toml", loopMixerTopology)
		lo, hi, _, _, _ := st.Loop[0].Range()
		osc, _ := st.Figures.Get("osc_f")
		if osc.Origin.Source != figure.Solver || osc.Range == nil || osc.Range.Min != lo || osc.Range.Max != hi {
			t.Errorf("osc f %+v: want the loop's range %g–%g", osc, lo, hi)
		}
		ift, _ := st.Figures.Get("ift_f")
		if ift.Origin.Source != figure.Solver || ift.Check == nil {
			t.Errorf("IF transformer f %+v: want the IF can's in-circuit resonance with its formula", ift)
		}
		// derived from f = 1/(2π√(LC)), 680 µH and 180 pF: 454.9 kHz
		if math.Abs(ift.Value/454.9e3-1) > figure.CheckAgreement {
			t.Errorf("IF transformer f %g, want about 454.9 kHz", ift.Value)
		}
		sig, _ := st.Figures.Get("sig_f")
		// signal = oscillator − IF (high-side injection, common practice)
		if sig.Origin.Source != figure.Solver || sig.Range == nil || sig.Range.Min != lo-455e3 || sig.Range.Max != hi-455e3 {
			t.Errorf("sig f %+v: want the loop's range less the IF", sig)
		}
	})
}

func loopFixtureStage(t *testing.T, file, topology string) *Stage {
	t.Helper()
	c, err := graph.LoadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	found := find(t, c, Options{})
	st := stageOf(found, topology)
	if st == nil || len(st.Loop) != 1 {
		t.Fatalf("stages %s: want %s with its loop", topologies(found), topology)
	}
	return st
}
