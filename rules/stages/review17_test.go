package stages

import (
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/figure"
)

// The blind review 17 wrote three sets of its own; copies of its circuits
// are in testdata/review17/ beside this file.

func reduceReview17(t *testing.T, name string) []Stage {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("testdata", "review17", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return findReduced(t, c)
}

// A shape that looks like a tuned winding is one only by its behaviour.
// In the AC/DC set the oscillator coil T2 with its trimmer TC2 alone
// (f = 1/(2π√(LC)) = 4.48 MHz, handbook formula) is part of the
// oscillator's tank, whose padder C3 and gang section VC1b the mixer holds:
// the mixer takes the trimmer too. C20 across the output transformer's
// primary is a top cut: the primary's 8 H with the loudspeaker reflected
// (n² · 3 Ω, n = √(8 H/3 mH) = 51.6, so 8 kΩ) in parallel with the
// pentode's ra 30 kΩ, R = 6.3 kΩ, gives Q = R·√(C/L) = 0.22 (handbook
// formula for a parallel RLC), far below a tuned circuit's.
func TestReview17TunedByBehaviour(t *testing.T) {
	st := reduceReview17(t, "acdc-superhet.toml")
	for _, s := range st {
		if s.Topology == "tuned-winding" && (slices.Contains(s.Parts, "T2") || slices.Contains(s.Parts, "T5")) {
			t.Errorf("%s %s: a tuned winding on %v", s.Name, s.Title, s.Parts)
		}
	}
	osc := topWith(st, "T2")
	if osc == nil {
		t.Fatalf("no stage holds T2: %s", topologies(st))
	}
	for _, r := range []string{"TC2", "C3", "VC1b"} {
		if !slices.Contains(osc.Parts, r) {
			t.Errorf("%s (%s) lacks %s of the oscillator tank: %v", osc.Name, osc.Topology, r, osc.Parts)
		}
	}
	if out := topWith(st, "T5"); out == nil || !slices.Contains(out.Parts, "C20") {
		t.Errorf("C20 not in the output stage: %s", topologies(st))
	}
}

// topWith is the top-level stage that holds part ref, nil when none does.
func topWith(st []Stage, ref string) *Stage {
	for i := range st {
		if !strings.Contains(st[i].Name, ".") && slices.Contains(st[i].Parts, ref) {
			return &st[i]
		}
	}
	return nil
}

// The aerial coil's secondary returns to chassis through the AGC feed's
// bypass C6 (50 nF, 6 Ω at 525 kHz): with its gang section VC1a (and the
// trimmer the reduction joins to it) it is the aerial circuit, the first
// tuned circuit before the frequency changer in a set with no RF stage.
// f = 1/(2π√(LC)) with 230 µH and 27–380 pF gives 538–2020 kHz (handbook
// formula); the solver's range sits within 3 % of it.
func TestReview17AerialCircuit(t *testing.T) {
	st := reduceReview17(t, "acdc-superhet.toml")
	s := topWith(st, "T1")
	if s == nil || !slices.Contains(s.Parts, "VC1a") {
		t.Fatalf("no stage holds the aerial coil T1 with VC1a: %s", topologies(st))
	}
	if s.Topology != "tuned-winding" || !strings.HasPrefix(s.Title, "Aerial circuit: ") {
		t.Errorf("%s %s (%s), want an aerial circuit", s.Name, s.Title, s.Topology)
	}
	f, ok := s.Figures.Get("f")
	if !ok || f.Range == nil || math.Abs(f.Range.Min/538e3-1) > 0.03 || math.Abs(f.Range.Max/2020e3-1) > 0.03 {
		t.Errorf("%s f %+v (ok %v), want about 538 kHz–2.02 MHz", s.Name, f, ok)
	}
}

// Role names on the flagship. The aerial circuit keeps its name behind a fixed-tuned IF trap at the
// aerial and ahead of an RF stage (common practice: the aerial coil with
// its gang section is the aerial circuit whatever follows it): the club
// receiver's T1 with VC1a, after the series trap L4/C1.
func TestFlagshipRoleNames(t *testing.T) {
	c, err := graph.LoadFile(filepath.Join("..", "..", "examples", "club-receiver.toml"))
	if err != nil {
		t.Fatal(err)
	}
	st := findReduced(t, c)
	if s := topWith(st, "T1"); s == nil || !strings.HasPrefix(s.Title, "Aerial circuit: ") {
		t.Errorf("T1's stage is not the aerial circuit: %s", topologies(st))
	}
	if s := topWith(st, "L4"); s == nil || strings.HasPrefix(s.Title, "Aerial circuit") {
		t.Errorf("the trap L4 is not its own stage, or is called the aerial circuit: %s", topologies(st))
	}
	// After the detector, the preamplifier V6 (gain 56.9 in circuit; the
	// flagship's header, ngspice 56.88 in the first flagship review) is
	// the audio amplifier; the output stage V7 keeps its own name.
	if s := topWith(st, "V6"); s == nil || !strings.HasPrefix(s.Title, "Audio amplifier: ") {
		t.Errorf("V6's stage is not named the audio amplifier: %s", topologies(st))
	}
	if s := topWith(st, "V7"); s == nil || strings.HasPrefix(s.Title, "Audio amplifier") {
		t.Errorf("the output stage V7 is named an audio amplifier: %s", topologies(st))
	}
}

// A frame aerial is a tuned loop: L1 (260 µH) across the gang section
// VC1a at the first grid, returned to chassis through the AGC bypass C1
// (50 nF). It is the aerial circuit, not a pi network, whose capacitors
// sit within a factor of about 30 of each other (here 50 nF against at
// most 364 pF). f = 1/(2π√(LC)) with 24–364 pF (VC1a with the trimmer the
// reduction joins to it) in series with the 50 nF bypass, 24.0–361.4 pF,
// gives 519.2 kHz–2.015 MHz (handbook formula).
func TestReview17FrameAerial(t *testing.T) {
	st := reduceReview17(t, "battery-portable.toml")
	s := topWith(st, "L1")
	if s == nil || !slices.Contains(s.Parts, "VC1a") {
		t.Fatalf("no stage holds the frame L1 with VC1a: %s", topologies(st))
	}
	if s.Topology != "lc-tank" || !strings.HasPrefix(s.Title, "Aerial circuit: ") {
		t.Errorf("%s %s (%s), want the aerial circuit", s.Name, s.Title, s.Topology)
	}
	f, ok := s.Figures.Get("f")
	if !ok || f.Origin.Source != figure.Solver || f.Range == nil || math.Abs(f.Range.Min/519.2e3-1) > 0.02 || math.Abs(f.Range.Max/2.015e6-1) > 0.02 {
		t.Errorf("%s f %+v (ok %v), want 519.2 kHz–2.015 MHz in circuit", s.Name, f, ok)
	}
}
