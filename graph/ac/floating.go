// Nodes the equations cannot fix: no path to ground through any part that
// conducts at AC.

package ac

import (
	"errors"
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

// Undriven lists the nets of c that no part conducting at AC ties to
// ground, to a declared input, or to a way in from outside (a port, a
// generic part: portHeldNets): a winding or stage truly left unconnected,
// which no small-signal solve can fix. `pare check` warns about them so
// that the capture is mended before the AC proof fails on them. An
// elaboration error returns nil: the solves report it with its context.
func Undriven(c *graph.Circuit) []string {
	nl, err := elaborate(c, Options{})
	if err != nil {
		return nil
	}
	// Only nodes some element touches are unknowns of a solve.
	s := &system{nl: nl, unk: make([]int, len(nl.nodes))}
	for i := range s.unk {
		s.unk[i] = unkGround
	}
	for _, p := range nl.prims {
		for _, n := range []int{p.a, p.b, p.c, p.d} {
			if n > 0 { // a negative node is no node (portHeldNets)
				s.unk[n] = 0
			}
		}
	}
	for _, g := range nl.groups {
		for _, w := range g.winds {
			for _, n := range []int{w.a, w.b} {
				if n > 0 {
					s.unk[n] = 0
				}
			}
		}
	}
	s.unk[0] = unkGround
	held := make([]bool, len(nl.nodes))
	for _, in := range c.Inputs {
		if n, ok := nl.netNode[in]; ok {
			held[n] = true
		}
	}
	var fe *FloatingError
	if errors.As(s.checkFloating(0, held), &fe) {
		return fe.Nets
	}
	return nil
}
