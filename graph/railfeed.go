package graph

// railFeed is the rail that feeds a net a reduction is about to tie to AC
// ground, and the part it comes through: of the resistors and chokes from
// the net to rails, a supply's before a bias line's (a base line's
// standing-bias resistor runs from the line being named towards the base,
// and carries the base current, not the line's), then the lowest
// resistance, the one that carries the most of the line's current, then
// the first by ref. A leg to chassis that is no rail makes the net a
// bias divider's tap, not a line (ok false), unless it is a bleed far
// above the feed (bleedRatio).
func (c *Circuit) railFeed(net string) (from *Net, via string, ok bool) {
	bestRank, bestR := 0, 0.0
	leg, legR := false, 0.0 // the lowest DC path to chassis
	for _, cn := range c.ConnsOf(net) {
		other, ok := dcNeighbour(cn)
		if !ok || other.Net == net || !c.RoleOf(other.Net).IsACGround() {
			continue
		}
		ret := c.ReturnOf(other)
		if ret == nil || !ret.Role.IsRail() {
			if r := feedOhms(cn.Part); !leg || r < legR {
				leg, legR = true, r
			}
			continue
		}
		rank, r := 0, feedOhms(cn.Part)
		if ret.Role == Bias {
			rank = 1
		}
		better := from == nil || rank < bestRank || rank == bestRank && (r < bestR || r == bestR && cn.Part.Ref < via)
		if better {
			from, via, bestRank, bestR = ret, cn.Part.Ref, rank, r
		}
	}
	if leg && c.Part(via) != nil && c.Part(via).Kind == Inductor {
		// fed through a choke and loaded to chassis (a bleeder, a dummy
		// load): a smoothing section's own line, named by the supply's
		// pass, not a line hung off the rail before the choke
		return nil, "", false
	}
	if from == nil || leg && legR < bleedRatio*bestR {
		return nil, "", false // a bias divider's tap, not a supply line
	}
	return from, via, true
}

// bleedRatio is how much more resistance a path to chassis must have than
// the feed for the net to stay a supply line it merely loads (a bias chain
// hung on a decoupled line: 47 kΩ below 330 Ω), not a divider's tap: 20,
// the line within 5 % of its rail (judgement, common practice for a
// decoupled line; a base divider's legs are within a factor of ten).
const bleedRatio = 20

// feedOhms is the DC resistance a feed part puts in the line: a
// resistor's value, a choke's winding resistance where given (else none).
func feedOhms(p *Part) float64 {
	if p.Kind == Resistor {
		return p.Value.Max
	}
	if r, ok := p.Param("rdc"); ok {
		return r
	}
	return 0
}
