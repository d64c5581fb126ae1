package stages

import (
	"math"
	"slices"
	"testing"

	"pare/graph"
	"pare/rules"
)

// The blind review of sheets (review 12): its circuits are
// testdata/review12/*.toml, the reviewer's ngspice decks in
// testdata/review12/spice/.

// review12 loads a review circuit and finds its stages on the reduction, as
// the main job does.
func review12(t *testing.T, file string, o ...Options) []Stage {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/review12/" + file)
	if err != nil {
		t.Fatal(err)
	}
	if len(o) == 0 {
		return findReduced(t, c)
	}
	return find(t, c, o[0])
}

// review12Candidates are the matches of one built-in pattern on a review
// circuit's reduction that survive its guards, before any other stage
// (an oscillator found by its loop) takes their parts.
func review12Candidates(t *testing.T, file, id string) []*found {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/review12/" + file)
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	acg := map[string]bool{}
	for _, n := range log.ACGround {
		acg[n] = true
	}
	budget := DefaultLimit
	got, err := recognise(r, &Library{Patterns: []*Pattern{lib.Pattern(id)}}, false, acg,
		newWorldJoined(c, false, acg, switchJoins(c)), nil, &budget)
	if err != nil {
		t.Fatal(err)
	}
	return got
}

// An AGC filter is named only where a detector feeds it and its line runs
// on to a grid or base return (rcagc.go, agcConfirmed). The record-player
// preamp's part-bypass R11 + C9 in TR2's emitter lead (220 Ω × 47 µF =
// 10.3 ms, above the filter's 10 ms floor) and the phase-shift oscillator's
// long RCs (R1 4.7 kΩ or R2 100 kΩ into the 100 µF decoupler) have neither;
// the oscillator's are looked for among the pattern's own matches, before
// the loop stage takes every part round the device, on the capture with
// the preset's wiper unconnected that once showed one and on the final one.
func TestReview12NoAGCFilterWithoutDetector(t *testing.T) {
	st := review12(t, "c09.toml")
	if s := stageOf(st, "agc-filter"); s != nil {
		t.Errorf("c09 named an AGC filter %v with no detector feeding it: %s", s.Parts, topologies(st))
	}
	for _, file := range []string{"c02.toml", "c02-wiper-nc.toml"} {
		for _, f := range review12Candidates(t, file, "agc-filter") {
			t.Errorf("%s: an AGC filter %v matched in an oscillator with no detector", file, f.Parts)
		}
	}
}

// c07's Zobel (R8 10 Ω + C4 100 nF across SP1 8 Ω) is a Zobel, not an RC
// low-pass section: the load the output sees stays near 8 Ω across the
// band. ngspice .ac on testdata/review12/c07-zobel-load.cir: 7.9498 Ω at
// 12 kHz to 8.0000 Ω at 60 Hz (docs/references.md §31); its corner
// 1/(2πRC) = 159.15 kHz (handbook formula).
func TestReview12Zobel(t *testing.T) {
	st := review12(t, "c07.toml")
	s := stageOf(st, "zobel")
	if s == nil {
		t.Fatalf("no Zobel: %s", topologies(st))
	}
	if z, ok := s.Figures.Get("z_load"); !ok || z.Range == nil || !within(z.Range.Min, 7.9498, 2e-4) || !within(z.Range.Max, 8.0, 2e-4) {
		t.Errorf("load |Z| %+v, want ngspice's 7.9498–8.0000 Ω", z)
	}
	if f := fig(s.Figures, "f_zobel_hz"); !within(f, 159155, 1e-4) {
		t.Errorf("Zobel corner %g Hz, want 159.15 kHz", f)
	}
	if stageOf(st, "rc-low-pass") != nil {
		t.Errorf("an RC low-pass section is still named: %s", topologies(st))
	}
}

// The figures of one coupling stage agree: c09's S1 printed "f c 90.6 Hz,
// tau 0.475 s", the corner of the circuit beside the time constant of the
// part and its resistors alone (1/(2π·0.475 s) = 0.335 Hz). Now τ and r in
// are read from the corner in circuit, τ = RC and the resistors to AC
// ground kept as their formulas (docs/references.md §31).
func TestReview12CornerAgreesWithTau(t *testing.T) {
	for _, file := range []string{"c07.toml", "c09.toml"} {
		for _, s := range review12(t, file) {
			f, okF := s.Figures.Get("f_c")
			tau, okT := s.Figures.Get("tau")
			if !okF || !okT || f.Range != nil || tau.Range != nil {
				continue
			}
			if !within(2*math.Pi*f.Value*tau.Value, 1, 1e-6) {
				t.Errorf("%s %s %v: f c %g Hz beside τ %g s (1/(2πτ) = %g Hz)", file, s.Name, s.Parts, f.Value, tau.Value, 1/(2*math.Pi*tau.Value))
			}
		}
	}
	s := stageWith(review12(t, "c09.toml"), "C1")
	if r := fig(s.Figures, "r_in_ohm"); !within(r, 1756, 0.01) {
		t.Errorf("C1 works into %g Ω, want 1.756 kΩ (1/(2π·90.63 Hz·1 µF))", r)
	}
}

