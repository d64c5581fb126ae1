package pipeline

import (
	"path/filepath"
	"sync"

	"pare/rules"
)

// stagesRun is Run up to the stages at level signal, once per file in the
// test binary: the drawing, supply and mark tests read the same examples
// and review sets (the club receiver's run alone takes seconds, every step
// proven), and only read the result. A test that needs a run of its own
// (other options, or a run to compare with another) calls Run.
func stagesRun(path string) (*Result, error) {
	stagesRuns.Lock()
	if stagesRuns.m == nil {
		stagesRuns.m = map[string]*stagesEntry{}
	}
	e, ok := stagesRuns.m[filepath.Clean(path)]
	if !ok {
		e = &stagesEntry{}
		stagesRuns.m[filepath.Clean(path)] = e
	}
	stagesRuns.Unlock()
	e.once.Do(func() { e.r, e.err = Run(Options{Path: path, Until: PhaseStages, Level: rules.LevelSignal}) })
	return e.r, e.err
}

var stagesRuns struct {
	sync.Mutex
	m map[string]*stagesEntry
}

type stagesEntry struct {
	once sync.Once
	r    *Result
	err  error
}
