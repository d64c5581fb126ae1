package pipeline

import (
	"maps"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/device"
)

// The per-step proof, local to what a step can affect.
//
// In the small-signal model every net whose role is AC ground is one node,
// the reference, so two groups of parts joined only through AC-ground nets
// are independent systems: a change in one cannot move any voltage in the
// other. The same holds for "nc": its terminals are connected to nothing. A step changes a few parts (and perhaps the role of a net); every
// quantity outside the groups those parts touch, before or after the step,
// is the same in both circuits, and a transfer between two different groups
// is zero in both. Comparing only the touched groups is therefore the same
// proof as comparing the whole circuit, at the cost of the groups: on a set
// of many channels, one channel per step instead of the whole set.
//
// Two things of the rest still count and are carried over: the bands of the
// regions (a net's band comes from the regions that hold it) and the
// frequencies the sweep visits on purpose (named frequencies and every
// crystal's resonances, which the comparison adds to each pair's grid).

// localPair returns the parts of before and after that the step between
// them can have affected, as two circuits for the comparison. whole is true
// when that is everything (or the step changed what the circuit declares),
// and the caller compares the circuits as they are; none is true when the
// step touched only AC-ground nets, where nothing can have changed.
func localPair(before, after *graph.Circuit) (b, a *graph.Circuit, whole, none bool) {
	if !sameDeclarations(before, after) {
		return before, after, true, false
	}
	seeds := changedNets(before, after)
	uf := &graph.NamedSets{} // nets joined through parts, AC ground and "nc" left out
	deadB, deadA := deadNets(before), deadNets(after)
	live := func(c *graph.Circuit, net string) bool {
		if c == before {
			return !deadB[net]
		}
		return !deadA[net]
	}
	for _, c := range []*graph.Circuit{before, after} {
		for _, p := range c.Parts {
			first := ""
			for _, pin := range p.Pins {
				if !live(c, pin.Net) {
					continue
				}
				if first == "" {
					first = pin.Net
					continue
				}
				uf.Union(first, pin.Net)
			}
		}
	}
	touched := map[string]bool{}
	for _, n := range seeds {
		if live(before, n) || live(after, n) {
			touched[uf.Find(n)] = true
		}
	}
	if len(touched) == 0 {
		return nil, nil, false, true
	}
	in := func(c *graph.Circuit, net string) bool { return live(c, net) && touched[uf.Find(net)] }
	b, allB := subCircuit(before, deadB, in)
	a, allA := subCircuit(after, deadA, in)
	if (allB && allA) || !regionsFit(b) || !regionsFit(a) {
		return before, after, true, false
	}
	filterEnds(before, after, b, a, in)
	return b, a, false, false
}

// deadNets lists the nets of c that carry no signal between the parts on
// them: those at AC ground (the reference node) and "nc", whose terminals
// the small-signal model leaves unconnected each on its own. Every static
// electrode a reduction drops goes to "nc", so taking it as a net would
// join every channel of a bank whose valves were tidied into one group.
// A net c does not list is a signal net (Circuit.RoleOf). The set is taken
// from the net list rather than by RoleOf, which would build the index of
// the engine's fresh clone on every step.
func deadNets(c *graph.Circuit) map[string]bool {
	dead := map[string]bool{graph.NotConnected: true}
	for _, n := range c.Nets {
		if n.Role.IsACGround() {
			dead[n.Name] = true
		}
	}
	return dead
}

// sameDeclarations reports whether a step left the circuit's declared ends,
// bands, named frequencies and regions alone (a join can rename an end;
// then the whole circuit is compared).
func sameDeclarations(x, y *graph.Circuit) bool {
	if x.Band != y.Band || !slices.Equal(x.Inputs, y.Inputs) || !slices.Equal(x.Outputs, y.Outputs) ||
		!maps.Equal(x.Freqs, y.Freqs) || len(x.Regions) != len(y.Regions) {
		return false
	}
	for i, r := range x.Regions {
		s := y.Regions[i]
		if r == s {
			continue // one region the step did not touch (localJournal shares them)
		}
		if r.Name != s.Name || r.Band != s.Band || r.Input != s.Input || r.Output != s.Output || !slices.Equal(r.Parts, s.Parts) {
			return false
		}
	}
	return true
}

