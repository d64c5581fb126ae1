package stages

import (
	"math"
	"os"
	"regexp"
	"testing"

	"pare/graph"
)

// TestTopCutAcrossPushPullPrimary: a capacitor from collector to collector
// across a push-pull output transformer's primary is a top cut, not a
// coupling capacitor (it couples nothing). Its corner is the solver's: the
// −3 dB point of |Z| across the primary with the capacitor against
// without. Check value: ngspice 39 (Debian) on the same small-signal
// circuit (testdata/topcut-pushpull.cir, written by `pare spice --reduced`
// with a 1 A source across the primary), swept with and without C17 and
// divided, the −3 dB point read the same way (3.988 kHz when written).
func TestTopCutAcrossPushPullPrimary(t *testing.T) {
	c, err := graph.LoadFile("../../testdata/good/review17-pushpull.toml")
	if err != nil {
		t.Fatal(err)
	}
	var got float64
	for _, s := range findReduced(t, c) {
		if len(s.Parts) == 1 && s.Parts[0] == "C17" {
			if s.Topology != "top-cut-push-pull" {
				t.Fatalf("C17 named %q (%s), want the top cut", s.Title, s.Topology)
			}
			f, ok := s.Figures.Get("f_top_cut")
			if !ok {
				t.Fatal("no f_top_cut figure")
			}
			got = f.Value
		}
	}
	if got == 0 {
		t.Fatal("no stage holds C17 alone")
	}
	deck, err := os.ReadFile("testdata/topcut-pushpull.cir")
	if err != nil {
		t.Fatal(err)
	}
	const sweep = "dec 400 100 20k"
	f, with := ngspiceSweep(t, string(deck), sweep)
	bare := regexp.MustCompile(`(?m)^C17 .*$`).ReplaceAllString(string(deck), "")
	_, without := ngspiceSweep(t, bare, sweep)
	want := 0.0
	for i := 1; i < len(f) && want == 0; i++ {
		r0, r1 := with[i-1]/without[i-1], with[i]/without[i]
		if r0 >= 1/math.Sqrt2 && r1 < 1/math.Sqrt2 {
			x := (math.Log(r0) - math.Log(1/math.Sqrt2)) / (math.Log(r0) - math.Log(r1))
			want = math.Exp(math.Log(f[i-1]) + x*(math.Log(f[i])-math.Log(f[i-1])))
		}
	}
	if want == 0 || math.Abs(got-want)/want > 0.01 {
		t.Errorf("top-cut corner %.5g Hz, ngspice %.5g Hz", got, want)
	}
}
