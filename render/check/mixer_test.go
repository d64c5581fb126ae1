package check

import (
	"testing"

	"pare/render/geom"
)

// mixerSheet is a frequency changer's frame by hand: valve V1 at x 10, IF
// transformer T2 (fixed capacitor C9 across its primary) at ifX, oscillator
// coil T3 (gang section VC1b on its hot end) at (oscX, oscY).
func mixerSheet(title string, ifX, oscX, oscY float64) *geom.Sheet {
	sym := func(ref, kind, typ string, x, y float64, nets ...string) geom.Symbol {
		s := geom.Symbol{Ref: ref, Kind: kind, Type: typ, Box: geom.R(x-2, y-2, x+2, y+2)}
		for i, n := range nets {
			s.Pins = append(s.Pins, geom.Pin{Name: string(rune('a' + i)), Net: n, At: geom.Pt{X: x, Y: y}})
		}
		return s
	}
	return &geom.Sheet{
		Symbols: []geom.Symbol{
			sym("V1", "valve", "heptode", 10, 0, "mix_a", "osc_g", "sig_g", "gnd"),
			sym("T2", "transformer", "", ifX, 0, "mix_a", "ht", "if_g", "gnd"),
			sym("C9", "capacitor", "fixed", ifX-4, 0, "mix_a", "ht"),
			sym("T3", "transformer", "", oscX, oscY, "osc_t", "gnd", "g2f", "ht"),
			sym("VC1b", "capacitor", "variable", oscX-4, oscY, "osc_t", "gnd"),
		},
		Locals: []geom.Local{{Kind: geom.LocalGround, Net: "gnd"}, {Kind: geom.LocalRail, Net: "ht"}},
		Frames: []geom.Frame{{Title: geom.Label{Lines: []string{title}}, Parts: []string{"V1", "T2", "C9", "T3", "VC1b"}}},
	}
}

// TestMixerOrder: the trade draws a frequency changer with the IF
// transformer right of the mixer and the oscillator coil below it (common
// practice); MixerOrder names each part out of that order, in mixer
// frames only.
func TestMixerOrder(t *testing.T) {
	cases := []struct {
		name, title     string
		ifX, oscX, oscY float64
		want            int
	}{
		{"in order", "S2 Self-oscillating mixer (valve)", 30, 10, 12, 0},
		{"IF transformer left", "S2 Self-oscillating mixer (valve)", -10, 10, 12, 1},
		{"IF transformer over the valve", "S2 Self-oscillating mixer (valve)", 11, 10, 12, 1},
		{"oscillator coil beside", "S2 Self-oscillating mixer (valve)", 30, 50, 0, 1},
		{"both", "S2 Frequency changer (valve)", -10, 10, -12, 2},
		{"not a mixer frame", "S2 Tuned amplifier (valve)", -10, 10, -12, 0},
	}
	for _, c := range cases {
		r := &Report{}
		r.mixerOrder(mixerSheet(c.title, c.ifX, c.oscX, c.oscY))
		if len(r.MixerOrder) != c.want {
			t.Errorf("%s: %d findings %v, want %d", c.name, len(r.MixerOrder), r.MixerOrder, c.want)
		}
	}
}
