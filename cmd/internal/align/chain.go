package align

import (
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
)

// The injection points follow the signal, not a count of parts from the
// input: a hop count runs along anything that touches, so a supply line
// behind an on/off switch, a decoupled rail or an AGC line put an output
// transistor's base "nearer" the aerial than the second IF amplifier's.
// The chain is walked instead from the input, one stage at a time: from a
// point, the signal leaves by its device's output electrode (its common
// electrode for a follower whose output sits at AC ground), and the next
// point is the one it reaches first through passive parts in the band it
// carries there, by the AC solver with every device quietened (so what is
// compared is the passive path alone, not a gain further on).

// chainOrder reorders pts (in the walk's order) along the signal path:
// the slots the chain's points hold in pts are refilled in the chain's
// order; a point the chain does not reach keeps its slot.
func chainOrder(c *graph.Circuit, pts []point, g *Guide, hasMixer bool) []point {
	chain := signalChain(c, pts, g, hasMixer)
	if len(chain) < 2 {
		return pts
	}
	in := make([]bool, len(pts))
	for _, k := range chain {
		in[k] = true
	}
	out := slices.Clone(pts)
	next := 0
	for i := range pts {
		if in[i] {
			out[i] = pts[chain[next]]
			next++
		}
	}
	return out
}

// signalChain is the indices of pts along the signal path from the first
// point (the input), each the strongest passive reach of the one before.
func signalChain(c *graph.Circuit, pts []point, g *Guide, hasMixer bool) []int {
	if len(pts) < 2 {
		return nil
	}
	sw := switched(c)
	quiet := quietened(sw)
	rs := ac.NewResponses(quiet)
	byNet := map[string]int{}
	for i, p := range pts {
		byNet[p.net] = i
	}
	used := make([]bool, len(pts))
	chain := []int{0}
	used[0] = true
	mixerSeen, detSeen := pts[0].mixer, pts[0].detector
	for cur := 0; ; {
		f := rowFreq(c, chainBand(c, g, hasMixer, mixerSeen, detSeen), g)
		nxt := nextPoint(sw, rs, pts, byNet, used, leaveNet(sw, pts[cur], byNet), f)
		if nxt < 0 {
			return chain
		}
		for _, k := range withHalves(pts, used, nxt) {
			used[k] = true
			chain = append(chain, k)
			mixerSeen = mixerSeen || pts[k].mixer
			detSeen = detSeen || pts[k].detector
		}
		cur = nxt
	}
}

// chainBand is the band the signal is in after the points walked so far:
// classify's rule, read along the chain.
func chainBand(c *graph.Circuit, g *Guide, hasMixer, mixerSeen, detSeen bool) string {
	switch {
	case detSeen:
		return "audio"
	case g.IF > 0 && (mixerSeen || !hasMixer):
		return "IF"
	case g.IF > 0:
		return "RF"
	case c.FullBand().Max <= 30e3:
		return "audio"
	}
	return "RF"
}

// withHalves is k and, when it is one of a pair's halves, the other
// halves not yet walked, all in pts's order: the signal reaches them side
// by side, so which the solver finds a hair stronger orders nothing.
func withHalves(pts []point, used []bool, k int) []int {
	if pts[k].halves == "" {
		return []int{k}
	}
	var out []int
	for j := range pts {
		if j == k || !used[j] && pts[j].halves == pts[k].halves {
			out = append(out, j)
		}
	}
	return out
}

// leaveNet is where the signal leaves a point: the output electrode of the
// device whose control electrode it is (its common electrode when the
// output is at AC ground: a follower), else the point's own net (the
// input, a detector's load).
func leaveNet(c *graph.Circuit, p point, byNet map[string]int) string {
	for _, cn := range c.ConnsOf(p.net) {
		d := cn.Part
		if !d.IsActive() || graph.RoleOfPin(d.Kind, cn.Pin) != graph.RoleControl && !p.mixer {
			continue
		}
		for _, role := range []graph.TermRole{graph.RoleOutput, graph.RoleCommon} {
			if n := d.NetOf(d.PinWithRole(role)); n != "" && !c.RoleOf(n).IsACGround() {
				return n
			}
		}
	}
	return p.net
}

// nextPoint is the unwalked point the signal leaving by net reaches most
// strongly at f among those a passive walk from net meets before any other
// point, −1 when none is reached.
func nextPoint(c *graph.Circuit, rs *ac.Responses, pts []point, byNet map[string]int, used []bool, net string, f float64) int {
	best, bestV := -1, 0.0
	for _, k := range passiveReach(c, net, byNet) {
		if used[k] {
			continue
		}
		v := 1.0
		if pts[k].net != net {
			r, err := rs.Transfer(net, pts[k].net, ac.Options{VarFrac: 0.5, VarSet: true})
			if err != nil {
				continue
			}
			h, err := r.At(f)
			if err != nil {
				continue
			}
			v = math.Abs(real(h)*real(h) + imag(h)*imag(h))
		}
		if v > bestV && !math.IsNaN(v) && !math.IsInf(v, 0) {
			best, bestV = k, v
		}
	}
	return best
}

// passiveReach are the points (indices, in net order of the walk) a walk
// from net over passive parts meets, not crossing a net at AC ground nor
// going on past a point.
func passiveReach(c *graph.Circuit, net string, byNet map[string]int) []int {
	seen := map[string]bool{net: true}
	front := []string{net}
	var out []int
	for len(front) > 0 {
		var next []string
		for _, n := range front {
			if k, ok := byNet[n]; ok {
				out = append(out, k)
				if n != net {
					continue
				}
			}
			for _, cn := range c.ConnsOf(n) {
				if cn.Part.IsActive() {
					continue
				}
				for _, m := range netsOf(cn.Part) {
					if !seen[m] && !c.RoleOf(m).IsACGround() {
						seen[m] = true
						next = append(next, m)
					}
				}
			}
		}
		slices.Sort(next)
		front = next
	}
	return out
}

// quietened is a copy of c with every active device's gain taken out and
// its resistances kept (quieten), c's nets and passive parts as they are.
func quietened(c *graph.Circuit) *graph.Circuit {
	out := c.Clone()
	for _, p := range out.Parts {
		if p.IsActive() {
			quieten(p)
		}
	}
	return out
}
