package stages

import (
	"math"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

func loadOsc(t *testing.T, name string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/osc/" + name)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// Each oscillator stage carries its loop across the dial and the flags a
// repairer needs. The margins are pare's return-ratio loop gains, which
// graph/ac checks against ngspice transients on the same fixtures; here the
// check is that the stage reports them and words the right flag.
func TestOscillatorLoopFlags(t *testing.T) {
	cases := []struct {
		file, topology string
		settings       int
		flag           string // a flag that must be there ("" none of the loop flags)
		reduced        bool   // found on the reduced circuit, as pare runs
	}{
		// A tickler's feedback rises with frequency (M·ω against a
		// tank of falling dynamic resistance): too loose a coupling
		// fails first at the low end of the dial (common practice).
		{"tickler-valve-weak.toml", "tuned-grid-tickler", 5, "will not start: loop gain -1.3 dB at the low end of the dial", false},
		{"tickler-valve.toml", "tuned-grid-tickler", 5, "may squegg", false},
		{"edge-below-colpitts-bjt.toml", "colpitts-common-tap", 1, "Q1: loop phase 0° at 2.817 MHz, loop gain -0.5 dB at best (Q1's gm would have to rise 0.5 dB", false},
		{"edge-above-colpitts-bjt.toml", "colpitts-common-tap", 1, "", false},
		{"hartley-valve.toml", "hartley-common-tap", 1, "", false},
		// The Hartley pair straddles the threshold (−1.8 dB and +0.4 dB;
		// the kicked ngspice transients in graph/ac decay and grow).
		{"edge-below-hartley-valve.toml", "hartley-common-tap", 1, "loop gain -1.8 dB at best (V1's gm would have to rise 1.8 dB (1.23×) to start): does not oscillate as drawn", false},
		{"edge-above-hartley-valve.toml", "hartley-common-tap", 1, "", false},
		// The control electrode at AC ground (common base, grounded grid):
		// named by their patterns, the loop confirming or refusing each.
		// The base or grid is at AC ground only once the reduction has
		// shorted its bypass, so these are found on the reduced circuit.
		{"colpitts-cb-bjt.toml", "colpitts-grounded-control", 1, "", true},
		{"colpitts-cb-valve.toml", "colpitts-grounded-control", 1, "", true},
		{"edge-below-colpitts-cb-valve.toml", "colpitts-grounded-control", 1, "loop gain -0.8 dB at best", true},
		{"hartley-cb-bjt.toml", "hartley-grounded-control", 1, "", true},
		{"clapp-ce-bjt.toml", "clapp-grounded-tap", 1, "", true},
		// A tickler in transistor form: the collector's winding feeds the
		// tuned base winding back.
		{"tickler-bjt.toml", "tuned-grid-tickler", 5, "", false},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c := loadOsc(t, tc.file)
			var found []Stage
			if tc.reduced {
				reduced, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
				if err != nil {
					t.Fatal(err)
				}
				found = find(t, reduced, Options{Full: c, ACGround: log.ACGround})
			} else {
				found = find(t, c, Options{})
			}
			st := stageOf(found, tc.topology)
			if st == nil || len(st.Loop) != 1 {
				t.Fatalf("no %s stage with one loop", tc.topology)
			}
			if n := len(st.Loop[0].Settings); n != tc.settings {
				t.Errorf("%d gang settings, want %d", n, tc.settings)
			}
			flags := strings.Join(st.Flags, "\n")
			if tc.flag != "" && !strings.Contains(flags, tc.flag) {
				t.Errorf("flags %q lack %q", st.Flags, tc.flag)
			}
			if tc.flag == "" {
				for _, w := range []string{"will not start", "does not oscillate", "squegg"} {
					if strings.Contains(flags, w) {
						t.Errorf("unexpected flag %q", flags)
					}
				}
			}
			if line := LoopLine(st.Loop[0]); !strings.HasPrefix(line, "loop ") {
				t.Errorf("loop line %q", line)
			}
		})
	}
}

