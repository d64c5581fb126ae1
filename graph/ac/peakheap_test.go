package ac

import (
	"runtime/metrics"
	"sync"
	"time"
)

// peakLive watches the live heap (as of each collection's end) while a
// benchmark runs and gives the largest it saw, in megabytes: what a
// comparison keeps at once, which sets the main job's peak resident memory
// on a whole set (docs/performance.md). Sampling misses nothing between
// collections, since the figure changes only at one.
type peakLive struct {
	mu   sync.Mutex
	peak uint64
	done chan struct{}
	wg   sync.WaitGroup
}

func watchLive() *peakLive {
	w := &peakLive{done: make(chan struct{})}
	w.wg.Add(1)
	go func() {
		defer w.wg.Done()
		s := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
		t := time.NewTicker(2 * time.Millisecond)
		defer t.Stop()
		for {
			metrics.Read(s)
			w.mu.Lock()
			w.peak = max(w.peak, s[0].Value.Uint64())
			w.mu.Unlock()
			select {
			case <-w.done:
				return
			case <-t.C:
			}
		}
	}()
	return w
}

// stop ends the watch and returns the peak in megabytes.
func (w *peakLive) stop() float64 {
	close(w.done)
	w.wg.Wait()
	return float64(w.peak) / (1 << 20)
}
