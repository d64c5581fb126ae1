package layout

import (
	"reflect"
	"testing"

	"pare/render/check"
)

// TestPlacementKey: two placements route the same way exactly when the
// router sees the same thing: the same pins in the same places, the same
// bodies, locals, labels and frames, and the same net order.
func TestPlacementKey(t *testing.T) {
	c := parse(t, triodeStage)
	o := Options{Untangle: true}
	plain := place(c, o, nil, false)
	if again := place(c, o, nil, false); again.key() != plain.key() {
		t.Error("the same placement twice has two keys")
	}
	// every orientation of R3 (the anode load): equal keys for equal pins
	turns := plain.cells[0].turns
	for _, cl := range plain.cells {
		if cl.ref == "R3" {
			turns = cl.turns
		}
	}
	byTurn := map[int]*state{}
	for i := range turns {
		byTurn[i] = place(c, o, map[string]int{"R3": i}, false)
	}
	pinsOf := func(ly *state) any {
		for _, cl := range ly.cells {
			if cl.ref == "R3" {
				return cl.shape.Pins
			}
		}
		return nil
	}
	for i := range turns {
		for j := range turns {
			same := reflect.DeepEqual(pinsOf(byTurn[i]), pinsOf(byTurn[j])) && reflect.DeepEqual(byTurn[i].frames, byTurn[j].frames)
			if (byTurn[i].key() == byTurn[j].key()) != same {
				t.Errorf("turns %d and %d of R3: same pins %v, same key %v", i, j, same, byTurn[i].key() == byTurn[j].key())
			}
		}
	}
	short := place(c, o, nil, false)
	short.shortFirst = true
	if short.key() == plain.key() {
		t.Error("the other net order has the same key")
	}
}

// TestUntangleNeverAddsCrossings: the search keeps a layout only when it has
// fewer crossings, so a reduced sheet never has more crossings than the
// plain layout (crossings matter most to a reader: Purchase 1997). Measured
// by the sheet checker.
func TestUntangleNeverAddsCrossings(t *testing.T) {
	for _, src := range []string{triodeStage, coupledStages} {
		c := parse(t, src)
		frames := []Frame{{Title: "S1", Parts: []string{"C1", "Q1", "V1", "R1"}}, {Title: "S2", Parts: []string{"R2", "R3", "T1", "Q2"}}}
		plain, err := Layout(c, Options{Frames: frames})
		if err != nil {
			t.Fatal(err)
		}
		searched, err := Layout(c, Options{Frames: frames, Untangle: true})
		if err != nil {
			t.Fatal(err)
		}
		p, s := check.Measure(&plain.Geom), check.Measure(&searched.Geom)
		if s.Crossings > p.Crossings {
			t.Errorf("%s: %d crossings after the search, %d without", c.Title, s.Crossings, p.Crossings)
		}
		for _, msg := range s.Problems() {
			t.Errorf("%s: %s", c.Title, msg)
		}
	}
}

// TestSamplerRoutesOnce: on the sampler fixture's reduced sheet the search
// stops on its work budget, well short of its limits on tries, and the
// result is the same on every run.
func TestSamplerRoutesOnce(t *testing.T) {
	if testing.Short() {
		t.Skip("routes the sampler a few times")
	}
	c := loadFixture(t, "../testdata/all-symbols.toml")
	o := reducedOptions(c, 0)
	u := &untangler{c: c, o: o, seen: map[string]*wiring{}, sc: new(scratch)}
	plain := u.layout(nil, false)
	u.plan(plain)
	best := u.untangle(plain)
	if len(u.seen) > 6 {
		t.Errorf("%d placements routed; the budget allows a few", len(u.seen))
	}
	again, _ := Layout(c, o)
	// the winner wired again with the passes after crossings, as run does
	w := route(best.ly, u.sc, true)
	if got, want := sheetText(&again.Geom), sheetText(&assemble(best.ly, w).Geom); got != want {
		t.Error("two runs of the search differ")
	}
}

// TestCrowdedSheetRoutedOnce: a sheet whose plain layout alone took more
// than the search's budget (here a budget of one state, standing in for a
// long crowded row of a whole set) is routed once: the lined-up and the
// shortest-first layouts are not begun. With room in the budget both are.
func TestCrowdedSheetRoutedOnce(t *testing.T) {
	c := loadFixture(t, "../testdata/all-symbols.toml")
	o := reducedOptions(c, 0)
	for _, tc := range []struct {
		budget, want int
	}{
		{1, 1},              // over budget after the plain layout: that one only
		{untangleBudget, 3}, // as Layout runs it: plain, lined up, shortest first (and single changes while the budget lasts)
	} {
		u := &untangler{c: c, o: o, seen: map[string]*wiring{}, sc: new(scratch), budget: tc.budget}
		plain := u.layout(nil, false)
		if plain.crossings == 0 {
			t.Fatal("the sampler's plain layout has no crossing; the test needs one")
		}
		u.untangle(plain)
		if len(u.seen) != tc.want && (tc.budget == 1 || len(u.seen) < tc.want) {
			t.Errorf("budget %d: %d placements routed, want %d", tc.budget, len(u.seen), tc.want)
		}
	}
}
