package stages

import (
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/figure"
	"pare/rules"
)

// reduceFixture loads a circuit of testdata/ and reduces it at the default
// level, as `pare stages` does, then recognises its stages.
func reduceFixture(t *testing.T, name string) (*graph.Circuit, []Stage) {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("testdata", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatalf("reduce %s: %v", name, err)
	}
	return r, find(t, r, Options{Full: c, ACGround: log.ACGround})
}

func within(got, want, frac float64) bool { return math.Abs(got-want) <= frac*math.Abs(want) }

// Two devices on one shared cathode (emitter, source) resistor match both
// push-pull and long-tailed-pair with three parts; the outputs decide.
func TestPushPullOrPair(t *testing.T) {
	cases := []struct {
		name, parts, want, not string
	}{
		{"both outputs on the ends of one centre-tapped winding", `@Q1(g1, k, a1)
@Q2(g2, k, a2)
R1 = { r = "130", pins = ["k", "gnd"] }
T1 = { windings = { p = ["10", "10"], s = "25m" }, k = 0.99, pins = { p1 = "a1", pt = "ht", p2 = "a2", s1 = "spk", s2 = "gnd" } }`,
			"push-pull", "long-tailed-pair"},
		{"each output on a resistor of its own", `@Q1(g1, k, a1)
@Q2(g2, k, a2)
R1 = { r = "10k", pins = ["k", "gnd"] }
R2 = { r = "10k", pins = ["a1", "ht"] }
R3 = { r = "10k", pins = ["a2", "ht"] }`,
			"long-tailed-pair", "push-pull"},
		{"each output on a transformer of its own", `@Q1(g1, k, a1)
@Q2(g2, k, a2)
R1 = { r = "10k", pins = ["k", "gnd"] }
T1 = { windings = { p = "10", s = "25m" }, k = 0.99, pins = { p1 = "a1", p2 = "ht", s1 = "spk", s2 = "gnd" } }
T2 = { windings = { p = "10", s = "25m" }, k = 0.99, pins = { p1 = "a2", p2 = "ht", s1 = "spk2", s2 = "gnd" } }`,
			"long-tailed-pair", "push-pull"},
	}
	for _, tc := range cases {
		for _, fam := range allFamilies {
			t.Run(tc.name+"/"+fam, func(t *testing.T) {
				st := find(t, circuit(t, fam, tc.parts), Options{})
				if stageOf(st, tc.want) == nil || stageOf(st, tc.not) != nil {
					t.Errorf("want %s and no %s; found %s", tc.want, tc.not, topologies(st))
				}
			})
		}
	}
	_, st := reduceFixture(t, "push-pull-output.toml")
	s := stageOf(st, "push-pull")
	if s == nil || stageOf(st, "long-tailed-pair") != nil {
		t.Fatalf("push-pull output stage: found %s", topologies(st))
	}
	// n = √(Lp/Ls), inductance going with turns squared (from memory); the
	// primary's two 10 H halves are one winding, (√10 + √10)² = 40 H, so
	// n = √(40 H / 25 mH) = 40.
	if got := fig(s.Figures, "turns_ratio"); !within(got, 40, 0.001) {
		t.Errorf("turns ratio %g, want 40", got)
	}
}

// A plain RC ladder, 3 × 10 kΩ / 10 nF with an audio band and no FM, is
// three RC low-pass sections: no de-emphasis, no pi filter. The first two
// are loaded by the next section, so 1/(2πRC) is said to be unloaded.
func TestRCLadder(t *testing.T) {
	_, st := reduceFixture(t, "rc-ladder.toml")
	if len(st) != 3 {
		t.Fatalf("want 3 stages, found %s", topologies(st))
	}
	fc := 1 / (2 * math.Pi * 10e3 * 10e-9) // 1591.55 Hz, derived from fc = 1/(2πRC)
	for i, s := range st {
		if s.Topology != "rc-low-pass" || len(s.Parts) != 2 {
			t.Fatalf("stage %d: %s, want an RC low-pass section of two parts", i, topologies(st))
		}
		loaded := i < 2
		key := "f_c_hz"
		if loaded {
			key = "f_c_unloaded_hz"
		}
		// the formula exactly; the last section, open beyond, in circuit
		// too (0.01 %: the solver reads the pass band three decades down)
		if got, _ := formulaOf(s.Figures, key); !within(got, fc, 1e-6) || !within(fig(s.Figures, key), fc, 1e-4) {
			t.Errorf("%s %s = %g, want %g; figures %v", s.Name, key, got, fc, s.Figures)
		}
		if _, ok := s.Figures.Lookup("f_c_hz"); ok && loaded {
			t.Errorf("%s: a loaded section reports a plain corner f_c_hz", s.Name)
		}
		if loaded != (len(s.Notes) > 0 && strings.Contains(s.Notes[0], "unloaded")) {
			t.Errorf("%s notes %q", s.Name, s.Notes)
		}
	}
}

