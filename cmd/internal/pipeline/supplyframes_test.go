package pipeline

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestSupplyDrawnAsOnePiece: a technician draws a set's supply as one π
// filter beside its rectifier (common practice), so on the faded sheet the
// smoothing section on the rectifier's output is framed right after the
// rectifier's frame and joined to it (the page flow never cuts between
// them).
func TestSupplyDrawnAsOnePiece(t *testing.T) {
	cases := []struct {
		path        string
		host, joins string // frame titles' stage names
		joined      int
	}{
		{example("club-receiver"), "ST26", "ST23", 1},
		// near miss: a decoupling filter no rectifier stage feeds stays
		// unframed at the stage it feeds
		{filepath.Join("..", "..", "..", "testdata", "good", "review17-acdc.toml"), "", "", 0},
	}
	for _, tc := range cases {
		r, err := stagesRun(tc.path)
		if err != nil {
			t.Fatal(err)
		}
		s := r.Sheet(render.Faded)
		joined := 0
		for i, f := range s.Frames {
			if !f.Joined || !f.Supply {
				continue // a signal filter joined to the detector before it is another rule's
			}
			joined++
			if i == 0 {
				t.Errorf("%s: the first frame %q is joined to nothing", tc.path, f.Title)
				continue
			}
			if tc.host != "" && (stageOf(s.Frames[i-1].Title) != tc.host || stageOf(f.Title) != tc.joins) {
				t.Errorf("%s: %q joined after %q, want %s after %s", tc.path, f.Title, s.Frames[i-1].Title, tc.joins, tc.host)
			}
		}
		if joined != tc.joined {
			t.Errorf("%s: %d joined frames, want %d", tc.path, joined, tc.joined)
		}
	}
}

// stageOf is a frame title's stage name ("ST24 Smoothing filter" → ST24).
func stageOf(title string) string {
	for i, c := range title {
		if c == ' ' {
			return title[:i]
		}
	}
	return title
}
