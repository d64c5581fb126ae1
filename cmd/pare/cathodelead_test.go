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