// A ladder whose refs do not follow the chain still pairs each resistor
// with the capacitor after it, never with the one before (that belongs to
// the previous section).
func TestRCLadderPairsForward(t *testing.T) {
	c := circuit(t, "valve", `R1 = { r = "10k", pins = ["in", "n1"] }
C2 = { c = "10n", pins = ["n1", "gnd"] }
R3 = { r = "10k", pins = ["n1", "n2"] }
C1 = { c = "10n", pins = ["n2", "gnd"] }
R2 = { r = "10k", pins = ["n2", "out"] }
C3 = { c = "10n", pins = ["out", "gnd"] }`)
	st := find(t, c, Options{})
	got := topologies(st)
	if want := "S1:rc-low-pass[C2 R1] S2:rc-low-pass[C1 R3] S3:rc-low-pass[C3 R2]"; got != want {
		t.Errorf("sections %s, want %s", got, want)
	}
}

// De-emphasis needs τ within ±20 % of 50 µs or 75 µs (the broadcast FM time
// constants, from memory: ITU-R BS.450 and regional FM practice), and a set
// that receives FM: a band or IF of 10 MHz or more (FM IF 10.7 MHz, from
// memory). τ = RC is derived.
func TestDeEmphasisNeedsFMAndBroadcastTau(t *testing.T) {
	const audio = "[regions]\naudio = { band = \"20..15k\", parts = [\"R1\", \"C1\"] }"
	const fmIF = "[freqs]\nif = \"10.7M\"\n"
	cases := []struct {
		name, extra, r, c string
		want              bool
	}{
		{"47 µs, audio of an FM set", fmIF + audio, "47k", "1n", true},
		{"75 µs, audio of an FM set", fmIF + audio, "75k", "1n", true},
		{"62 µs, audio beside an FM region", audio + "\nrf = { band = \"88M..108M\", parts = [\"R9\"] }", "62k", "1n", true},
		{"47 µs, in the MW band of an FM set, not audio", fmIF, "47k", "1n", false},
		{"39 µs, below 40 µs", fmIF + audio, "39k", "1n", false},
		{"100 µs, above 90 µs", fmIF + audio, "10k", "10n", false},
		{"47 µs, audio of an AM set (IF 470 kHz)", "[freqs]\nif = \"470k\"\n" + audio, "47k", "1n", false},
		{"75 µs, no FM anywhere", audio, "75k", "1n", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := circuit(t, "valve", `R1 = { r = "`+tc.r+`", pins = ["in", "b"] }
C1 = { c = "`+tc.c+`", pins = ["b", "gnd"] }
R9 = { r = "1k", pins = ["rf", "gnd"] }`, tc.extra)
			st := find(t, c, Options{})
			got := stageOf(st, "de-emphasis") != nil
			if got != tc.want {
				t.Errorf("de-emphasis %v, want %v; found %s", got, tc.want, topologies(st))
			}
			if !tc.want && stageOf(st, "rc-low-pass") == nil && stageOf(st, "agc-filter") == nil {
				t.Errorf("not de-emphasis, but not an RC low-pass either: %s", topologies(st))
			}
		})
	}
}

// A pi filter needs its first capacitor on a net fed by something other
// than an RC section (the detector's diode); a section after a section is
// an RC low-pass.
func TestPiFilterNeedsASource(t *testing.T) {
	pi := find(t, circuit(t, "valve", `D1 = { diode = "signal", pins = ["in", "det"] }
C1 = { c = "100p", pins = ["det", "gnd"] }
R1 = { r = "47k", pins = ["det", "f"] }
C2 = { c = "100p", pins = ["f", "gnd"] }`), Options{})
	if stageOf(pi, "rc-pi-filter") == nil {
		t.Errorf("diode-fed pi filter not recognised: %s", topologies(pi))
	}
	ladder := find(t, circuit(t, "valve", `R0 = { r = "47k", pins = ["in", "det"] }
C1 = { c = "100p", pins = ["det", "gnd"] }
R1 = { r = "47k", pins = ["det", "f"] }
C2 = { c = "100p", pins = ["f", "gnd"] }`), Options{})
	if stageOf(ladder, "rc-pi-filter") != nil {
		t.Errorf("an RC ladder taken for a pi filter: %s", topologies(ladder))
	}
}

