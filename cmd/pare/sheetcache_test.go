package main

import (
	"bytes"
	"fmt"
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
// checked where an independent run is compared with a cached one
// (TestMainJobDeterministic, TestDrawExampleSheets, TestDrawMatchesMainJob).
//
// A circuit builds its connection index on first use, so two goroutines
// working on one file's result at once could race: each file's result and
// sheets are made under that file's lock, and warmSheets works on as many
// files at a time as there are cores. Tests that read these in-memory
// results run one after another; tests that read only the main job's files
// (cachedJob) and runs of their own call t.Parallel, and share the cores
// with the kill test and the browser, which mostly wait.
var sheetCache struct {
	sync.Mutex
	files    map[string]*fileSheets
	drawn    memo[drawKey, []byte]
	measured memo[*geom.Sheet, *check.Report]
}

// fileSheets is one file's pipeline result and its laid-out sheets.
type fileSheets struct {
	sync.Mutex
	res    *pipeline.Result
	sheets map[sheetKey]*laidSheet
	pages  map[pageKey][]*geom.Sheet
}

// pageKey is a view cut onto a paper (IEC symbols).
type pageKey struct {
	view  render.View
	paper string
}

type sheetKey struct {
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

var bothStyles = []render.Style{render.IEC, render.IEEE}

// fileEntry is file's entry in the cache, made on first use.
func fileEntry(file string) *fileSheets {
	sheetCache.Lock()
	defer sheetCache.Unlock()
	fs, ok := sheetCache.files[file]
	if !ok {
		if sheetCache.files == nil {
			sheetCache.files = map[string]*fileSheets{}
		}
		fs = &fileSheets{sheets: map[sheetKey]*laidSheet{}, pages: map[pageKey][]*geom.Sheet{}}
		sheetCache.files[file] = fs
	}
	return fs
}

// result is sheetsOf at level signal; the caller holds fs's lock.
func (fs *fileSheets) result(file string) (*pipeline.Result, error) {
	if fs.res != nil {
		return fs.res, nil
	}
	res, err := pipeline.Run(pipeline.Options{Path: file, Level: rules.LevelSignal, Until: pipeline.PhaseStages})
	if err != nil {
		return nil, fmt.Errorf("%s: %w", file, err)
	}
	fs.res = res
	return res, nil
}

// sheet lays out one view in one symbol style and measures it with the
// checker; the caller holds fs's lock.
func (fs *fileSheets) sheet(file string, k sheetKey) (*laidSheet, error) {
	if s, ok := fs.sheets[k]; ok {
		return s, nil
	}
	res, err := fs.result(file)
	if err != nil {
		return nil, err
	}
	g, err := render.Config{Style: k.style}.Geometry(res.Sheet(k.view))
	if err != nil {
		return nil, fmt.Errorf("%s %s %s: %w", file, k.view, k.style, err)
	}
	s := &laidSheet{g: g, report: measured(g)}
	fs.sheets[k] = s
	return s, nil
}

// paged cuts one view onto paper (render.Config.Geometries, IEC); the caller
// holds fs's lock.
func (fs *fileSheets) paged(file string, v render.View, paper string) ([]*geom.Sheet, error) {
	k := pageKey{v, paper}
	if p, ok := fs.pages[k]; ok {
		return p, nil
	}
	res, err := fs.result(file)
	if err != nil {
		return nil, err
	}
	pp, err := render.ParsePaper(paper)
	if err != nil {
		return nil, err
	}
	p, err := render.Config{Page: pp}.Geometries(res.Sheet(v))
	if err != nil {
		return nil, fmt.Errorf("%s %s on %s: %w", file, v, paper, err)
	}
	fs.pages[k] = p
	return p, nil
}

// geometries is one view as one sheet (IEC) or cut onto paper; the caller
// holds fs's lock.
func (fs *fileSheets) geometries(file string, v render.View, onPaper bool, paper string) ([]*geom.Sheet, error) {
	if onPaper {
		return fs.paged(file, v, paper)
	}
	s, err := fs.sheet(file, sheetKey{v, render.IEC})
	if err != nil {
		return nil, err
	}
	return []*geom.Sheet{s.g}, nil
}

// cachedPages is one view of a file cut onto paper, once.
func cachedPages(file string, v render.View, paper string) ([]*geom.Sheet, error) {
	fs := fileEntry(file)
	fs.Lock()
	defer fs.Unlock()
	return fs.paged(file, v, paper)
}

// measured is the checker's report on g, measured once per sheet: the
// whole sheets and the pages the cache holds are read by several checks
// (frames, wire boxes, feed order, mixers, paging, earths), each of which
// measured every page again. The report is shared: a test that changes
// one changes a copy.
func measured(g *geom.Sheet) *check.Report {
	r, _ := sheetCache.measured.get(g, func() (*check.Report, error) { return check.Measure(g), nil })
	return r
}

// cachedResult is sheetsOf at level signal, once per file.
func cachedResult(t *testing.T, file string) *pipeline.Result {
	t.Helper()
	res, err := resultOnce(file)
	if err != nil {
		t.Fatal(err)
	}
	return res
}

func resultOnce(file string) (*pipeline.Result, error) {
	fs := fileEntry(file)
	fs.Lock()
	defer fs.Unlock()
	return fs.result(file)
}

// cachedSheet lays out one view of a file in one symbol style, once, and
// measures it with the checker.
func cachedSheet(t *testing.T, file string, v render.View, st render.Style) *laidSheet {
	t.Helper()
	s, err := laidOut(file, v, st)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func laidOut(file string, v render.View, st render.Style) (*laidSheet, error) {
	fs := fileEntry(file)
	fs.Lock()
	defer fs.Unlock()
	return fs.sheet(file, sheetKey{v, st})
}

// warmSheets lays out every view in both symbol styles of every file, and
// on paper when given one, a file per core at a time, so the tests that
// read them one after another find them made. A file that fails is left
// for the test that reads it to report.
func warmSheets(files []string, paper string) {
	eachAtOnce(len(files), func(i int) {
		for _, v := range drawViews {
			for _, st := range bothStyles {
				if _, err := laidOut(files[i], v, st); err != nil {
					return
				}
			}
			if paper != "" {
				if _, err := cachedPages(files[i], v, paper); err != nil {
					return
				}
			}
		}
	})
}

// cachedDraw is the output of `pare draw FILE --view V -o - --page none`
// (the whole sheet, as the committed example sheets show it on a screen),
// run once.
func cachedDraw(t *testing.T, file string, v render.View) []byte {
	t.Helper()
	out, err := drawOnce(file, v)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

func drawOnce(file string, v render.View) ([]byte, error) {
	return sheetCache.drawn.get(drawKey{file, v}, func() ([]byte, error) {
		var out, errb bytes.Buffer
		if code := run([]string{"draw", file, "-o", "-", "--view", v.String(), "--page", "none"}, &out, &errb); code != exitOK {
			return nil, fmt.Errorf("pare draw %s --view %s --page none: exit %d: %s", file, v, code, errb.String())
		}
		return out.Bytes(), nil
	})
}

// warmDraws runs `pare draw` on every file in every view, as many at a time
// as there are cores (each run is independent, in-process); a run
// that fails is reported by the test that reads it.
func warmDraws(files []string) {
	eachAtOnce(len(files)*len(drawViews), func(i int) {
		drawOnce(files[i/len(drawViews)], drawViews[i%len(drawViews)])
	})
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
