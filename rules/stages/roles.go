package stages

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
	"pare/graph/figure"
)

// Roles: the trade names a tuned amplifier by where it stands in the
// signal path, not by its topology: the RF amplifier works at the signal
// frequency before the frequency changer, the 1st, 2nd … IF amplifiers
// after it at the IF. The topology stays in the title after the role
// ("1st IF amplifier: tuned amplifier, common cathode (valve)"), and the
// role is confirmed by the solver's figures: a load that peaks (its
// in-circuit Q at least tunedMinQ), at the IF for an IF amplifier and away
// from it for an RF one.

// ifRoleTol is how far a load's peak may sit from the IF and the stage
// still be named an IF amplifier: 5 % (common practice, no source: an IF
// can's core tunes it over about ±10 %, a misaligned one sits a few kHz
// off; a signal-frequency stage is hundreds of kHz away).
const ifRoleTol = 0.05

// nameRoles prefixes the titles of the tuned amplifiers among tops, which
// are in signal order, with their role in the signal path.
func nameRoles(tops []*found, c *graph.Circuit) {
	nameAerial(tops)
	nameAudio(tops)
	nameLevel(tops, c)
	var changer *found
	nIF := 0
	for _, f := range tops {
		if f.group == "mixer" {
			if changer == nil {
				changer = f
			}
			continue
		}
		peak, dial, ok := tunedPeak(f.Stage)
		if !ok {
			continue
		}
		fIF := intermediate(changer, c)
		atIF := fIF > 0 && math.Abs(peak-fIF) <= ifRoleTol*fIF
		switch {
		case changer == nil && !atIF && (changerAfter(tops, f) || dial):
			f.Title = withRole("RF amplifier", f.Title)
			why := "named RF amplifier: a tuned amplifier before the frequency changer, its load away from the IF"
			if dial {
				why = "named RF amplifier: its load is tuned across the dial by the gang, so it works at the signal frequency"
			}
			f.Notes = append(f.Notes, why)
		case changer == nil && atIF:
			// An IF strip captured without its frequency changer: the
			// role is sure, the place in the strip is not.
			f.Title = withRole("IF amplifier", f.Title)
			f.Notes = append(f.Notes, fmt.Sprintf("named IF amplifier: its load peaks at %s in circuit, within %d %% of the %s IF",
				figure.Format(peak, figure.Hertz, figure.Text), int(ifRoleTol*100), figure.Format(fIF, figure.Hertz, figure.Text)))
		case changer != nil && atIF:
			nIF++
			role := ordinal(nIF) + " IF amplifier"
			f.Title = withRole(role, f.Title)
			f.Notes = append(f.Notes, fmt.Sprintf("named %s: after the frequency changer, its load peaks at %s in circuit, within %d %% of the %s IF",
				role, figure.Format(peak, figure.Hertz, figure.Text), int(ifRoleTol*100), figure.Format(fIF, figure.Hertz, figure.Text)))
		}
	}
}

// tunedPeak is the frequency a tuned amplifier's load peaks at in circuit
// (the middle of its range across the gang), when the stage has a tuned
// load with a Q worth the name; a lone tuned stage with a fixed load and no
// frequency changer round it could be either, and takes no role.
// dial is set when the gang tunes the load (a range across its travel).
func tunedPeak(s *Stage) (peak float64, dial, ok bool) {
	f, ok := s.Figures.Get("load_f")
	if !ok || f.Origin.Source != figure.Solver {
		return 0, false, false
	}
	if q, ok := s.Figures.Get("load_q_loaded"); !ok || q.Value < tunedMinQ {
		return 0, false, false
	}
	if f.Range != nil && f.Range.Max > f.Range.Min {
		return (f.Range.Min + f.Range.Max) / 2, true, true
	}
	return f.Value, false, f.Value > 0
}

// changerAfter tells whether a frequency changer follows f in signal order.
func changerAfter(tops []*found, f *found) bool {
	after := false
	for _, g := range tops {
		if g == f {
			after = true
		} else if after && g.group == "mixer" {
			return true
		}
	}
	return false
}

// intermediate is the IF: the frequency changer's own figure, else the
// netlist's freqs.if; 0 where neither says.
func intermediate(changer *found, c *graph.Circuit) float64 {
	if changer != nil {
		if f, ok := changer.Figures.Get("if"); ok && f.Value > 0 {
			return f.Value
		}
	}
	return c.Freqs["if"]
}

// withRole puts the role before the topology's title, whose first letter
// is lowered: "RF amplifier: tuned amplifier, …".
func withRole(role, title string) string {
	if title == "" {
		return role
	}
	return role + ": " + strings.ToLower(title[:1]) + title[1:]
}

// ordinal is the trade's short ordinal: 1st, 2nd, 3rd, 4th, … 11th, 12th.
func ordinal(n int) string {
	suffix := "th"
	if n%100 < 11 || n%100 > 13 {
		switch n % 10 {
		case 1:
			suffix = "st"
		case 2:
			suffix = "nd"
		case 3:
			suffix = "rd"
		}
	}
	return fmt.Sprintf("%d%s", n, suffix)
}

// nameAudio names an amplifier after the detector that is not the output
// stage (the trade's audio or AF amplifier, the preamplifier before the
// output valve), when the solver gives it a voltage gain above 1: a
// follower or a stage that loses signal keeps its topology's name alone.
func nameAudio(tops []*found) {
	detected := false
	for _, f := range tops {
		if f.group == "detector" {
			detected = true
			continue
		}
		if !detected || f.group != "amplifier" || f.Topology == "output-transformer" || strings.HasPrefix(f.Title, "Driver") {
			// a driver's title names its role already
			continue
		}
		g, ok := f.Figures.Get("gain")
		if !ok || g.Origin.Source != figure.Solver || math.Abs(g.Value) <= 1 {
			continue
		}
		f.Title = withRole("Audio amplifier", f.Title)
		f.Notes = append(f.Notes, fmt.Sprintf("named audio amplifier: after the detector, not the output stage, voltage gain %s in circuit",
			figure.Format(math.Abs(g.Value), figure.Ratio, figure.Text)))
	}
}

// nameAerial names the aerial circuit: the first gang-tuned stage (group
// "tuned"; a fixed-tuned one before it, such as an IF trap, is passed
// over) in signal order when no amplifier, mixer or oscillator comes
// before it, a frequency changer comes after it and the gang tunes it in
// circuit (its solved f a range across the travel). The trade calls it
// the aerial circuit (aerial coil and its gang section), not a
// "single-tuned transformer" like an interstage coupling.
func nameAerial(tops []*found) {
	for _, f := range tops {
		switch f.group {
		case "amplifier", "mixer", "oscillator":
			return
		case "tuned":
			fig, ok := f.Figures.Get("f")
			if !ok || fig.Origin.Source != figure.Solver || fig.Range == nil || fig.Range.Max <= fig.Range.Min {
				continue // fixed-tuned (an IF trap at the aerial): the gang's circuit may follow
			}
			if !changerAfter(tops, f) {
				return
			}
			f.Title = withRole("Aerial circuit", f.Title)
			f.Notes = append(f.Notes, "named aerial circuit: the first circuit from the input that the gang tunes across the dial in circuit, with no amplifier before it and a frequency changer after it")
			return
		}
	}
}
