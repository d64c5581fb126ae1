package stages

import (
	"fmt"
	"math"

	"pare/graph/figure"
)

// A mixer's "IF transformer f" is where its anode's load peaks in circuit:
// the primary's voltage with the secondary coupled in, pulled off the
// windings' own tuning by the coupling and the loads. A technician reads a
// figure off 465 kHz as the can off tune, so where the transformer's own
// stage (a double-tuned sub-stage) gives each winding's tuning and the two
// differ in the printed digits, the mixer's notes say which response the
// figure is and what the windings tune to.

// noteIFTuning adds that note to s from its double-tuned sub-stage.
func noteIFTuning(s *found) {
	ift, ok := s.Figures.Get("ift_f")
	if !ok || ift.Range != nil || !(ift.Value > 0) {
		return
	}
	for _, sub := range s.subs {
		if sub.Topology != "double-tuned" {
			continue
		}
		f1, ok1 := sub.Figures.Get("f1")
		f2, ok2 := sub.Figures.Get("f2")
		if !ok1 || !ok2 || f1.Range != nil || f2.Range != nil {
			continue
		}
		if sameDigits(ift.Value, f1.Value) && sameDigits(ift.Value, f2.Value) {
			return
		}
		s.Notes = append(s.Notes, fmt.Sprintf("IF transformer f %s is the primary's response at the anode, the secondary coupled in; its windings tune to %s (primary) and %s (secondary), %s's f1 and f2: a reading off the IF here is not a can off tune",
			figure.Format(ift.Value, figure.Hertz, figure.Text), figure.Format(f1.Value, figure.Hertz, figure.Text), figure.Format(f2.Value, figure.Hertz, figure.Text), sub.Name))
		return
	}
}

// sameDigits tells whether a and b print alike at a sheet's four
// significant digits (within half a unit of the fourth).
func sameDigits(a, b float64) bool {
	return math.Abs(a-b) <= 5e-4*math.Abs(b)
}
