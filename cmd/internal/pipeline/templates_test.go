package pipeline

import (
	"fmt"
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// TestStageTemplatesPlaceParts: on fixtures of the commonest templated
// stages (a Hartley oscillator with its cathode tap, a self-oscillating
// mixer, a Colpitts with its blocking capacitor, a common-cathode
// amplifier with its bypassed cathode resistor), every part a stage's
// template places stands on its slot's side of the anchor on the reduced
// sheet: left or right of it, above or below it, or level with it, as the
// pattern's [draw] table says (the trade's usual arrangement, common
// practice; DRAWING-NOTES "Stage templates"). The same sheets laid out
// without the templates break the arrangement, so the check can fail.
func TestStageTemplatesPlaceParts(t *testing.T) {
	// refs are the parts checked: those the template places alone. A part
	// that stands in one block with another (a cathode bypass beside its
	// resistor, a capacitor beside a resistor the template does not place)
	// moves with its block or not at all, by design.
	// generic says the generic placement alone already draws the stage so.
	cases := []struct {
		path, anchor string
		refs         []string
		generic      bool
	}{
		{filepath.Join("..", "..", "..", "testdata", "osc", "hartley-valve.toml"), "V1", []string{"C2", "R1", "L1"}, true},
		{example("frequency-changer"), "V1", []string{"C1", "C2", "R1", "L1"}, false},
		{filepath.Join("..", "..", "..", "testdata", "good", "review-osc-c1-vfo.toml"), "Q1", []string{"C1", "C2", "C3", "L1"}, false},
		{example("if-detector-audio"), "V3", []string{"R8", "R9"}, true},
	}
	for _, tc := range cases {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			r, err := stagesRun(tc.path)
			if err != nil {
				t.Fatal(err)
			}
			s := r.Sheet(render.Reduced)
			want := map[string]bool{}
			for _, ref := range tc.refs {
				want[ref] = true
			}
			var places []render.Place
			for _, f := range s.Frames {
				for _, p := range f.Places {
					if p.Anchor == tc.anchor && want[p.Ref] {
						places = append(places, p)
						delete(want, p.Ref)
					}
				}
			}
			if len(want) > 0 {
				t.Fatalf("the template of %s places none of %v on the sheet", tc.anchor, want)
			}
			g, err := render.Config{}.Geometry(s)
			if err != nil {
				t.Fatal(err)
			}
			for _, v := range offSlot(g, places) {
				t.Error(v)
			}
			for i := range s.Frames {
				s.Frames[i].Places = nil
			}
			g, err = render.Config{}.Geometry(s)
			if err != nil {
				t.Fatal(err)
			}
			if off := offSlot(g, places); len(off) == 0 && !tc.generic {
				t.Errorf("laid out without templates, every part still stands as the template says: the check cannot fail here")
			} else if len(off) > 0 && tc.generic {
				t.Errorf("laid out without templates, the stage is no longer drawn as its template says (%v): not generic", off)
			}
		})
	}
}

// offSlot lists the parts that do not stand on their slot's side of the
// anchor: a negative column left of it, a positive one right of it,
// column 0 under or over it (overlapping its width widened by 3 grid
// steps, the gap between the parts of a block: a resistor beside its
// bypass capacitor under the cathode); a negative row above it, a positive one
// below it, row 0 overlapping its height.
func offSlot(g *geom.Sheet, places []render.Place) []string {
	box := map[string]geom.Rect{}
	for _, s := range g.Symbols {
		box[s.Ref] = s.Box
	}
	var out []string
	for _, p := range places {
		a, okA := box[p.Anchor]
		b, okB := box[p.Ref]
		if !okA || !okB {
			out = append(out, fmt.Sprintf("%s or its anchor %s is not drawn", p.Ref, p.Anchor))
			continue
		}
		cx, cy := (b.X0+b.X1)/2, (b.Y0+b.Y1)/2
		ay := (a.Y0 + a.Y1) / 2
		colOK := p.Col < 0 && cx < a.X0 || p.Col > 0 && cx > a.X1 || p.Col == 0 && b.X0 < a.X1+3 && b.X1 > a.X0-3
		rowOK := p.Row < 0 && cy < ay && b.Y1 <= a.Y0+1 || p.Row > 0 && cy > ay && b.Y0 >= a.Y1-1 ||
			p.Row == 0 && b.Y0 < a.Y1 && b.Y1 > a.Y0
		if p.Ref != p.Anchor && (!colOK || !rowOK) {
			out = append(out, fmt.Sprintf("%s at (%g,%g)-(%g,%g) is not at column %d, row %d of %s at (%g,%g)-(%g,%g)",
				p.Ref, b.X0, b.Y0, b.X1, b.Y1, p.Col, p.Row, p.Anchor, a.X0, a.Y0, a.X1, a.Y1))
		}
	}
	return out
}
