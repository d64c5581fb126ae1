package stages

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
)

// TestSeriesCoilTanks: an aerial tank whose coil is two windings in series
// (a long-wave loading winding on the rod with the medium-wave one) or a
// winding with a separate loading coil is one tuned circuit, named as the
// aerial circuit, and its range is the solver's across the gang. The
// check values are ngspice's peak of V(ant_tank) driven through the top
// coupling capacitor, at the gang's least and greatest.
func TestSeriesCoilTanks(t *testing.T) {
	for _, tc := range []struct {
		path, topology string
		parts          []string
		lo, hi         float64 // Hz
		source         string
	}{
		{filepath.Join("..", "..", "testdata", "review21", "b05.toml"), "tuned-winding-series", []string{"T1", "TC4", "VC1a"},
			149.8e3, 400.6e3, "ngspice 39, testdata/review21/spice/b/c05fe_lw.cir (the reviewer's deck; RESULTS.md)"},
		{filepath.Join("..", "..", "cmd", "internal", "align", "testdata", "lw-loading-coil.toml"), "tuned-winding-loading-coil", []string{"L1", "T1", "TC4", "VC1b"},
			162.8e3, 424.9e3, "ngspice 39, cmd/internal/align/testdata/lw-loading-coil-aerial.cir (the same deck, the loading winding uncoupled)"},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			c, err := graph.LoadFile(tc.path)
			if err != nil {
				t.Fatal(err)
			}
			for _, s := range []string{"S1a", "S1b", "S1c"} {
				c.Part(s).Set = 2 // long wave
			}
			st := findReduced(t, c)
			s := stageOf(st, tc.topology)
			if s == nil {
				t.Fatalf("no %s stage: %s", tc.topology, topologies(st))
			}
			if !slices.Equal(s.Parts, tc.parts) {
				t.Errorf("parts %v, want %v", s.Parts, tc.parts)
			}
			f, ok := s.Figures.Get("f")
			if !ok || f.Range == nil {
				t.Fatalf("no tuning range: %v", s.Figures)
			}
			for _, e := range []struct{ got, want float64 }{{f.Range.Min, tc.lo}, {f.Range.Max, tc.hi}} {
				if math.Abs(e.got-e.want)/e.want > 0.005 {
					t.Errorf("f %g Hz, want %g Hz within 0.5 %% (%s)", e.got, e.want, tc.source)
				}
			}
		})
	}
}

// TestJoinSeries: two coils in series are L1 + L2 + 2M when the current
// runs start to finish through both and L1 + L2 − 2M when it runs through
// one backwards (handbook: series-aiding and series-opposing inductors);
// nets 1 and 2 are the ends, 5 the junction. 330 µH and 2.7 mH at k 0.3:
// M = 0.3·√(330µ·2.7m) = 283.2 µH (by hand).
func TestJoinSeries(t *testing.T) {
	l1, l2, k := 330e-6, 2.7e-3, 0.3
	m := k * math.Sqrt(l1*l2)
	for _, tc := range []struct {
		name   string
		e1, e2 coilEnds
		want   float64
		a, b   int
	}{
		{"aiding", coilEnds{a: 1, b: 5, l: l1}, coilEnds{a: 5, b: 2, l: l2}, l1 + l2 + 2*m, 1, 2},
		{"aiding, both backwards", coilEnds{a: 5, b: 1, l: l1}, coilEnds{a: 2, b: 5, l: l2}, l1 + l2 + 2*m, 1, 2},
		{"opposing at the finishes", coilEnds{a: 1, b: 5, l: l1}, coilEnds{a: 2, b: 5, l: l2}, l1 + l2 - 2*m, 1, 2},
		{"opposing at the starts", coilEnds{a: 5, b: 1, l: l1}, coilEnds{a: 5, b: 2, l: l2}, l1 + l2 - 2*m, 1, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, ok := joinSeries("T1", tc.e1, tc.e2, k)
			if !ok {
				t.Fatal("not joined")
			}
			if math.Abs(c.l-tc.want) > 1e-12 || c.a != tc.a || c.b != tc.b || c.sec.mid != 5 {
				t.Errorf("L %g ends %d–%d junction %d, want %g ends %d–%d junction 5", c.l, c.a, c.b, c.sec.mid, tc.want, tc.a, tc.b)
			}
			if s := c.sec.nA + c.sec.nB; math.Abs(s-1) > 1e-12 {
				t.Errorf("section shares add to %g, want 1", s)
			}
		})
	}
	if _, ok := joinSeries("T1", coilEnds{a: 1, b: 2, l: l1}, coilEnds{a: 3, b: 4, l: l2}, k); ok {
		t.Error("joined two coils that share no net")
	}
}
