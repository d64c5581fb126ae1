package ac

import (
	"math/rand/v2"
	"slices"
	"testing"

	"pare/graph"
	"pare/graph/value"
	"pare/internal/synth"
)

// TestRunsMatchPointByPoint: a probe solved a run of frequencies at a time
// (atMany) gives every response to the last bit as solving the points one
// by one in the same order (at), over every quantity Compare would sweep
// in the examples, the fixtures and a bank, at three gang settings, with
// the points in the order a sweep gives them (a grid, then points between
// its neighbours in no order) so that kept pivots go stale and are chosen
// afresh part way through a run. The test counts the pivot orders that
// changed, so that it fails if it stops covering them.
func TestRunsMatchPointByPoint(t *testing.T) {
	files := append([]string{"testdata/two-inputs.toml", "testdata/hartley-xtal.toml", "testdata/if-pair.toml",
		"testdata/fm-discriminator.toml", "testdata/bjt-stage.toml"}, exampleFiles(t)...)
	var circuits []*graph.Circuit
	for _, f := range files {
		circuits = append(circuits, load(t, f))
	}
	bank, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	circuits = append(circuits, bank)
	rng := rand.New(rand.NewPCG(1, 2))
	repivots, points := 0, 0
	for _, c := range circuits {
		qs := quantities(c, c, &Report{})
		for _, frac := range []float64{0, 0.5, 1} {
			m, err := newModel(c, Options{VarSet: true, VarFrac: frac}, &dcShare{})
			if err != nil {
				t.Fatal(err)
			}
			for _, q := range qs {
				fs := sweepOrder(q.bands, rng)
				r, n := runMatches(t, m, q, fs)
				repivots += r
				points += n
			}
		}
	}
	if repivots == 0 {
		t.Errorf("no pivot order changed in %d points: the test no longer covers a stale pivot within a run", points)
	}
	t.Logf("%d points, %d changes of pivot order", points, repivots)
}

// sweepOrder is a coarse log grid over the bands, then points between
// neighbours of it in random order, some of them twice.
func sweepOrder(bands []value.Range, rng *rand.Rand) []float64 {
	var fs []float64
	for _, b := range bands {
		fs = append(fs, logSweep(b.Min, b.Max, 60)...)
	}
	grid := slices.Clone(fs)
	slices.Sort(grid)
	for range 90 {
		i := rng.IntN(len(grid) - 1)
		fs = append(fs, logSweepInner(grid[i], grid[i+1], 3)...)
	}
	return fs
}

// runMatches solves quantity q of model m at fs both ways and compares;
// it returns the changes of pivot order seen point by point and the
// points compared.
func runMatches(t *testing.T, m *model, q quantity, fs []float64) (int, int) {
	t.Helper()
	one, err1 := newProbe(m, q.what, q.from, q.to)
	many, err2 := newProbe(m, q.what, q.from, q.to)
	if err1 != nil || err2 != nil {
		return 0, 0 // an open input: nothing to solve
	}
	fs = (&pairSweep{}).firstOfEach(fs)
	want := make([]complex128, 0, len(fs))
	var wantErr error
	repivots := 0
	var prow []int
	for _, f := range fs {
		v, err := one.at(f)
		if err != nil {
			wantErr = err
			break
		}
		want = append(want, v)
		if one.s != nil && one.s.f != nil {
			if prow != nil && !slices.Equal(prow, one.s.f.prow) {
				repivots++
			}
			prow = append(prow[:0], one.s.f.prow...)
		}
	}
	got := make([]complex128, len(fs))
	n, err := many.atMany(fs, got)
	if n != len(want) || (err == nil) != (wantErr == nil) || (err != nil && err.Error() != wantErr.Error()) {
		t.Fatalf("%s %s→%s: %d points then %v, want %d then %v", q.what, q.from, q.to, n, err, len(want), wantErr)
	}
	for i := range want {
		if !sameBits(real(got[i]), real(want[i])) || !sameBits(imag(got[i]), imag(want[i])) {
			t.Fatalf("%s %s→%s at %g Hz (point %d): run %v, one by one %v", q.what, q.from, q.to, fs[i], i, got[i], want[i])
		}
	}
	return repivots, n
}

// TestSameSystemSweep: two probes of one system, swept in full as two
// (sweepPair: the coarse grid and every refinement round, each side solved
// apart), give exactly the pair sweepSame gives from the coarse grid
// alone: 0 dB and 0° at the first point. Over every quantity of the
// examples and fixtures at three gang settings.
func TestSameSystemSweep(t *testing.T) {
	files := append([]string{"testdata/two-inputs.toml", "testdata/hartley-xtal.toml", "testdata/if-pair.toml"}, exampleFiles(t)...)
	swept := 0
	for _, file := range files {
		c := load(t, file)
		marks := landmarks(c)
		for _, frac := range []float64{0, 0.5, 1} {
			m, err := newModel(c, Options{VarSet: true, VarFrac: frac}, &dcShare{})
			if err != nil {
				t.Fatal(err)
			}
			for _, q := range quantities(c, c, &Report{}) {
				po, err1 := newProbe(m, q.what, q.from, q.to)
				pr, err2 := newProbe(m, q.what, q.from, q.to)
				ps, err3 := newProbe(m, q.what, q.from, q.to)
				if err1 != nil || err2 != nil || err3 != nil || po.zero || po.silent {
					continue
				}
				if po.key() != pr.key() {
					t.Fatalf("%s: %s %s→%s: two probes of one system have different digests", file, q.what, q.from, q.to)
				}
				want, err := sweepPair(po, pr, q.bands, CompareOptions{Points: 100, TolDB: DefaultTolDB, TolDeg: DefaultTolDeg}, marks)
				if err != nil {
					t.Fatal(err)
				}
				got, err := sweepSame(ps, q.bands, 100, marks)
				if err != nil {
					t.Fatal(err)
				}
				if got != want {
					t.Errorf("%s: %s %s→%s: sweepSame %+v, sweepPair %+v", file, q.what, q.from, q.to, got, want)
				}
				swept++
			}
		}
	}
	if swept == 0 {
		t.Fatal("no quantity swept")
	}
}
