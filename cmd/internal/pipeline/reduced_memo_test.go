package pipeline

import (
	"sync"
	"testing"

	"pare/rules"
)

// mainReduction is the main job's reduction of path at lvl (every step
// proven locally against the one before, on the pieces its responses
// read), run once in the test binary: the tests that hold another way of
// proving the steps to it (TestLocalStepProofIsWhole,
// TestReadPieceStepsAreBlockSteps) reduce the same sets and only read the
// result.
func mainReduction(t *testing.T, path string, lvl rules.Level) (*Result, error) {
	t.Helper()
	k := reductionKey{path, lvl}
	reductions.Lock()
	e, ok := reductions.m[k]
	if !ok {
		e = &reductionEntry{}
		reductions.m[k] = e
	}
	reductions.Unlock()
	e.once.Do(func() {
		e.r, e.err = Run(mainReductionOptions(path, lvl))
	})
	return e.r, e.err
}

// mainReductionOptions are the options mainReduction runs with; a test
// varies a copy of them.
func mainReductionOptions(path string, lvl rules.Level) Options {
	return Options{Path: path, Until: PhaseReduce, Level: lvl, StepCheck: AgainstPrevious}
}

type reductionKey struct {
	path string
	lvl  rules.Level
}

type reductionEntry struct {
	once sync.Once
	r    *Result
	err  error
}

var reductions = struct {
	sync.Mutex
	m map[reductionKey]*reductionEntry
}{m: map[reductionKey]*reductionEntry{}}