// A lone coupling capacitor reports the high-pass corner against the
// resistance it feeds on its downstream side.
func TestCouplingCapacitorCorner(t *testing.T) {
	cases := []struct {
		name, parts  string
		fc, tau, rIn float64 // 0: no corner
		source       string
	}{
		{"into a grid leak", `C1 = { c = "10n", pins = ["in", "g"] }
R1 = { r = "470k", pins = ["g", "gnd"] }
@Q1(g, gnd, o)
R2 = { r = "47k", pins = ["o", "ht"] }`, 33.8628, 4.7e-3, 470e3, "docs/references.md §4: 10 nF into 470 kΩ"},
		// The anode load (47 kΩ to HT, AC ground) is upstream: the corner
		// is against the 470 kΩ beyond, not 338.6 Hz against the load.
		{"from an anode into the next grid", `@Q1(in, gnd, a)
R2 = { r = "47k", pins = ["a", "ht"] }
C1 = { c = "10n", pins = ["a", "b"] }
R1 = { r = "470k", pins = ["b", "gnd"] }`, 33.8628, 4.7e-3, 470e3, "docs/references.md §4: 10 nF into 470 kΩ"},
		// Only a port beyond: the 47 kΩ anode load is the source, not what
		// the capacitor feeds, so no corner (not 338.6 Hz).
		{"from an anode into a port", `@Q1(in, gnd, a)
R2 = { r = "47k", pins = ["a", "ht"] }
C1 = { c = "10n", pins = ["a", "out"] }
P1 = { port = "to the output stage", pins = ["out"] }`, 0, 0, 0, "nothing resistive downstream: no corner"},
		{"into a tank", `C1 = { c = "10p", pins = ["in", "t"] }
L1 = { l = "230u", pins = ["t", "gnd"] }
C2 = { c = "365p", pins = ["t", "gnd"] }`, 0, 0, 0, "no resistance to feed: no corner"},
	}
	for _, tc := range cases {
		for _, fam := range allFamilies {
			t.Run(tc.name+"/"+fam, func(t *testing.T) {
				st := find(t, circuit(t, fam, tc.parts), Options{})
				s := stageOf(st, "coupling-capacitor")
				if s == nil {
					t.Fatalf("no coupling capacitor: %s", topologies(st))
				}
				fc, has := formulaOf(s.Figures, "f_c_hz")
				if tc.fc == 0 {
					if has {
						t.Errorf("corner %g Hz with nothing resistive to feed", fc)
					}
					if port := strings.Contains(tc.parts, "port ="); port != (len(s.Notes) == 1 && strings.Contains(s.Notes[0], "feeds P1 (to the output stage)")) {
						t.Errorf("into a port %v, notes %q", port, s.Notes)
					}
					return
				}
				tau, _ := formulaOf(s.Figures, "tau_s")
				rIn, _ := formulaOf(s.Figures, "r_in_ohm")
				if !within(fc, tc.fc, 1e-5) || !within(tau, tc.tau, 1e-6) || !within(rIn, tc.rIn, 1e-6) {
					t.Errorf("fc %g τ %g R %g, want %g, %g, %g (%s)", fc, tau, rIn, tc.fc, tc.tau, tc.rIn, tc.source)
				}
				// The figures shown agree with each other: τ = 1/(2π·fc)
				// and fc = 1/(2π·R·C), all three of the circuit.
				f, t0, r := fig(s.Figures, "f_c_hz"), fig(s.Figures, "tau_s"), fig(s.Figures, "r_in_ohm")
				if !within(2*math.Pi*f*t0, 1, 1e-9) || !within(2*math.Pi*f*r*10e-9, 1, 1e-9) {
					t.Errorf("shown f c %g Hz, τ %g s, r in %g Ω disagree (1/(2πτ) = %g Hz)", f, t0, r, 1/(2*math.Pi*t0))
				}
			})
		}
	}
	// The triode stage's input: 22 nF into the 1 MΩ grid leak, 7.2343 Hz
	// (derived from fc = 1/(2πRC)), and the leak goes with the capacitor.
	_, st := reduceFixture(t, "triode-stage.toml")
	s := stageOf(st, "coupling-capacitor")
	if s == nil {
		t.Fatalf("triode stage: %s", topologies(st))
	}
	// The grid draws nothing, so in circuit the corner is the same to
	// 0.01 % (the solver's pass band is read three decades up).
	want := 1 / (2 * math.Pi * 1e6 * 22e-9)
	if got, _ := formulaOf(s.Figures, "f_c_hz"); !within(got, want, 1e-6) || !within(fig(s.Figures, "f_c_hz"), want, 1e-4) {
		t.Errorf("triode input corner %g Hz (formula %g), want %g", fig(s.Figures, "f_c_hz"), got, want)
	}
	if !slices.Equal(s.Parts, []string{"C1", "R1"}) {
		t.Errorf("coupling stage parts %v, want [C1 R1]", s.Parts)
	}
}

