package pipeline

import (
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph/figure"
	"pare/rules"
	"pare/rules/stages"
)

// TestRFAmplifierWithItsLoad: in the main job a tuned RF amplifier is one
// stage with its tuned load, named by its role. The blind reviews' RF
// stages (review13 … review22 b02, a transistor on a tap of a gang-tuned
// transformer) had the collector winding's cold end on a decoupled line
// the reduction keeps (its resistor and bypass stand between the winding
// and chassis at signal level), where the tuned-amplifier patterns asked
// for chassis: the device was "Q1 stage" with no gain, the transformer a
// "Single-tuned transformer" of its own (review22 b02, reviewer B).
func TestRFAmplifierWithItsLoad(t *testing.T) {
	cases := []struct {
		review string
		load   []string // the tuned load's transformer and gang section
	}{
		{"review13", []string{"Q1", "T2", "VC1b"}},
		{"review14", []string{"Q1", "T2", "VC1b"}},
		{"review15", []string{"Q1", "T2", "VC1b"}},
		// review16's runs with its rod free: TestRFStageThatRuns.
		{"review17", []string{"Q1", "T2", "VC1b"}},
		{"review18", []string{"Q1", "T2", "VC1b"}},
		{"review19", []string{"Q1", "T2", "VC1b"}},
		{"review20", []string{"Q1", "T2", "VC1b"}},
		{"review21", []string{"Q1", "T2", "VC1b"}},
		{"review22", []string{"Q1", "T2", "VC1b"}},
	}
	for _, tc := range cases {
		t.Run(tc.review, func(t *testing.T) {
			res := runFixture(t, tc.review, "b02")
			s := stageHolding(res.Stages, tc.load[0])
			if s == nil || !strings.HasPrefix(s.Title, "RF amplifier: tuned amplifier") {
				t.Fatalf("%s is in %v, want a stage named RF amplifier", tc.load[0], s)
			}
			for _, ref := range tc.load[1:] {
				if !slices.Contains(s.Parts, ref) {
					t.Errorf("%s %q: parts %v, want its tuned load %s in it", s.Name, s.Title, s.Parts, ref)
				}
			}
			if g, ok := s.Figures.Get("gain"); !ok || g.Origin.Source != figure.Solver {
				t.Errorf("%s: no solved gain: %v", s.Name, s.Figures)
			}
		})
	}
}

// TestRFStageThatRuns: review16 b02's RF stage has a tuned base (the
// ferrite-rod tank, T1's primary with VC1a and TC1, its link winding into
// Q1's base) and a tuned collector (T2 with VC1b), and C6 from T2's small
// winding back to the base. With the rod's tank free, as the set runs, the
// stage's own loop closes: ngspice-39's return ratio on
// testdata/review16/spice/b/c02_loop.cir (Q1 at pare's DC point) reaches 0°
// of loop phase at 1.66689 MHz with a loop gain of 1.878 (+5.47 dB) with
// the gang at 12 pF, and at 917.9 kHz with 0.765 (−2.3 dB) at 100 pF; with
// the rod held at 0 V, as an idle generator would hold it, only at
// 39.6 MHz, far below 0 dB, which named it an RF amplifier before. The
// stage is named by the loop the solver finds (docs/references.md §53):
// 0.1 % on the frequency, 1 dB on the margin (pare refers each coil's q to
// the frequency its tank tunes at, the deck to the band's centre).
func TestRFStageThatRuns(t *testing.T) {
	res := runFixture(t, "review16", "b02")
	s := stageHolding(res.Stages, "Q1")
	if s == nil || s.Topology != "oscillator-loop" || len(s.Loop) != 1 {
		t.Fatalf("Q1 is in %v, want an oscillator found by its loop", s)
	}
	top := s.Loop[0].Settings[0]
	if top.Gang != 0 {
		t.Fatalf("first setting at gang %g, want the least capacitance", top.Gang)
	}
	if math.Abs(top.F/1.66689e6-1) > 0.001 || math.Abs(top.MarginDB-5.47) > 1 {
		t.Errorf("%s: loop at %.6g Hz %+.2f dB, ngspice 1.66689 MHz +5.47 dB", s.Name, top.F, top.MarginDB)
	}
}

