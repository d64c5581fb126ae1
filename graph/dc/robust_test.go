package dc

import (
	"math"
	"math/rand/v2"
	"path/filepath"
	"testing"
	"time"

	"pare/graph"
)

// TestWildValuesNeverHang scales every resistor and every valve's stated
// current of each example and fixture by random factors over six decades
// (fixed seed): the solver must either settle, with finite voltages, or say
// which nets would not, within a bounded time; never panic.
func TestWildValuesNeverHang(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	files := dcFiles(t)
	more, _ := filepath.Glob("../ac/testdata/*.toml")
	files = append(files, more...)
	settled, gaveUp := 0, 0
	for _, file := range files {
		for trial := 0; trial < 5; trial++ {
			c := load(t, file)
			for _, p := range c.Parts {
				f := math.Pow(10, rng.Float64()*6-3)
				if p.Kind == graph.Resistor {
					p.Value.Min *= f
					p.Value.Max *= f
				} else if ia, ok := p.Param("ia"); ok {
					p.Params["ia"] = ia * f
				}
			}
			start := time.Now()
			pt, err := Solve(c)
			// The bound is on a hang, not on speed: Newton runs are capped by
			// maxIter, so only a loop outside them could pass two minutes,
			// while a loaded two-core machine has taken 20 s to settle.
			if d := time.Since(start); d > 2*time.Minute {
				t.Errorf("%s trial %d: %v to settle or give up", file, trial, d)
			}
			if err != nil {
				if !IsNoConvergence(err) {
					t.Logf("%s trial %d: %v", file, trial, err)
				}
				gaveUp++
				continue
			}
			settled++
			for _, n := range pt.Nets {
				if math.IsNaN(n.Volts) || math.IsInf(n.Volts, 0) {
					t.Errorf("%s trial %d: net %s at %v", file, trial, n.Name, n.Volts)
				}
			}
		}
	}
	t.Logf("%d settled, %d gave up with a message", settled, gaveUp)
}
