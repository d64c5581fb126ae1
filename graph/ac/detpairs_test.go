package ac

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"pare/graph"
)

// reviewFixture loads one of the blind reviewer's circuits (issue 10).
func reviewFixture(t *testing.T, name string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/good/" + name)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func pairLabels(rep *Report) map[string]Pair {
	out := map[string]Pair{}
	for _, p := range rep.Pairs {
		out[p.Label()] = p
	}
	return out
}

// TestComparePairsPerRegion: each pair is compared over the regions its
// path works in (issue 10, item 6). Failed before: the portable and the IF
// strip compared only IF input -> audio output at the IF (the IF leaking
// through a detector modelled as a resistor), and the VFO only Z(tank),
// never its declared output.
func TestComparePairsPerRegion(t *testing.T) {
	for _, tc := range []struct {
		file      string
		want      map[string]string // label -> bands swept
		notPair   string            // left out, with a note naming it
		noteWords string
	}{
		{"review-portable.toml", map[string]string{"V(out)/V(det)": "100 Hz–10 kHz", "V(det_in)/V(if_in)": "445 kHz–465 kHz"},
			"V(out)/V(if_in)", "past detector D1"},
		// No audio band below the IF declared for det: the default 20 Hz–20 kHz
		// would apply; the region "audio" (50 Hz–5 kHz) on the output wins.
		{"review-ifstrip.toml", map[string]string{"V(audio)/V(det)": "50 Hz–5 kHz", "V(d_a)/V(if_in)": "460 kHz–480 kHz"},
			"V(audio)/V(if_in)", "past detector V2"},
		{"review-vfo.toml", map[string]string{"V(out)/V(tank)": "4.8 MHz–5.7 MHz", "Z(tank)": "4.8 MHz–5.7 MHz"}, "", ""},
	} {
		c := reviewFixture(t, tc.file)
		rep, err := Compare(c, c.Clone(), CompareOptions{Points: 20})
		if err != nil {
			t.Fatalf("%s: %v", tc.file, err)
		}
		got := pairLabels(rep)
		for label, bands := range tc.want {
			if p, ok := got[label]; !ok || p.Bands != bands {
				t.Errorf("%s: pair %s over %q (present %v), want over %q", tc.file, label, p.Bands, ok, bands)
			}
		}
		if tc.notPair == "" {
			continue
		}
		if _, ok := got[tc.notPair]; ok {
			t.Errorf("%s: %s compared at the IF, where past the detector it is residue", tc.file, tc.notPair)
		}
		if notes := strings.Join(rep.Notes, "\n"); !strings.Contains(notes, tc.notPair+" not compared") || !strings.Contains(notes, tc.noteWords) {
			t.Errorf("%s: no note says %s is not compared and why:\n%s", tc.file, tc.notPair, notes)
		}
	}
}

// TestDetectorAudioPairAgainstNgspice: the audio chain the detector feeds,
// which the proof now compares, is solved as ngspice solves it. ngspice 42
// .ac of the reviewer's deck port_au.cir (Q2 and Q3 hybrid-π from the
// netlist's ic and beta): |V(b3)/V(b2)|·|V(out)/V(b3)| = 73.588 at 100 Hz
// and 119.42 at 1 kHz.
func TestDetectorAudioPairAgainstNgspice(t *testing.T) {
	c := reviewFixture(t, "review-portable.toml")
	r, err := NewTransfer(c, "b2", "out", Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, pt := range []struct{ f, ng float64 }{{100, 73.5878627}, {1e3, 119.422013}} {
		h, err := r.At(pt.f)
		if err != nil {
			t.Fatal(err)
		}
		if g := cmplx.Abs(h); math.Abs(g-pt.ng) > 1e-3*pt.ng {
			t.Errorf("|V(out)/V(b2)| at %g Hz = %.6g, ngspice %.6g", pt.f, g, pt.ng)
		}
	}
}

// TestDetectorPairsStayInTheirCopy: a detector's pairs are those of the
// inputs and outputs joined to it. In n renamed copies of the IF strip
// (synth.Copies: joined only through AC ground) each copy's detector is
// noted against its own copy's input and output alone, so the notes about
// detectors number n times those of one copy; listing every detector
// against every input and output gave n² times, and on a bank of a hundred
// channels hundreds of thousands of notes about transfers that are zero
// by structure.
func TestDetectorPairsStayInTheirCopy(t *testing.T) {
	count := func(n int) int {
		c := copies(t, "../../examples/if-detector-audio.toml", n)
		r, err := Compare(c, c.Clone(), CompareOptions{Points: 20})
		if err != nil {
			t.Fatal(err)
		}
		k := 0
		for _, note := range r.Notes {
			if strings.Contains(note, "past detector") {
				k++
			}
		}
		return k
	}
	one := count(1)
	if one == 0 {
		t.Fatal("one copy of the IF strip: no note about its detector")
	}
	if three := count(3); three != 3*one {
		t.Errorf("three copies: %d notes about detectors, want 3 × %d", three, one)
	}
}
