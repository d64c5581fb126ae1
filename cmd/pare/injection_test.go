package main

import (
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestInjectedOscillatorEntersOnTheLeft: a mixer fed by a separate
// oscillator through a capacitor on its emitter is drawn as the trade
// draws it (common practice): the injection capacitor is the mixer's,
// framed with it, and the oscillator's socket enters on the left, under the
// signal input, as a source does; review18 b02 drew the capacitor as a
// stage of its own right of the mixer, the socket on the right edge and
// its wire run back under the stage.
func TestInjectedOscillatorEntersOnTheLeft(t *testing.T) {
	const f = "../../testdata/review18/b02.toml"
	for _, st := range bothStyles {
		g := cachedSheet(t, f, render.Reduced, st).g
		var mixer *geom.Frame
		for i, fr := range g.Frames {
			if strings.Contains(fr.Title.Lines[0], "Mixer, oscillator injected") {
				mixer = &g.Frames[i]
			}
		}
		if mixer == nil {
			t.Fatalf("%s: no injected mixer frame", st)
		}
		if !strings.Contains(strings.Join(mixer.Parts, " "), "C7") {
			t.Errorf("%s: the injection capacitor C7 is not framed with the mixer (%v)", st, mixer.Parts)
		}
		osc, in := symbolBox(g, "P2"), connectorBox(g, "q2_b")
		if osc.X0 > mixer.Box.X0 {
			t.Errorf("%s: the oscillator socket stands at x %.0f, right of the mixer's frame (x %.0f)", st, osc.X0, mixer.Box.X0)
		}
		if in != (geom.Rect{}) && osc.Y0 < in.Y0 {
			t.Errorf("%s: the oscillator socket (y %.0f) stands over the signal input (y %.0f)", st, osc.Y0, in.Y0)
		}
	}
}

// connectorBox is the box of the connector symbol carrying net on g.
func connectorBox(g *geom.Sheet, net string) geom.Rect {
	for _, s := range g.Symbols {
		if s.Kind == "" && len(s.Pins) == 1 && s.Pins[0].Net == net {
			return s.Box
		}
	}
	return geom.Rect{}
}
