package layout

import (
	"slices"

	"pare/graph"
)

// leadsToControl says whether the active electrodes nearest net, through
// the row's passive parts over followed nets, include a control electrode,
// or no active part is met at all (a row of passive parts).
func (ly *state) leadsToControl(net string, follow func(string) bool) bool {
	e := ly.nearestElectrodes(net, follow)
	return e.control || !e.met
}

// nearestElectrodes walks from net through passive parts over followed
// nets to the first active parts met and says whether their electrodes
// there include a control, common or output electrode, and whether any
// active part was met at all.
func (ly *state) nearestElectrodes(net string, follow func(string) bool) (e electrodes) {
	seenNet, seenCell := map[string]bool{net: true}, map[*cell]bool{}
	front := []string{net}
	for len(front) > 0 {
		var next []string
		for _, n := range front {
			for _, cl := range ly.cellsOn(n) {
				for _, pn := range cl.part.Pins {
					if pn.Net != n || seenCell[cl] || cl.part.Kind == graph.Port {
						continue
					}
					if cl.part.IsActive() {
						e.met = true
						switch graph.RoleOfPin(cl.part.Kind, pn.Name) {
						case graph.RoleControl:
							e.control = true
						case graph.RoleCommon:
							e.common = true
						case graph.RoleOutput:
							e.output = true
						}
						continue
					}
					seenCell[cl] = true
					for _, m := range cl.part.Pins {
						if !seenNet[m.Net] && follow(m.Net) {
							seenNet[m.Net] = true
							next = append(next, m.Net)
						}
					}
				}
			}
		}
		if e.met {
			return e
		}
		front = next
	}
	return e
}

// cellsOn are the cells with a pin on net, any net, in cell order: the
// walks of nearestElectrodes ask for them net by net, and scanning every
// cell for each made the placement of a whole set grow with its square
// (a 10,000-part bank took minutes to rank).
func (ly *state) cellsOn(net string) []*cell {
	if ly.pinCells == nil {
		ly.pinCells = map[string][]*cell{}
		for _, cl := range ly.cells {
			for i, pn := range cl.part.Pins {
				if !slices.ContainsFunc(cl.part.Pins[:i], func(q graph.Pin) bool { return q.Net == pn.Net }) {
					ly.pinCells[pn.Net] = append(ly.pinCells[pn.Net], cl)
				}
			}
		}
	}
	return ly.pinCells[net]
}

// electrodes are the kinds of electrode nearestElectrodes met.
type electrodes struct{ control, common, output, met bool }
