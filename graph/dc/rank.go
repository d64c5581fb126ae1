package dc

import (
	"math"
	"sort"
)

// The ranking compares the readings with what each single fault predicts
// (the same meter on the same net) and orders the faults by the sum of
// squared misfits, each in units of the reading's tolerance: the nearest
// dictionary entry, in the manner of Bandler and Salama (1985). A fault
// "explains" a reading that lies off the healthy chart (beyond tolerance)
// when its prediction lies within tolerance of the reading; a reading on
// the chart that a fault leaves there says nothing for it. It
// "contradicts" a reading when its prediction lies outside tolerance of it. A
// fault that explains nothing (it moves no reading the way the bench
// shows) is ranked after every fault that explains something, so a fault
// that changes nothing never ties with the true one.

// absFloor is the smallest tolerance band, in volts: an analogue meter is not
// read closer than about 0.1 V near zero (common practice).
const absFloor = 0.1

// Flagged is one reading against the fault-free chart.
type Flagged struct {
	Reading
	Expected float64 `json:"expected"` // what the meter should read on a healthy set (oscillators stopped)
	Outside  bool    `json:"outside"`
	// Oscillator is set on a reading a running oscillator moves: it is
	// compared only where the oscillator cannot explain it (the wrong way,
	// for a direction the laws give), else "not compared".
	Oscillator  *Shift `json:"oscillator,omitempty"`
	NotCompared bool   `json:"not_compared,omitempty"`
	// AsStopped marks the electrode that shows an oscillator running
	// reading as the stopped chart while the readings say the oscillators
	// run: the oscillator may not be running (common practice).
	AsStopped bool `json:"as_stopped,omitempty"`
}

// Candidate is one fault with how well it explains the readings.
type Candidate struct {
	Fault       Fault     `json:"fault"`
	Score       float64   `json:"misfit"`      // Σ ((reading − prediction)/band)² over the readings compared
	Explains    []string  `json:"explains"`    // keys of the readings off the chart its prediction fits within tolerance
	Contradicts []string  `json:"contradicts"` // keys of the readings its prediction misses by more than tolerance
	Predicted   []float64 `json:"predicted"`   // per reading, volts on its meter
	sim         *Faulted
}

// Diagnosis is the outcome of a ranking.
type Diagnosis struct {
	Readings []Flagged   `json:"readings"`
	Ranked   []Candidate `json:"ranked"`
	// Next is the net whose reading best separates the first two candidates
	// ("" when there is none), with what the readings' meter would read
	// there under each.
	Next      string  `json:"next,omitempty"`
	NextMeter Meter   `json:"next_meter"`
	NextA     float64 `json:"next_if_first,omitempty"`
	NextB     float64 `json:"next_if_second,omitempty"`
	Unsolved  []Fault `json:"unsolved,omitempty"` // faults whose circuit would not settle
}

func (rd *Readings) band(v float64) float64 {
	return math.Max(rd.Tolerance*math.Abs(v), absFloor)
}

// misfit is reading r against prediction pred (oscillators stopped) in
// tolerance bands, and whether it counts. A reading a running oscillator
// moves counts only outside the range the oscillator can move it over:
// from pred the way the shift goes, to cut (the value with the device cut
// off) for a bounded one; it is measured from the nearer end.
func (rd *Readings) misfit(r Reading, pred, cut float64, sh *Shift) (float64, bool) {
	band := rd.band(r.Volts)
	d := (r.Volts - pred) / band
	switch {
	case math.IsNaN(d):
		return 1e3, true
	case sh == nil:
		return d, true
	case sh.Dir == 0:
		return 0, false
	case sh.Bounded && !math.IsNaN(cut):
		lo, hi := math.Min(pred, cut), math.Max(pred, cut)
		switch {
		case r.Volts < lo:
			return (r.Volts - lo) / band, true
		case r.Volts > hi:
			return (r.Volts - hi) / band, true
		}
		return 0, false
	case d*float64(sh.Dir) > 0:
		return 0, false
	}
	return d, true
}

// cutReadings are what the readings' meters show on fd with the running
// oscillators cut off (NaN where no reading needs it).
func cutReadings(fd *Faulted, flagged []Flagged, refs []string) []float64 {
	out := make([]float64, len(flagged))
	var cut *Faulted
	for i, fl := range flagged {
		out[i] = math.NaN()
		if fl.Oscillator == nil || !fl.Oscillator.Bounded {
			continue
		}
		if cut == nil {
			c, err := fd.CutOff(refs)
			if err != nil {
				return out
			}
			cut = c
		}
		if v, err := cut.Reading(fl.Net, fl.Meter); err == nil {
			out[i] = v
		}
	}
	return out
}

