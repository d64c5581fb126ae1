package main

import (
	"fmt"
	"math"
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/render/check"
	"pare/render/geom"
)

// Ceilings of the faded view's measures over review16 and review17 cut onto
// A3 (fadedHomeCases), lower only. Measured when set: greyed parts across
// another part (acrossGaps) off its page or farther than acrossNear 2
// (review17 b05's AGC return R12 in the row of loose parts, pages from the
// filter capacitor C19 it is across; 4 before a05's bridge buffer
// capacitors C5 and C6 stood with their diodes); greyed wires crossing
// black ones 30 (31 before); greyed parts farther than fadedFar from every part they
// share a net with, or on another page than all of them, 2 (review17
// b05's screen bypass C13 and preamp decoupler C22); greyed resistors and
// capacitors farther than fadedServeFar from all they serve (unserved) 54,
// 55 before review16 and review17 a03's AGC decouplers R2/C4 stood at
// their first IF can's foot instead of after the second can a row away.
const (
	fadedAcrossCeiling = 0  // 2 before with the tapped follower's gain calc loading again and a shunt stabiliser's feed framed after its rectifier as a supply section (review15 b05)
	fadedCrossCeiling  = 24 // 26 before push-pull pairs strapped their suppressors inside the envelope on the faded sheet (review16/17 a04)
	fadedFarCeiling    = 2
	fadedServeCeiling  = 50 // 52 before with the tapped follower's gain calc loading again and a shunt stabiliser's feed framed after its rectifier as a supply section (review15 b05); 52 with a stretch too big for its page cut from the unframed parts riding on it (render/riders.go; review16 b05's mixer at 2.5 mm)
)

// fadedFar is how far (sheet units, centre to centre) a greyed part may
// stand from the nearest part it is wired to before a reader looks for what
// it serves: about two columns of an A3 row.
const fadedFar = 60.0

// acrossNear bounds the gap between a greyed part across another part (its
// two nets that part's two nets: a buffer capacitor across a rectifier
// diode) and that part: the next column or the next place in its own.
const acrossNear = 30.0

// TestFadedPartsServeNearby measures the faded view (the original layout
// with the removed parts greyed) by what the blind review (review17)
// rejected it for: a05's buffer capacitors across the bridge's diodes drawn
// beside the loudspeaker a page from the bridge, greyed parts far from what
// they serve, greyed wires crossing black ones. Common practice on a
// service sheet: a part is drawn at the part it works with, a part across
// another beside it. Each count may only fall.
func TestFadedPartsServeNearby(t *testing.T) {
	across, cross, far, serve := 0, 0, 0, 0
	for _, file := range fadedHomeCases(t) {
		c := cachedResult(t, file).Circuit
		pages, err := cachedPages(file, render.Faded, "A3")
		if err != nil {
			t.Fatal(err)
		}
		name := filepath.Base(filepath.Dir(file)) + "/" + filepath.Base(file)
		for _, m := range acrossGaps(c, pages) {
			if m.gap > acrossNear {
				t.Logf("%s faded: %s across %s stands %s, want the same page within %g", name, m.ref, m.host, m.text(), acrossNear)
				across++
			}
		}
		for _, m := range unserved(c, pages) {
			t.Logf("%s faded: %s stands %s from %s it serves, want the same page within %g", name, m.ref, m.text(), m.host, fadedServeFar)
			serve++
		}
		fc, ff := 0, farParts(c, pages)
		for _, g := range pages {
			fc += greyOverBlack(g)
		}
		if fc > 0 || len(ff) > 0 {
			t.Logf("%s faded: %d grey-over-black crossings; far from what they serve: %v", name, fc, ff)
		}
		cross += fc
		far += len(ff)
	}
	t.Logf("faded view, review16+17 on A3: %d greyed parts away from the part they are across (ceiling %d), %d grey-over-black crossings (ceiling %d), %d greyed parts far from what they serve (ceiling %d)",
		across, fadedAcrossCeiling, cross, fadedCrossCeiling, far, fadedFarCeiling)
	t.Logf("faded view, review16+17 on A3: %d greyed parts away from what they serve (ceiling %d)", serve, fadedServeCeiling)
	if serve > fadedServeCeiling {
		t.Errorf("%d greyed parts stand away from what they serve, ceiling %d", serve, fadedServeCeiling)
	}
	if across > fadedAcrossCeiling {
		t.Errorf("%d greyed parts stand away from the part they are across, ceiling %d", across, fadedAcrossCeiling)
	}
	if cross > fadedCrossCeiling {
		t.Errorf("%d greyed wires cross black ones, ceiling %d", cross, fadedCrossCeiling)
	}
	if far > fadedFarCeiling {
		t.Errorf("%d greyed parts stand far from every part they are wired to, ceiling %d", far, fadedFarCeiling)
	}
}

