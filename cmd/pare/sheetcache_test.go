package main

import (
	"bytes"
	"sync"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/render"
	"pare/render/check"
	"pare/render/geom"
	"pare/rules"
)

// The tests that walk every example and fixture (the layout checks, the
// rail and frame checks, the committed sheets) read the same sheets; the
// whole set's sheets take seconds each to lay out, and the stage finder
// seconds per pipeline run. Each is worked out once per test binary here
// and shared: these tests only read them. The repeatability of a run is
// checked where two independent runs are compared (TestMainJobDeterministic,
// TestDrawExampleSheets, TestDrawMatchesMainJob), never on a cached copy.
//
// Tests that read these in-memory results run one after another: a circuit
// builds its connection index on first use, so two tests reading one result
// at once could race. Tests that read only the main job's files (cachedJob)
// and runs of their own call t.Parallel, and share the two cores with the
// kill test and the browser, which mostly wait.
var sheetCache struct {
	sync.Mutex
	results map[string]*pipeline.Result
	sheets  map[sheetKey]*laidSheet
	drawn   map[drawKey][]byte
}

type sheetKey struct {
	file  string
	view  render.View
	style render.Style
}

type drawKey struct {
	file string
	view render.View
}

// laidSheet is one sheet's geometry and the checker's report on it.
type laidSheet struct {
	g      *geom.Sheet
	report *check.Report
}

// cachedResult is sheetsOf at level signal, once per file.
func cachedResult(t *testing.T, file string) *pipeline.Result {
	t.Helper()
	sheetCache.Lock()
	defer sheetCache.Unlock()
	return cachedResultLocked(t, file)
}

func cachedResultLocked(t *testing.T, file string) *pipeline.Result {
	t.Helper()
	if r, ok := sheetCache.results[file]; ok {
		return r
	}
	if sheetCache.results == nil {
		sheetCache.results = map[string]*pipeline.Result{}
	}
	r := sheetsOf(t, pipeline.Options{Path: file, Level: rules.LevelSignal})
	sheetCache.results[file] = r
	return r
}

// cachedSheet lays out one view of a file in one symbol style, once, and
// measures it with the checker.
func cachedSheet(t *testing.T, file string, v render.View, st render.Style) *laidSheet {
	t.Helper()
	sheetCache.Lock()
	defer sheetCache.Unlock()
	k := sheetKey{file, v, st}
	if s, ok := sheetCache.sheets[k]; ok {
		return s
	}
	res := cachedResultLocked(t, file)
	g, err := render.Config{Style: st}.Geometry(res.Sheet(v))
	if err != nil {
		t.Fatalf("%s %s %s: %v", file, v, st, err)
	}
	if sheetCache.sheets == nil {
		sheetCache.sheets = map[sheetKey]*laidSheet{}
	}
	s := &laidSheet{g: g, report: check.Measure(g)}
	sheetCache.sheets[k] = s
	return s
}

// cachedDraw is the output of `pare draw FILE --view V -o -`, run once.
func cachedDraw(t *testing.T, file string, v render.View) []byte {
	t.Helper()
	sheetCache.Lock()
	defer sheetCache.Unlock()
	k := drawKey{file, v}
	if b, ok := sheetCache.drawn[k]; ok {
		return b
	}
	var out, errb bytes.Buffer
	if code := run([]string{"draw", file, "-o", "-", "--view", v.String()}, &out, &errb); code != exitOK {
		t.Fatalf("pare draw %s --view %s: exit %d: %s", file, v, code, errb.String())
	}
	if sheetCache.drawn == nil {
		sheetCache.drawn = map[drawKey][]byte{}
	}
	sheetCache.drawn[k] = out.Bytes()
	return out.Bytes()
}

// memo computes each key's value once per test binary: callers of one key
// wait for the first, callers of other keys go ahead, so tests that run in
// parallel share the work without queueing behind each other's.
type memo[K comparable, V any] struct {
	mu sync.Mutex
	m  map[K]*memoEntry[V]
}

type memoEntry[V any] struct {
	once sync.Once
	v    V
	err  error
}

func (c *memo[K, V]) get(k K, compute func() (V, error)) (V, error) {
	c.mu.Lock()
	if c.m == nil {
		c.m = map[K]*memoEntry[V]{}
	}
	e, ok := c.m[k]
	if !ok {
		e = &memoEntry[V]{}
		c.m[k] = e
	}
	c.mu.Unlock()
	e.once.Do(func() { e.v, e.err = compute() })
	return e.v, e.err
}