// Rank simulates every single fault and orders them by how well each
// explains all the readings together.
func (p *Point) Rank(rd *Readings) (*Diagnosis, error) {
	dg := &Diagnosis{}
	var refs []string
	if !rd.Stopped {
		refs = p.oscRefs()
	}
	for _, r := range rd.List {
		exp, err := p.Reading(r.Net, r.Meter)
		if err != nil {
			return nil, err
		}
		f := Flagged{Reading: r, Expected: exp}
		if sh, ok := p.ShiftOf(r.Net); ok && !rd.Stopped {
			f.Oscillator = &sh
		}
		dg.Readings = append(dg.Readings, f)
	}
	cut := cutReadings(p.healthy(), dg.Readings, refs)
	for i := range dg.Readings {
		f := &dg.Readings[i]
		d, counts := rd.misfit(f.Reading, f.Expected, cut[i], f.Oscillator)
		f.Outside, f.NotCompared = counts && math.Abs(d) > 1, !counts
		f.AsStopped = f.Oscillator != nil && f.Oscillator.Shows && counts && math.Abs(d) <= 1
	}
	for _, f := range p.Faults() {
		sim, err := p.simulated(f)
		if err != nil {
			dg.Unsolved = append(dg.Unsolved, f)
			continue
		}
		dg.Ranked = append(dg.Ranked, rd.candidate(sim, dg.Readings, refs))
	}
	sort.SliceStable(dg.Ranked, func(i, j int) bool {
		a, b := dg.Ranked[i], dg.Ranked[j]
		if (len(a.Explains) > 0) != (len(b.Explains) > 0) {
			return len(a.Explains) > 0
		}
		if a.Score != b.Score {
			return a.Score < b.Score
		}
		return len(a.Explains) > len(b.Explains)
	})
	dg.next(p, rd)
	return dg, nil
}

// candidate scores one simulated fault against the flagged readings.
func (rd *Readings) candidate(sim *Faulted, flagged []Flagged, refs []string) Candidate {
	c := Candidate{Fault: sim.Fault, sim: sim}
	cut := cutReadings(sim, flagged, refs)
	for i, fl := range flagged {
		r := fl.Reading
		pr, err := sim.Reading(r.Net, r.Meter)
		if err != nil {
			pr = math.NaN()
		}
		c.Predicted = append(c.Predicted, pr)
		d, counts := rd.misfit(r, pr, cut[i], fl.Oscillator)
		if !counts {
			continue
		}
		c.Score += d * d
		switch {
		case math.Abs(d) > 1:
			c.Contradicts = append(c.Contradicts, r.Key)
		case fl.Outside:
			c.Explains = append(c.Explains, r.Key)
		}
	}
	return c
}

// next picks the test point, not yet read, where the first two candidates
// differ most in units of their tolerance band, as the readings' meter
// would read it under each.
func (dg *Diagnosis) next(p *Point, rd *Readings) {
	if len(dg.Ranked) < 2 {
		return
	}
	read := map[string]bool{}
	for _, r := range rd.List {
		read[r.Net] = true
	}
	a, b := dg.Ranked[0].sim, dg.Ranked[1].sim
	best := 0.0
	for _, n := range p.Nets {
		if n.Fixed || n.Floating || read[n.Name] || !p.isTestPoint(n.Name) {
			continue
		}
		if _, osc := p.ShiftOf(n.Name); osc && !rd.Stopped {
			continue // a running oscillator moves it: no test between faults
		}
		va, errA := a.Reading(n.Name, rd.Meter)
		vb, errB := b.Reading(n.Name, rd.Meter)
		if errA != nil || errB != nil {
			continue
		}
		if d := math.Abs(va-vb) / rd.band(math.Max(math.Abs(va), math.Abs(vb))); d > best && d > 1 {
			best, dg.Next, dg.NextA, dg.NextB = d, n.Name, va, vb
		}
	}
	dg.NextMeter = rd.Meter
}

// simulated is one fault's solve, kept on the Point: a fault's circuit
// does not depend on the readings, and with an estimated rail each solve
// steps the reservoir through the mains (rectwave.go), so ranking several
// sets of readings on one set solves each fault once.
type simulated struct {
	sim *Faulted
	err error
}

func (p *Point) simulated(f Fault) (*Faulted, error) {
	if s, ok := p.sims[f]; ok {
		return s.sim, s.err
	}
	sim, err := p.Simulate(f)
	if p.sims == nil {
		p.sims = map[Fault]simulated{}
	}
	p.sims[f] = simulated{sim, err}
	return sim, err
}
