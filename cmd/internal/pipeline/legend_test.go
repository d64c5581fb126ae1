package pipeline

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
	"pare/rules"
)

// TestLegendFollowsTheView: each legend line of the flagship's sheets names
// parts of the circuit that sheet draws (a page finds its lines by them),
// lines about the whole set name none, and the furniture is the legend's
// lines (the note prints the furniture whole; the reduced sheet leaves out
// lines about parts it does not draw, the supply's). On the reduced sheet a
// switch is gone and its line goes with its neighbours; a region naming
// only its input and output (rf) goes with the parts on those nets.
func TestLegendFollowsTheView(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "club-receiver.toml")
	res, err := Run(Options{Path: path, Level: rules.LevelSignal, Views: []render.View{render.Reduced, render.Faded}})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range res.Sheets {
		sh := s.Sheet
		byText := map[string][]string{}
		for _, l := range sh.Legend {
			byText[l.Text] = l.Parts
			for _, r := range l.Parts {
				if sh.Circuit.Part(r) == nil {
					t.Errorf("%s: %q names %s, not drawn on the sheet", s.View, l.Text, r)
				}
			}
		}
		for _, f := range sh.Furniture {
			parts, ok := byText[f]
			whole := f == "IF 470 kHz" || strings.HasPrefix(f, "Reduction level") || f == PinLegend
			switch {
			case !ok && s.View == render.Reduced:
				// about parts the reduction took away (the supply): the
				// note lists it, no page of this sheet draws them
			case !ok:
				t.Errorf("%s: furniture line %q not in the legend", s.View, f)
			case whole != (len(parts) == 0):
				t.Errorf("%s: %q names %d parts", s.View, f, len(parts))
			}
		}
		for _, want := range []string{"Switch S1a at position 1 of 2", "Region rf: 540 kHz–1.6 MHz"} {
			if len(byText[want]) == 0 {
				t.Errorf("%s: %q names no part drawn", s.View, want)
			}
		}
	}
}
