package main

import (
	"fmt"
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/check"
	"pare/render/layout"
)

// flatShuntCeiling is how many shunts, on the reduced and faded A3 pages of
// the examples and the review circuits (review13 to review21), lie flat in
// the signal row between two wires (render/check's FlatShunts: a part with
// one end on chassis, a rail, a net the reduction tied to AC ground or a
// bias point bypassed to chassis, drawn in line, reads as a series part;
// review21 a03's detector IF bypasses C12 and C13). 159 when the count
// began, 150 once shunt capacitors to a bypassed cathode or emitter hang
// down to it (render/layout/returns.go); most left are feed resistors to
// a rail or a decoupled line on the faded pages, and split cathode and
// emitter resistors; 142 once the untuned common-emitter transistor
// stages keep their templates on the faded sheets (the emitter resistor
// and its bypass stand below the emitter); 143 once a shunt stabiliser's
// feed off the reservoir is a supply section framed after its rectifier,
// its feed resistor in line from the reservoir to the stabilised rail as
// the supply's flow draws it (review15 b05's R5). A change may lower it,
// never raise it.
const flatShuntCeiling = 143

// reviewFiles are the examples and every blind review's circuits, review13
// to review21.
func reviewFiles(t *testing.T) []string {
	t.Helper()
	files := exampleFiles(t)
	for i := 13; i <= 21; i++ {
		more, err := filepath.Glob(filepath.Join("../../testdata", fmt.Sprintf("review%d", i), "*.toml"))
		if err != nil || len(more) == 0 {
			t.Fatalf("no review circuits in testdata/review%d: %v", i, err)
		}
		files = append(files, more...)
	}
	return files
}

// TestShuntsHangOffTheRow counts the shunts drawn flat in the row against
// flatShuntCeiling.
func TestShuntsHangOffTheRow(t *testing.T) {
	files := reviewFiles(t)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		res := cachedResult(t, f)
		for _, v := range []render.View{render.Reduced, render.Faded} {
			s := res.Sheet(v)
			bias := layout.BiasReturns(s.Circuit)
			isReturn := func(net string) bool {
				return s.Circuit.RoleOf(net).IsACGround() || s.Quiet[net] || bias[net]
			}
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			name := filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f))
			for i, g := range pages {
				for _, p := range check.FlatShunts(g, isReturn) {
					n++
					t.Logf("%s %s page %d: %s", name, v, i+1, p)
				}
			}
		}
	}
	t.Logf("shunts lying flat in the row: %d (ceiling %d)", n, flatShuntCeiling)
	if n > flatShuntCeiling {
		t.Errorf("%d shunts drawn flat in the row, ceiling %d: the log lists them", n, flatShuntCeiling)
	}
}

// runTogetherCeiling is how many pairs of labels of different parts, on
// the same pages, stand on one text line with less than a character's
// width between them (render/check's RunTogether: they read as one label,
// review21 b03 "C15 180pT1", a02 "C8 100p T3 k=0.01"). 69 when the count
// began, nearly all an IF can's name against its tuning capacitor's plates
// with the capacitor's label on the far side; 0 once one label of such a
// pair is moved after routing into room no wire uses (render/layout
// labelnudge.go: the wires and the pages stay as they were). Lower only.
const runTogetherCeiling = 0

// TestLabelsApart counts the labels that run together against
// runTogetherCeiling.
func TestLabelsApart(t *testing.T) {
	files := reviewFiles(t)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			name := filepath.Join(filepath.Base(filepath.Dir(f)), filepath.Base(f))
			for i, g := range pages {
				for _, p := range check.RunTogether(g) {
					n++
					t.Logf("%s %s page %d: %s", name, v, i+1, p)
				}
			}
		}
	}
	t.Logf("labels running together: %d (ceiling %d)", n, runTogetherCeiling)
	if n > runTogetherCeiling {
		t.Errorf("%d pairs of labels run together, ceiling %d: the log lists them", n, runTogetherCeiling)
	}
}
