package stages

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/figure"
	"pare/rules"
)

// pieceChannel is one channel of a synthetic set: a triode (µ 20, ra 10k)
// with a 47k anode load, coupled through 100n into a chain of n series
// resistors of rc each ending in rl to chassis, and, when leak is not
// empty, a grid leak of that value at the chain's start. The chain puts
// its far end, which sets the load, more than solverDepth steps from the
// amplifier. Invented values.
func pieceChannel(i, n int, rc, rl, leak string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "V%d = { valve = \"triode\", pins = { g1 = \"in%d\", k = \"gnd\", a = \"a%d\" }, mu = 20, ra = \"10k\" }\n", i, i, i)
	fmt.Fprintf(&b, "R%d01 = { r = \"47k\", pins = [\"a%d\", \"ht\"] }\n", i, i)
	fmt.Fprintf(&b, "C%d01 = { c = \"100n\", pins = [\"a%d\", \"g%d_0\"] }\n", i, i, i)
	for j := 1; j <= n; j++ {
		fmt.Fprintf(&b, "R%d%02d = { r = %q, pins = [\"g%d_%d\", \"g%d_%d\"] }\n", i, 10+j, rc, i, j-1, i, j)
	}
	fmt.Fprintf(&b, "R%d99 = { r = %q, pins = [\"g%d_%d\", \"gnd\"] }\n", i, rl, i, n)
	if leak != "" {
		fmt.Fprintf(&b, "R%d98 = { r = %q, pins = [\"g%d_0\", \"gnd\"] }\n", i, leak, i)
	}
	return b.String()
}

// pieceSet is a set of channels channels, each pieceChannel(i, …).
func pieceSet(t *testing.T, channels, n int, rc, rl, leak string) *graph.Circuit {
	t.Helper()
	var ins []string
	for i := 1; i <= channels; i++ {
		ins = append(ins, fmt.Sprintf("%q", fmt.Sprintf("in%d", i)))
	}
	src := "title = \"piece test set\"\nband = \"1k..10k\"\ninputs = [" + strings.Join(ins, ", ") + "]\n" +
		"[nets]\nht = { role = \"supply\", volts = 250 }\n[parts]\n"
	for i := 1; i <= channels; i++ {
		src += pieceChannel(i, n, rc, rl, leak)
	}
	c, err := graph.Parse("piece.toml", []byte(src))
	if err != nil {
		t.Fatalf("set: %v\n%s", err, src)
	}
	return c
}

