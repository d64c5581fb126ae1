package ac_test

import (
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules"
)

// A comparison that takes the original's responses from a memo reports what
// a fresh comparison reports (the reference is the fresh solve; the two may
// differ only by the rounding of the LU's pivot history, far below the
// 10⁻⁶ dB and 10⁻⁴° allowed here, "common practice" for a rounding check),
// and Settle keeps only the circuit it is told lives on.
func TestMemoMatchesFreshSolve(t *testing.T) {
	for _, f := range examples(t) {
		t.Run(filepath.Base(f), func(t *testing.T) {
			c, err := graph.LoadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			red, _, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			fresh, err := ac.Compare(c, red, ac.CompareOptions{})
			if err != nil {
				t.Fatal(err)
			}
			m := ac.NewMemo()
			if _, err := ac.Compare(c, red, ac.CompareOptions{Memo: m}); err != nil {
				t.Fatal(err)
			}
			m.Settle(true, false)
			kept := ac.MemoLen(m)
			if kept == 0 {
				t.Fatal("the memo kept no responses of the original")
			}
			again, err := ac.Compare(c, red, ac.CompareOptions{Memo: m})
			if err != nil {
				t.Fatal(err)
			}
			if len(again.Pairs) != len(fresh.Pairs) || again.OK != fresh.OK {
				t.Fatalf("with memo %d pairs ok=%v, fresh %d pairs ok=%v", len(again.Pairs), again.OK, len(fresh.Pairs), fresh.OK)
			}
			for i, p := range again.Pairs {
				q := fresh.Pairs[i]
				if p.Label() != q.Label() || math.Abs(p.MaxDB-q.MaxDB) > 1e-6 || math.Abs(p.MaxDeg-q.MaxDeg) > 1e-4 {
					t.Errorf("%s: with memo %.9f dB %.6f°, fresh %s %.9f dB %.6f°", p.Label(), p.MaxDB, p.MaxDeg, q.Label(), q.MaxDB, q.MaxDeg)
				}
			}
			m.Settle(false, false)
			if n := ac.MemoLen(m); n != 0 {
				t.Errorf("after settling with nothing kept the memo holds %d response sets", n)
			}
		})
	}
}