// changedNets lists the nets of every part that differs between the two
// circuits (added, removed, or changed in any way but its position) and
// every net that appeared, disappeared or changed its role.
func changedNets(before, after *graph.Circuit) []string {
	var out []string
	pinsOf := func(p *graph.Part) {
		for _, pin := range p.Pins {
			out = append(out, pin.Net)
		}
	}
	old := make(map[string]*graph.Part, len(before.Parts))
	for _, p := range before.Parts {
		old[p.Ref] = p
	}
	for _, p := range after.Parts {
		q := old[p.Ref]
		delete(old, p.Ref)
		if q != nil && samePart(p, q) {
			continue
		}
		pinsOf(p)
		if q != nil {
			pinsOf(q)
		}
	}
	for _, p := range before.Parts {
		if old[p.Ref] != nil {
			pinsOf(p)
		}
	}
	roles := make(map[string]graph.Role, len(before.Nets))
	for _, n := range before.Nets {
		roles[n.Name] = n.Role
	}
	for _, n := range after.Nets {
		if r, ok := roles[n.Name]; !ok || r != n.Role {
			out = append(out, n.Name)
		}
		delete(roles, n.Name)
	}
	for _, n := range before.Nets {
		if _, gone := roles[n.Name]; gone {
			out = append(out, n.Name)
		}
	}
	return out
}

// samePart compares everything about two parts except where they were read.
func samePart(p, q *graph.Part) bool {
	if p.Kind != q.Kind || p.Type != q.Type || p.Value != q.Value || p.Set != q.Set || p.Tol != q.Tol ||
		p.Rating != q.Rating || p.Gang != q.Gang || p.Envelope != q.Envelope || p.Keep != q.Keep ||
		p.Note != q.Note || p.Label != q.Label || len(p.Pins) != len(q.Pins) {
		return false
	}
	for i := range p.Pins {
		if p.Pins[i].Name != q.Pins[i].Name || p.Pins[i].Net != q.Pins[i].Net {
			return false
		}
	}
	return slices.Equal(p.Windings, q.Windings) && slices.Equal(p.Coupling, q.Coupling) &&
		slices.Equal(p.From, q.From) && maps.Equal(p.Params, q.Params) &&
		slices.EqualFunc(p.Closes, q.Closes, func(x, y [][2]string) bool { return slices.Equal(x, y) })
}

// subCircuit keeps the parts with a pin on a net in the touched groups, the
// nets they use, and everything the circuit declares; all is true when no
// part with a live net was left out. The crystals left out keep their
// resonances as named frequencies, so the sweep visits the same points.
func subCircuit(c *graph.Circuit, dead map[string]bool, in func(*graph.Circuit, string) bool) (*graph.Circuit, bool) {
	s := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: maps.Clone(c.Freqs),
		DetectorLoads: c.DetectorLoads} // a cut keeps the detectors' loads: DC flows through the whole set
	if s.Freqs == nil {
		s.Freqs = map[string]float64{}
	}
	used := map[string]bool{}
	all := true
	for _, p := range c.Parts {
		keep, live := false, false
		for _, pin := range p.Pins {
			if !dead[pin.Net] {
				live = true
			}
			keep = keep || in(c, pin.Net)
		}
		if !keep {
			if live {
				all = false
				crystalMarks(s.Freqs, p)
			}
			continue
		}
		s.Parts = append(s.Parts, p)
		for _, pin := range p.Pins {
			used[pin.Net] = true
		}
	}
	for _, n := range c.Nets {
		if used[n.Name] {
			s.Nets = append(s.Nets, n)
		}
	}
	named := namedIn(s, c)
	for _, r := range c.Regions {
		rr := *r
		if !used[r.Input] && !used[r.Output] {
			// A region of another group: its band still counts, its ends
			// are not compared here.
			rr.Input, rr.Output = "", ""
		}
		rr.Parts = keepNamed(r.Parts, named)
		rr.Nets = keepNamed(r.Nets, named)
		s.Regions = append(s.Regions, &rr)
	}
	return s, all
}