// A set larger than wholeCircuitParts is solved on a piece; a part beyond
// solverDepth steps that sets a figure (the far end of a resistor chain
// that loads an amplifier) must still be in it. Each case's gain is
// checked against the whole circuit solved whole (the solver is the
// truth) and against ngspice on the channel written by hand, and the
// gain the 4-step cut alone would give (the chain open past R*13) is
// checked to differ where the far load matters, so the case can fail.
func TestPieceSolve(t *testing.T) {
	cases := []struct {
		name           string
		channels, n    int
		rc, rl, leak   string
		whole          int    // wholeCircuitParts for the case
		how            string // what the gain's origin must say
		farLoadMatters bool
	}{
		// two channels of 10 parts in a "large" set of 20: each channel's
		// piece closes at AC ground within the bound, exact
		{"closed at AC ground", 2, 6, "1k", "4k", "", 12, "cut only at AC ground: exact", true},
		// one channel of 16 parts past the bound of 12: the 4-step piece's
		// edge moves the gain, so it is widened until it closes
		{"widened until closed", 1, 12, "500", "4k", "", 12, "widened to it", true},
		// the far chain is 10 GΩ behind a 100k grid leak: the 4-step
		// piece's edge open or held gives the same gain, confirmed there
		{"confirmed at depth 4", 1, 12, "10G", "10G", "100k", 12, "within 4 steps, confirmed", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := pieceSet(t, tc.channels, tc.n, tc.rc, tc.rl, tc.leak)
			saved := wholeCircuitParts
			defer func() { wholeCircuitParts = saved }()
			wholeCircuitParts = tc.whole
			piece := stageOf(find(t, c, Options{}), "amp-common")
			wholeCircuitParts = len(c.Parts)
			whole := stageOf(find(t, c, Options{}), "amp-common")
			if piece == nil || whole == nil {
				t.Fatalf("no amplifier (piece %v, whole %v)", piece != nil, whole != nil)
			}
			g, gw := fig(piece.Figures, "gain"), fig(whole.Figures, "gain")
			// exact pieces to the rounding; a confirmed one to pieceAgree
			if !within(g, gw, pieceAgree) {
				t.Errorf("gain on the piece %g, whole circuit %g", g, gw)
			}
			for _, f := range piece.Figures {
				if f.Name == "gain" && f.Origin.Source == figure.Solver && !strings.Contains(f.Origin.Piece, tc.how) {
					t.Errorf("gain's origin %q, want it to say %q", f.Origin.String(), tc.how)
				}
			}
			// ngspice on channel 1 as written: gm = µ/ra = 2 mS
			deck := "V1 in 0 DC 0 AC 1\nG1 out 0 in 0 2m\nRa out 0 10k\nR1 out 0 47k\nC1 out g0 100n\n"
			cut := deck
			for j := 1; j <= tc.n; j++ {
				r := fmt.Sprintf("Rc%d g%d g%d %s\n", j, j-1, j, tc.rc)
				deck += r
				if j <= 3 {
					cut += r
				}
			}
			deck += fmt.Sprintf("RL g%d 0 %s\n", tc.n, tc.rl) // SPICE reads 10G as giga
			if tc.leak != "" {
				deck += "Rg g0 0 " + tc.leak + "\n"
				cut += "Rg g0 0 " + tc.leak + "\n"
			}
			cut += "Rx g3 0 1e15\n" // the open end, given a path for the simulator
			f := math.Sqrt(1e3 * 10e3)
			want, naive := valueAt(t, deck, f), valueAt(t, cut, f)
			if !within(-g, want, 1e-3) {
				t.Errorf("gain %g, ngspice %g", g, -want)
			}
			if moved := !within(naive, want, 0.01); moved != tc.farLoadMatters {
				t.Errorf("the 4-step cut's gain %g against %g: the far load matters %v, want %v", naive, want, moved, tc.farLoadMatters)
			}
		})
	}
}

// A mixer found by its oscillator loop has no pattern match to cut a piece
// round: in a set over wholeCircuitParts its tracking figures were solved
// on the piece of a nil match and pare crashed (a 1,010-part bank at level
// tidy). They are now solved on the piece the feedback transformer stands
// in, cut at AC ground: exact, so the same as on the whole circuit.
func TestLoopMixerTrackingInLargeSet(t *testing.T) {
	c, err := graph.LoadFile("../../examples/transistor-front-end.toml")
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelTidy})
	if err != nil {
		t.Fatal(err)
	}
	trackOf := func() map[string]float64 {
		out := map[string]float64{}
		for _, s := range find(t, r, Options{Full: c, ACGround: log.ACGround}) {
			for _, f := range s.Figures {
				if strings.Contains(f.Name, "track") {
					out[s.Name+" "+f.Name] = f.Value
				}
			}
		}
		return out
	}
	whole := trackOf()
	saved := wholeCircuitParts
	defer func() { wholeCircuitParts = saved }()
	wholeCircuitParts = 5
	cut := trackOf()
	if len(whole) == 0 {
		t.Fatal("no tracking figures on the whole circuit")
	}
	for k, v := range whole {
		if w, ok := cut[k]; !ok || !within(w, v, pieceAgree) {
			t.Errorf("%s: %v on the piece (found %v), %v on the whole circuit", k, w, ok, v)
		}
	}
}
