package stages

import (
	"math"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// stageWith is the stage that holds part ref, nil when none does.
func stageWith(stages []Stage, ref string) *Stage {
	for i := range stages {
		if slices.Contains(stages[i].Parts, ref) && len(stages[i].Contains) == 0 {
			return &stages[i]
		}
	}
	return nil
}

// A coupling capacitor with a resistor to AC ground on both sides has its
// corner against the resistor it feeds (downstream, away from the driving
// electrode), never against the source's resistor: f = 1/(2πRC)
// (docs/references.md §4).
func TestCouplingCornerUsesLoadSide(t *testing.T) {
	for _, c := range []struct {
		file, cap, load, source string
		r, c                    float64
	}{
		// FET source follower: R2 1k source resistor, C4 10n, R3 10k load.
		{"fet-colpitts-vfo.toml", "C4", "R3", "R2", 10e3, 10e-9},
		// Triode detector: R2 47k anode load, C3 10n, R3 470k grid leak.
		{"grid-leak-reaction.toml", "C3", "R3", "R2", 470e3, 10e-9},
	} {
		t.Run(c.file, func(t *testing.T) {
			_, st := reduceFixture(t, c.file)
			s := stageWith(st, c.cap)
			if s == nil {
				t.Fatalf("%s is in no stage: %s", c.cap, topologies(st))
			}
			if !slices.Contains(s.Parts, c.load) {
				t.Errorf("%s: stage %s %v lacks the load %s", c.cap, s.Topology, s.Parts, c.load)
			}
			tau := c.r * c.c              // τ = RC
			fc := 1 / (2 * math.Pi * tau) // derived from f = 1/(2πRC)
			if got := fig(s.Figures, "tau_s"); math.Abs(got-tau) > 1e-3*tau {
				t.Errorf("%s: tau %g s, want %g s (%s·%s, not the source's %s)", c.cap, got, tau, c.load, c.cap, c.source)
			}
			if got := fig(s.Figures, "f_c_hz"); math.Abs(got-fc) > 1e-3*fc {
				t.Errorf("%s: f c %g Hz, want %g Hz", c.cap, got, fc)
			}
		})
	}
}

// The smoothing filter of the transistor example runs vcc (C12 100 µF, on
// the battery port and the declared supply) → R7 470 Ω → vcc_mix (C10
// 47 µF), which feeds the mixer's line alone: a decoupler, C10 its
// decoupling capacitor (C12 is the battery line's, not the section's; no
// rectifier, so no reservoir), and the corner is 1/(2π·R7·C10) =
// 7.205 Hz (derived from f = 1/(2πRC)). The stage is on
// the full circuit only, so it comes after every signal stage, marked.
func TestSmoothingFilterFacesTheSupply(t *testing.T) {
	full, reduced, log := reduceExample(t, "transistor-front-end.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	sm := stageOf(st, "smoothing-filter")
	if sm == nil {
		t.Fatalf("no smoothing filter: %s", topologies(st))
	}
	for _, c := range []struct {
		key  string
		want float64
	}{
		{"c_decoupling_f", 47e-6},                   // C10, on vcc_mix
		{"f_c_hz", 1 / (2 * math.Pi * 470 * 47e-6)}, // derived from f = 1/(2πRC)
	} {
		if got, _ := formulaOf(sm.Figures, c.key); math.Abs(got-c.want) > 1e-3*c.want {
			t.Errorf("%s = %g, want %g", c.key, got, c.want)
		}
	}
	if !sm.Supply || !slices.Contains(sm.Notes, SupplyNote) {
		t.Errorf("smoothing filter supply %v notes %q: want it marked, with the note %q", sm.Supply, sm.Notes, SupplyNote)
	}
	seenSupply := false
	for _, s := range st {
		if s.Supply {
			seenSupply = true
		} else if seenSupply {
			t.Errorf("signal stage %s %s listed after a supply stage: %s", s.Name, s.Topology, topologies(st))
		}
	}
}

// The same filter drawn the other way round in the netlist (supply input on
// the net the pattern calls out): the reservoir still is the capacitor on
// the rectifier's side. A valve supply: rectifier D1 into C1 32 µF, choke L1
// 10 H, C2 16 µF on HT; f = 1/(2π√(L·C2)) (handbook formula, from memory)
// with the smoothing capacitor, 12.58 Hz, not 8.9 Hz with the reservoir.
func TestSmoothingFilterRectifierSide(t *testing.T) {
	src := `title = "supply"
band = "20..20k"
inputs = ["ac"]
outputs = ["ht"]
[nets]
gnd = { role = "ground" }
ht = { role = "supply", volts = 250 }
[parts]
D1 = { diode = "rectifier", pins = { a = "ac", k = "raw" } }
R1 = { r = "100k", pins = ["ac", "gnd"] }
C1 = { c = "32u", type = "electrolytic", pins = ["raw", "gnd"] }
L1 = { l = "10", type = "choke", pins = ["raw", "ht"] }
C2 = { c = "16u", type = "electrolytic", pins = ["ht", "gnd"] }
R2 = { r = "10k", pins = ["ht", "gnd"] }
V9 = { valve = "triode", pins = { g1 = "gnd", k = "gnd", a = "a9" }, mu = 20, ra = "10k" }
R9 = { r = "47k", pins = ["ht", "a9"] }
`
	full, err := graph.Parse("supply.toml", []byte(src))
	if err != nil {
		t.Fatalf("fixture: %v", err)
	}
	reduced, log, err := rules.Reduce(full, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatalf("reduce: %v", err)
	}
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	sm := stageOf(st, "smoothing-filter")
	if sm == nil {
		t.Fatalf("no smoothing filter: %s", topologies(st))
	}
	// derived: the section's model with no copper and no DC point is an
	// undamped LC, falling 3 dB at √(1+√2) × 1/(2π√(LC2)) (docs/references.md §52)
	want := math.Sqrt(1+math.Sqrt2) / (2 * math.Pi * math.Sqrt(10*16e-6))
	if got, _ := formulaOf(sm.Figures, "f_c_hz"); math.Abs(got-want) > 1e-3*want {
		t.Errorf("f c %g Hz, want %g Hz (with C2, the smoothing capacitor)", got, want)
	}
	if got := fig(sm.Figures, "c_reservoir_f"); got != 32e-6 {
		t.Errorf("reservoir %g F, want C1 32 µF (on the rectifier)", got)
	}
}

// docs/references.md §2, three-point tracking: the padded set of
// TestTrackingAcrossTheDial (RF tank 230.625 µH + 26.0046 pF trimmer; L2
// 135.265 µH, Ct2 33.5915 pF, Cp 364.241 pF; IF 455 kHz) was designed exact
// at 600, 1100 and 1600 kHz, so the fitted set must track exactly there and
// nowhere else on the dial.
func TestFittedTrackingPoints(t *testing.T) {
	c := circuit(t, "valve", `@Q1(g, tap, o)
T1 = { windings = { p = "40u", s = "230.625u" }, k = 0.3, pins = { p1 = "in", p2 = "gnd", s1 = "rf", s2 = "gnd" } }
VC1 = { c = "12p..365p", pins = ["rf", "gnd"], gang = "tune" }
TC1 = { c = "5p..50p", set = "26.0046p", pins = ["rf", "gnd"] }
C1 = { c = "10p", pins = ["rf", "g"] }
C2 = { c = "100p", pins = ["top", "g"] }
L1 = { l = "135.265u", tap = 0.12, pins = ["gnd", "tap", "top"] }
C6 = { c = "364.241p", pins = ["top", "pad"] }
VC2 = { c = "12p..365p", pins = ["pad", "gnd"], gang = "tune" }
TC2 = { c = "5p..50p", set = "33.5915p", pins = ["pad", "gnd"] }
T2 = { windings = { p = "1m", s = "1m" }, k = 0.01, pins = { p1 = "o", p2 = "ht", s1 = "if", s2 = "gnd" } }
C3 = { c = "122.354p", pins = ["o", "ht"] }
C4 = { c = "122.354p", pins = ["if", "gnd"] }`, "[freqs]\nif = \"455k\"")
	s := stageOf(find(t, c, Options{}), "self-oscillating-mixer")
	if s == nil {
		t.Fatal("mixer not recognised")
	}
	for i, want := range []float64{600e3, 1100e3, 1600e3} { // docs/references.md §2 design points
		key := "track_fit" + string(rune('1'+i)) + "_hz" // the formula's, beside the solver's
		if got, ok := formulaOf(s.Figures, key); !ok || math.Abs(got-want) > 0.5e3 {
			t.Errorf("%s = %g Hz (present %v), want %g Hz", key, got, ok, want)
		}
	}
	if _, ok := formulaOf(s.Figures, "track_fit4_hz"); ok {
		t.Errorf("a fourth exact-tracking point: %v", s.Figures)
	}
}

// The frequency changer example's parts alone (RF 260 µH + 23.6 pF
// trimmer; oscillator 126 µH, 36.3 pF trimmer, 390 pF padder; gang
// 12–365 pF; IF 470 kHz) track nowhere on the dial: the design counts the
// strays the circuit adds (the 4.7 pF injection capacitor, the aerial
// winding). Worked by hand, f = 1/(2π√(LC)) with C = (Cg+Ct)·Cp/(Cg+Ct+Cp)
// (docs/references.md §1, §4), the error keeps one sign over the dial, so
// pare gives the in-circuit crossings with no formula's beside them and
// says so in the note.
func TestFittedTrackingFrequencyChanger(t *testing.T) {
	full, reduced, log := reduceExample(t, "frequency-changer.toml")
	mix := stageOf(find(t, reduced, Options{Full: full, ACGround: log.ACGround}), "self-oscillating-mixer")
	if mix == nil {
		t.Fatal("no self-oscillating mixer")
	}
	sign := 0.0
	for i := 0; i <= 200; i++ {
		cg := 12e-12 + float64(i)/200*353e-12
		fs := 1 / (2 * math.Pi * math.Sqrt(260e-6*(cg+23.6e-12)))
		ct := cg + 36.3e-12
		fo := 1 / (2 * math.Pi * math.Sqrt(126e-6*ct*390e-12/(ct+390e-12)))
		e := fo - (fs + 470e3)
		if sign != 0 && e*sign <= 0 {
			t.Fatalf("by hand the formula's error changes sign near %g Hz: the test's premise is wrong", fs)
		}
		sign = e
	}
	f, ok := mix.Figures.Get("track_fit")
	if !ok || len(f.Points) != 3 || f.Check != nil {
		t.Errorf("track_fit %+v: want three crossings in circuit and no formula's", f)
	}
	noted := false
	for _, n := range mix.Notes {
		noted = noted || strings.Contains(n, "by the formula on its parts alone, nowhere on the dial")
	}
	if !noted {
		t.Errorf("notes %q: want the formula's crossings (none) in words", mix.Notes)
	}
}

// A cathode bypass works against Rk in parallel with the impedance looking
// into the cathode, (ra + RL)/(µ + 1) (textbook small-signal result, from
// memory): with µ 100, ra 62.5 kΩ, RL 100 kΩ that is 1608.9 Ω, so 1.5 kΩ
// ∥ 1608.9 Ω = 776.3 Ω and with 100 µF the corner is 2.050 Hz (derived from
// f = 1/(2πRC)), not the 1.061 Hz of Rk alone.
func TestCathodeBypassCountsTheCathode(t *testing.T) {
	_, st := reduceFixture(t, "triode-bypassed.toml")
	s := stageWith(st, "V1")
	if s == nil || s.Topology != "amp-common-bypassed" {
		t.Fatalf("V1 not in a bypassed common-cathode stage: %s", topologies(st))
	}
	zk := (62.5e3 + 100e3) / (100 + 1)
	r := 1.5e3 * zk / (1.5e3 + zk)
	fc := 1 / (2 * math.Pi * r * 100e-6)
	if got := fig(s.Figures, "bypass_r_ohm"); !within(got, r, 1e-3) {
		t.Errorf("bypass r %g Ω, want %g Ω", got, r)
	}
	if got, _ := formulaOf(s.Figures, "bypass_f_c_hz"); !within(got, fc, 1e-3) || !within(fc, 2.050, 1e-3) {
		t.Errorf("bypass f c by formula %g Hz, want %g Hz (2.050 Hz)", got, fc)
	}
}
