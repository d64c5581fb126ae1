// Package testmain is what the packages with long tests run before their
// tests: the collector setting the pare command itself runs under.
//
// The command lets the heap grow to five times what is live before the
// collector runs (cmd/pare's tuneCollector: at the default, the collector's
// preemption of the solver's and the router's inner loops cost the main job
// on the flagship a quarter of its CPU). A test binary runs that same code
// many times over, so at the default it paid the same share: the sheet
// checks' first laying out of every sheet took 16.5 s of CPU at GOGC 100
// and 13.5 s at 400 (two paired runs each, load 16; 120 MB peak against
// 260 MB). Nothing a test checks depends on when the collector runs.
package testmain

import (
	"os"
	"runtime/debug"
	"testing"
)

// gcPercent is the command's setting; memoryLimit the soft ceiling past
// which the collector runs whatever gcPercent says: above the command's
// 256 MiB, since a test binary keeps every example's sheets and runs in
// memory for its tests to share.
const (
	gcPercent   = 400
	memoryLimit = 1 << 30
)

// Collector sets the collector as the command sets it, unless GOGC or
// GOMEMLIMIT is in the environment (a run measuring the collector keeps its
// own).
func Collector() {
	_, gogc := os.LookupEnv("GOGC")
	_, limit := os.LookupEnv("GOMEMLIMIT")
	if gogc || limit {
		return
	}
	debug.SetGCPercent(gcPercent)
	debug.SetMemoryLimit(memoryLimit)
}

// Main is a package's TestMain: Collector, then the tests.
func Main(m *testing.M) {
	Collector()
	os.Exit(m.Run())
}
