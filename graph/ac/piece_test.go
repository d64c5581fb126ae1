package ac

import (
	"math/cmplx"
	"testing"

	"pare/graph"
)

// A response solved on its read piece (pieceOf) is the whole block's to
// rounding (the block-triangular form: the piece's rows hold no entry
// outside it), on every example and three fixtures, one copy and two, for
// every transfer and input impedance; and on the IF strip and audio
// preamplifier, whose valves have no grid–anode capacitance, the input
// impedance's piece stops at the first valve's grid: the stages after it
// cannot move it (the one-way stamp of a controlled source, common
// practice).
func TestReadPieceMatchesBlock(t *testing.T) {
	files := append([]string{"testdata/two-inputs.toml", "testdata/hartley-xtal.toml", "testdata/if-pair.toml"}, exampleFiles(t)...)
	for i := 0; i < 2*len(files); i++ {
		f, n := files[i/2], 1+i%2
		c := copies(t, f, n)
		m, err := newModel(c, Options{VarSet: true, VarFrac: 0.3}, &dcShare{})
		if err != nil {
			t.Fatal(err)
		}
		freqs := logSweep(c.Band.Min, c.Band.Max, 7)
		for _, in := range c.Inputs {
			for _, out := range c.Outputs {
				if out != in {
					pieceAgrees(t, m, f, "transfer", in, out, freqs)
				}
			}
			if _, err := newProbe(m, "impedance", in, ""); err == nil {
				pieceAgrees(t, m, f, "impedance", in, "", freqs)
			}
		}
	}
	c, err := graph.LoadFile("../../examples/if-detector-audio.toml")
	if err != nil {
		t.Fatal(err)
	}
	m, err := newModel(c, Options{}, &dcShare{})
	if err != nil {
		t.Fatal(err)
	}
	p, err := newProbeOpt(m, "impedance", "mix_a", "", true)
	if err != nil {
		t.Fatal(err)
	}
	block := m.sourceAt(p.node).block(m, p.node)
	for _, i := range p.sub.nodes {
		if net := m.nl.nodes[i]; net == "pre_a" || net == "audio_out" || net == "det_a" {
			t.Errorf("Z(mix_a)'s piece holds %s, beyond the IF valve's grid", net)
		}
	}
	if len(p.sub.nodes) >= len(block.nodes) {
		t.Errorf("Z(mix_a)'s piece has %d nodes, its block %d: nothing left out", len(p.sub.nodes), len(block.nodes))
	}
}

func pieceAgrees(t *testing.T, m *model, file, what, from, to string, freqs []float64) {
	t.Helper()
	whole, err := newProbe(m, what, from, to)
	if err != nil {
		t.Fatalf("%s: %s %s→%s: %v", file, what, from, to, err)
	}
	piece, err := newProbeOpt(m, what, from, to, true)
	if err != nil {
		t.Fatalf("%s: %s %s→%s on its piece: %v", file, what, from, to, err)
	}
	for _, f := range freqs {
		want, err1 := whole.at(f)
		got, err2 := piece.at(f)
		if (err1 == nil) != (err2 == nil) {
			t.Fatalf("%s: %s %s→%s at %g Hz: block %v, piece %v", file, what, from, to, f, err1, err2)
		}
		if d := cmplx.Abs(got - want); d > 1e-10*cmplx.Abs(want) {
			t.Errorf("%s: %s %s→%s at %g Hz: piece %v, block %v", file, what, from, to, f, got, want)
		}
	}
}
