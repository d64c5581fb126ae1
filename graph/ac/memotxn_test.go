package ac

import (
	"crypto/sha256"
	"reflect"
	"testing"
)

// A quantity the sequential loop would not have run leaves the memo as it
// found it (finish undoes its responses and the entries it made), and one
// it would have run leaves what attach leaves: its systems in used. The
// reference is the memo before the quantity ran, copied by hand.
func TestMemoTxnUndoesAndKeeps(t *testing.T) {
	old, fresh := sha256.Sum256([]byte("old")), sha256.Sum256([]byte("fresh"))
	m := NewMemo()
	m.series[old] = map[float64]complex128{1e3: 1}
	want := map[[sha256.Size]byte]map[float64]complex128{old: {1e3: 1}}
	for _, keep := range []bool{false, true} {
		tx := &memoTxn{}
		p, q := &probe{}, &probe{}
		m.attachTxn(0, p, old, tx)
		m.attachTxn(1, q, fresh, tx)
		p.memo[2e3] = 2
		p.wrote(2e3)
		q.memo[3e3] = 3
		q.wrote(3e3)
		m.finish(tx, keep)
		if !keep {
			if !reflect.DeepEqual(m.series, want) || len(m.used[0])+len(m.used[1]) != 0 {
				t.Errorf("undone: memo %v used %v, want %v and nothing used", m.series, m.used, want)
			}
			continue
		}
		if len(m.series[old]) != 2 || len(m.series[fresh]) != 1 || len(m.used[0]) != 1 || len(m.used[1]) != 1 {
			t.Errorf("kept: memo %v used %v", m.series, m.used)
		}
	}
}
