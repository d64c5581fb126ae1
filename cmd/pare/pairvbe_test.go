package main

import (
	"fmt"
	"testing"

	"pare/render/geom"
)

// A complementary pair biased by a Vbe multiplier drawn as the trade draws
// it (common practice in transistor service sheets), on the faded view as
// on the reduced one: the NPN straight above the PNP, and the multiplier's
// transistor between the two bases, left of them. Review19 b04's faded
// sheet stood the pair upside down (the PNP above the NPN, the multiplier
// under both) where its reduced sheet used the pattern's template. The
// class: the multiplier with its preset in the lower leg (review19 b04)
// and with fixed resistors alone (pairs/comp-vbe).
func TestVbePairDrawnStacked(t *testing.T) {
	checkReducedAndFaded(t, vbePair,
		"../../testdata/review19/b04.toml",
		"../../testdata/pairs/comp-vbe.toml")
}

// vbePair lists what is wrong with a Vbe-multiplier pair's drawing.
func vbePair(g *geom.Sheet) []string {
	fr := titled(g, "Vbe multiplier")
	if fr == nil {
		return []string{"no frame of a pair with a Vbe multiplier"}
	}
	sym := symbols(g)
	var bjts []geom.Symbol
	for _, ref := range fr.Parts {
		if s := sym[ref]; s.Kind == "bjt" {
			bjts = append(bjts, s)
		}
	}
	if len(bjts) != 3 {
		return []string{fmt.Sprintf("the frame holds %d transistors, want the pair and the multiplier", len(bjts))}
	}
	// the pair: the NPN and the PNP whose bases the third one's collector
	// and emitter hold; the multiplier: the one whose base is on neither
	var npn, pnp, mult *geom.Symbol
	for i := range bjts {
		s := &bjts[i]
		b := controlPin(*s).Net
		other := 0
		for _, o := range bjts {
			for _, p := range o.Pins {
				if o.Ref != s.Ref && p.Net == b {
					other++
				}
			}
		}
		switch {
		case other == 0:
			mult = s
		case s.Type == "npn":
			npn = s
		case s.Type == "pnp":
			pnp = s
		}
	}
	if npn == nil || pnp == nil || mult == nil {
		return []string{"no NPN, PNP and multiplier told apart by their bases"}
	}
	var out []string
	if npn.Box.Y1 > pnp.Box.Y0 || abs(npn.Box.X0-pnp.Box.X0) > 0.5 {
		out = append(out, fmt.Sprintf("%s (NPN) at %v not straight above %s (PNP) at %v", npn.Ref, npn.Box, pnp.Ref, pnp.Box))
	}
	top, bottom := controlPin(*npn), controlPin(*pnp)
	cy, cx := (mult.Box.Y0+mult.Box.Y1)/2, (mult.Box.X0+mult.Box.X1)/2
	if cy <= top.At.Y || cy >= bottom.At.Y || cx >= top.At.X {
		out = append(out, fmt.Sprintf("multiplier %s at (%.1f, %.1f) not between the bases (%.1f, %.1f) and (%.1f, %.1f), left of them",
			mult.Ref, cx, cy, top.At.X, top.At.Y, bottom.At.X, bottom.At.Y))
	}
	return out
}
