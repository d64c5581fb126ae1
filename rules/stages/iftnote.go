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
		if centreIFT(s, sub, ift, f1.Value, f2.Value) {
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

// centreIFT makes the mixer's "IF transformer" figure the centre of the
// band its pair passes (the sub-stage's solved pass_centre), the anode's
// own peak kept beside it as "anode peak", with a note that says which is
// which, what the windings tune to, and an over-coupled pair's humps; false
// where the pair's pass band was not solved.
func centreIFT(s *found, sub *found, anode figure.Figure, f1, f2 float64) bool {
	c, ok := sub.Figures.Get("pass_centre")
	if !ok || !(c.Value > 0) {
		return false
	}
	txt := func(v float64) string { return figure.Format(v, figure.Hertz, figure.Text) }
	centre := c
	centre.Name, centre.Label, centre.Check, centre.Why = "ift_f", "IF pass band centre", nil, ""
	s.Figures.Put(centre)
	peak := anode
	peak.Name, peak.Label = "ift_anode_f", "anode peak"
	s.Figures.Put(peak)
	if len(s.figRanks) < len(s.Figures) {
		s.figRanks = append(s.figRanks, figRank{})
	}
	humps := ""
	lo, okLo := sub.Figures.Get("hump_lo")
	hi, okHi := sub.Figures.Get("hump_hi")
	if okLo && okHi {
		humps = fmt.Sprintf("; the pair is over-coupled, its humps at %s and %s", txt(lo.Value), txt(hi.Value))
	}
	s.Notes = append(s.Notes, fmt.Sprintf("IF transformer: the band it passes is centred on %s (%s's secondary, solved); its windings tune to %s (primary) and %s (secondary)%s. The anode alone peaks at %s, pulled by the secondary coupled in: a reading off the IF there is not a can off tune",
		txt(centre.Value), sub.Name, txt(f1), txt(f2), humps, txt(anode.Value)))
	return true
}