// c07's output pair (TR2 NPN, TR3 PNP, D1 D2 and the preset RV1 between
// the bases, R6 R7 0.47 Ω to the mid-point) is a complementary follower
// pair, not a coupling capacitor and parts in no stage. Its gain from the
// driven base (c1, TR1's collector) to the mid-point at mid-band: ngspice
// .ac on testdata/review12/c07-pair-gain.cir (the reviewer's linear deck
// at 848.53 Hz) 0.86856 (docs/references.md §31).
func TestReview12ComplementaryPair(t *testing.T) {
	st := review12(t, "c07.toml")
	s := stageOf(st, "complementary-pair-preset")
	if s == nil {
		t.Fatalf("no complementary pair: %s", topologies(st))
	}
	for _, ref := range []string{"TR2", "TR3", "D1", "D2", "RV1", "R6", "R7"} {
		if !slices.Contains(s.Parts, ref) {
			t.Errorf("pair %v lacks %s", s.Parts, ref)
		}
	}
	if g := fig(s.Figures, "gain"); !within(g, 0.86856, 1e-3) {
		t.Errorf("pair gain %g, want ngspice's 0.86856", g)
	}
}

// c07's driver TR1 with its bootstrapped collector load (R4 + R5, C2 from
// the tap to the mid-point) is a driver stage, not "RC coupling" of C2
// and R5. In circuit, TR1 made quiet and 1 A into c1 at 848.53 Hz: R4
// presents 15.715 kΩ with the bootstrap, 2.000 kΩ with C2 open; the
// driver's whole load is 524.84 Ω (the output pair's input sets it); its
// gain V(c1)/V(b1) is −5.0828. ngspice .ac on
// testdata/review12/c07-boot.cir, c07-noboot.cir and c07-pair-gain.cir
// (docs/references.md §31).
func TestReview12Bootstrap(t *testing.T) {
	st := review12(t, "c07.toml")
	s := stageOf(st, "bootstrapped-load")
	if s == nil {
		t.Fatalf("no bootstrapped driver: %s", topologies(st))
	}
	for _, ref := range []string{"TR1", "R1", "R4", "R5", "C2"} {
		if !slices.Contains(s.Parts, ref) {
			t.Errorf("driver %v lacks %s", s.Parts, ref)
		}
	}
	for _, tc := range []struct {
		key  string
		want float64
	}{
		{"r_boot_ohm", 15714.83},
		{"r_load_plain_ohm", 2000},
		{"r_load_ohm", 524.8425},
		{"gain", -5.0828},
	} {
		if got := fig(s.Figures, tc.key); !within(got, tc.want, 1e-3) {
			t.Errorf("%s %g, want ngspice's %g", tc.key, got, tc.want)
		}
	}
}

// c07's C6 (100 pF, TR1's collector to its base) is a stability
// capacitor, not a coupling capacitor. With the input freed and 1 A into
// the base, the collector's response with C6 against without it falls
// 3 dB at 64.50 kHz and is −0.1735 dB at 12 kHz: ngspice .ac on
// testdata/review12/c07-miller.cir and c07-nomiller.cir
// (docs/references.md §31).
func TestReview12StabilityCapacitor(t *testing.T) {
	st := review12(t, "c07.toml")
	s := stageWith(st, "C6")
	if s == nil || s.Topology != "feedback-capacitor" {
		t.Fatalf("C6 in %v, want a stability capacitor: %s", s, topologies(st))
	}
	if f := fig(s.Figures, "f_rolloff_hz"); !within(f, 64503, 2e-3) {
		t.Errorf("roll-off %g Hz, want ngspice's 64.50 kHz", f)
	}
	if d := fig(s.Figures, "cut_top_db"); !within(d, 0.1735, 2e-3) {
		t.Errorf("cut at 12 kHz %g dB, want ngspice's 0.1735 dB", d)
	}
}

// c09's recovery stage TR2 (R9 4.7 kΩ load, R10 1 kΩ in the emitter,
// bypassed through R11 220 Ω + C9 47 µF) is an amplifier, its R11/C9 part
// of it: no AGC filter, no RC section, no transistor in no stage.
func TestReview12SeriesBypassedAmplifier(t *testing.T) {
	st := review12(t, "c09.toml")
	s := stageWith(st, "TR2")
	if s == nil || s.Topology != "amp-common-series-bypassed" {
		t.Fatalf("TR2 in %v: %s", s, topologies(st))
	}
	for _, ref := range []string{"R10", "R11", "C9", "R9"} {
		if !slices.Contains(s.Parts, ref) {
			t.Errorf("TR2's stage %v lacks %s", s.Parts, ref)
		}
	}
}

// c09's passive bass and treble network (R4, RV1 with C4 and C5, R5, R6;
// C6, RV2, C7) is one stage with the solver's boost and cut at the band's
// ends, not four coupling boxes. Driven at tc_in, loaded by TR2 as pare
// models it: ngspice .ac on testdata/review12/c09-tone-*.cir gives the
// level at 632.46 Hz with both pots at mid −23.1104 dB, and against it
// at 20 Hz +15.7280 dB (RV1 at 0) and −20.4411 dB (RV1 at 1), at 20 kHz
// +21.6441 dB (RV2 at 0) and −20.4821 dB (RV2 at 1) (docs/references.md
// §31).
func TestReview12ToneControl(t *testing.T) {
	st := review12(t, "c09.toml")
	s := stageOf(st, "tone-bass-treble")
	if s == nil {
		t.Fatalf("no bass and treble control: %s", topologies(st))
	}
	for _, tc := range []struct {
		key  string
		want float64
	}{
		{"loss_mid_db", -23.1104},
		{"bass_min_db", -20.4411},
		{"bass_max_db", 15.7280},
		{"treble_min_db", -20.4821},
		{"treble_max_db", 21.6441},
	} {
		if got, ok := s.Figures.Lookup(tc.key); !ok || math.Abs(got-tc.want) > 0.002 {
			t.Errorf("%s %g (ok %v), want ngspice's %g", tc.key, got, ok, tc.want)
		}
	}
	for _, ref := range []string{"C4", "C5", "C6", "C7", "RV1", "RV2"} {
		if o := stageWith(st, ref); o != s {
			t.Errorf("%s is in %v, not the tone control", ref, o)
		}
	}
}
