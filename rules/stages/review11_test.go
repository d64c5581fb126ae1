package stages

import (
	"math"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// The blind review of oscillator recognition (review 11): its circuits are
// testdata/good/review-osc-*.toml, its ngspice decks beside them in
// testdata/good/review-osc/ (docs/references.md §22).

// A coupling capacitor's corner is against the resistance of the side it
// feeds even when no input is declared and the signal starts at an
// oscillator: the walk that orders the circuit does not run backwards
// through the oscillator's own emitter or collector. C6 feeds buffer Q2's
// base bias, R5 ∥ R6 = 100k ∥ 100k = 50 kΩ; C4 feeds R5 47 kΩ, fc =
// 1/(2π·47k·1µ) = 3.386 Hz (handbook formula fc = 1/(2πRC),
// docs/references.md §4).
func TestReviewOscCouplingReadsLoadSide(t *testing.T) {
	for _, tc := range []struct {
		file, cap string
		rIn, fc   float64 // fc 0: not checked
	}{
		{"review-osc-c1-vfo.toml", "C6", 50e3, 0},
		{"review-osc-c3-phaseshift.toml", "C4", 47e3, 3.386},
	} {
		t.Run(tc.file, func(t *testing.T) {
			_, st := reduceGood(t, tc.file)
			s := stageWith(st, tc.cap)
			if s == nil {
				t.Fatalf("no stage holds %s: %s", tc.cap, topologies(st))
			}
			r, ok := formulaOf(s.Figures, "r_in_ohm") // the resistors to AC ground, the corner's formula
			if !ok || math.Abs(r/tc.rIn-1) > 0.01 {
				t.Errorf("%s %s: r in %v (ok %v), want %v", s.Name, tc.cap, r, ok, tc.rIn)
			}
			if tc.fc > 0 {
				if f, ok := s.Figures.Lookup("f_c_hz"); !ok || math.Abs(f/tc.fc-1) > 0.02 {
					t.Errorf("%s %s: f c %v (ok %v), want %v", s.Name, tc.cap, f, ok, tc.fc)
				}
			}
		})
	}
}

// A device whose loop reaches 0° of loop phase is reported on both sides
// of 0 dB, with the margin worded as what it is (the return ratio of the
// device's gm). ngspice .ac on testdata/good/review-osc/c3-phaseshift-loop.cir:
// R7 100 Ω, 0° at 1555.0 Hz, +0.49 dB; R7 120 Ω, 0° at 1532.1 Hz, −2.05 dB
// (the kicked transient c3-phaseshift-below-tran.cir decays). ngspice .ac
// on c1-vfo-loop.cir: +27.92 dB at 5.858 MHz (C1 15p), +27.75 dB at 5.300
// MHz (C1 50p); base time constant 1 nF into 33k: squegging risk (common
// practice, squeggMarginDB and squeggTau).
func TestReviewOscLoopFlags(t *testing.T) {
	for _, tc := range []struct {
		file string
		want []string
	}{
		{"review-osc-c3-phaseshift-below.toml", []string{"loop phase 0° at 1.532 kHz, loop gain -2.1 dB", "does not oscillate as drawn", "gm would have to rise 2.1 dB"}},
		{"review-osc-c3-phaseshift.toml", []string{"loop Q1: 1.555 kHz, gm margin +0.5 dB"}},
		{"review-osc-c1-vfo.toml", []string{"0 %: 5.858 MHz +27.9 dB", "100 %: 5.3 MHz +27.7 dB", "long base time constant", "may squegg"}},
	} {
		t.Run(tc.file, func(t *testing.T) {
			_, st := reduceGood(t, tc.file)
			var flags []string
			for _, s := range st {
				flags = append(flags, s.Flags...)
				for _, l := range s.Loop {
					flags = append(flags, LoopLine(l))
				}
			}
			all := strings.Join(flags, "\n")
			for _, w := range tc.want {
				if !strings.Contains(all, w) {
					t.Errorf("no flag says %q; flags:\n%s", w, all)
				}
			}
		})
	}
}

// A loop well short of 0 dB is stray feedback, not an oscillator that
// fails to start: a plain amplifier stays silent (loopReachDB).
func TestReviewOscReachIsBounded(t *testing.T) {
	_, st := reduceGood(t, "review-audio-triode.toml")
	for _, s := range st {
		if slices.ContainsFunc(s.Flags, func(f string) bool {
			return strings.Contains(f, "will not start as drawn") || strings.Contains(f, "does not oscillate as drawn")
		}) {
			t.Errorf("%s: an audio amplifier flagged as an oscillator short of starting: %v", s.Name, s.Flags)
		}
	}
}

// A capacitor in an oscillator's loop is no coupling capacitor: opened, the
// loop stops or moves. The Colpitts VFO's C3 is an arm of its feedback
// divider and C2 the DC block from the tank into the base (handbook: a
// Colpitts oscillator's feedback is its capacitive divider, from memory):
// both sit in the Colpitts stage the pattern names; C6, a 22p light
// coupling into the buffer, stays a coupling capacitor. The triode-heptode's padder C2,
// opened, leaves T2's 110 µH with the 10p trimmer: f = 1/(2π√(LC)) = 4.80
// MHz (handbook formula) against 3.25 MHz with the gang at its minimum.
func TestReviewOscLoopCapacitors(t *testing.T) {
	for _, tc := range []struct {
		file, cap, topology, says string
	}{
		{"review-osc-c1-vfo.toml", "C3", "colpitts-common-tap-blocked", ""},
		{"review-osc-c1-vfo.toml", "C2", "colpitts-common-tap-blocked", ""},
		{"review-osc-c1-vfo.toml", "C6", "coupling-capacitor", ""},
		{"review-osc-c2b-triode-heptode.toml", "C2", loopCapTopology, "open, it detunes the oscillator at the high end of the dial (3.253 MHz → 4.78"},
	} {
		t.Run(tc.file+"/"+tc.cap, func(t *testing.T) {
			_, st := reduceGood(t, tc.file)
			s := holderOf(st, tc.cap)
			if s == nil {
				t.Fatalf("no stage holds %s: %s", tc.cap, topologies(st))
			}
			if s.Topology != tc.topology || !strings.Contains(strings.Join(s.Notes, "\n"), tc.says) {
				t.Errorf("%s: %s %q, notes %q; want %s saying %q", tc.cap, s.Topology, s.Title, s.Notes, tc.topology, tc.says)
			}
			if tc.topology == loopCapTopology {
				if _, ok := s.Figures.Get("f_c"); ok || !strings.Contains(s.Title, "oscillator loop") {
					t.Errorf("%s: %q keeps a coupling corner or a coupling name: %v", tc.cap, s.Title, s.Figures)
				}
			}
		})
	}
}

// The review's RC phase-shift oscillator: three 10n/4k7 sections, the
// last arm the base bias divider (47k ∥ 10k = 8.25 kΩ, merged by the
// reduction), the emitter resistor split with its lower part partly
// bypassed (R7, then R8 ∥ C5). It is named an RC phase-shift oscillator
// holding the whole ladder, with the loop's frequency, ngspice .ac on
// testdata/good/review-osc/c3-phaseshift-loop.cir: 1555.0 Hz, +0.49 dB.
func TestReviewOscPhaseShiftNamed(t *testing.T) {
	_, st := reduceGood(t, "review-osc-c3-phaseshift.toml")
	s := stageOf(st, "rc-phase-shift-degenerated")
	if s == nil {
		t.Fatalf("no RC phase-shift oscillator: %s", topologies(st))
	}
	for _, p := range []string{"C1", "C2", "C3", "R1", "R2", "R3", "R7", "R8", "C5", "Q1"} {
		if !slices.Contains(s.Parts, p) {
			t.Errorf("%s not in %v", p, s.Parts)
		}
	}
	if f, ok := s.Figures.Lookup("f_hz"); !ok || math.Abs(f/1555.0-1) > 0.005 {
		t.Errorf("f %v (ok %v), want 1555 Hz (ngspice)", f, ok)
	}
}

// A winding with only its trimmer across it, inside an oscillator, is no
// tuned stage of its own: T2 with its trimmer alone gives f = 1/(2π√(LC))
// = 4.80 MHz (handbook formula), while the gang and the padder put the
// loop at 1.02–3.25 MHz (ngspice .ac on testdata/good/review-osc/c2b-triode-loop.cir,
// by the review: 1.021 MHz to 3.255 MHz). In circuit the impedance across
// T2 shows no peak near 4.8 MHz, so the shape alone names nothing; the
// oscillator holds the winding and its trimmer, and its loop solves the
// whole tank.
func TestReviewOscWindingFormulaNotShown(t *testing.T) {
	_, st := reduceGood(t, "review-osc-c2b-triode-heptode.toml")
	for i := range st {
		if st[i].Topology == "tuned-winding" && slices.Contains(st[i].Parts, "T2") {
			t.Errorf("%s names T2 with part of its tank a tuned winding: %v", st[i].Name, st[i].Figures)
		}
	}
	osc := stageWith(st, "T2")
	if osc == nil || !slices.Contains(osc.Parts, "TC2") {
		t.Fatalf("no stage holds T2 with its trimmer: %s", topologies(st))
	}
	if fMin, fMax, _, _, ok := loopSpanOf(osc); !ok || math.Abs(fMin/1.021e6-1) > 0.05 || math.Abs(fMax/3.255e6-1) > 0.05 {
		t.Errorf("%s loop %v–%v (ok %v), want 1.021–3.255 MHz (ngspice)", osc.Name, fMin, fMax, ok)
	}
}

// loopSpanOf is the span of a stage's first loop.
func loopSpanOf(s *Stage) (fMin, fMax, mMin, mMax float64, ok bool) {
	if len(s.Loop) == 0 {
		return 0, 0, 0, 0, false
	}
	return s.Loop[0].Range()
}

// A heptode whose oscillator feedback runs through a reaction winding in
// its g2 (oscillator anode) lead is a self-oscillating mixer found by its
// loop, with the padder inside it. ngspice .ac on
// testdata/good/review-osc/c2-heptode-loop.cir (the reviewer's deck, g2
// current 0.5 mA/V × v(g1, k)): 0° at 1.021 MHz with the gang full, 3.255
// MHz with it empty; the kicked transient c2-heptode-tran.cir grows. The
// deck's margins (+8.6, +12.6 dB) rest on its own 20 kΩ g2 resistance and
// no anode current, so only the frequencies and the sign are compared.
func TestReviewOscHeptodeReactionInG2(t *testing.T) {
	_, st := reduceGood(t, "review-osc-c2-heptode.toml")
	var s *Stage
	for i := range st {
		if slices.Contains(st[i].Parts, "V1") && strings.HasPrefix(st[i].Title, "Self-oscillating mixer") {
			s = &st[i]
		}
	}
	if s == nil {
		t.Fatalf("V1 not in a self-oscillating mixer: %s", topologies(st))
	}
	if !slices.Contains(s.Parts, "C2") {
		t.Errorf("the padder C2 is not in the mixer: %v", s.Parts)
	}
	if len(s.Loop) == 0 {
		t.Fatalf("%s: no loop", s.Name)
	}
	fMin, fMax, mMin, _, ok := s.Loop[0].Range()
	if !ok || mMin <= 0 {
		t.Fatalf("loop %+v: want margin above 0 dB across the dial", s.Loop[0])
	}
	for _, c := range []struct{ got, want float64 }{{fMin, 1.021e6}, {fMax, 3.255e6}} {
		if math.Abs(c.got/c.want-1) > 0.002 {
			t.Errorf("loop 0° at %.4g Hz, ngspice %.4g Hz", c.got, c.want)
		}
	}
}

// A Colpitts whose tank reaches the base through a DC block, with the
// divider's upper arm from base to emitter (the reviewer's VFO), is named a
// Colpitts with the tuning capacitor and both arms in it; without the upper
// arm it is not one. Its loop figures are checked against ngspice in
// TestReviewOscLoopFlags.
func TestReviewOscColpittsBehindBlock(t *testing.T) {
	_, st := reduceGood(t, "review-osc-c1-vfo.toml")
	s := holderOf(st, "Q1")
	if s == nil || s.Topology != "colpitts-common-tap-blocked" {
		t.Fatalf("Q1 not in a Colpitts: %s", topologies(st))
	}
	for _, r := range []string{"C1", "C2", "C3", "C4", "L1"} {
		if !slices.Contains(s.Parts, r) {
			t.Errorf("%s lacks %s: %v", s.Name, r, s.Parts)
		}
	}
	c, err := graph.LoadFile("testdata/colpitts-blocked-no-feedback.toml")
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range find(t, r, Options{Full: c, ACGround: log.ACGround}) {
		if strings.HasPrefix(s.Topology, "colpitts") {
			t.Errorf("near miss named %s (%s)", s.Topology, s.Title)
		}
	}
}

// holderOf is the innermost stage holding ref: a sub-stage-free one first
// (stageWith), else the stage whose sub-stages leave ref out.
func holderOf(st []Stage, ref string) *Stage {
	if s := stageWith(st, ref); s != nil {
		return s
	}
	for i := range st {
		if slices.Contains(st[i].Parts, ref) {
			return &st[i]
		}
	}
	return nil
}
