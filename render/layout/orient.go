package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// orient picks each cell's orientation by scoring where its pins point:
// ground and bias down, rails up, signal pins towards the parts they lead to.
// An orientation the untangle search fixed wins, if it keeps the symbol
// upright; short of that, a padder and the part under it (padder.go) stand
// vertical, hot end up.
func (ly *state) orient() {
	stands := ly.stands()
	ly.slot = ly.templateSlots()
	ly.slotMates = map[*cell][]*cell{}
	for _, cl := range ly.cells {
		if t, ok := ly.slot[cl.ref]; ok {
			ly.slotMates[t.anchor] = append(ly.slotMates[t.anchor], cl)
		}
	}
	ly.slotNetSum = ly.slotNets()
	ups := ly.padderUps()
	for _, cl := range ly.cells {
		if cl.conn {
			cl.shape = connectorShape(cl)
			continue
		}
		base := symbol.ForMarked(ly.o.drawnPart(cl.part), ly.o.Style, ly.marksOf(cl.part))
		if cl.part.Kind == graph.Port && len(cl.part.Pins) == 1 {
			in := cl.edge <= 0
			if ly.supplyPorts[cl.ref] {
				// in the supply's flow: a mains port before what it
				// feeds, a port taking a line on after it
				in = ly.netCol[cl.part.Pins[0].Net] >= float64(cl.col)
			}
			base = symbol.Flag(cl.part.Label, in)
			for i := range base.Pins {
				base.Pins[i].Net = cl.part.Pins[0].Net
			}
			cl.shape = base
			continue
		}
		if stands[cl.ref] == StandFlipped && len(base.Pins) > 2 {
			// the lower half of a pair, mirrored about the line between
			// the halves: one orientation, which the search keeps
			flip := symbol.Orient{Mirror: true, Quarter: 2}
			cl.shape, cl.turns, cl.turn = base.Oriented(flip), []symbol.Orient{flip}, 0
			continue
		}
		best, bestScore := base, math.Inf(-1)
		cl.turns = base.Turns
		// a turn the search fixed holds when it leaves the part upright
		t, fixed := ly.turns[cl.ref]
		fixed = fixed && len(base.Turns) > 0 && upright(ly.c, cl.part, base.Oriented(base.Turns[t])) && ly.hangsToReturn(cl, base.Oriented(base.Turns[t]))
		for i, o := range base.Turns {
			s := base.Oriented(o)
			score := ly.score(cl, s)
			if up, ok := ups[cl.ref]; ok {
				score += upBonus(s, up)
			}
			if fixed {
				score = 0
				if t == i {
					score = 1
				}
			}
			if score > bestScore+1e-9 {
				best, bestScore, cl.turn = s, score, i
			}
		}
		if _, fixed := ly.turns[cl.ref]; !fixed && stands[cl.ref] != "" && standOf(best) != stands[cl.ref] {
			best = ly.standing(cl, base, best, stands[cl.ref])
		}
		if ly.bridgeDiode(cl) {
			best = ly.alongDiamond(cl, base, best)
		}
		cl.shape = best
	}
	ly.orientTanks()
}

// alongDiamond is a bridge diode's orientation on its side of the
// diamond (supplyflow.go): lying along the flow, anode left, cathode right.
func (ly *state) alongDiamond(cl *cell, base, best symbol.Shape) symbol.Shape {
	for i, o := range base.Turns {
		s := base.Oriented(o)
		for _, p := range s.Pins {
			if p.Name == "a" && p.Dir == geom.Left {
				cl.turn = i
				return s
			}
		}
	}
	return best
}

// standing is the best-scoring upright orientation of a cell that runs the
// way its stage template asks, or best when none does.
func (ly *state) standing(cl *cell, base, best symbol.Shape, stand string) symbol.Shape {
	bestScore := math.Inf(-1)
	for i, o := range base.Turns {
		s := base.Oriented(o)
		if standOf(s) != stand || !upright(ly.c, cl.part, s) || !ly.hangsToReturn(cl, s) {
			continue
		}
		if score := ly.score(cl, s); score > bestScore+1e-9 {
			best, bestScore, cl.turn = s, score, i
		}
	}
	return best
}

// upBonus outweighs every other score of a part's orientation when its pin
// on net up points up: a padder's pair stands as its tank's C does.
func upBonus(s symbol.Shape, up string) float64 {
	for _, p := range s.Pins {
		if p.Net == up && p.Dir == geom.Up {
			return 100
		}
	}
	return 0
}

// upright says whether a symbol keeps grounds and low rails from pointing
// up and high rails from pointing down (railWant): the search for fewer
// crossings may only choose such.
func upright(c *graph.Circuit, part *graph.Part, s symbol.Shape) bool {
	for _, p := range s.Pins {
		if !c.RoleOf(p.Net).IsACGround() {
			continue
		}
		if want, ok := railWant(c, part, p); ok && p.Dir == geom.Dir((int(want)+2)%4) {
			return false
		}
	}
	return true
}

// score rates an orientation of a cell: ground and low rails down, high
// rails up (railWant), signal pins towards the rest of their net, and a part
// whose pins are all signal pins lying along the signal path.
func (ly *state) score(cl *cell, s symbol.Shape) float64 {
	score := 0.0
	horizontalSignal := 0
	signal := 0
	ret := ly.returnPin(cl)
	for _, p := range s.Pins {
		want, rail := railWant(ly.c, cl.part, p)
		switch {
		case rail && ly.c.RoleOf(p.Net).IsACGround():
			score += railScore(p.Dir, want)
		case p.Net == ret:
			// a shunt's end on a bias return hangs down to it
			score += railScore(p.Dir, geom.Down)
		default:
			signal++
			score += ly.towards(cl, p)
			if p.Dir == geom.Left || p.Dir == geom.Right {
				horizontalSignal++
			}
		}
	}
	if signal == len(s.Pins) && horizontalSignal == signal {
		score += 1 // a part in the signal path lies along it
	}
	return score + ly.hangScore(cl, s) + ly.lineScore(cl, s)
}

// railScore rates a rail pin pointing in direction d where it should point
// in direction want: its own way, the opposite way, or sideways.
func railScore(d, want geom.Dir) float64 {
	switch d {
	case want:
		return 4
	case geom.Dir((int(want) + 2) % 4):
		return -4
	}
	return -1
}

// towards rates a signal pin by whether it points to the side where the
// rest of its net lies, by mean column.
func (ly *state) towards(cl *cell, p geom.Pin) float64 {
	n := ly.netCol[p.Net]
	here := float64(cl.col)
	others := float64(ly.netCount[p.Net] - 1)
	if others > 0 {
		tot := n*(others+1) - here
		n = tot / others
	}
	if t, ok := ly.slot[cl.ref]; ok && others > 0 {
		// where its stage template will put it, and its neighbours
		// where theirs will
		here = t.col
		n = (ly.slotNetSum[p.Net] - here) / others
	}
	switch {
	case n < here-0.01:
		if p.Dir == geom.Left {
			return 2
		} else if p.Dir == geom.Right {
			return -2
		}
	case n > here+0.01:
		if p.Dir == geom.Right {
			return 2
		} else if p.Dir == geom.Left {
			return -2
		}
	}
	return 0
}
