package rules

import (
	"encoding/json"
	"errors"
	"testing"

	"pare/graph"
)

// snapshot is everything about a circuit a step can change, as text: the
// JSON form holds parts with their pins (and the rails they returned to),
// nets with roles, labels and feeds, regions, ends and retired rails.
func snapshot(t *testing.T, c *graph.Circuit) string {
	t.Helper()
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// The journal that replaced a copy of the circuit per proven step must give
// the proof the circuit as it was (Before, BeforePart, BeforeNet,
// BeforeConns) and put a refused step back exactly as the copy did. Every
// fixture is reduced at every level with every third step refused, and the
// circuit each step starts from is compared with a deep copy of the one the
// driver should be holding: the result of the last step kept, or the
// circuit before the last step refused.
func TestJournalMatchesCopies(t *testing.T) {
	steps, refused := 0, 0
	for _, path := range fixtures(t) {
		for _, lvl := range levels {
			c := loadFile(t, path)
			var want string // the circuit the next step must start from
			n := 0
			check := func(j *graph.Journal, st *Step) error {
				n++
				steps++
				before := j.Before()
				if got := snapshot(t, before); want != "" && got != want {
					t.Fatalf("%s %v step %d (%s): the circuit before the step is not the one the last step left\n got %s\nwant %s", path, lvl, n, st.Rule, got, want)
				}
				if err := invariants(j.Circuit()); err != nil {
					t.Fatalf("%s %v step %d (%s): %v", path, lvl, n, st.Rule, err)
				}
				checkBeforeLookups(t, j, before)
				if n%3 == 0 {
					refused++
					want = snapshot(t, before)
					return errors.New("refused for the test")
				}
				want = snapshot(t, j.Circuit())
				return nil
			}
			r, _, err := Reduce(c, Options{Level: lvl, CheckStep: check, Rules: append(Table(), endsProbe(t, path))})
			if err != nil {
				continue // a fixture a level refuses: nothing to compare
			}
			if err := invariants(r); err != nil {
				t.Fatalf("%s %v: %v", path, lvl, err)
			}
		}
	}
	if steps < 100 || refused == 0 {
		t.Fatalf("%d steps, %d refused: the fixtures exercise too little", steps, refused)
	}
	t.Logf("%d steps, %d refused", steps, refused)
}

// checkBeforeLookups compares the journal's lookups with the circuit
// before the step built whole.
func checkBeforeLookups(t *testing.T, j *graph.Journal, before *graph.Circuit) {
	t.Helper()
	ix := graph.NewIndex(before.Parts, before.Nets)
	names := append(j.Nets(), ix.NetNames()...)
	for _, ref := range j.Parts() {
		if p := j.BeforePart(ref); p != ix.Part(ref) {
			t.Fatalf("BeforePart(%s) = %v, the whole circuit before has %v", ref, p, ix.Part(ref))
		}
		if p := j.BeforePart(ref); p != nil {
			for _, pin := range p.Pins {
				names = append(names, pin.Net)
			}
		}
	}
	for _, name := range names {
		if j.BeforeNet(name) != ix.Net(name) {
			t.Fatalf("BeforeNet(%s) differs from the whole circuit before", name)
		}
		got, want := j.BeforeConns(name), ix.Conns(name)
		if len(got) != len(want) {
			t.Fatalf("BeforeConns(%s): %d terminals, the whole circuit before has %d", name, len(got), len(want))
		}
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("BeforeConns(%s)[%d] = %s.%s, want %s.%s", name, i, got[i].Part.Ref, got[i].Pin, want[i].Part.Ref, want[i].Pin)
			}
		}
	}
}

// endsProbe is a rule that never matches: offered the whole circuit once
// per sweep, it holds the context's set of ends (Ctx.IsEnd, kept by Join
// and dropped by an undo) to the circuit's own lists.
func endsProbe(t *testing.T, path string) Rule {
	return Rule{Name: "ends probe", Level: LevelTidy, Whole: true,
		Match: func(x *Ctx, _ Anchor) *Plan {
			names := []string{""}
			for _, n := range x.c.Nets {
				names = append(names, n.Name)
			}
			for _, n := range names {
				if x.IsEnd(n) != x.c.IsEnd(n) {
					t.Fatalf("%s: IsEnd(%q) = %v, the circuit's lists say %v", path, n, x.IsEnd(n), x.c.IsEnd(n))
				}
			}
			return nil
		},
		Apply: func(*Ctx, *Plan) Step { return Step{} }}
}
