package ac

import (
	"reflect"
	"testing"

	"pare/graph"
	"pare/graph/value"
)

// The remembered loop search is the search solved afresh on the same
// system, and a circuit that differs anywhere the loop's block reaches
// (a value, the gang setting, the sign) is solved anew, not handed a
// neighbour's result. The check values are the solver's own fresh search
// (loopSystem.find on a system nothing else has touched).
func TestLoopCacheIsTheFreshSearch(t *testing.T) {
	c, err := graph.LoadFile("testdata/hartley-xtal.toml")
	if err != nil {
		t.Fatal(err)
	}
	detuned := c.Clone()
	detuned.Part("C3").Value = value.Range{Min: 150e-12, Max: 150e-12}
	cases := []struct {
		name string
		c    *graph.Circuit
		o    LoopOptions
	}{
		{"low end", c, LoopOptions{Options: Options{VarFrac: 0, VarSet: true}}},
		{"high end", c, LoopOptions{Options: Options{VarFrac: 1, VarSet: true}}},
		{"turned over", c, LoopOptions{Options: Options{VarFrac: 1, VarSet: true}, Inverted: true}},
		{"other feedback capacitor", detuned, LoopOptions{Options: Options{VarFrac: 1, VarSet: true}}},
		{"copy of the first", c.Clone(), LoopOptions{Options: Options{VarFrac: 0, VarSet: true}}},
	}
	var prev []Loop
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := NewLoops(tc.c).Find("V1", tc.o)
			if err != nil {
				t.Fatal(err)
			}
			ls, err := NewLoops(tc.c).system("V1", tc.o.Options)
			if err != nil {
				t.Fatal(err)
			}
			loopCache.Lock()
			_, kept := loopCache.m[ls.key(tc.o, 0)]
			loopCache.Unlock()
			if !kept {
				t.Errorf("the search is not remembered")
			}
			want, err := ls.find(tc.o)
			if err != nil {
				t.Fatal(err)
			}
			want.Ref, want.Frac = "V1", tc.o.VarFrac
			if !reflect.DeepEqual(got, want) {
				t.Errorf("remembered %+v, solved afresh %+v", got, want)
			}
			if len(got.Crossings) == 0 {
				t.Errorf("no crossing: the case checks nothing")
			}
			for i, p := range prev {
				if tc.name != "copy of the first" && reflect.DeepEqual(p.Crossings, got.Crossings) {
					t.Errorf("same crossings as case %d: a neighbour's result", i)
				}
			}
			prev = append(prev, got)
		})
	}
}
