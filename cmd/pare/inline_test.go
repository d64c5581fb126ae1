package main

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/render"
)

// TestReviewSheetsReadAsJoinedNowhere: the faded sheets the fourth blind
// review rejected for wires that read as joined, as the main job puts them
// on A3. No wire ends in line with another net's across a gap (a reader
// joins them: the driver's cathode and anode leads on a04, the decoupled and
// the reservoir HT on a05; render/check's InLine and EndsInLine, cleared by
// the layout's unline pass), and no wire boxes a stage title (the title
// reads as a part: the anode wire round a04's and a05's driver titles, the
// cathode wire round a02's mixer title; lifted over the wire by
// liftTitles), and b04's collector and the pair's mid-point no longer share
// a line. The whole gallery's counts are misreadCeiling's and
// wireBoxCeiling's.
func TestReviewSheetsReadAsJoinedNowhere(t *testing.T) {
	cases := []struct {
		file           string
		page           int  // the page the review named; 0: every page
		inLine, titles bool // held to none in line, none boxing a title
	}{
		{"a04.toml", 0, true, true},
		{"a05.toml", 0, true, true},
		{"a02.toml", 0, true, true},
		// the collector q1_c and the pair's mid-point on one line; page 1
		// still holds the mid-point in line with the emitter's wire
		{"b04.toml", 2, true, true},
	}
	for _, c := range cases {
		f := filepath.Join("../../testdata/review15", c.file)
		pages, err := cachedPages(f, render.Faded, "A3")
		if err != nil {
			t.Fatal(err)
		}
		for i, g := range pages {
			if c.page != 0 && c.page != i+1 {
				continue
			}
			r := measured(g)
			var bad []string
			if c.inLine {
				bad = append(append(bad, r.InLine...), r.EndsInLine...)
			}
			for _, b := range r.WireBoxes {
				if c.titles && strings.Contains(b, "the title of frame") {
					bad = append(bad, b)
				}
			}
			for _, p := range bad {
				t.Errorf("%s: %s", pageName(f, render.Faded, i), p)
			}
		}
	}
}

// TestOutputFlagOnItsRow: a circuit's output gets its end flag on the row
// where its net stops, never also on an earlier row that only passes the
// net on (review15 a04: the overall feedback resistor's row drew the
// loudspeaker's "spk" end flag beside its connector to the output row, read
// as a second output). The faded pages of a04 hold one output flag in all.
func TestOutputFlagOnItsRow(t *testing.T) {
	f := "../../testdata/review15/a04.toml"
	pages, err := cachedPages(f, render.Faded, "A3")
	if err != nil {
		t.Fatal(err)
	}
	var on []int // the pages holding spk's end flag
	for i, g := range pages {
		for _, s := range g.Symbols {
			if s.Ref == "@out:spk" {
				on = append(on, i+1)
			}
		}
	}
	if len(on) != 1 {
		t.Errorf("a04 faded: the output spk's end flag on pages %v, want on one", on)
	}
}
