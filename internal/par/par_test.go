package par

import (
	"runtime"
	"sync/atomic"
	"testing"
)

// TestDoCallsEachOnce: every index is called once, whatever the number of
// processors, and the results merged by index are the same.
func TestDoCallsEachOnce(t *testing.T) {
	for _, procs := range []int{1, 2, 8} {
		old := runtime.GOMAXPROCS(procs)
		for _, n := range []int{0, 1, 2, 7, 100} {
			calls := make([]atomic.Int32, n)
			out := make([]int, n)
			Do(n, func(i int) { calls[i].Add(1); out[i] = i * i })
			for i := range n {
				if calls[i].Load() != 1 || out[i] != i*i {
					t.Errorf("GOMAXPROCS %d, n %d: index %d called %d times, result %d", procs, n, i, calls[i].Load(), out[i])
				}
			}
		}
		runtime.GOMAXPROCS(old)
		if b := busy.Load(); b != 0 {
			t.Errorf("GOMAXPROCS %d: %d helpers still counted after Do returned", procs, b)
		}
	}
}

// TestReserveLeavesNoHelper: with every processor reserved by whole jobs,
// Do runs its calls on the caller alone, in order.
func TestReserveLeavesNoHelper(t *testing.T) {
	old := runtime.GOMAXPROCS(4)
	defer runtime.GOMAXPROCS(old)
	var releases []func()
	for range 3 { // the batch's workers after its first
		releases = append(releases, Reserve())
	}
	var order []int
	Do(5, func(i int) { order = append(order, i) }) // no lock: must run on the caller
	for i, v := range order {
		if v != i {
			t.Fatalf("calls ran out of order with no processor free: %v", order)
		}
	}
	for _, r := range releases {
		r()
		r() // a second release changes nothing
	}
	if b := busy.Load(); b != 0 {
		t.Errorf("busy %d after every release, want 0", b)
	}
}

// TestDoRaisesPanic: a panic in a helper's call reaches the caller.
func TestDoRaisesPanic(t *testing.T) {
	old := runtime.GOMAXPROCS(4)
	defer runtime.GOMAXPROCS(old)
	defer func() {
		if recover() == nil {
			t.Error("a call's panic was lost")
		}
		if b := busy.Load(); b != 0 {
			t.Errorf("busy %d after a panic, want 0", b)
		}
	}()
	Do(8, func(i int) {
		if i == 5 {
			panic("five")
		}
	})
}

// TestAheadOnlyWhenFree: work ahead of need runs only with a processor
// free, and then calls every index once.
func TestAheadOnlyWhenFree(t *testing.T) {
	old := runtime.GOMAXPROCS(1)
	defer runtime.GOMAXPROCS(old)
	called := false
	if Ahead(4, func(int) { called = true }) || called {
		t.Error("ran ahead with no processor to spare")
	}
	runtime.GOMAXPROCS(4)
	calls := make([]atomic.Int32, 6)
	if !Ahead(6, func(i int) { calls[i].Add(1) }) {
		t.Fatal("did not run ahead with three processors free")
	}
	for i := range calls {
		if calls[i].Load() != 1 {
			t.Errorf("index %d called %d times", i, calls[i].Load())
		}
	}
}

// TestSpareCounts: a spared place is taken only while one is free and is
// counted until released.
func TestSpareCounts(t *testing.T) {
	old := runtime.GOMAXPROCS(2)
	defer runtime.GOMAXPROCS(old)
	release, ok := Spare()
	if !ok {
		t.Fatal("no place spared with one processor free")
	}
	if _, again := Spare(); again {
		t.Error("a second place spared with two processors")
	}
	release()
	if b := busy.Load(); b != 0 {
		t.Errorf("busy %d after release, want 0", b)
	}
}