// An oscillator no pattern names is found by its loop: the converter whose
// feedback reaches the emitter through a separate link winding, and the
// Wien bridge whose first valve has the bridge's arm on its cathode, with a
// Wien pattern that knows only the grounded drawing in place of the
// built-in one (which names the class: TestWienBridgeClass); its second
// valve, which an amplifier pattern names, is in the same loop and joins
// the one oscillator, named by its network, with no amplifier flagged as
// oscillating (TestLoopThroughTwoDevicesIsOneOscillator). The near miss is
// the same converter with the link winding reversed: negative feedback, no
// 0° loop phase, no oscillator.
func TestOscillatorFoundByLoop(t *testing.T) {
	cases := []struct {
		path, device, title string
		joined              string // a second device in the same loop, in the stage
	}{
		{"../../testdata/osc/link-bjt.toml", "Q1", "Oscillator, feedback through T1 (BJT)", ""},
		{"../../testdata/osc/wien-valve.toml", "V1", "Wien-bridge oscillator (valve)", "V2"},
		{"../../testdata/osc/wien-bjt.toml", "Q1", "Wien-bridge oscillator (BJT)", "Q2"},
		// an LC loop no pattern takes (an anode stopper in the tank's feed):
		// the coil in the network makes it a tuned circuit, not RC
		{"../../testdata/loops/colpitts-anode-stopper.toml", "V1", "Oscillator, feedback through a tuned circuit (valve)", ""},
		{"testdata/link-bjt-reversed.toml", "", "", ""},
		{"testdata/triode-stage.toml", "", "", ""},
	}
	for _, tc := range cases {
		t.Run(tc.path, func(t *testing.T) {
			c, err := graph.LoadFile(tc.path)
			if err != nil {
				t.Fatal(err)
			}
			found := find(t, c, Options{PatternDir: "testdata/patterns-wien-grounded-only"})
			st := stageOf(found, loopTopology)
			if tc.device == "" {
				if st != nil {
					t.Fatalf("near miss found as %s %v", st.Title, st.Parts)
				}
				return
			}
			if st == nil || st.Title != tc.title || !slices.Contains(st.Parts, tc.device) {
				t.Fatalf("stages %s: want %q holding %s", topologies(found), tc.title, tc.device)
			}
			if len(st.Loop) != 1 || st.Loop[0].Device != tc.device {
				t.Errorf("loop %+v", st.Loop)
			}
			if tc.joined != "" && !slices.Contains(st.Parts, tc.joined) {
				t.Errorf("%s, in the same loop, not in the oscillator %v", tc.joined, st.Parts)
			}
			for _, other := range found {
				if strings.Contains(strings.Join(other.Flags, "\n"), "oscillates") {
					t.Errorf("%s flagged as oscillating: %q", other.Name, other.Flags)
				}
			}
		})
	}
}

// Patterns as equivalence classes: a phase-shift oscillator whose emitter
// resistor is only partly bypassed (4.7 µF: 51 Ω at 660 Hz against
// 1/gm = 26 Ω, so the reduction keeps it) is still a phase-shift
// oscillator; the same circuit with two sections (each under 90°, so short of the 180° the
// ladder must give; handbook analysis) is not, and has no loop.
func TestVariantPatterns(t *testing.T) {
	cases := []struct{ file, topology string }{
		{"testdata/phase-shift-partial-bypass.toml", "rc-phase-shift-degenerated"},
		{"testdata/phase-shift-two-sections.toml", ""},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			found := find(t, c, Options{})
			for _, s := range found {
				if s.group == "oscillator" && s.Topology != tc.topology {
					t.Errorf("unexpected oscillator %s", s.Topology)
				}
			}
			if tc.topology == "" {
				return
			}
			st := stageOf(found, tc.topology)
			if st == nil || len(st.Loop) != 1 {
				t.Fatalf("stages %s: want %s with its loop", topologies(found), tc.topology)
			}
			if _, _, _, m, ok := st.Loop[0].Range(); !ok || m < 0 {
				t.Errorf("loop %+v: the fixture oscillates (its bypass is partial, not absent)", st.Loop[0])
			}
		})
	}
}

// The self-oscillating mixer is any device with an oscillator loop and an
// output tuned to the IF, however the feedback is coupled: here a link
// winding to the emitter. Its padder and link capacitor belong to it, not
// to "coupling capacitor" stages. The near miss has the IF can tuned far
// off the IF (47 pF: about 890 kHz by f = 1/(2π√(LC))): an oscillator, not
// a mixer.
func TestMixerFoundByLoop(t *testing.T) {
	cases := []struct{ file, topology string }{
		{"testdata/converter-link.toml", loopMixerTopology},
		{"testdata/converter-link-off-if.toml", loopTopology},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			found := find(t, c, Options{})
			st := stageOf(found, tc.topology)
			if st == nil {
				t.Fatalf("stages %s: no %s", topologies(found), tc.topology)
			}
			if !strings.Contains(st.Title, "T2") {
				t.Errorf("title %q: the feedback goes through T2", st.Title)
			}
			for _, ref := range []string{"C3", "C4", "Q1", "T2", "VC1b"} {
				if !slices.Contains(st.Parts, ref) {
					t.Errorf("parts %v lack %s", st.Parts, ref)
				}
			}
			if cc := stageOf(found, "coupling-capacitor"); cc != nil && slices.Contains(cc.Parts, "C3") {
				t.Errorf("the padder C3 is still a coupling capacitor")
			}
			if tc.topology == loopMixerTopology {
				if _, ok := st.Figures.Lookup("osc_f_min_hz"); !ok {
					t.Errorf("figures %v lack the oscillator range", st.Figures)
				}
			}
		})
	}
}

