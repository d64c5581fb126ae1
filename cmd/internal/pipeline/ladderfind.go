package pipeline

import (
	"slices"

	"pare/graph"
)

// arm is one branch of a ladder: parts in series through nets only they
// share (a fixed resistor and a preset strapped as a rheostat, review18
// b01's second shunt arm, which read as no ladder when an arm had to be a
// single part and left the whole network a tangle), from end a to end b.
type arm struct {
	parts []string
	a, b  string
}

// touching is the arm's part on net n, one of its two ends.
func (m arm) touching(n string) string {
	if m.a == n {
		return m.parts[0]
	}
	return m.parts[len(m.parts)-1]
}

// flipped is the arm run from b to a.
func (m arm) flipped() arm {
	ps := slices.Clone(m.parts)
	slices.Reverse(ps)
	return arm{parts: ps, a: m.b, b: m.a}
}

// ladder is a chain of series arms joined at inner nets, each holding
// exactly one shunt arm to AC ground: elems alternate series, shunt,
// series ... series; a series arm runs from the walk's start towards its
// end, a shunt arm from its inner net down to AC ground.
type ladder struct {
	elems []arm
}

// start and end are the nets the ladder's outer series arms leave it by.
func (l ladder) start() string { return l.elems[0].a }
func (l ladder) end() string   { return l.elems[len(l.elems)-1].b }

// ladderMin is the fewest inner nodes that make a ladder worth a template:
// two (three sections of a phase-shift network, or a pi and a half); a
// single node is an L or a pi section the generic placement draws in line.
const ladderMin = 2

// twoNets are the two nets a resistor, capacitor, coil or pot of the
// stage runs between: a pot strapped as a rheostat (wiper on one end) is a
// two-ended part too.
func twoNets(p *graph.Part) (string, string, bool) {
	if p == nil || p.Kind != graph.Resistor && p.Kind != graph.Capacitor && p.Kind != graph.Inductor && p.Kind != graph.Pot {
		return "", "", false
	}
	var nets []string
	for _, pn := range p.Pins {
		if pn.Net == "" {
			return "", "", false
		}
		if !slices.Contains(nets, pn.Net) {
			nets = append(nets, pn.Net)
		}
	}
	if len(nets) != 2 {
		return "", "", false
	}
	return nets[0], nets[1], true
}

// ladderArms joins the stage's two-ended parts into arms through the nets
// only two of them share (no device, no socket, no third part).
func ladderArms(parts []string, c *graph.Circuit, in map[string]bool) []arm {
	ground := func(n string) bool { return c.RoleOf(n).IsACGround() }
	ends := map[string][2]string{}
	for _, r := range parts {
		if a, b, ok := twoNets(c.Part(r)); ok {
			ends[r] = [2]string{a, b}
		}
	}
	// other is the one other two-ended part of the stage on private net n
	other := func(n, from string) string {
		if ground(n) {
			return ""
		}
		var refs []string
		for _, k := range c.ConnsOf(n) {
			if k.Part == nil || !in[k.Part.Ref] {
				return ""
			}
			if _, ok := ends[k.Part.Ref]; !ok {
				return ""
			}
			if !slices.Contains(refs, k.Part.Ref) {
				refs = append(refs, k.Part.Ref)
			}
		}
		// a coil in series with a capacitor is a tuned arm (a Clapp's
		// L and C, which read as a ladder wound the oscillator's tank
		// round on the faded sheet), not an RC ladder's
		if len(refs) != 2 || !slices.Contains(refs, from) || c.Part(refs[0]).Kind == graph.Inductor || c.Part(refs[1]).Kind == graph.Inductor {
			return ""
		}
		if refs[0] == from {
			return refs[1]
		}
		return refs[0]
	}
	var arms []arm
	used := map[string]bool{}
	for _, r := range parts {
		e, ok := ends[r]
		if !ok || used[r] {
			continue
		}
		used[r] = true
		left, a := walkArm(r, e[0], ends, other, used)
		right, b := walkArm(r, e[1], ends, other, used)
		slices.Reverse(left)
		ps := append(append(left, r), right...)
		arms = append(arms, arm{parts: ps, a: a, b: b})
	}
	return arms
}

