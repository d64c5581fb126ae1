package stages

import (
	"math"
	"testing"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// A self-oscillating mixer's oscillator frequency (osc f, the frame's
// headline) is where its loop runs, as a separate oscillator's is: the
// solver's 0° of loop phase with the loop gain above 0 dB, at each gang
// setting, its tank's own resonance beside it as "osc tank alone". Check
// values: ngspice-39 .ac on decks of the loop broken at the transistor's
// controlled source, committed beside the fixtures
// (testdata/osc/*-loop.cir, run by hand), docs/references.md §43.
func TestMixerHeadlineIsTheLoop(t *testing.T) {
	cases := []struct {
		file, topology string
		lo, hi         float64 // ngspice's 0° of loop phase, gang full in and full out
		dbLo, dbHi     float64 // the loop gain there
	}{
		// a pattern names the mixer; transistor-front-end-loop.cir:
		// f_low 997306 Hz +4.761 dB, f_top 2056543 Hz +11.234 dB
		{"../../examples/transistor-front-end.toml", "self-oscillating-mixer-common-link", 997.306e3, 2056.543e3, 4.761, 11.234},
		// found by its loop, its tank a stage of its own;
		// mixer-bjt-reaction-loop.cir: f_low 948267 Hz +7.540 dB,
		// f_top 2190425 Hz +19.034 dB
		{"../../testdata/osc/mixer-bjt-reaction.toml", loopMixerTopology, 948.267e3, 2190.425e3, 7.540, 19.034},
	}
	for _, tc := range cases {
		t.Run(tc.topology, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			found := findReduced(t, c)
			st := stageOf(found, tc.topology)
			if st == nil {
				t.Fatalf("stages %s: want %s", topologies(found), tc.topology)
			}
			if len(st.Figures) < 2 || st.Figures[0].Name != "osc_f" || st.Figures[1].Name == mixerTankAlone {
				t.Fatalf("figures %v: want osc f first and the tank alone after the frame's two", st.Figures)
			}
			osc := st.Figures[0]
			if osc.Range == nil || osc.Origin.Name != loopOrigin.Name {
				t.Fatalf("osc f %+v: want the loop's range across the gang", osc)
			}
			near := func(what string, got, want, tol float64) {
				if math.Abs(got/want-1) > tol {
					t.Errorf("%s %.6g, want within %.1f %% of ngspice's %.6g", what, got, 100*tol, want)
				}
			}
			near("osc f low", osc.Range.Min, tc.lo, 0.002)
			near("osc f high", osc.Range.Max, tc.hi, 0.002)
			if len(st.Loop) == 0 {
				t.Fatal("no loop on the stage")
			}
			for _, s := range st.Loop[0].Settings {
				switch s.Gang {
				case 1:
					near("loop gain at the low end (dB)", s.MarginDB, tc.dbLo, 0.02)
				case 0:
					near("loop gain at the high end (dB)", s.MarginDB, tc.dbHi, 0.02)
				}
			}
			tank, ok := st.Figures.Get(mixerTankAlone)
			if !ok || tank.Label != mixerTankAloneLabel || tank.Origin.Source != figure.Solver || tank.Range == nil {
				t.Fatalf("osc tank alone %+v (%v): want the tank's resonance in circuit beside the loop's", tank, ok)
			}
			if tank.Range.Min == osc.Range.Min && tank.Range.Max == osc.Range.Max {
				t.Errorf("tank alone %v equals the loop's %v: want the two solved apart", tank.Range, osc.Range)
			}
			sig, _ := st.Figures.Get("sig_f")
			ifHz := c.Freqs["if"]
			near("sig f low", sig.Range.Min, osc.Range.Min-ifHz, 1e-9)
			near("sig f high", sig.Range.Max, osc.Range.Max-ifHz, 1e-9)
		})
	}
}

// mixerLoopFigures leaves a pattern-found mixer's tank figures alone when
// its loop does not start, or has no 0° crossing: there the tank's
// resonance is the only frequency the stage has.
func TestMixerLoopFiguresNeedARunningLoop(t *testing.T) {
	tank := figure.Figure{Name: "osc_f", Label: "osc f", Unit: figure.Hertz, Range: &value.Range{Min: 1e6, Max: 2e6}, Origin: figure.BySolver("tank", "across the gang")}
	cases := []struct {
		name string
		loop Loop
		want float64 // osc f's low end after
	}{
		{"short of 0 dB", Loop{Device: "Q1", Settings: []LoopSetting{{Gang: 0, F: 2.01e6, MarginDB: -1}, {Gang: 1, F: 1.01e6, MarginDB: -0.5}}}, 1e6},
		{"no crossing", Loop{Device: "Q1", Settings: []LoopSetting{{Gang: 0}, {Gang: 1}}}, 1e6},
		{"runs", Loop{Device: "Q1", Settings: []LoopSetting{{Gang: 0, F: 2.01e6, MarginDB: 3}, {Gang: 1, F: 1.01e6, MarginDB: 2}}}, 1.01e6},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			st := &Stage{Figures: figure.List{tank}}
			mixerLoopFigures(st, tc.loop, value.Range{})
			got, _ := st.Figures.Get("osc_f")
			if got.Range == nil || got.Range.Min != tc.want {
				t.Errorf("osc f %+v, want low end %g", got, tc.want)
			}
			_, moved := st.Figures.Get(mixerTankAlone)
			if moved != (tc.want != 1e6) {
				t.Errorf("tank alone shown %v, want %v", moved, tc.want != 1e6)
			}
		})
	}
}

// A self-oscillating mixer whose oscillator is a sub-stage of its own (a
// Hartley the pattern names inside the mixer) leads with the loop that
// sub-stage carries: the mixer's osc f and the oscillator's f are one
// frequency, where the loop runs (the loop solver itself is checked
// against ngspice in graph/ac, TestLoopGainAgainstNgspiceTransient).
func TestMixerLeadsWithItsOscillatorsLoop(t *testing.T) {
	cases := []struct{ file, mixer, osc string }{
		{"../../examples/frequency-changer.toml", "self-oscillating-mixer", "hartley-common-tap"},
	}
	for _, tc := range cases {
		t.Run(tc.mixer, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			found := findReduced(t, c)
			mix, osc := stageOf(found, tc.mixer), stageOf(found, tc.osc)
			if mix == nil || osc == nil || len(osc.Loop) == 0 {
				t.Fatalf("stages %s: want %s holding %s with its loop", topologies(found), tc.mixer, tc.osc)
			}
			fMin, fMax, _, _, _ := osc.Loop[0].Range()
			f, ok := mix.Figures.Get("osc_f")
			if !ok || f.Range == nil || f.Range.Min != fMin || f.Range.Max != fMax {
				t.Errorf("osc f %+v, want the loop's %s–%s", f, hzText(fMin), hzText(fMax))
			}
			if _, ok := mix.Figures.Get(mixerTankAlone); !ok {
				t.Error("no osc tank alone beside it")
			}
		})
	}
}
