package stages

import (
	"runtime"
	"sync/atomic"

	"pare/graph"
	"pare/graph/ac"
	"pare/internal/par"
)

// prefetchLoops starts solving, beside the pattern search, the loops the
// stage finder asks for afterwards: every active part of the reduced
// circuit at every gang setting of lc, the circuit the loops are solved on
// (loopStages and addLoops ask for nearly all of them). A loop search's
// result is remembered by ac under a digest of its system, so when
// loopStages asks, it gets what it would have solved, only sooner; the
// answers and their order are the finder's own. Each worker solves on its
// own copy of lc (an ac.Loops is not shared between goroutines, and the
// finder keeps reading lc). With no processor free (one alone, or each
// holding a set of a batch) there is no one to do it beside the search,
// and nothing is started. The returned stop makes the
// workers take no further part once the finder has what it needs.
func prefetchLoops(reduced, lc *graph.Circuit) (stop func()) {
	var refs []string
	for _, p := range reduced.Parts {
		if p.IsActive() && lc.Part(p.Ref) != nil {
			refs = append(refs, p.Ref)
		}
	}
	if len(refs) == 0 {
		return func() {}
	}
	var next, stopped atomic.Int64
	// up to two workers, each on a processor no other work of the process
	// holds (par): the stages' figures, solved side by side after the
	// search, find the processors these leave once they stop
	for range min(runtime.GOMAXPROCS(0)-1, 2) {
		release, ok := par.Spare()
		if !ok {
			break
		}
		lp := ac.NewLoops(lc.Clone())
		go func() {
			defer release()
			for stopped.Load() == 0 {
				i := int(next.Add(1)) - 1
				if i >= len(refs) {
					return
				}
				_, _ = loopOf(lp, refs[i]) // remembered by ac; errors are the finder's to meet
			}
		}()
	}
	return func() { stopped.Store(1) }
}
