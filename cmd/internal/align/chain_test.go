package align_test

import (
	"math"
	"math/cmplx"
	"path/filepath"
	"testing"

	"pare/cmd/internal/align"
	"pare/internal/reftool"
)

func review14(name string) string {
	return filepath.Join("..", "..", "..", "testdata", "review14", name+".toml")
}

// TestInjectionChainBySolver: the injection rows follow the signal
// through the set, each device in the band it handles and each stage's
// gain taken to the point the signal reaches next, whatever a count of
// parts from the aerial says. b05's supply runs through the on/off switch
// and its AGC line ties the first IF base to the detector, which put the
// audio output Q5 in the IF chain ("IF 455 kHz … would take 5.75e+04 V")
// and Q2's gain "to q5_b"; the complementary pairs of b04 (and the review
// 12 and 13 amplifiers) gave one half's gain to the other half's base
// through the 1 Ω emitter resistors both share. Expected chain: the
// circuit's own comments and regions (mixer → IF1 → IF2 → detector →
// driver → output pair).
func TestInjectionChainBySolver(t *testing.T) {
	type row struct{ net, band, gainTo string }
	for _, tc := range []struct {
		path string
		rows []row // input to output
	}{
		{review14("b05"), []row{
			{"ext_ant", "RF", "q1_b"},
			{"q1_b", "IF", "q2_b"},
			{"q2_b", "IF", "q3_b"},
			{"q3_b", "IF", "det_k"},
			{"det_out", "audio", "q4_b"},
			// the driver feeds both halves side by side: its gain to
			// the first of them, each half's past the other
			{"q4_b", "audio", "q5_b"},
			{"q5_b", "audio", "spk_p"},
			{"drv_c", "audio", "spk_p"},
		}},
		{review14("b04"), []row{
			{"drv_c", "audio", "spk_p"},
		}},
		{filepath.Join("..", "..", "..", "testdata", "review13", "b04.toml"), []row{
			{"q1_c", "audio", "spk"},
		}},
	} {
		_, g := build(t, tc.path)
		got := map[string]align.Injection{}
		var order []string
		for i := len(g.Inject) - 1; i >= 0; i-- {
			got[g.Inject[i].Net] = g.Inject[i]
			order = append(order, g.Inject[i].Net)
		}
		if len(tc.rows) > 2 && len(order) != len(tc.rows) {
			t.Errorf("%s: rows %v, want %d", tc.path, order, len(tc.rows))
		}
		for i, w := range tc.rows {
			in, ok := got[w.net]
			if !ok {
				t.Errorf("%s: no row on %s (rows %v)", tc.path, w.net, order)
				continue
			}
			if len(tc.rows) > 2 && order[i] != w.net {
				t.Errorf("%s: row %d on %s, want %s (rows %v)", tc.path, i+1, order[i], w.net, order)
			}
			if in.Band != w.band || in.GainTo != w.gainTo || in.Why != "" {
				t.Errorf("%s %s: band %s, gain to %s (%s), want %s to %s", tc.path, w.net, in.Band, in.GainTo, in.Why, w.band, w.gainTo)
			}
		}
	}
}

// TestChainGainsAgainstNgspice: b05's stage gains along the chain match
// ngspice's .ac on the deck pare writes, driven at the row's point, within
// 0.1 dB (ngspice, docs/references.md §15 for the recipe).
func TestChainGainsAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	r, g := build(t, review14("b05"))
	for _, in := range g.Inject {
		v := spiceAt(t, bin, in.Circuit(r.Circuit), in)
		gain := cmplx.Abs(v[0])
		if d := 20 * math.Log10(gain/in.Gain); math.Abs(d) > 0.1 {
			t.Errorf("%s→%s: gain %g, ngspice %g (%.3f dB)", in.Net, in.GainTo, in.Gain, gain, d)
		}
		t.Logf("%s→%s at %g Hz: pare %.6g, ngspice %.6g", in.Net, in.GainTo, in.Freq, in.Gain, gain)
	}
}