// A resistor to AC ground is no stage of its own: it joins the stage it
// loads, or stays unmatched beside no stage.
func TestShuntResistorsJoinTheirStage(t *testing.T) {
	_, st := reduceFixture(t, "push-pull-output.toml")
	for _, s := range st {
		if len(s.Parts) == 1 && strings.HasPrefix(s.Parts[0], "R") {
			t.Errorf("%s is a stage of one resistor: %s", s.Name, topologies(st))
		}
	}
	pp := stageOf(st, "push-pull")
	if pp == nil {
		t.Fatalf("no push-pull: %s", topologies(st))
	}
	for _, r := range []string{"R2", "R3", "R4"} { // the two grid leaks, the speaker
		if !slices.Contains(pp.Parts, r) {
			t.Errorf("push-pull parts %v lack %s", pp.Parts, r)
		}
	}
	for _, name := range []string{"frequency-changer.toml", "if-detector-audio.toml", "transistor-front-end.toml"} {
		_, reduced, log := reduceExample(t, name)
		for _, s := range find(t, reduced, Options{ACGround: log.ACGround}) {
			if p := reduced.Part(s.Parts[0]); len(s.Parts) == 1 && p != nil && p.Kind == graph.Resistor {
				t.Errorf("%s: %s is a stage of one resistor (%s)", name, s.Name, s.Parts[0])
			}
		}
	}
	c := circuit(t, "valve", `R1 = { r = "1M", pins = ["in", "gnd"] }`)
	st = find(t, c, Options{})
	if len(st) != 0 || !slices.Equal(Unmatched(c, st), []string{"R1"}) {
		t.Errorf("a lone resistor: stages %s, unmatched %v", topologies(st), Unmatched(c, st))
	}
}

// Stage names step aside from switch refs (IEC letter code S): a circuit
// with a part S1 gets ST1, ST2…; any other keeps S1, S2….
func TestStageNamesAvoidRefs(t *testing.T) {
	_, st := reduceFixture(t, "band-switch.toml")
	if len(st) == 0 {
		t.Fatal("no stages")
	}
	for i, s := range st {
		if want := "ST" + string(rune('1'+i)); s.Name != want {
			t.Errorf("stage %d named %q, want %q: %s", i, s.Name, want, topologies(st))
		}
	}
	_, st = reduceFixture(t, "triode-stage.toml")
	if len(st) == 0 || st[0].Name != "S1" {
		t.Errorf("no switch, names %s", topologies(st))
	}
	for _, tc := range []struct {
		ref  string
		want bool
	}{{"S1", true}, {"S12", true}, {"S2.1", true}, {"S", false}, {"SW1", false}, {"S1a", false}, {"S2.", false}, {"C1", false}} {
		if got := stageLike(tc.ref); got != tc.want {
			t.Errorf("stageLike(%q) = %v", tc.ref, got)
		}
	}
}

// Figure labels in the trade's words: a row of the figure table for the
// whole name, the prefix's word before a known name, else the name spelt
// plainly.
func TestFigureLabels(t *testing.T) {
	for _, tc := range []struct{ prefix, name, want string }{
		{"", "if", "IF"}, {"", "ift_f", "IF transformer f"}, {"ift", "f", "IF transformer f"}, {"load", "f", "load tuned f"},
		{"load", "q_loaded", "load tuned Q (loaded)"}, // not "load loaded Q"
		{"", "f_c_unloaded", "f c (unloaded)"}, {"", "pad_c", "padder"}, {"", "gain_min", "gain needed to oscillate ≥"},
		{"grid", "f_c", "grid f c"}, {"bypass", "tau", "bypass tau"}, {"", "gain", "gain"}, {"", "r_track", "r track"},
	} {
		if got := nameOf(tc.prefix, tc.name, figure.Ratio).label; got != tc.want {
			t.Errorf("label of %q under prefix %q = %q, want %q", tc.name, tc.prefix, got, tc.want)
		}
	}
}
