package ac

import (
	"reflect"
	"testing"
)

// TestMemoKeepsSweeps: a comparison that a memo saw before (the same two
// systems, bands and plan: a channel built like one already proven) takes
// every sweep from the memo and reports the same, to the bit; a
// comparison under another plan (another tolerance) sweeps afresh.
func TestMemoKeepsSweeps(t *testing.T) {
	for _, f := range exampleFiles(t) {
		c := load(t, f)
		d := scaleCaps(c, 1.03)
		memo := NewMemo()
		o := CompareOptions{Memo: memo, AboveRounding: true}
		first, err := Compare(c, d, o)
		if err != nil {
			t.Fatal(err)
		}
		memo.Settle(false, true)
		kept := len(memo.sweeps)
		if kept == 0 {
			t.Fatalf("%s: no sweep kept", f)
		}
		again, err := Compare(c, d, o)
		if err != nil {
			t.Fatal(err)
		}
		memo.Settle(false, true)
		if !reflect.DeepEqual(first, again) || len(memo.sweeps) != kept {
			t.Errorf("%s: again %+v (%d sweeps kept), first %+v (%d)", f, again, len(memo.sweeps), first, kept)
		}
		o.TolDB = 0.25
		if _, err := Compare(c, d, o); err != nil {
			t.Fatal(err)
		}
		if len(memo.sweeps) <= kept {
			t.Errorf("%s: a comparison at another tolerance took the sweeps made at the first", f)
		}
	}
}
