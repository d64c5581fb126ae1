package ac

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/value"
)

const highPass = `band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "470k", pins = ["out", "gnd"] }
`

func TestCompareIdentical(t *testing.T) {
	for _, f := range append([]string{"testdata/triode-stage.toml", "testdata/hartley-xtal.toml"}, exampleFiles(t)...) {
		c := load(t, f)
		r, err := Compare(c, c.Clone(), CompareOptions{})
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		if !r.OK || len(r.Pairs) == 0 {
			t.Fatalf("%s: a circuit against its own copy: %+v", f, r)
		}
		for _, p := range r.Pairs {
			if p.MaxDB != 0 || p.MaxDeg != 0 {
				t.Errorf("%s: %s deviates from itself", f, p)
			}
		}
	}
}

func TestCompareHighPass(t *testing.T) {
	// Halving the coupling capacitor of a high-pass: the worst change is at
	// the band's low edge, 20 Hz. Derived from |H| = ωRC/√(1+(ωRC)²) and
	// arg H = atan(1/(ωRC)).
	orig := mustParse(t, highPass)
	red := orig.Clone()
	red.Part("C1").Value.Min, red.Part("C1").Value.Max = 5e-9, 5e-9
	r, err := Compare(orig, red, CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	x1, x2 := 2*math.Pi*20*470e3*10e-9, 2*math.Pi*20*470e3*5e-9
	mag := func(x float64) float64 { return x / math.Sqrt(1+x*x) }
	wantDB := 20 * math.Log10(mag(x1)/mag(x2))
	// The phase difference atan(2/x) − atan(1/x) peaks at x = √2 (inside the
	// band, at 47.9 Hz): atan(√2) − atan(1/√2) = 19.4712° (derived).
	wantDeg := (math.Atan(math.Sqrt2) - math.Atan(1/math.Sqrt2)) * 180 / math.Pi
	var tr *Pair
	for i := range r.Pairs {
		if r.Pairs[i].What == "transfer" {
			tr = &r.Pairs[i]
		}
	}
	if tr == nil {
		t.Fatalf("no transfer pair in %+v", r.Pairs)
	}
	if math.Abs(tr.MaxDB-wantDB) > 1e-9 || math.Abs(tr.MaxDeg-wantDeg) > 1e-3 || tr.AtHz != 20 {
		t.Errorf("got %s, want %.4f dB, %.3f° at 20 Hz", tr, wantDB, wantDeg)
	}
	if r.OK {
		t.Error("a 5 dB change passed the 0.5 dB tolerance")
	}
	err = CompareOptions{}.Check(orig, red)
	var te *ToleranceError
	if !errors.As(err, &te) || !strings.Contains(err.Error(), "tolerance 0.5 dB, 5°") {
		t.Errorf("Check: %v, want a tolerance error", err)
	}
	// The same change passes a tolerance wide enough for it.
	if err := (CompareOptions{TolDB: 6, TolDeg: 20}).Check(orig, red); err != nil {
		t.Errorf("Check with a wide tolerance: %v", err)
	}
}

// A 1 % shift of a Q 100 tank's capacitor moves the resonance by half a
// bandwidth; the refined sweep must find the same worst deviation as a
// brute-force sweep ten times denser than the peak is wide.
func TestCompareFindsNarrowResonance(t *testing.T) {
	src := `band = "300k..3M"
inputs = ["in"]
outputs = ["tank"]
[parts]
R1 = { r = "10M", pins = ["in", "tank"] }
L1 = { l = "253u", pins = ["tank", "gnd"] }
C1 = { c = "100p", pins = ["tank", "gnd"] }
R2 = { r = "159k", pins = ["tank", "gnd"], note = "Q about 100 at 1 MHz" }
`
	orig := mustParse(t, src)
	red := orig.Clone()
	red.Part("C1").Value.Min, red.Part("C1").Value.Max = 101e-12, 101e-12
	r, err := Compare(orig, red, CompareOptions{Points: 40})
	if err != nil {
		t.Fatal(err)
	}
	var got Pair
	for _, p := range r.Pairs {
		if p.What == "transfer" {
			got = p
		}
	}
	var freqs []float64
	for f := 0.95e6; f < 1.05e6; f += 5 {
		freqs = append(freqs, f)
	}
	ho, _ := Transfer(orig, "in", "tank", freqs, Options{})
	hr, _ := Transfer(red, "in", "tank", freqs, Options{})
	want := 0.0
	for i := range freqs {
		want = math.Max(want, math.Abs(20*math.Log10(cmplx.Abs(hr[i])/cmplx.Abs(ho[i]))))
	}
	if want < 3 {
		t.Fatalf("test premise: brute force found only %.2f dB", want)
	}
	if math.Abs(got.MaxDB-want) > 0.02*want {
		t.Errorf("refined sweep found %.3f dB, brute force %.3f dB", got.MaxDB, want)
	}
}

func TestCompareGangSettings(t *testing.T) {
	// 10 pF of extra stray across a 12–365 pF gang section nearly doubles the
	// tank capacitance at minimum but adds 3 % at maximum: the worst change
	// must be found with the gang at minimum (derived from f = 1/(2π√(LC))).
	src := `band = "400k..3.5M"
inputs = ["in"]
outputs = ["tank"]
[parts]
R1 = { r = "10k", pins = ["in", "tank"] }
L1 = { l = "250u", pins = ["tank", "gnd"] }
C1 = { c = "12p..365p", pins = ["tank", "gnd"] }
R2 = { r = "100k", pins = ["tank", "gnd"], note = "coil loss" }
`
	c := mustParse(t, src)
	red := c.Clone()
	red.AddPart(&graph.Part{Ref: "C9", Kind: graph.Capacitor, Type: graph.CapFixed, Value: value.Range{Min: 10e-12, Max: 10e-12},
		Pins: []graph.Pin{{Name: "1", Net: "tank"}, {Name: "2", Net: "gnd"}}})
	r, err := Compare(c, red, CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	w, _ := r.Worst()
	if w.Setting != "min" {
		t.Errorf("worst pair %s, want it at the gang's minimum", w)
	}
	r2, err := Compare(c, red, CompareOptions{Options: Options{VarFrac: 1, VarSet: true}})
	if err != nil {
		t.Fatal(err)
	}
	w2, _ := r2.Worst()
	if w2.Setting != "1" || w2.MaxDB >= w.MaxDB {
		t.Errorf("at full mesh %s, at min %s: expected a smaller change at full mesh", w2, w)
	}
}

func TestCompareJoinedNets(t *testing.T) {
	orig := mustParse(t, highPass)
	red := orig.Clone()
	red.JoinNets("o2", "out") // renames the output in the reduced circuit
	r, err := Compare(orig, red, CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !r.OK || len(r.Notes) == 0 || !strings.Contains(strings.Join(r.Notes, "\n"), "net out is o2 in the reduced circuit") {
		t.Errorf("report %+v, want the rename noted and the pair compared", r)
	}
	// A reduced circuit without the output at all: noted, not compared.
	red2 := orig.Clone()
	red2.JoinNets("o2", "out")
	red2.Outputs = nil
	r2, err := Compare(orig, red2, CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(r2.Notes, "\n"), "net out of the original is gone") {
		t.Errorf("notes %q, want the missing output noted", r2.Notes)
	}
	for _, p := range r2.Pairs {
		if p.What == "transfer" {
			t.Errorf("compared %s although the output is gone", p)
		}
	}
}

func TestCompareReducedUnsolvable(t *testing.T) {
	orig := mustParse(t, highPass)
	red := orig.Clone()
	red.RemovePart("R1") // out now floats between C1 and nothing
	r, err := Compare(orig, red, CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if r.OK {
		t.Fatal("an unsolvable reduction passed")
	}
	w, _ := r.Worst()
	if !strings.Contains(w.Error, "floating") && !strings.Contains(w.Error, "not connected") {
		t.Errorf("worst %s, want the reason", w)
	}
}

// A crystal of Q 50 000 at 1 MHz is 20 Hz wide; a coarse grid over
// 0.9–1.1 MHz is 2 kHz apart. Moving its series frequency by 10 Hz (half a
// bandwidth) changes the transfer through it into 50 Ω by about 2 dB at fs
// (derived from the four-element equivalent: Rm 159 Ω, Xm = 2·Lm·2π·10 Hz
// = 159 Ω) and by hundredths of a dB a grid step away. The refined sweep must
// find what a brute-force sweep in 0.5 Hz steps finds.
func TestCompareFindsCrystal(t *testing.T) {
	src := `band = "900k..1.1M"
inputs = ["in"]
outputs = ["out"]
[parts]
X1 = { xtal = "1M", c0 = "1p", pins = ["in", "out"] }
R1 = { r = "50", pins = ["out", "gnd"] }
`
	orig := mustParse(t, src)
	red := orig.Clone()
	red.Part("X1").Value.Min, red.Part("X1").Value.Max = 1.00001e6, 1.00001e6
	r, err := Compare(orig, red, CompareOptions{Points: 100})
	if err != nil {
		t.Fatal(err)
	}
	var got Pair
	for _, p := range r.Pairs {
		if p.What == "transfer" {
			got = p
		}
	}
	var freqs []float64
	for f := 0.9999e6; f < 1.0001e6; f += 0.5 {
		freqs = append(freqs, f)
	}
	ho, _ := Transfer(orig, "in", "out", freqs, Options{})
	hr, _ := Transfer(red, "in", "out", freqs, Options{})
	want := 0.0
	for i := range freqs {
		want = math.Max(want, math.Abs(20*math.Log10(cmplx.Abs(hr[i])/cmplx.Abs(ho[i]))))
	}
	if want < 1.5 {
		t.Fatalf("test premise: brute force found only %.2f dB", want)
	}
	if math.Abs(got.MaxDB-want) > 0.02*want {
		t.Errorf("refined sweep found %s, brute force %.3f dB", got, want)
	}
}

func TestNetBands(t *testing.T) {
	c, err := graph.LoadFile("../../examples/if-detector-audio.toml")
	if err != nil {
		t.Fatal(err)
	}
	ifBand := value.Range{Min: 455e3, Max: 485e3}
	audio := value.Range{Min: 20, Max: 20e3}
	cases := []struct {
		net  string
		want []value.Range
	}{
		{"mix_a", []value.Range{ifBand}},          // IF1 primary and the port from the mixer
		{"audio_out", []value.Range{audio}},       // coupling capacitor to the output stage; the port does not count
		{"det_out", []value.Range{audio, ifBand}}, // the detector load is both
	}
	for _, tc := range cases {
		got := BandsOf(c, tc.net)
		if fmt.Sprint(got) != fmt.Sprint(tc.want) {
			t.Errorf("bands of %s: %v, want %v", tc.net, got, tc.want)
		}
	}
}