// namedIn is every name the comparison can look up in a region's lists of
// the sub-circuit s: its parts' refs and origins (a part's band is that of
// the first region naming it or an origin, else of the first naming one of
// its nets) and its nets and the whole circuit c's declared ends (a net's
// bands are those of every region naming it; filterEnds keeps the ends the
// sub-circuit compares).
func namedIn(s, c *graph.Circuit) map[string]bool {
	named := make(map[string]bool, 4*len(s.Parts)+len(s.Nets))
	for _, p := range s.Parts {
		named[p.Ref] = true
		for _, o := range p.From {
			named[o] = true
		}
	}
	for _, n := range s.Nets {
		named[n.Name] = true
	}
	for _, n := range append(slices.Clone(c.Inputs), c.Outputs...) {
		named[n] = true
	}
	return named
}

// keepNamed is list without the names the sub-circuit cannot look up, in
// order: a region of a whole set lists a channel's parts and nets, and a
// region index of the sub-circuit (graph.RegionIndex, built for every
// step's comparison) built from every channel's lists made each step's
// proof cost the whole set. The first region naming each name that is
// kept is the same, so every band the comparison reads is the same.
func keepNamed(list []string, named map[string]bool) []string {
	var out []string
	for _, x := range list {
		if named[x] {
			out = append(out, x)
		}
	}
	return out
}

// crystalMarks adds a crystal's series and parallel resonance under names
// no netlist can use, computed as the comparison computes its landmarks.
func crystalMarks(freqs map[string]float64, p *graph.Part) {
	if p.Kind != graph.Crystal {
		return
	}
	_, lm, cm, c0, err := device.Crystal(p)
	if err != nil {
		return
	}
	fs := 1 / (2 * math.Pi * math.Sqrt(lm*cm))
	freqs["\x00"+p.Ref+" fs"] = fs
	if c0 > 0 {
		freqs["\x00"+p.Ref+" fp"] = fs * math.Sqrt(1+cm/c0)
	}
}

// regionsFit reports whether every region kept with its ends has both ends
// in the sub-circuit; a region that spans the cut makes the caller compare
// the whole circuit.
func regionsFit(s *graph.Circuit) bool {
	for _, r := range s.Regions {
		if r.Input == "" && r.Output == "" {
			continue
		}
		if (r.Input != "" && s.Net(r.Input) == nil) || (r.Output != "" && s.Net(r.Output) == nil) {
			return false
		}
	}
	return true
}

// filterEnds keeps the declared inputs and outputs that lie in the touched
// groups. The comparison pairs the ends of the two circuits by position
// when a name is gone, so when the lists are alike an end is kept or
// dropped in both together.
func filterEnds(before, after, b, a *graph.Circuit, in func(*graph.Circuit, string) bool) {
	pick := func(x, y []string) ([]string, []string) {
		var kx, ky []string
		if len(x) == len(y) {
			for i := range x {
				if in(before, x[i]) || in(after, y[i]) {
					kx, ky = append(kx, x[i]), append(ky, y[i])
				}
			}
			return kx, ky
		}
		for _, n := range x {
			if in(before, n) {
				kx = append(kx, n)
			}
		}
		for _, n := range y {
			if in(after, n) {
				ky = append(ky, n)
			}
		}
		return kx, ky
	}
	b.Inputs, a.Inputs = pick(before.Inputs, after.Inputs)
	b.Outputs, a.Outputs = pick(before.Outputs, after.Outputs)
}
