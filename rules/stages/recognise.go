package stages

// Matching the library on a circuit: every pattern of one kind tried, the
// matches placed in a tree (a tank inside an oscillator), each level in a
// stable order.

import (
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/dc"
)

// recognise matches the library's patterns of one kind (full: the power
// supply's, on the original circuit, whose operating point is op) on c.
func recognise(c *graph.Circuit, lib *Library, full bool, acg map[string]bool, orig *world, op *dc.Point, budget *int) ([]*found, error) {
	w := newWorld(c, full, acg)
	w.orig = orig
	w.op = op
	s := &searcher{w: w, limit: *budget, partUsed: make([]bool, len(w.parts)), netOwner: make([]int, len(w.names)), seen: map[string]bool{}}
	for i := range s.netOwner {
		s.netOwner[i] = -1
	}
	s.eval = func(m *match) *found {
		st := evaluate(w, m, false)
		if st == nil {
			return nil
		}
		set := map[string]bool{}
		for _, r := range st.Parts {
			set[r] = true
		}
		return &found{Stage: st, m: m, set: set}
	}
	var runErr error
	for _, p := range lib.Patterns {
		if (p.Circuit == "full") != full {
			continue
		}
		for _, v := range p.variants {
			if err := s.run(v); err != nil {
				runErr = err
				break
			}
		}
		if runErr != nil {
			break
		}
	}
	*budget -= s.steps
	cands := s.cands
	// The overlap rule: larger first, then the more specific pattern, then
	// pattern id and refs, so the outcome never depends on search order.
	sort.SliceStable(cands, func(i, j int) bool {
		a, b := cands[i], cands[j]
		if len(a.Parts) != len(b.Parts) {
			return len(a.Parts) > len(b.Parts)
		}
		if a.m.v.p.Rank != b.m.v.p.Rank {
			return a.m.v.p.Rank > b.m.v.p.Rank
		}
		if a.Topology != b.Topology {
			return a.Topology < b.Topology
		}
		return strings.Join(a.Parts, ",") < strings.Join(b.Parts, ",")
	})
	var tops []*found
	claimedBy := map[string]*found{} // part ref → the top-level stage holding it
	for _, f := range cands {
		var holder *found
		straddles := false
		for r := range f.set {
			if t := claimedBy[r]; t != nil {
				if holder != nil && holder != t {
					straddles = true
				}
				holder = t
			}
		}
		switch {
		case straddles:
		case holder == nil:
			tops = append(tops, f)
			for r := range f.set {
				claimedBy[r] = f
			}
		default:
			place(&holder.subs, f, holder)
		}
	}
	sortTree(tops)
	tops = solveFigures(w, tops)
	return tops, runErr
}

// place puts a candidate that overlaps stage parent inside it when it lies
// wholly inside and its pattern may nest (and is of another group: a tank
// in an oscillator, not a tank in a tank), then recursively among parent's
// sub-stages the same way; a candidate that straddles is dropped. The
// top level is handled by recognise with an index.
func place(level *[]*found, f *found, parent *found) {
	if inside, _ := relation(f.set, parent.set); !inside || !f.m.v.p.Inner || f.group == parent.group || len(f.set) == len(parent.set) {
		return
	}
	if sharesCoil(f, parent) && tunesOwnCoil(parent) {
		// an oscillator's figures already give its tank's resonance with
		// every capacitor of the tank counted; a tank stage inside it would
		// repeat f on part of them (a Colpitts' gang without the divider).
		// An FM detector's give its transformer's two resonances: a
		// double-tuned pair inside it would add a pass band its
		// secondary, which drives the diodes, does not have
		return
	}
	for _, t := range *level {
		if _, overlap := relation(f.set, t.set); overlap {
			place(&t.subs, f, t)
			return
		}
	}
	*level = append(*level, f)
}

// tunesOwnCoil says whether a stage's own figures solve the coils it
// holds: an oscillator's, or one whose pattern asks for a discriminator.
func tunesOwnCoil(f *found) bool {
	if f.group == "oscillator" {
		return true
	}
	for _, fs := range f.m.v.p.Figures {
		if fs.Calc == "discriminator" {
			return true
		}
	}
	return false
}

// sortTree orders each level of sub-stages by first part ref, so names do
// not depend on the order patterns were tried.
func sortTree(level []*found) {
	sort.SliceStable(level, func(i, j int) bool { return level[i].Parts[0] < level[j].Parts[0] })
	for _, f := range level {
		sortTree(f.subs)
	}
}

func relation(a, b map[string]bool) (inside, overlap bool) {
	inside = true
	for r := range a {
		if b[r] {
			overlap = true
		} else {
			inside = false
		}
	}
	return inside && overlap, overlap
}