// TestRFGainAtTheBandEnds: the RF amplifier's gain solved at each end of
// the gang's travel, at its load's peak there. ngspice-39 on reviewer B's
// deck testdata/review22/spice/b/c02-base.inc (gang CG 250p and 10p, `ac
// dec 4000 300k 3meg`, peak of mag(v(q1_c)/v(q1_b))) gives 274.3 at
// 529.2 kHz and 1430 at 1.6326 MHz. The deck's transistor has an Early
// voltage (VAF 100: ro about 53 kΩ at 1.88 mA) the capture does not give,
// across the 6.6 kΩ the collector works into at the top of the band: pare
// is 1.9 % under there, so 3 % (the gain falls five times from top to
// bottom, what the figure is for).
func TestRFGainAtTheBandEnds(t *testing.T) {
	res := runFixture(t, "review22", "b02")
	s := stageHolding(res.Stages, "Q1")
	if s == nil {
		t.Fatal("no stage holds Q1")
	}
	for _, c := range []struct {
		name     string
		gain, at float64 // ngspice-39, above
	}{{"gain_band_low", 274.3, 529.2e3}, {"gain_band_high", 1430, 1.6326e6}} {
		g, ok := s.Figures.Get(c.name)
		if !ok || g.At == nil {
			t.Errorf("%s: no %s: %v", s.Name, c.name, s.Figures)
			continue
		}
		if math.Abs(math.Abs(g.Value)-c.gain) > 0.03*c.gain || math.Abs(g.At.Value-c.at) > 0.005*c.at {
			t.Errorf("%s %s %g at %g Hz, ngspice %g at %g Hz", s.Name, c.name, g.Value, g.At.Value, c.gain, c.at)
		}
	}
}

// TestNoBandGainsOnAFixedLoad: a near miss. An IF amplifier's load is
// fixed-tuned: no gain at the band's ends (the gang does not move it),
// only its gain (review20 b05's IF strip).
func TestNoBandGainsOnAFixedLoad(t *testing.T) {
	res := runFixture(t, "review20", "b05")
	n := 0
	for _, s := range res.Stages {
		if !strings.Contains(s.Title, "IF amplifier") {
			continue
		}
		n++
		for _, name := range []string{"gain_band_low", "gain_band_high"} {
			if _, ok := s.Figures.Get(name); ok {
				t.Errorf("%s %q has %s on a fixed-tuned load", s.Name, s.Title, name)
			}
		}
	}
	if n == 0 {
		t.Fatal("no IF amplifier found")
	}
}

func runFixture(t *testing.T, review, name string) *Result {
	t.Helper()
	res, err := Run(Options{Path: filepath.Join("..", "..", "..", "testdata", review, name+".toml"), Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// stageHolding is the top stage whose parts hold ref, nil when none does.
func stageHolding(found []stages.Stage, ref string) *stages.Stage {
	for i := range found {
		if !strings.Contains(found[i].Name, ".") && slices.Contains(found[i].Parts, ref) {
			return &found[i]
		}
	}
	return nil
}

// TestNoTunedReturnThroughASmallCapacitor: a near miss. The RF
// transformer's cold end held by 100 pF, not a bypass (about 3 kΩ at
// 525 kHz against the 330 Ω feed; the tuned-winding pattern's 10 nF floor,
// common practice for an RF bypass), closes no tank to chassis: no
// tuned-amplifier pattern takes the winding as its load there, and the
// stage holding Q1 is not named an RF amplifier on a decoupled return.
func TestNoTunedReturnThroughASmallCapacitor(t *testing.T) {
	data, err := os.ReadFile(filepath.Join("..", "..", "..", "testdata", "review22", "b02.toml"))
	if err != nil {
		t.Fatal(err)
	}
	old := `C3 = { c = "47n", pins = ["vcc_rf", "gnd"]`
	if !strings.Contains(string(data), old) {
		t.Fatal("fixture changed: C3 not found")
	}
	text := strings.Replace(string(data), old, `C3 = { c = "100p", pins = ["vcc_rf", "gnd"]`, 1)
	path := filepath.Join(t.TempDir(), "b02-small-return.toml")
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	res, err := Run(Options{Path: path, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	if s := stageHolding(res.Stages, "Q1"); s != nil && strings.HasPrefix(s.Topology, "amp-tuned") && slices.Contains(s.Parts, "C3") {
		t.Errorf("%s %q takes the 100 pF C3 as its tank's bypass: %v", s.Name, s.Title, s.Parts)
	}
}
