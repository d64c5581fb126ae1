package graph

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"pare/graph/value"
)

// A wavechange switch turned away from the position the netlist sets
// (`--switch S1=2`, or another band's run) puts other coils on the gang:
// the bands the netlist declares are the first band's, and a proof swept
// over them compares the other band's tanks where they do not work. The
// declared bands that the switch retunes therefore follow the tanks it
// switches in, solved on the circuit (gang fully open to fully meshed).

// Retuned is one declared band a switch setting moved.
type Retuned struct {
	Was, Now value.Range
	Coils    []string // the coils switched in whose tuning gives Now
	Regions  []string // the regions whose band it was ("" for the default band)
	Switches []string // the switches turned that moved it
}

// String says what moved and why, for a proof's notes.
func (r Retuned) String() string {
	where := make([]string, 0, len(r.Regions))
	for _, n := range r.Regions {
		if n == "" {
			n = "the default band"
		} else {
			n = "region " + n
		}
		where = append(where, n)
	}
	return fmt.Sprintf("%s turned from the netlist's position: %s swept over %s, the range %s tune%s in circuit (gang fully open to fully meshed), instead of the declared %s",
		strings.Join(r.Switches, ", "), strings.Join(where, " and "), rangeText(r.Now), strings.Join(r.Coils, " and "), verbS(len(r.Coils)), rangeText(r.Was))
}

// verbS is a verb's third-person -s for one subject.
func verbS(n int) string {
	if n == 1 {
		return "s"
	}
	return ""
}

func rangeText(b value.Range) string {
	return value.Format(b.Min, value.Hertz, value.Symbol) + "–" + value.Format(b.Max, value.Hertz, value.Symbol)
}

// RetuneBands moves the declared bands after switches were turned from
// the positions the netlist sets (was: ref → position as written). For
// each switch turned, a tuned coil on a contact the old position closed
// and the new one opens names the band it works in (its region's, or the
// default band) when its own tuning range meets that band; the coils on
// the contacts the new position closes, through the same switch, tune
// the replacement: the span of their ranges. Every declared band equal
// to a replaced one follows (a region declared with the default band's
// value is the same band). Each coil's q stays referred where it was
// before (its QAt fixed first), so the model of every part is unchanged:
// only where the proof looks moves.
func (c *Circuit) RetuneBands(was map[string]int) []Retuned {
	type span struct {
		lo, hi   float64
		coils    []string
		switches []string
	}
	repl := map[value.Range]*span{}
	var order []value.Range
	t := newTuner(c)
	for _, p := range c.Parts {
		old, now := was[p.Ref], int(p.Set)
		if p.Kind != Switch || old == now || old < 1 || now < 1 || old > len(p.Closes) || now > len(p.Closes) {
			continue
		}
		outNets, inNets := contactNets(p, old, now), contactNets(p, now, old)
		for _, q := range t.tunedOn(outNets) {
			lo, hi := t.tankRange(q)
			b := c.BandOf(q)
			if b.Min <= 0 || hi < b.Min || lo > b.Max {
				continue
			}
			for _, n := range t.tunedOn(inNets) {
				nlo, nhi := t.tankRange(n)
				s := repl[b]
				if s == nil {
					s = &span{lo: nlo, hi: nhi}
					repl[b] = s
					order = append(order, b)
				}
				s.lo, s.hi = math.Min(s.lo, nlo), math.Max(s.hi, nhi)
				if !slices.Contains(s.coils, n.Ref) {
					s.coils = append(s.coils, n.Ref)
				}
				if !slices.Contains(s.switches, p.Ref) {
					s.switches = append(s.switches, p.Ref)
				}
			}
		}
	}
	if len(order) == 0 {
		return nil
	}
	c.fixQRef()
	var out []Retuned
	for _, b := range order {
		s := repl[b]
		now := value.Range{Min: s.lo, Max: s.hi}
		sort.Strings(s.coils)
		r := Retuned{Was: b, Now: now, Coils: s.coils, Switches: s.switches}
		if c.Band == b {
			c.Band, r.Regions = now, append(r.Regions, "")
		}
		for _, rg := range c.Regions {
			if rg.Band == b {
				rg.Band, r.Regions = now, append(r.Regions, rg.Name)
			}
		}
		out = append(out, r)
	}
	return out
}

// contactNets are the nets of the pins a switch closes at position at
// and not at position other: the band's own contacts, not the common one.
func contactNets(p *Part, at, other int) []string {
	keep := map[string]bool{}
	for _, pr := range p.Closes[other-1] {
		keep[pr[0]], keep[pr[1]] = true, true
	}
	var out []string
	for _, pr := range p.Closes[at-1] {
		for _, pin := range pr {
			if n := p.NetOf(pin); !keep[pin] && n != "" && n != "nc" && !slices.Contains(out, n) {
				out = append(out, n)
			}
		}
	}
	return out
}

// tunedOn are the parts with a pin on one of the nets whose coil tunes
// with the capacitance around it (tankRange finds a range).
func (t *tuner) tunedOn(nets []string) []*Part {
	var out []*Part
	for _, p := range t.c.Parts {
		if p.Kind == Switch || (p.Kind != Inductor && len(p.Windings) == 0) {
			continue
		}
		on := slices.ContainsFunc(p.Pins, func(pin Pin) bool { return slices.Contains(nets, pin.Net) })
		if !on {
			continue
		}
		if lo, _ := t.tankRange(p); lo > 0 {
			out = append(out, p)
		}
	}
	return out
}

// fixQRef refers every winding whose q was referred to its band's centre
// to that centre now, before the bands move (ReferQ, BandCentre).
func (c *Circuit) fixQRef() {
	for _, p := range c.Parts {
		for i := range p.Windings {
			if p.Windings[i].QAt <= 0 {
				p.Windings[i].QAt = c.BandCentre(p)
			}
		}
	}
}
