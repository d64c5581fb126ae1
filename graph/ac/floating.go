// Nodes the equations cannot fix: no path to ground through any part that
// conducts at AC.

package ac

import (
	"fmt"
	"strings"

	"pare/graph"
)

// checkFloating finds nodes with no path to ground (or to the driven node)
// through any element that conducts at AC; such a circuit has no unique
// solution, and naming the nets beats a singular matrix.
func (s *system) checkFloating(driven int, held []bool) error {
	nl := s.nl
	var sets graph.DisjointSets
	find, join := sets.Find, sets.Union
	if driven > 0 {
		join(0, driven)
	}
	for i, h := range held {
		if h {
			join(0, i)
		}
	}
	for _, p := range nl.prims {
		if p.kind != primVCCS {
			join(p.a, p.b)
		}
	}
	for _, g := range nl.groups {
		for _, w := range g.winds {
			join(w.a, w.b)
		}
	}
	var floating []string
	for i := 1; i < len(nl.nodes); i++ {
		if s.unk[i] >= 0 && find(i) != find(0) {
			floating = append(floating, nl.nodes[i])
		}
	}
	if len(floating) == 0 {
		return nil
	}
	return &FloatingError{Nets: floating}
}

// FloatingError names nets with no path to ground through any part that
// conducts at AC: the equations do not fix their voltages.
type FloatingError struct{ Nets []string }

func (e *FloatingError) Error() string {
	nets, more := e.Nets, ""
	if len(nets) > 8 {
		more = fmt.Sprintf(" and %d more", len(nets)-8)
		nets = nets[:8]
	}
	return fmt.Sprintf("floating: net(s) %s%s have no path to ground through any part (a winding or stage left unconnected?)", strings.Join(nets, ", "), more)
}
