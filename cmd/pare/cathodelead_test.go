package main

import (
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestOscillatorCathodeLeadUnderTheValve: an oscillator's cathode resistor
// and its (partial) bypass hang straight under the valve, wired to the
// cathode, with the tank below them (common practice: the cathode lead is
// drawn down from the valve to chassis). review16 a01's Colpitts template
// had no place for them, so they stood under the tank and the cathode net
// came out as three net flags, two over the coil's value.
func TestOscillatorCathodeLeadUnderTheValve(t *testing.T) {
	cases := []struct{ file, net string }{
		{"../../testdata/review16/a01.toml", "osc_k"}, // from the reviewer's capture
	}
	for _, c := range cases {
		for _, st := range bothStyles {
			s, err := laidOut(c.file, render.Reduced, st)
			if err != nil {
				t.Fatal(err)
			}
			for _, l := range s.g.Locals {
				if l.Kind == geom.LocalFlag && l.Net == c.net {
					t.Errorf("%s %v: the cathode net %s is a flag at %s.%s, not a wire", c.file, st, c.net, l.Owner, l.Pin)
				}
			}
		}
	}
}

// TestOscillatorPadderBesideItsWinding: a padder stands at the cold end of
// the tuned winding it pads and an anode feed over the anode it feeds
// (common practice: a padder is drawn in series with the oscillator coil,
// ../shared/DRAWING-NOTES.md). review16 a02's tickler oscillator template
// had no place for either, so the padder C10 was reached by a loop across
// the sheet and the anode load R7 stood under the tank.
func TestOscillatorPadderBesideItsWinding(t *testing.T) {
	cases := []struct {
		file, part, beside string
		reach              float64 // grid units between the boxes, at most
	}{
		{"../../testdata/review16/a02.toml", "C10", "T2", 5},
		{"../../testdata/review16/a02.toml", "R7", "V1a", 3},
	}
	for _, c := range cases {
		s, err := laidOut(c.file, render.Reduced, render.IEC)
		if err != nil {
			t.Fatal(err)
		}
		var a, b *geom.Symbol
		for i := range s.g.Symbols {
			switch s.g.Symbols[i].Ref {
			case c.part:
				a = &s.g.Symbols[i]
			case c.beside:
				b = &s.g.Symbols[i]
			}
		}
		if a == nil || b == nil {
			t.Fatalf("%s: %s or %s not drawn", c.file, c.part, c.beside)
		}
		dx := max(0, a.Box.X0-b.Box.X1, b.Box.X0-a.Box.X1)
		dy := max(0, a.Box.Y0-b.Box.Y1, b.Box.Y0-a.Box.Y1)
		if dx > c.reach || dy > c.reach {
			t.Errorf("%s: %s stands %.1f across and %.1f down from %s, more than %.0f", c.file, c.part, dx, dy, c.beside, c.reach)
		}
	}
}
