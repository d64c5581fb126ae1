package dc

import (
	"math"
	"sort"
)

// The ranking compares the readings with what each single fault predicts
// (the same meter on the same net) and orders the faults by the sum of
// squared misfits, each in units of the reading's tolerance: the nearest
// dictionary entry, in the manner of Bandler and Salama (1985). A reading
// "is explained" by a fault when the prediction lies within tolerance.

// absFloor is the smallest tolerance band, in volts: an analogue meter is not
// read closer than about 0.1 V near zero (common practice).
const absFloor = 0.1

// Flagged is one reading against the fault-free chart.
type Flagged struct {
	Reading
	Expected float64 `json:"expected"` // what the meter should read on a healthy set
	Outside  bool    `json:"outside"`
}

// Candidate is one fault with how well it explains the readings.
type Candidate struct {
	Fault     Fault     `json:"fault"`
	Score     float64   `json:"misfit"`    // Σ ((reading − prediction)/band)²
	Explains  []string  `json:"explains"`  // keys of the readings within tolerance of the prediction
	Predicted []float64 `json:"predicted"` // per reading, volts on its meter
	sim       *Faulted
}

// Diagnosis is the outcome of a ranking.
type Diagnosis struct {
	Readings []Flagged   `json:"readings"`
	Ranked   []Candidate `json:"ranked"`
	// Next is the net whose reading best separates the first two candidates
	// ("" when there is none), with their predicted voltages there.
	Next     string  `json:"next,omitempty"`
	NextA    float64 `json:"next_if_first,omitempty"`
	NextB    float64 `json:"next_if_second,omitempty"`
	Unsolved []Fault `json:"unsolved,omitempty"` // faults whose circuit would not settle
}

func (rd *Readings) band(v float64) float64 {
	return math.Max(rd.Tolerance*math.Abs(v), absFloor)
}

// Rank simulates every single fault and orders them by how well each
// explains all the readings together.
func (p *Point) Rank(rd *Readings) (*Diagnosis, error) {
	dg := &Diagnosis{}
	for _, r := range rd.List {
		exp, err := p.Reading(r.Net, r.Meter)
		if err != nil {
			return nil, err
		}
		dg.Readings = append(dg.Readings, Flagged{r, exp, math.Abs(r.Volts-exp) > rd.band(exp)})
	}
	for _, f := range p.Faults() {
		sim, err := p.Simulate(f)
		if err != nil {
			dg.Unsolved = append(dg.Unsolved, f)
			continue
		}
		c := Candidate{Fault: f, sim: sim}
		for _, r := range rd.List {
			pr, err := sim.Reading(r.Net, r.Meter)
			if err != nil {
				pr = math.NaN()
			}
			c.Predicted = append(c.Predicted, pr)
			d := (r.Volts - pr) / rd.band(r.Volts)
			if math.IsNaN(d) {
				d = 1e3
			}
			c.Score += d * d
			if math.Abs(d) <= 1 {
				c.Explains = append(c.Explains, r.Key)
			}
		}
		dg.Ranked = append(dg.Ranked, c)
	}
	sort.SliceStable(dg.Ranked, func(i, j int) bool { return dg.Ranked[i].Score < dg.Ranked[j].Score })
	dg.next(p, rd)
	return dg, nil
}

// next picks the test point, not yet read, where the first two candidates
// differ most in units of their tolerance band.
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
		va, vb := a.Volts(n.Name), b.Volts(n.Name)
		if d := math.Abs(va-vb) / rd.band(math.Max(math.Abs(va), math.Abs(vb))); d > best && d > 1 {
			best, dg.Next, dg.NextA, dg.NextB = d, n.Name, va, vb
		}
	}
}
