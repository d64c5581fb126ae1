package main

import (
	"math"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// A push-pull output stage drawn as the trade draws it (common practice in
// valve and transistor service sheets): the two devices one above the
// other, mirrored about the output transformer's centre tap, and each
// grid (base) stopper at its own grid pin. Before the pair's template held
// its stoppers and cathode network, the stoppers landed across the stage
// (review13 a04's R12 at the far right, by the speaker) and the lower
// valve stood off the centre line.
func TestPushPullDrawnSymmetric(t *testing.T) {
	cases := []struct {
		file     string
		stoppers int // stoppers at grid pins the circuit has
	}{
		{"../../testdata/review14/a04.toml", 2},
		{"../../testdata/review13/a04.toml", 2},
		{"../../testdata/review13/b05.toml", 0},
	}
	// stopperReach: a stopper's grid end at the valve's grid pin, a
	// junction's lead (two grid units) away, or a little further where
	// the valve's label is in the way, and level with it, on the reduced
	// and the faded sheet. Two earlier drawings put them 18-21 units
	// away, then 11 (a slot gap and the valve's label), which a reader
	// took for a stretch of the grid circuit (review14 a04). tapSlack:
	// the pair's midpoint within 3 units of the centre tap.
	const stopperReach, tapSlack = 4.0, 3.0
	type sheetCase struct {
		file     string
		stoppers int
		view     render.View
	}
	var all []sheetCase
	for _, tc := range cases {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			all = append(all, sheetCase{tc.file, tc.stoppers, v})
		}
	}
	for _, tc := range all {
		g := cachedSheet(t, tc.file, tc.view, render.IEC).g
		fr := pushPullFrame(g)
		if fr == nil {
			t.Errorf("%s: no push-pull frame", tc.file)
			continue
		}
		sym := map[string]geom.Symbol{}
		for _, s := range g.Symbols {
			sym[s.Ref] = s
		}
		var devs []geom.Symbol
		tap := math.NaN()
		for _, ref := range fr.Parts {
			s := sym[ref]
			switch {
			case controlPin(s) != nil:
				devs = append(devs, s)
			case s.Kind == "transformer":
				if p := centreTap(s); p != nil {
					tap = p.At.Y
				}
			}
		}
		if len(devs) != 2 || math.IsNaN(tap) {
			t.Errorf("%s: %d devices, centre tap found %v", tc.file, len(devs), !math.IsNaN(tap))
			continue
		}
		mid := (devs[0].Box.Y0 + devs[0].Box.Y1 + devs[1].Box.Y0 + devs[1].Box.Y1) / 4
		if math.Abs(mid-tap) > tapSlack || math.Abs(devs[0].Box.X0-devs[1].Box.X0) > 0.5 {
			t.Errorf("%s %s: %s and %s not mirrored about the centre tap: midpoint y %g, tap y %g, x %g / %g",
				tc.file, tc.view, devs[0].Ref, devs[1].Ref, mid, tap, devs[0].Box.X0, devs[1].Box.X0)
		}
		near := 0
		for _, d := range devs {
			gp := controlPin(d)
			for _, ref := range fr.Parts {
				s := sym[ref]
				if s.Kind != "resistor" || s.Ref == d.Ref {
					continue
				}
				for _, p := range s.Pins {
					if p.Net != gp.Net {
						continue
					}
					if dist := math.Hypot(p.At.X-gp.At.X, p.At.Y-gp.At.Y); dist <= stopperReach && p.At.Y == gp.At.Y {
						near++
					} else {
						t.Errorf("%s %s: stopper %s stands %.1f grid steps from %s's grid pin", tc.file, tc.view, s.Ref, dist, d.Ref)
					}
				}
			}
		}
		if near != tc.stoppers {
			t.Errorf("%s: %d stoppers at their grid pins, want %d", tc.file, near, tc.stoppers)
		}
	}
}

func pushPullFrame(g *geom.Sheet) *geom.Frame {
	for i, f := range g.Frames {
		if strings.Contains(strings.Join(f.Title.Lines, " "), "Push-pull") {
			return &g.Frames[i]
		}
	}
	return nil
}

// controlPin is a valve's first grid, a transistor's base or a FET's gate, nil for any
// other symbol.
func controlPin(s geom.Symbol) *geom.Pin {
	for i, p := range s.Pins {
		if (s.Kind == "valve" && p.Name == "g1") || (s.Kind == "bjt" && p.Name == "b") || (s.Kind == "fet" && p.Name == "g") {
			return &s.Pins[i]
		}
	}
	return nil
}

// centreTap is a transformer's pin that ends none of its windings.
func centreTap(s geom.Symbol) *geom.Pin {
	ends := map[string]bool{}
	for _, w := range s.Windings {
		ends[w[0]], ends[w[1]] = true, true
	}
	for i, p := range s.Pins {
		if !ends[p.Name] {
			return &s.Pins[i]
		}
	}
	return nil
}
