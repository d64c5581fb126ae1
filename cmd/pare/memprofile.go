package main

import (
	"os"
	"runtime/metrics"
	"runtime/pprof"
	"time"
)

// memProfileEnv names a file to write a heap profile of the job to, taken
// at the largest live heap the job reached. Hidden like profileEnv: it
// serves the memory work (docs/performance.md). A heap profile written at
// the end shows what is live then, which for a main job is the written
// sheets and little else; the peak resident memory is set mid-drawing, so
// the profile is rewritten whenever a collection finds more live than any
// before it (pprof's heap profile is as of the last collection).
const memProfileEnv = "PARE_MEMPROFILE"

// memPeakStep is how much the live heap must grow past the last profiled
// peak before the profile is written again: writing one walks every
// sampled allocation site, so a heap that creeps up is not rewritten at
// every collection.
const memPeakStep = 1.05

// startMemProfile starts the watcher if memProfileEnv names a file and
// returns the function that stops it. A file that cannot be written is
// reported once and the job runs unwatched.
func startMemProfile() func() {
	path := os.Getenv(memProfileEnv)
	if path == "" {
		return func() {}
	}
	w := &peakWatch{path: path, done: make(chan struct{}), stopped: make(chan struct{})}
	go w.run()
	return func() {
		close(w.done)
		<-w.stopped
	}
}

// peakWatch polls the live heap and keeps the profile of its peak.
type peakWatch struct {
	path          string
	peak          uint64
	done, stopped chan struct{}
}

func (w *peakWatch) run() {
	defer close(w.stopped)
	sample := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	tick := time.NewTicker(50 * time.Millisecond)
	defer tick.Stop()
	for {
		select {
		case <-w.done:
			if w.peak == 0 {
				w.write() // a job shorter than a tick still gets its profile
			}
			return
		case <-tick.C:
		}
		metrics.Read(sample)
		if sample[0].Value.Kind() != metrics.KindUint64 {
			return
		}
		live := sample[0].Value.Uint64()
		if float64(live) <= float64(w.peak)*memPeakStep {
			continue
		}
		w.peak = live
		if !w.write() {
			return
		}
	}
}

// write replaces the profile file with the heap profile as of now.
func (w *peakWatch) write() bool {
	f, err := os.Create(w.path)
	if err == nil {
		err = pprof.Lookup("heap").WriteTo(f, 0)
		if cerr := f.Close(); err == nil {
			err = cerr
		}
	}
	if err != nil {
		os.Stderr.WriteString("pare: " + memProfileEnv + ": " + err.Error() + "\n")
		return false
	}
	return true
}
