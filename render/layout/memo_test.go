package layout

import (
	"path/filepath"
	"reflect"
	"testing"

	"pare/graph"
	"pare/internal/synth"
	"pare/render/geom"
)

// TestMemoChangesNothing: every sheet lays out the same with the search
// memo off, with it starting empty, and with it holding every search the
// sheet makes (the layout after is all remembered searches): the same
// wires, flags and placement, and the same work counted, which the budgets
// read. The sheets are the examples (full and untangled), the sampler's
// reduced sheet in both styles and a channel of a synthetic bank.
func TestMemoChangesNothing(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out every example three times")
	}
	type sheet struct {
		name string
		c    *graph.Circuit
		o    Options
	}
	var sheets []sheet
	files, _ := filepath.Glob("../../examples/*.toml")
	if len(files) == 0 {
		t.Fatal("no examples")
	}
	for _, f := range files {
		c := loadFixture(t, f)
		sheets = append(sheets, sheet{f + " full", c, Options{Links: true}},
			sheet{f + " untangled", c, Options{Untangle: true, HideUnconnected: true}})
	}
	sampler := loadFixture(t, "../testdata/all-symbols.toml")
	sheets = append(sheets, sheet{"sampler iec", sampler, reducedOptions(sampler, 0)},
		sheet{"sampler ieee", sampler, reducedOptions(sampler, 1)})
	one, err := synth.Load(synth.Superhet)
	if err != nil {
		t.Fatal(err)
	}
	sheets = append(sheets, sheet{"superhet channel", one, Options{Untangle: true, HideUnconnected: true}})
	defer func() { memoOff = false }()
	for _, s := range sheets {
		memoOff = true
		want, wantPops := layoutPops(t, s.c, s.o)
		memoOff = false
		resetMemo()
		for _, run := range []string{"memo starting empty", "memo holding every search"} {
			got, pops := layoutPops(t, s.c, s.o)
			if !reflect.DeepEqual(got, want) {
				t.Errorf("%s, %s: the layout differs from the one without the memo", s.name, run)
			}
			if pops != wantPops {
				t.Errorf("%s, %s: %d states counted, %d without the memo", s.name, run, pops, wantPops)
			}
		}
	}
}

// layoutPops is Layout's result and the router's work, in states.
func layoutPops(t *testing.T, c *graph.Circuit, o Options) (*Result, int) {
	t.Helper()
	u := &untangler{c: c, o: o, seen: map[string]*wiring{}, sc: new(scratch)}
	best := u.run()
	return assemble(best.ly, best.w), u.pops
}

// TestMemoKeysTheCrossingPrice: the same search at the plain and at the
// wide crossing price (the long wire of TestCrossOrGoRound: crossed at the
// plain price, gone round at the wide one) are two searches to the memo.
func TestMemoKeysTheCrossingPrice(t *testing.T) {
	ly := handSheet(
		box{"A1", geom.R(-10, -1, -8, 1), []geom.Pin{pinAt("a", -8, 0, geom.Right)}},
		box{"A2", geom.R(32, -1, 34, 1), []geom.Pin{pinAt("a", 32, 0, geom.Left)}},
		box{"B1", geom.R(11, -12, 13, -10), []geom.Pin{pinAt("b", 12, -10, geom.Down)}},
		box{"B2", geom.R(11, 10, 13, 12), []geom.Pin{pinAt("b", 12, 10, geom.Up)}},
	)
	defer func() { memoOff = false }()
	found := map[bool]map[bool][]int{}
	for _, off := range []bool{true, false} {
		memoOff = off
		found[off] = map[bool][]int{}
		rt := newRouter(ly, &scratch{})
		if !rt.routeNet(0) {
			t.Fatal("net a could not be wired")
		}
		from, to := rt.nets[1].pins[0], rt.nets[1].pins[1]
		rt.addArm(from.cell, 2, 1<<opposite(int(from.pin.Dir)))
		win := window{0, 0, rt.w - 1, rt.h - 1}
		for _, wide := range []bool{false, true} {
			rt.wide = wide
			found[off][wide] = rt.search(2, to, rt.cellRect(from.cell), win)
		}
	}
	if reflect.DeepEqual(found[true][false], found[true][true]) {
		t.Fatal("the wide price found the same wire; the test needs two")
	}
	if !reflect.DeepEqual(found[false], found[true]) {
		t.Error("with the memo the two prices found other wires than without")
	}
}

// TestMemoKeysTheStrictSearch: a strict search (unline.go) is a search of
// its own to the memo, and its key holds the grid as far beyond its window
// as its in-line test looks (unlineReach), where a plain search's stops at
// memoMargin: a point changed between the two margins changes the strict
// key alone.
func TestMemoKeysTheStrictSearch(t *testing.T) {
	ly := handSheet(
		box{"A1", geom.R(-10, -1, -8, 1), []geom.Pin{pinAt("a", -8, 0, geom.Right)}},
		box{"A2", geom.R(32, -1, 34, 1), []geom.Pin{pinAt("a", 32, 0, geom.Left)}},
		box{"B1", geom.R(11, -12, 13, -10), []geom.Pin{pinAt("b", 12, -10, geom.Down)}},
		box{"B2", geom.R(11, 10, 13, 12), []geom.Pin{pinAt("b", 12, 10, geom.Up)}},
	)
	rt := newRouter(ly, &scratch{})
	from, to := rt.nets[1].pins[0], rt.nets[1].pins[1]
	reach := max(memoMargin, unlineReach)
	win := window{reach + 1, reach + 1, rt.w - reach - 2, rt.h - reach - 2}
	if win.x1 <= win.x0 || win.y1 <= win.y0 || unlineReach <= memoMargin {
		t.Fatalf("the grid (%d by %d) or the reaches leave no window to test", rt.w, rt.h)
	}
	key := func(strict bool) memoKey {
		rt.strict = strict
		defer func() { rt.strict = false }()
		tree := rt.cellRect(from.cell)
		k := seek{net: 2, home: rt.nets[1].home, pinCell: to.cell, win: win,
			to: aim{int(tree.X0) - rt.x0, int(tree.Y0) - rt.y0, int(tree.X1) - rt.x0, int(tree.Y1) - rt.y0}}
		return rt.searchKey(&k, to)
	}
	plain, strict := key(false), key(true)
	if plain == strict {
		t.Fatal("a strict search and a plain one share a key")
	}
	// a point unlineReach steps right of the window, beyond memoMargin
	c := win.y0*rt.w + win.x1 + unlineReach
	rt.g[c].flags ^= fBlocked
	if key(false) != plain {
		t.Error("a point beyond memoMargin changed a plain search's key")
	}
	if key(true) == strict {
		t.Error("a point unlineReach beyond the window left a strict search's key the same")
	}
}
