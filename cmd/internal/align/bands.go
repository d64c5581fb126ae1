package align

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/safety"
	"pare/graph/value"
	"pare/rules/stages"
)

// A wavechange switch puts another set of coils, trimmers and padders on
// the same gang and valves at each position: every band is aligned on its
// own after the IF (common practice), with the trimmers and cores that
// band switches in. pare runs its stages once per band (the circuit with
// the switch turned) and adds that band's tracking steps.

// Runner runs pare's stages on the netlist with the switches named turned
// to the positions given: the circuit as captured at that setting and the
// stages found in it.
type Runner func(positions map[string]int) (*graph.Circuit, []stages.Stage, error)

// bandSwitches are the switches that change band: those with a contact
// that only some positions close on a net of a part the tracking tanks
// use at the set position (a coil, a trimmer, a padder of a gang section),
// and the positions they have (their least number of positions).
func bandSwitches(c *graph.Circuit, sts []stages.Stage) (refs []string, positions int) {
	sc := switched(c)
	mix := mixerStage(sts)
	if mix == nil {
		return nil, 0
	}
	osc := oscTank(sc, mix)
	if osc.gang == nil {
		return nil, 0
	}
	var nets []string
	power := safety.PowerSwitches(c)
	for _, t := range append(sigTanks(sc, osc.gang), osc) {
		for _, p := range []*graph.Part{t.gang, t.trimmer, t.padder, t.coil} {
			if p != nil {
				if q := c.Part(p.Ref); q != nil {
					nets = append(nets, netsOf(q)...)
				}
			}
		}
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Switch || len(p.Closes) < 2 || int(p.Set) < 1 || int(p.Set) > len(p.Closes) || power[p.Ref] {
			continue // a power switch's other position is the set switched off, not a band
		}
		if slices.ContainsFunc(switchedPins(p), func(pin string) bool { return slices.Contains(nets, p.NetOf(pin)) }) {
			refs = append(refs, p.Ref)
			if positions == 0 || len(p.Closes) < positions {
				positions = len(p.Closes)
			}
		}
	}
	return refs, positions
}

// switchedPins are a switch's pins that some positions close and others
// do not (a band's own contacts, not the common one every position uses).
func switchedPins(p *graph.Part) []string {
	count := map[string]int{}
	var pins []string
	for _, pos := range p.Closes {
		seen := map[string]bool{}
		for _, pr := range pos {
			for _, pin := range pr {
				if !seen[pin] {
					seen[pin] = true
					if count[pin] == 0 {
						pins = append(pins, pin)
					}
					count[pin]++
				}
			}
		}
	}
	var out []string
	for _, pin := range pins {
		if count[pin] < len(p.Closes) {
			out = append(out, pin)
		}
	}
	return out
}

// bandParts are the parts the switches put in circuit at their set
// positions only: those with a pin on a net of a closed contact that not
// every position closes. Of two trimmers on one tank, the band's own is
// that band's; one on the gang section itself serves every band and is
// set on the first.
func bandParts(c *graph.Circuit) map[string]bool {
	nets := map[string]bool{}
	power := safety.PowerSwitches(c)
	for _, p := range c.Parts {
		pos := int(p.Set)
		if p.Kind != graph.Switch || pos < 1 || pos > len(p.Closes) || power[p.Ref] {
			continue // a power switch puts no band's parts in circuit
		}
		own := switchedPins(p)
		for _, pr := range p.Closes[pos-1] {
			for _, pin := range pr {
				if n := p.NetOf(pin); slices.Contains(own, pin) && !c.RoleOf(n).IsACGround() {
					nets[n] = true // a contact to chassis puts no one part in circuit: every part has a pin there
				}
			}
		}
	}
	out := partsOnNets(c, nets)
	for r := range leftOutElsewhere(c, power) {
		out[r] = true
	}
	return out
}

// partsOnNets are the parts other than switches with a pin on one of the
// nets: what a switch's contacts put in or take out of circuit.
func partsOnNets(c *graph.Circuit, nets map[string]bool) map[string]bool {
	out := map[string]bool{}
	if len(nets) == 0 {
		return out
	}
	for _, p := range c.Parts {
		if p.Kind == graph.Switch {
			continue
		}
		for _, pin := range p.Pins {
			if nets[pin.Net] {
				out[p.Ref] = true
			}
		}
	}
	return out
}

// AddBands adds, after the set's own band, the tracking steps of every
// other position of its wavechange switch, each from a run of run with the
// switches turned there. A band that does not run gets a warning.
func (g *Guide) AddBands(c *graph.Circuit, sts []stages.Stage, run Runner) {
	if run == nil {
		return
	}
	for _, set := range BandSets(c, sts) {
		var refs []string // in the circuit's order, as bandSwitches found them
		pos := 0
		for _, p := range c.Parts {
			if at, ok := set[p.Ref]; ok {
				refs, pos = append(refs, p.Ref), at
			}
		}
		label := fmt.Sprintf("band %d (%s at position %d)", pos, strings.Join(refs, ", "), pos)
		bc, bsts, err := run(set)
		if err != nil {
			g.Warnings = append(g.Warnings, fmt.Sprintf("%s: not aligned: %v", label, err))
			continue
		}
		g.addBand(label, bc, bsts)
	}
	// A band's steps turn parts the set's own band left out: name only
	// what no band turns.
	g.LeftOut = nil
	g.account(switched(c), sts)
}

// BandSets are the switch settings AddBands runs, one per band other than
// the set's own, in position order: the main job starts their runs while
// it draws (pipeline.Options.BandSets).
func BandSets(c *graph.Circuit, sts []stages.Stage) []map[string]int {
	refs, n := bandSwitches(c, sts)
	if len(refs) == 0 {
		return nil
	}
	var out []map[string]int
	cur := int(c.Part(refs[0]).Set)
	for pos := 1; pos <= n; pos++ {
		if pos == cur {
			continue
		}
		set := map[string]int{}
		for _, r := range refs {
			set[r] = pos
		}
		out = append(out, set)
	}
	return out
}

// addBand appends one band's tracking: its steps numbered on from the
// guide's, its dial ends and warnings under its label. The declared band
// is the set's first band's, so it is not the dial of this one: the
// tracking points are this band's own.
func (g *Guide) addBand(label string, c *graph.Circuit, sts []stages.Stage) {
	bc := c.Clone()
	bc.Band = value.Range{}
	b := &Guide{IF: g.IF, IFFrom: g.IFFrom, FM: g.FM}
	b.tracking(bc, sts)
	for _, s := range b.Steps {
		s.Band = label
		s.N = len(g.Steps) + 1
		g.Steps = append(g.Steps, s)
	}
	for _, r := range b.Repeat {
		g.Repeat = append(g.Repeat, label+": "+r)
	}
	for _, e := range b.Ends {
		e.Where = label + ", " + e.Where
		g.Ends = append(g.Ends, e)
	}
	if b.TrackNote != "" {
		g.Warnings = append(g.Warnings, label+": "+b.TrackNote)
	}
	for _, w := range b.Warnings {
		g.Warnings = append(g.Warnings, label+": "+w)
	}
	if len(b.Steps) == 0 && b.TrackNote == "" {
		g.Warnings = append(g.Warnings, label+": no tracking steps: "+strings.TrimSpace(b.Nothing))
	}
}
