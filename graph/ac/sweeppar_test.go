package ac

import (
	"fmt"
	"math"
	"path/filepath"
	"runtime"
	"slices"
	"testing"

	"pare/graph"
)

// TestSweepPointsIsLoop: on every example and fixture circuit, a transfer
// and an impedance swept with the points shared between cores (however
// small the system) and only the unknowns read solved (solveRHSFrom) give
// the voltages of the one-by-one loop of whole solves to the bit, and its
// error, also with a frequency that is no frequency midway; the loop
// chooses fresh pivots after the first point on some of them, so the
// handover from the cores back to the loop is exercised.
func TestSweepPointsIsLoop(t *testing.T) {
	defer func(w, p int) { parallelWork = w; runtime.GOMAXPROCS(p) }(parallelWork, runtime.GOMAXPROCS(2))
	parallelWork = 0
	var files []string
	for _, pat := range []string{"../../examples/*.toml", "../../testdata/good/*.toml", "../../testdata/osc/*.toml", "../../testdata/review13/*.toml"} {
		m, _ := filepath.Glob(pat)
		files = append(files, m...)
	}
	if len(files) < 20 {
		t.Fatalf("only %d circuits", len(files))
	}
	freqs := logSweep(10, 1e8, 300)
	broken := slices.Clone(freqs)
	broken[150] = math.NaN()
	swept, fresh := 0, 0
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		in, _, _ := graph.InferredInput(c)
		if len(c.Inputs) > 0 {
			in = c.Inputs[0]
		}
		if in == "" {
			continue
		}
		nl, err := elaborate(c, Options{VarFrac: 0.5, VarSet: true})
		if err != nil {
			continue
		}
		node, ok := nl.netNode[in]
		if !ok || node == 0 {
			continue
		}
		out := graph.FarthestNet(c, in)
		outNode, ok := nl.netNode[out]
		if out == "" || !ok {
			continue
		}
		for _, fs := range [][]float64{freqs, broken} {
			for _, driven := range []int{node, -1} {
				var rhs func(*system)
				if driven < 0 {
					rhs = func(s *system) { clear(s.b); s.b[s.unk[node]] = 1 }
				}
				read := []int{outNode, node}
				one, err := newSystem(nl, driven)
				if err != nil || one.unk[node] == unkGround {
					continue
				}
				two, _ := newSystem(nl, driven)
				want, renewed, wantErr := loopAll(one, fs, rhs, read)
				got := make([]complex128, len(read)*len(fs))
				gotErr := sweepPoints(two, fs, two.lowestStep(read), rhs, func(k int, s *system) {
					for i, n := range read {
						got[k*len(read)+i] = s.voltage(n)
					}
				})
				if (wantErr == nil) != (gotErr == nil) || wantErr != nil && wantErr.Error() != gotErr.Error() {
					t.Errorf("%s: error %v, the loop's %v", f, gotErr, wantErr)
				}
				if wantErr == nil && !sameVector(got, want) {
					t.Errorf("%s (driven %d): shared points differ from the loop's", f, driven)
				}
				swept++
				fresh += renewed
			}
		}
	}
	t.Logf("%d sweeps, %d fresh pivot orders after the first point", swept, fresh)
	if swept < 40 || fresh == 0 {
		t.Errorf("%d sweeps, %d fresh pivot orders: the test does not reach the loop's handover", swept, fresh)
	}
}

// loopAll is the one-by-one loop with whole solves, with the voltages of
// the nodes read at every point and the number of points where the pivots
// were chosen afresh.
func loopAll(s *system, freqs []float64, rhs func(*system), read []int) ([]complex128, int, error) {
	out := make([]complex128, len(read)*len(freqs))
	renewed := 0
	var prow []int
	for k, f := range freqs {
		if !validHz(f) {
			return nil, renewed, fmt.Errorf("frequency %g: must be a positive number of hertz", f)
		}
		if err := s.solveAt(f); err != nil {
			return nil, renewed, err
		}
		if rhs != nil {
			rhs(s)
		}
		if err := s.solveRHS(f); err != nil {
			return nil, renewed, err
		}
		if k > 0 && s.n > 0 && !slices.Equal(prow, s.f.prow) {
			renewed++
		}
		if s.n > 0 {
			prow = append(prow[:0], s.f.prow...)
		}
		for i, n := range read {
			out[k*len(read)+i] = s.voltage(n)
		}
	}
	return out, renewed, nil
}

func sameVector(a, b []complex128) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Float64bits(real(a[i])) != math.Float64bits(real(b[i])) || math.Float64bits(imag(a[i])) != math.Float64bits(imag(b[i])) {
			return false
		}
	}
	return true
}