// fadedHomeCases are the circuits of the last two blind reviews.
func fadedHomeCases(t *testing.T) []string {
	t.Helper()
	var out []string
	for _, dir := range []string{"review16", "review17"} {
		files, err := filepath.Glob(filepath.Join("../../testdata", dir, "*.toml"))
		if err != nil || len(files) == 0 {
			t.Fatalf("no review circuits in testdata/%s: %v", dir, err)
		}
		out = append(out, files...)
	}
	return out
}

// placed is where a greyed part stands against the part it goes with.
type placed struct {
	ref, host string
	gap       float64 // centre to centre; +Inf on another page
}

func (m placed) text() string {
	if math.IsInf(m.gap, 1) {
		return "on another page"
	}
	return fmt.Sprintf("at %.0f", m.gap)
}

// acrossGaps measures each greyed resistor or capacitor across another part
// against the nearest such part.
func acrossGaps(c *graph.Circuit, pages []*geom.Sheet) []placed {
	var out []placed
	for _, p := range c.Parts {
		if p.Kind != graph.Resistor && p.Kind != graph.Capacitor {
			continue
		}
		pp, box, faded := symbolFaded(pages, p.Ref)
		k, ok := pairOf(p)
		if pp < 0 || !faded || !ok {
			continue
		}
		best := placed{ref: p.Ref, gap: math.Inf(1)}
		for _, h := range c.Parts {
			if hk, ok := pairOf(h); !ok || hk != k || h == p || h.Kind == graph.Port {
				continue
			}
			hp, hbox, _ := symbolFaded(pages, h.Ref)
			if best.host == "" {
				best.host = h.Ref
			}
			if hp == pp && centreGap(box, hbox) < best.gap {
				best.host, best.gap = h.Ref, centreGap(box, hbox)
			}
		}
		if best.host != "" {
			out = append(out, best)
		}
	}
	return out
}

// farParts names the greyed parts farther than fadedFar from every part
// they share a wired net other than a rail or ground with, or on another
// page than all of them: a part drawn away from everything it is wired to
// (a decoupler in another stage's corner, a filter's return resistor in
// the row of loose parts pages from its filter).
func farParts(c *graph.Circuit, pages []*geom.Sheet) []string {
	var out []string
	for _, p := range c.Parts {
		pp, box, faded := symbolFaded(pages, p.Ref)
		if pp < 0 || !faded || p.Kind == graph.Port {
			continue
		}
		best, wired := math.Inf(1), false
		for _, o := range c.Parts {
			if o == p || o.Kind == graph.Port || !sharesNet(c, p, o) {
				continue
			}
			op, obox, _ := symbolFaded(pages, o.Ref)
			if op < 0 {
				continue
			}
			wired = true
			if op == pp {
				best = min(best, centreGap(box, obox))
			}
		}
		if wired && best > fadedFar {
			out = append(out, p.Ref)
		}
	}
	return out
}

// sharesNet says whether a and b share a net that is not AC ground.
func sharesNet(c *graph.Circuit, a, b *graph.Part) bool {
	for _, pa := range a.Pins {
		if pa.Net == "" || c.RoleOf(pa.Net).IsACGround() {
			continue
		}
		if slices.ContainsFunc(b.Pins, func(pb graph.Pin) bool { return pb.Net == pa.Net }) {
			return true
		}
	}
	return false
}

// pairOf is the two nets of a part wired to exactly two, in order.
func pairOf(p *graph.Part) ([2]string, bool) {
	var nets []string
	for _, pn := range p.Pins {
		if pn.Net != "" && !slices.Contains(nets, pn.Net) {
			nets = append(nets, pn.Net)
		}
	}
	if len(nets) != 2 {
		return [2]string{}, false
	}
	slices.Sort(nets)
	return [2]string{nets[0], nets[1]}, true
}

// symbolFaded is the page (-1 for none), box and greying of ref's symbol.
func symbolFaded(pages []*geom.Sheet, ref string) (int, geom.Rect, bool) {
	for i, g := range pages {
		for _, s := range g.Symbols {
			if s.Ref == ref {
				return i, s.Box, s.Faded
			}
		}
	}
	return -1, geom.Rect{}, false
}

// greyOverBlack counts the perpendicular crossings of a greyed wire with
// a black wire of another net on one page.
func greyOverBlack(g *geom.Sheet) int {
	n := 0
	for i, a := range g.Wires {
		for _, b := range g.Wires[i+1:] {
			if a.Net == b.Net {
				continue
			}
			n += check.CrossCount(segsOf(a, true), segsOf(b, false)) + check.CrossCount(segsOf(a, false), segsOf(b, true))
		}
	}
	return n
}

// segsOf are a wire's greyed (or black) segments.
func segsOf(w geom.Wire, grey bool) []geom.Seg {
	var out []geom.Seg
	for i, s := range w.Segs {
		if (i < len(w.Faded) && w.Faded[i]) == grey {
			out = append(out, s)
		}
	}
	return out
}
