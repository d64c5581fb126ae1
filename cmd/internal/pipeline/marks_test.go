package pipeline

import (
	"fmt"
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
// the sheet and the procedure agree; a mark on a part that is not the
// one turned names it ("align 5 (TC2)"), and a transformer turned at two
// windings says which step is which ("align 3 sec, 4 pri").
func TestAlignMarksOnEveryView(t *testing.T) {
	for _, path := range []string{example("frequency-changer"), example("if-detector-audio"), example("transistor-front-end"),
		filepath.Join("..", "..", "..", "testdata", "good", "review-align-c1-valve-superhet.toml")} {
		name := filepath.Base(path)
		r, err := stagesRun(path)
		if err != nil {
			t.Fatal(err)
		}
		g := align.Build(r.Title, r.Circuit, r.Stages, r.Caution)
		steps := len(g.Steps)
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
					f := strings.Fields(n)
					k, err := strconv.Atoi(f[0])
					if err != nil || k < 1 || k > steps {
						t.Fatalf("%s %v: mark %q", name, v, m)
					}
					got = append(got, k)
					if want := markWords(g.Steps[k-1], ref); !slices.Equal(f[1:], want) {
						t.Errorf("%s %v: mark %q on %s, want step %d with %q", name, v, n, ref, k, want)
					}
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

func example(name string) string { return filepath.Join("..", "..", "..", "examples", name+".toml") }

// markWords are the words a step's mark carries after its number on the
// part ref: the winding of a transformer turned at two windings (every
// such transformer here has its primary and secondary adjusted, so a
// winding step always has a sister), the part turned when the mark sits
// on another.
func markWords(s align.Step, ref string) []string {
	var w []string
	if s.Winding != "" {
		w = append(w, map[string]string{"s": "sec", "p": "pri"}[s.Winding])
	}
	if s.Part != ref {
		w = append(w, "("+s.Part+")")
	}
	return w
}

// TestEveryBandMarkedOnTheOriginal: a set with a wavechange switch is
// aligned band by band (common practice), and a band's own trimmers are
// parts of the original even where the captured switch position leaves
// them out: the faded and full views mark every step of every band at the
// part turned, the club receiver's LW trimmers TC1, TC3 and TC5 too, and
// MarkedOn names the page of the faded sheet that holds each, as the note
// says it.
func TestEveryBandMarkedOnTheOriginal(t *testing.T) {
	a3, _ := render.ParsePaper("A3")
	r, err := Run(Options{Path: example("club-receiver"), Level: rules.LevelSignal, Views: []render.View{render.Faded},
		Page: a3, BandSets: align.BandSets})
	if err != nil {
		t.Fatal(err)
	}
	g := align.Build(r.Title, r.Circuit, r.Stages, r.Caution)
	g.AddBands(r.Circuit, r.Stages, r.BandRun)
	sh := r.SheetFor(render.Faded)
	bands := 0
	for _, s := range g.Steps {
		if s.Band != "" {
			bands++
		}
		var nums []string // "align 1 sec, 2 pri": 1, 2
		for _, n := range strings.Split(strings.TrimPrefix(sh.Sheet.Marks[s.Part], "align "), ", ") {
			if f := strings.Fields(n); len(f) > 0 {
				nums = append(nums, f[0])
			}
		}
		if !slices.Contains(nums, strconv.Itoa(s.N)) {
			t.Errorf("step %d (%s %s): %s marked %q on the faded view", s.N, s.Band, s.Part, s.Part, sh.Sheet.Marks[s.Part])
		}
		where := r.MarkedOn(s.Part)
		var page int
		if _, err := fmt.Sscanf(where, "the faded sheet %d of", &page); err != nil || page < 1 || page > len(sh.Pages) {
			t.Errorf("step %d: %s marked on %q", s.N, s.Part, where)
			continue
		}
		if !strings.Contains(string(sh.Pages[page-1]), `data-ref="`+render.RefToken(s.Part)+`"`) {
			t.Errorf("step %d: %s is not on %s", s.N, s.Part, where)
		}
	}
	if bands != 6 {
		t.Errorf("%d steps of the other band, want LW's six (TC5, L2, TC3, T4, TC1, T2)", bands)
	}
}
