package align

import (
	"sync"

	"pare/graph"
	"pare/graph/safety"
	"pare/rules/stages"
)

// Reaches shares the trimmer-and-core reach searches (reachOf) between
// the guides made of one circuit. The main job makes the procedure three
// times over the same circuit as captured: the marks of each view's sheet
// and the repair note's guide; the reach search, a few hundred tank solves
// per short tank, was most of each. A search is a function of the circuit
// and its arguments alone, so the first answer is the answer of every
// later call with the same ones: what is printed stays the same.
//
// The circuits searched must not change while a Reaches holds them (the
// main job's circuit as captured does not). A Reaches is safe for the
// views drawn side by side: a search asked twice at once runs once, the
// second caller waiting for it.
type Reaches struct {
	mu sync.Mutex
	m  map[reachKey]*reachDone
}

// reachKey is one search's arguments: the circuit (by identity), the gang
// section's ref and the figures it is judged on.
type reachKey struct {
	c                *graph.Circuit
	gang             string
	lo, hi, wLo, wHi float64
}

// reachDone is one search, run once.
type reachDone struct {
	once sync.Once
	r    tankReach
	ok   bool
}

// NewReaches is an empty set of shared searches.
func NewReaches() *Reaches { return &Reaches{m: map[reachKey]*reachDone{}} }

// of is reachOf, answered from an earlier search with the same arguments
// when there was one (rs nil: searched afresh).
func (rs *Reaches) of(c *graph.Circuit, gang *graph.Part, lo, hi, wLo, wHi float64) (tankReach, bool) {
	if rs == nil {
		return reachOf(c, gang, lo, hi, wLo, wHi)
	}
	k := reachKey{c, gang.Ref, lo, hi, wLo, wHi}
	rs.mu.Lock()
	d := rs.m[k]
	if d == nil {
		d = &reachDone{}
		rs.m[k] = d
	}
	rs.mu.Unlock()
	d.once.Do(func() { d.r, d.ok = reachOf(c, gang, lo, hi, wLo, wHi) })
	return d.r, d.ok
}

// Build is the package's Build with its reach searches shared.
func (rs *Reaches) Build(title string, c *graph.Circuit, sts []stages.Stage, caution safety.Caution) *Guide {
	return build(title, c, sts, caution, rs)
}

// Marks is the package's Marks with its reach searches shared.
func (rs *Reaches) Marks(c *graph.Circuit, sts []stages.Stage, run Runner) map[string]string {
	return marks(c, sts, run, rs)
}