// walkArm follows an arm from part r out through net n while the net is
// private to two parts; the parts passed in order, and the net it stops at.
func walkArm(r, n string, ends map[string][2]string, other func(n, from string) string, used map[string]bool) ([]string, string) {
	var out []string
	for {
		q := other(n, r)
		if q == "" || used[q] {
			return out, n
		}
		used[q] = true
		out = append(out, q)
		if e := ends[q]; e[0] == n {
			n = e[1]
		} else {
			n = e[0]
		}
		r = q
	}
}

// findLadder is the longest ladder among parts on c, ok false for none.
// An inner net holds the stage's two series arms and its one shunt arm,
// and no device and no other part of the stage; a part of another stage
// may tap it (a buffer's coupling capacitor on the ladder's middle node).
func findLadder(parts []string, c *graph.Circuit) (ladder, bool) {
	in := map[string]bool{}
	for _, r := range parts {
		in[r] = true
	}
	ground := func(n string) bool { return c.RoleOf(n).IsACGround() }
	series, shunt := map[string][]arm{}, map[string][]arm{}
	arms := ladderArms(parts, c, in)
	for _, m := range arms {
		switch {
		case ground(m.a) && !ground(m.b):
			shunt[m.b] = append(shunt[m.b], m.flipped())
		case ground(m.b) && !ground(m.a):
			shunt[m.a] = append(shunt[m.a], m)
		case !ground(m.a) && !ground(m.b) && m.a != m.b:
			series[m.a] = append(series[m.a], m)
			series[m.b] = append(series[m.b], m)
		}
	}
	inner := func(n string) bool {
		if len(series[n]) != 2 || len(shunt[n]) != 1 {
			return false
		}
		mine := []string{series[n][0].touching(n), series[n][1].touching(n), shunt[n][0].parts[0]}
		for _, k := range c.ConnsOf(n) {
			if p := k.Part; p == nil || p.IsActive() || in[p.Ref] && !slices.Contains(mine, p.Ref) {
				return false
			}
		}
		return true
	}
	var best ladder
	for _, m := range arms {
		if len(series[m.a]) == 0 || len(series[m.b]) == 0 || ground(m.a) || ground(m.b) {
			continue
		}
		// start at a series arm with an end that is no inner net
		for _, s := range []arm{m, m.flipped()} {
			if inner(s.a) {
				continue
			}
			if l := walkLadder(s, series, shunt, inner); len(l.elems) > len(best.elems) {
				best = l
			}
		}
	}
	return best, len(best.elems) >= 2*ladderMin+1
}

// walkLadder follows a ladder from series arm s, entered at its end a.
func walkLadder(s arm, series, shunt map[string][]arm, inner func(string) bool) ladder {
	var l ladder
	seen := map[string]bool{}
	for !seen[s.parts[0]] {
		seen[s.parts[0]] = true
		l.elems = append(l.elems, s)
		next := s.b
		if !inner(next) {
			break
		}
		l.elems = append(l.elems, shunt[next][0])
		var q arm
		for _, m := range series[next] {
			if !slices.Equal(m.parts, s.parts) {
				q = m
			}
		}
		if q.b == next {
			q = q.flipped()
		}
		s = q
	}
	if len(l.elems)%2 == 0 { // ended on a shunt: the series arm was seen
		l.elems = l.elems[:len(l.elems)-1]
	}
	return l
}

// LadderArms are the arms of the RC ladder among a stage's parts on c, as
// the sheets draw it (series, shunt, series ... series, each arm's parts
// from the line outward), nil for none: what the sheet checks hold the
// drawing of a phase-shift network to.
func LadderArms(parts []string, c *graph.Circuit) [][]string {
	l, ok := findLadder(parts, c)
	if !ok {
		return nil
	}
	out := make([][]string, len(l.elems))
	for i, m := range l.elems {
		out[i] = m.parts
	}
	return out
}

// Originals are the full circuit's parts behind a stage's reduced parts:
// the parts a full or faded sheet draws for the stage.
func Originals(refs []string, reduced, full *graph.Circuit) []string {
	return originals(refs, reduced, full)
}
