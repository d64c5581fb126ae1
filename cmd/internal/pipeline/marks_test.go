package pipeline

import (
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/align"
	"pare/render"
	"pare/rules"
)

// TestAlignMarksOnEveryView: every step of the alignment procedure is
// marked exactly once on each view, at a part that view draws (on the
// reduced one a trimmer merged into its gang section is marked there), so
// the sheet and the procedure agree.
func TestAlignMarksOnEveryView(t *testing.T) {
	for _, name := range []string{"frequency-changer", "if-detector-audio", "transistor-front-end"} {
		r, err := Run(Options{Path: filepath.Join("..", "..", "..", "examples", name+".toml"), Until: PhaseStages, Level: rules.LevelSignal})
		if err != nil {
			t.Fatal(err)
		}
		steps := len(align.Build(r.Title, r.Circuit, r.Stages, r.Caution).Steps)
		if steps == 0 {
			t.Fatalf("%s: no steps", name)
		}
		for _, v := range []render.View{render.Reduced, render.Full, render.Faded} {
			s := r.Sheet(v)
			var got []int
			for ref, m := range s.Marks {
				if s.Circuit.Part(ref) == nil {
					t.Errorf("%s %v: mark on %s, which the view does not draw", name, v, ref)
				}
				for _, n := range strings.Split(strings.TrimPrefix(m, "align "), ", ") {
					k, err := strconv.Atoi(n)
					if err != nil {
						t.Fatalf("%s %v: mark %q", name, v, m)
					}
					got = append(got, k)
				}
			}
			slices.Sort(got)
			for i, k := range got {
				if k != i+1 {
					t.Errorf("%s %v: marks %v, want 1..%d once each", name, v, got, steps)
					break
				}
			}
			if len(got) != steps {
				t.Errorf("%s %v: %d marks for %d steps", name, v, len(got), steps)
			}
		}
	}
}
