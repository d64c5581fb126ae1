package dc

import (
	"bytes"
	"fmt"
	"math"
	"path/filepath"
	"sort"
	"strings"
	"sync"
	"testing"

	"pare/internal/reftool"
)

// suiteMeter is the meter of the injected-fault suite: 20 kΩ/V, each reading
// on the lowest standard range above the healthy set's voltage (common
// practice).
const suiteOhmsPerVolt = 20e3

// TestInjectedFaults is the injected-fault suite: for every example and
// fixture and every single fault of the dictionary, ngspice 39 `.op` on the
// faulty deck (meter in place, one reading at a time) gives the readings at
// the standard test points; pare ranks the faults from those readings. A
// fault whose readings all lie within tolerance of the healthy chart cannot
// be told from a healthy set and is listed, not counted; candidates with
// the same score (an ambiguity group, Bandler and Salama 1985) share a rank.
//
// The files run side by side (one Point each: a Point's caches are not
// shared between goroutines), and one ngspice process reads every fault of
// a file (faultBatch), so the suite costs what the solves and the ranking
// cost, not hundreds of process starts.
func TestInjectedFaults(t *testing.T) {
	if testing.Short() {
		t.Skip("the injected-fault suite runs ngspice once per file on every fault")
	}
	bin := reftool.Find(t, reftool.Ngspice)
	var tally faultTally
	t.Run("files", func(t *testing.T) {
		for _, file := range dcFiles(t) {
			if strings.Contains(file, "every-kind") {
				continue // not a working circuit (its own header says so)
			}
			t.Run(filepath.Base(file), func(t *testing.T) {
				t.Parallel()
				tally.add(injectFile(t, bin, file))
			})
		}
	})
	total, first, top3 := tally.total, tally.first, tally.top3
	sort.Strings(tally.misses)
	sort.Strings(tally.hidden)
	t.Logf("%d detectable faults: first %d (%.1f %%), top three %d (%.1f %%); %d not detectable",
		total, first, 100*float64(first)/float64(total), top3, 100*float64(top3)/float64(total), len(tally.hidden))
	for _, m := range tally.misses {
		t.Logf("miss: %s", m)
	}
	for _, h := range tally.hidden {
		t.Logf("not detectable at the test points: %s", h)
	}
	if total == 0 || float64(first) < 0.9*float64(total) || float64(top3) < 0.98*float64(total) {
		t.Errorf("ranking below the bar: first %d/%d, top three %d/%d (need 90 %% and 98 %%)", first, total, top3, total)
	}
}

// faultTally is the suite's count, summed over the files.
type faultTally struct {
	sync.Mutex
	total, first, top3 int
	misses, hidden     []string
}

func (a *faultTally) add(b *faultTally) {
	a.Lock()
	defer a.Unlock()
	a.total += b.total
	a.first += b.first
	a.top3 += b.top3
	a.misses = append(a.misses, b.misses...)
	a.hidden = append(a.hidden, b.hidden...)
}

// injectFile runs the suite on one file: every fault's deck in one ngspice
// run, then pare's ranking of each fault's readings.
func injectFile(t *testing.T, bin, file string) *faultTally {
	pt, err := Solve(load(t, file))
	if err != nil {
		t.Fatal(err)
	}
	nets, ohms := suitePoints(t, pt)
	var faults []Fault
	var decks []string
	for _, f := range pt.Faults() {
		sim, err := pt.Simulate(f)
		if err != nil {
			t.Errorf("%s %s: %v", file, f, err)
			continue
		}
		var deck bytes.Buffer
		if err := sim.WriteSpiceReadings(&deck, nets, ohms); err != nil {
			t.Fatal(err)
		}
		faults = append(faults, f)
		decks = append(decks, deck.String())
	}
	out := &faultTally{}
	for k, vals := range runFaultBatch(t, bin, decks, len(nets)) {
		f := faults[k]
		// ngspice .op has no oscillation: the readings are the stopped ones.
		rd := &Readings{Tolerance: defaultTolerance, Stopped: true}
		for i, n := range nets {
			rd.List = append(rd.List, Reading{Key: n, Net: n, Volts: vals[i], Meter: Meter{Ohms: ohms[i]}})
		}
		dg, err := pt.Rank(rd)
		if err != nil {
			t.Fatal(err)
		}
		name := filepath.Base(file) + ": " + f.String()
		if !anyOutside(dg) {
			out.hidden = append(out.hidden, name)
			continue
		}
		out.total++
		rank := rankOf(dg, f)
		if rank <= 3 {
			out.top3++
		}
		if rank == 1 {
			out.first++
			continue
		}
		out.misses = append(out.misses, fmt.Sprintf("%s (rank %d, first %s)", name, rank, dg.Ranked[0].Fault))
	}
	return out
}

// suitePoints are the standard test points: every electrode net that is not
// held and has a DC path, and every rail (a technician reads the HT or the
// battery first: common practice), each with its meter resistance.
func suitePoints(t *testing.T, pt *Point) ([]string, []float64) {
	ch, err := pt.Chart(Meter{})
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	var nets []string
	var ohms []float64
	for _, tp := range ch.Points {
		term := pt.m.netTerm[tp.Net]
		if seen[tp.Net] || term < 0 || tp.Elsewhere || tp.AC {
			continue
		}
		seen[tp.Net] = true
		nets = append(nets, tp.Net)
		ohms = append(ohms, Meter{OhmsPerVolt: suiteOhmsPerVolt}.Resistance(tp.Volts))
	}
	for _, r := range ch.Rails {
		if !seen[r.Net] && r.Volts != 0 {
			seen[r.Net] = true
			nets = append(nets, r.Net)
			ohms = append(ohms, Meter{OhmsPerVolt: suiteOhmsPerVolt}.Resistance(r.Volts))
		}
	}
	return nets, ohms
}

func anyOutside(dg *Diagnosis) bool {
	for _, r := range dg.Readings {
		if r.Outside {
			return true
		}
	}
	return false
}

// rankOf is 1 + the number of candidates that score clearly better than f.
func rankOf(dg *Diagnosis, f Fault) int {
	score := math.Inf(1)
	for _, c := range dg.Ranked {
		if c.Fault == f {
			score = c.Score
		}
	}
	rank := 1
	for _, c := range dg.Ranked {
		if c.Score < score-1e-6*(1+score) {
			rank++
		}
	}
	return rank
}
