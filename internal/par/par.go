// Package par runs the independent pieces of one job on the processors
// that are free, and only those: a process's jobs share one count of the
// goroutines working beside the one that runs each job, so a job alone on
// the machine spreads over every core, while the sets of a batch (each on
// a core of its own, cmd/pare/batch.go) keep their pieces to themselves
// until the batch runs short of sets.
//
// Each piece writes its own result; the caller merges them in the pieces'
// order, never in the order they finish, so the job's output does not
// depend on how many processors there are or how they were scheduled.
package par

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// busy counts the goroutines doing a job's work beside the process's own
// (the one every job starts on): helpers started by Do, and the batch's
// workers after its first (Reserve).
var busy atomic.Int64

// take claims a helper's place when one is free: busy stays below
// GOMAXPROCS less the process's own goroutine.
func take() bool {
	for {
		b := busy.Load()
		if b+1 >= int64(runtime.GOMAXPROCS(0)) {
			return false
		}
		if busy.CompareAndSwap(b, b+1) {
			return true
		}
	}
}

// Reserve counts a goroutine that runs a whole job beside the process's
// own (a batch's second and later workers) until the returned release is
// called, so the jobs' pieces find no processor free while every worker
// has a set.
func Reserve() (release func()) {
	busy.Add(1)
	var once sync.Once
	return func() { once.Do(func() { busy.Add(-1) }) }
}

// Spare claims a helper's place for work of a job's own beside it (a
// prefetch that stops itself), when one is free; ok false: none is, and
// the work is not to start. Release gives the place back.
func Spare() (release func(), ok bool) {
	if !take() {
		return nil, false
	}
	var once sync.Once
	return func() { once.Do(func() { busy.Add(-1) }) }, true
}

// Do calls fn(i) for every i in [0, n), on the calling goroutine and on as
// many helpers as there are processors free (none: all on the caller, in
// order), and returns when every call has returned. The calls must be
// independent of each other: each writes only its own result, and what
// they share they only read or guard. A panic in a call is raised again on
// the caller.
func Do(n int, fn func(i int)) {
	helpers := 0
	for helpers < n-1 && take() {
		helpers++
	}
	if helpers == 0 {
		for i := range n {
			fn(i)
		}
		return
	}
	run(n, helpers, fn)
}

// Ahead is Do for work done ahead of need (a guess at what a sequential
// pass will ask, remembered for it): it runs only when a processor is
// free, and else does nothing and returns false, so a job with no core to
// spare never pays for a guess.
func Ahead(n int, fn func(i int)) bool {
	helpers := 0
	for helpers < n-1 && take() {
		helpers++
	}
	if helpers == 0 {
		return false
	}
	run(n, helpers, fn)
	return true
}

// run calls fn for every index on the caller and helpers goroutines (their
// places already taken).
func run(n, helpers int, fn func(i int)) {
	var next atomic.Int64
	var wg sync.WaitGroup
	var mu sync.Mutex
	var raised any
	work := func() {
		defer func() {
			if p := recover(); p != nil {
				mu.Lock()
				if raised == nil {
					raised = p
				}
				mu.Unlock()
			}
		}()
		for i := int(next.Add(1)) - 1; i < n; i = int(next.Add(1)) - 1 {
			fn(i)
		}
	}
	for range helpers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer busy.Add(-1)
			work()
		}()
	}
	work()
	// the caller waits without working: its place is lent to the pieces'
	// own work ahead (a view's rows, par.Ahead) until the helpers finish
	busy.Add(-1)
	wg.Wait()
	busy.Add(1)
	if raised != nil {
		panic(raised)
	}
}