// Reaction in a grid-leak detector: the regeneration loop gain at the
// tuned frequency. Phased to regenerate and set below oscillation, the
// loop multiplies the tank's Q by 1/(1 − L) (regeneration, the classic
// result for positive feedback around a resonator); the same detector with
// the reaction winding reversed feeds back at 180° and is flagged.
func TestReaction(t *testing.T) {
	cases := []struct{ file, flag string }{
		{"testdata/grid-leak-reaction-phased.toml", ""},
		{"testdata/grid-leak-reaction.toml", "connected the wrong way round"},
	}
	for _, tc := range cases {
		t.Run(tc.file, func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			st := stageOf(find(t, c, Options{}), "grid-leak-detector-reaction")
			if st == nil || len(st.Loop) != 1 {
				t.Fatal("no detector with reaction and its loop")
			}
			flags := strings.Join(st.Flags, "\n")
			if tc.flag != "" {
				if !strings.Contains(flags, tc.flag) {
					t.Errorf("flags %q lack %q", st.Flags, tc.flag)
				}
				return
			}
			_, _, _, mMax, _ := st.Loop[0].Range()
			q, ok := st.Figures.Lookup("q_mult")
			want := 1 / (1 - math.Pow(10, mMax/20)) // derived: Q·1/(1 − L)
			if !ok || mMax >= 0 || math.Abs(q-want) > 1e-9*want || q <= 1 {
				t.Errorf("q mult %v (%v), loop %+.2f dB: want %.4g", q, ok, mMax, want)
			}
		})
	}
}

// The output stage's figures, derived by hand: n = √(10 H / 16 mH) = 25,
// reflected load n²·8 Ω = 5 kΩ (the top-cut corner has no fixture yet).
func TestOutputTransformerFigures(t *testing.T) {
	c, err := graph.LoadFile("testdata/output-single-ended.toml")
	if err != nil {
		t.Fatal(err)
	}
	st := stageOf(find(t, c, Options{}), "output-transformer")
	if st == nil {
		t.Fatal("no output stage")
	}
	for key, want := range map[string]float64{"turns_ratio": 25, "r_reflected_ohm": 5000} {
		got, ok := st.Figures.Lookup(key)
		if !ok || math.Abs(got/want-1) > 1e-3 {
			t.Errorf("%s = %v (%v), want %v", key, got, ok, want)
		}
	}
}

// A transistor set's audio end: the driver's phase-splitting transformer
// and the push-pull pair whose output transformer carries the loudspeaker,
// with the reflected load collector to collector, n²·Z: the primary's two
// halves are one winding, turns adding, Lp = (√0.05 + √0.05)² = 0.2 H
// against 1 mH, n² = 200, 1600 Ω (derived, ideal transformer).
func TestDriverAndPushPull(t *testing.T) {
	c, err := graph.LoadFile("testdata/driver-push-pull.toml")
	if err != nil {
		t.Fatal(err)
	}
	found := find(t, c, Options{})
	if stageOf(found, "phase-splitter-transformer") == nil {
		t.Errorf("no phase splitter: %s", topologies(found))
	}
	pp := stageOf(found, "push-pull")
	if pp == nil || !slices.Contains(pp.Parts, "LS1") {
		t.Fatalf("no push-pull stage with its loudspeaker: %s", topologies(found))
	}
	if z, ok := pp.Figures.Lookup("r_reflected_ohm"); !ok || math.Abs(z/1600-1) > 1e-3 {
		t.Errorf("reflected load %v (%v), want 1600 Ω", z, ok)
	}
}

// TestTurnedWindingFlagged: a device no pattern names whose loop does not
// run as captured, but runs with a transformer winding turned over, is
// flagged with the winding to check: a reversed reaction winding is a
// common capture and repair mistake (common practice), and pare drew the
// superhet's local oscillator as an unnamed "V1b stage" without a word.
// The loop figures, as captured and turned over, are the solver's.
func TestTurnedWindingFlagged(t *testing.T) {
	_, sts := findFixture(t, "loops", "superhet-reaction-reversed.toml")
	var flags []string
	for _, st := range sts {
		if slices.Contains(st.Parts, "V1b") {
			flags = append(flags, st.Flags...)
		}
	}
	found := false
	for _, f := range flags {
		found = found || strings.Contains(f, "V1b does not oscillate as captured") && strings.Contains(f, "check T2's connections")
	}
	if !found {
		t.Errorf("V1b's stage flags %q, want one saying it does not oscillate as captured and to check T2", flags)
	}
}
