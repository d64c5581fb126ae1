package ac

import (
	"errors"
	"math"
	"testing"
)

func TestSolveReal(t *testing.T) {
	// Nodal matrices stamped as a caller stamps them: a conductance g
	// between nodes i and j adds g at (i,i) and (j,j), -g at (i,j) and (j,i);
	// to ground only the diagonal.
	cases := []struct {
		name    string
		n       int
		entries []Entry
		b, want []float64
		source  string
	}{{
		// 1 A into 1 kΩ in series with 2 kΩ to ground: 3 kΩ, so 3000 V and 2000 V.
		name: "series resistors", n: 2,
		entries: []Entry{{0, 0, 1e-3}, {1, 1, 1e-3}, {0, 1, -1e-3}, {1, 0, -1e-3}, {1, 1, 0.5e-3}},
		b:       []float64{1, 0}, want: []float64{3000, 2000},
		source: "Ohm's law, series resistances add",
	}, {
		// a zero diagonal: only a row exchange solves it
		name: "needs pivoting", n: 2,
		entries: []Entry{{0, 1, 1}, {1, 0, 1}},
		b:       []float64{2, 3}, want: []float64{3, 2},
		source: "by inspection: x1 = 2, x0 = 3",
	}, {
		// 1 A into the middle of 1 kΩ and 1 kΩ to ground, each end via 1 kΩ:
		// a 1 kΩ arm in parallel with 2 kΩ, 666.7 Ω.
		name: "bridge of three nodes", n: 3,
		entries: []Entry{
			{0, 0, 2e-3}, {0, 1, -1e-3}, {1, 0, -1e-3}, {0, 2, -1e-3}, {2, 0, -1e-3},
			{1, 1, 1e-3}, {1, 1, 1e-3},
			{2, 2, 1e-3}, {2, 2, 1e-3}, {2, 1, 0}, // an explicit zero stamp changes nothing
		},
		b: []float64{1, 0, 0}, want: []float64{1000, 500, 500},
		source: "derived: node 0 sees two 2 kΩ paths to ground, 1 kΩ; each midpoint half of that",
	}}
	for _, tc := range cases {
		got, err := SolveReal(tc.n, tc.entries, tc.b)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for i := range tc.want {
			if math.Abs(got[i]-tc.want[i]) > 1e-9*math.Abs(tc.want[i]) {
				t.Errorf("%s: x[%d] = %g, want %g (%s)", tc.name, i, got[i], tc.want[i], tc.source)
			}
		}
	}
}

func TestSolveRealRefuses(t *testing.T) {
	// node 1 is stamped by nothing: no equation fixes it
	if _, err := SolveReal(2, []Entry{{0, 0, 1}}, []float64{1, 0}); !errors.Is(err, ErrSingular) {
		t.Errorf("floating node: err %v, want ErrSingular", err)
	}
	if _, err := SolveReal(1, []Entry{{0, 1, 1}}, []float64{1}); err == nil {
		t.Error("entry outside the system accepted")
	}
	if _, err := SolveReal(2, nil, []float64{1}); err == nil {
		t.Error("short right-hand side accepted")
	}
}
