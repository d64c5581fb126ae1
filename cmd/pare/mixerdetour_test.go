package main

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestSelfOscillatingMixersDrawnRound: transistor set diagrams draw the
// self-oscillating mixer round its transistor (common practice,
// ../shared/DRAWING-NOTES.md): the oscillator coil level with the device on
// its output side, its reaction winding in the collector lead on the way to
// the IF can, so the collector runs up and over into it and on to the can
// instead of looping round the frame to a coil drawn under the base side
// (review18 b05's "mixer tangle"). On every transistor self-oscillating
// mixer fixture's reduced sheet, in both symbol styles, the coil stands
// between the device and the IF can and overlaps the device's height.
func TestSelfOscillatingMixersDrawnRound(t *testing.T) {
	files := []string{"../../examples/transistor-front-end.toml"}
	for _, d := range []string{"review13", "review14", "review15", "review16", "review18"} {
		files = append(files, filepath.Join("../../testdata", d, "b05.toml"))
	}
	for _, f := range files {
		for _, st := range bothStyles {
			g := cachedSheet(t, f, render.Reduced, st).g
			n := 0
			for _, fr := range g.Frames {
				if !strings.Contains(fr.Title.Lines[0], "Self-oscillating mixer, oscillator fed into") {
					continue
				}
				n++
				q, coil, can := mixerRoles(t, g, fr.Parts)
				where := filepath.Base(filepath.Dir(f)) + "/" + filepath.Base(f) + " " + st.String()
				qb, cb, fb := symbolBox(g, q), symbolBox(g, coil), symbolBox(g, can)
				if !(qb.X1 <= cb.X0 && cb.X1 <= fb.X0) {
					t.Errorf("%s: oscillator coil %s (x %.0f..%.0f) not between %s (x ..%.0f) and the IF can %s (x %.0f..)", where, coil, cb.X0, cb.X1, q, qb.X1, can, fb.X0)
				}
				if cb.Y1 < qb.Y0 || cb.Y0 > qb.Y1 {
					t.Errorf("%s: oscillator coil %s (y %.0f..%.0f) not level with %s (y %.0f..%.0f)", where, coil, cb.Y0, cb.Y1, q, qb.Y0, qb.Y1)
				}
			}
			if n != 1 {
				t.Fatalf("%s: %d self-oscillating mixer frames, want 1 (the fixture's stages changed?)", f, n)
			}
		}
	}
}

// mixerRoles finds, among a mixer frame's symbols, the transistor, the
// oscillator coil (the transformer with a winding on one of the
// transistor's nets: the reaction winding in its collector lead) and the
// IF can (the other transformer).
func mixerRoles(t *testing.T, g *geom.Sheet, parts []string) (q, coil, can string) {
	t.Helper()
	in := map[string]bool{}
	for _, r := range parts {
		in[r] = true
	}
	qNets := map[string]bool{}
	var xfmrs []geom.Symbol
	for _, s := range g.Symbols {
		switch {
		case !in[s.Ref]:
		case s.Kind == "transformer":
			xfmrs = append(xfmrs, s)
		case s.Kind == "bjt":
			q = s.Ref
			for _, p := range s.Pins {
				qNets[p.Net] = true
			}
		}
	}
	if q == "" || len(xfmrs) != 2 {
		t.Fatalf("mixer frame %v: want one transistor and two transformers", parts)
	}
	coil, can = xfmrs[0].Ref, xfmrs[1].Ref
	for _, p := range xfmrs[1].Pins {
		if qNets[p.Net] {
			coil, can = can, coil
		}
	}
	return q, coil, can
}

// symbolBox is the box of ref's symbol on g.
func symbolBox(g *geom.Sheet, ref string) geom.Rect {
	for _, s := range g.Symbols {
		if s.Ref == ref {
			return s.Box
		}
	}
	return geom.Rect{}
}
