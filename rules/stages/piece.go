// Pieces: the part of a large set a stage's figures are solved on, chosen
// so that the rest of the set cannot move the figures.

package stages

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"pare/graph"
	"pare/graph/figure"
)

// wholeCircuitParts is the size up to which a stage is solved in the whole
// reduced circuit. A larger set is solved on a piece of it, so a figure
// costs the same in a 5,000-part set as in a one-stage sheet; a variable
// so a test can make a small set "large".
var wholeCircuitParts = 400

// solverDepth is the depth, in steps from part to part through nets, of
// the first piece tried where no piece closed at AC ground is small
// enough: four steps reach from a stage's output through a coupling
// capacitor to the next device and its emitter or cathode parts, which set
// what that device draws. It is only a start: the piece's figures are
// accepted once a piece twice as deep agrees (evaluatePiece).
const solverDepth = 4

// pieceAgree is how closely the figures of two pieces must agree for the
// smaller one's cut to be taken as not moving them: 10⁻⁵ of the value,
// well under the three or four digits a figure is printed with.
const pieceAgree = 1e-5

// evaluatePiece evaluates a kept stage with its figures solved in circuit.
// A set up to wholeCircuitParts is solved whole. A larger one is solved on
// a piece: (a) the parts reached from the stage through nets the solver
// does not hold at AC ground, when they close within wholeCircuitParts —
// the solver's matrix has no entry joining them to the rest, so the piece's
// figures are the whole circuit's, exactly; else (b) the parts within
// solverDepth steps, accepted only when its figures stay within pieceAgree
// with the nets at its edge left open and with them held at AC ground,
// the two extremes of what the rest of the set can hang on them; where
// they part, the piece is made twice as deep, until they agree or it
// closes (up to the whole circuit). Each solver figure's origin says which
// (figure.Origin.Piece).
func evaluatePiece(w *world, m *match) *Stage {
	if len(w.parts) <= wholeCircuitParts {
		return evaluate(w, m, true)
	}
	if c, edge := w.piece(m.parts, -1, wholeCircuitParts); edge == nil && c != nil {
		st := evaluateOn(w, m, true, c)
		markPiece(st, fmt.Sprintf("on a piece of %d parts cut only at AC ground: exact", len(c.Parts)))
		return st
	}
	last := 0
	for depth := solverDepth; ; depth *= 2 {
		c, edge := w.piece(m.parts, depth, len(w.parts))
		if c == nil || len(c.Parts) == last || edge != nil && len(edge) == 0 {
			// not closed, and nothing more to reach or a cut the solver does
			// not hold (piece): solved on all it reaches, as it
			// stands, and said so
			c, _ = w.piece(m.parts, -1, len(w.parts))
			st := evaluateOn(w, m, true, c)
			markPiece(st, fmt.Sprintf("on a piece of %d parts, all the stage reaches short of AC ground, not proven exact (a net a reduction grounded, or a detector without its kept DC load)", len(c.Parts)))
			return st
		}
		st := evaluateOn(w, m, true, c)
		if edge == nil {
			how := fmt.Sprintf("on a piece of %d parts cut only at AC ground: exact", len(c.Parts))
			if depth > solverDepth {
				how += ", widened to it as smaller pieces' edges moved the figures"
			}
			markPiece(st, how)
			return st
		}
		if sameFigures(st, evaluateOn(w, m, true, heldAt(c, edge))) {
			markPiece(st, fmt.Sprintf("on a piece of %d parts within %d steps, confirmed: its %d edge nets open or at AC ground give the same to %g",
				len(c.Parts), depth, len(edge), pieceAgree))
			return st
		}
		last = len(c.Parts)
	}
}

// heldAt is c with the nets edge held at AC ground.
func heldAt(c *graph.Circuit, edge []string) *graph.Circuit {
	out := withPart(c, &graph.Part{})
	out.Nets = make([]*graph.Net, len(c.Nets))
	for i, n := range c.Nets {
		out.Nets[i] = n
		if slices.Contains(edge, n.Name) {
			h := *n
			h.Role = graph.Ground
			out.Nets[i] = &h
		}
	}
	return out
}

// markPiece records on every solver figure of st the piece it was solved on.
func markPiece(st *Stage, how string) {
	if st == nil {
		return
	}
	for i := range st.Figures {
		if f := &st.Figures[i]; f.Origin.Source == figure.Solver {
			f.Origin.Piece = how
		}
	}
}

// sameFigures tells whether two evaluations of one stage agree: the same
// title, flags and figures, each number within pieceAgree.
func sameFigures(a, b *Stage) bool {
	if a == nil || b == nil {
		return a == b
	}
	if a.Title != b.Title || len(a.Figures) != len(b.Figures) || len(a.Flags) != len(b.Flags) {
		return false
	}
	for i := range a.Flags {
		if a.Flags[i] != b.Flags[i] {
			return false
		}
	}
	for i := range a.Figures {
		if !sameFigure(a.Figures[i], b.Figures[i]) {
			return false
		}
	}
	return true
}

func sameFigure(f, g figure.Figure) bool {
	if f.Name != g.Name || f.Unit != g.Unit || (f.Range == nil) != (g.Range == nil) || len(f.Points) != len(g.Points) {
		return false
	}
	if f.Range != nil && !(near(f.Range.Min, g.Range.Min) && near(f.Range.Max, g.Range.Max)) {
		return false
	}
	for i := range f.Points {
		if !near(f.Points[i], g.Points[i]) {
			return false
		}
	}
	if (f.At == nil) != (g.At == nil) || f.At != nil && !sameFigure(*f.At, *g.At) {
		return false
	}
	return near(f.Value, g.Value)
}

// near tells whether a and b agree to pieceAgree of the larger.
func near(a, b float64) bool {
	if math.IsNaN(a) || math.IsNaN(b) {
		return math.IsNaN(a) && math.IsNaN(b)
	}
	return math.Abs(a-b) <= pieceAgree*max(math.Abs(a), math.Abs(b))
}

// neighbourhood is the stage with every part within depth steps of it
// through nets that are not AC ground.
// through nets that are not AC ground (the matcher's: in the power
// supply's circuit the rails stay apart).
func (x *figCtx) neighbourhood(depth int) *graph.Circuit {
	return x.w.pieceCircuit(sortedParts(x.w.near(x.m.parts, depth, len(x.w.parts), false)))
}

// piece is the circuit of the parts within depth steps of the parts from
// (depth < 0: no bound) through nets the solver does not hold at AC
// ground, with its edge: the nets, sorted, other than one the solver holds
// at AC ground, that reach a part outside it. With no edge the solver's
// matrix for the piece is the whole circuit's block, and what is solved on
// it is exact. A search that passes limit parts gives no piece (nil).
// edge is nil only for a piece that is exact: one on a net the matcher
// folds but the solver does not, or with a detector whose DC load the
// solver would take from the piece, has a non-nil empty edge.
func (w *world) piece(from []int, depth, limit int) (c *graph.Circuit, edge []string) {
	in := w.near(from, depth, limit, true)
	if len(in) > limit {
		return nil, nil
	}
	idx := sortedParts(in)
	edge = w.edge(idx, in)
	if edge == nil && (w.softGround(idx) || w.unkeptDetector(idx)) {
		edge = []string{}
	}
	return w.pieceCircuit(idx), edge
}

// near is the parts within depth steps of from (depth < 0: no bound),
// through nets the matcher does not fold into AC ground and, with rails,
// nor any net the solver holds there (a rail the power supply's circuit
// keeps apart); a search that passes limit parts stops there.
func (w *world) near(from []int, depth, limit int, rails bool) map[int]bool {
	in := make(map[int]bool, 4*len(from))
	frontier := append([]int(nil), from...)
	for _, ci := range frontier {
		in[ci] = true
	}
	for d := 0; len(frontier) > 0 && (depth < 0 || d < depth) && len(in) <= limit; d++ {
		var next []int
		for _, ci := range frontier {
			for _, id := range w.pins[ci] {
				if id == groundNet || rails && w.role[id].IsACGround() {
					continue
				}
				for _, cj := range w.conns[id] {
					if !in[cj] {
						in[cj] = true
						next = append(next, cj)
					}
				}
			}
		}
		frontier = next
	}
	return in
}

// sortedParts is the parts of in by index: the circuit's parts are sorted
// by ref, so the piece's are too.
func sortedParts(in map[int]bool) []int {
	idx := make([]int, 0, len(in))
	for ci := range in {
		idx = append(idx, ci)
	}
	sort.Ints(idx)
	return idx
}

// edge is the names, sorted, of the nets of the parts idx (the parts of
// in), other than one the solver holds at AC ground, that lead to a part
// outside in; nil when none does.
func (w *world) edge(idx []int, in map[int]bool) []string {
	var names []string
	for _, ci := range idx {
		for j, id := range w.pins[ci] {
			if id == groundNet || w.role[id].IsACGround() {
				continue
			}
			for _, cj := range w.conns[id] {
				if !in[cj] {
					names = append(names, w.parts[ci].Pins[j].Net)
					break
				}
			}
		}
	}
	slices.Sort(names)
	return slices.Compact(names)
}

// softGround tells whether a part of idx sits on a net the matcher folds
// into AC ground but the solver does not hold there (a net a reduction
// found at AC ground and left in the circuit under a role of its own): a
// cut there is not exact.
func (w *world) softGround(idx []int) bool {
	c := w.c
	for _, ci := range idx {
		for j, id := range w.pins[ci] {
			if id != groundNet {
				continue
			}
			if n := c.Net(w.parts[ci].Pins[j].Net); n != nil && !n.Role.IsACGround() {
				return true
			}
		}
	}
	return false
}

// unkeptDetector tells whether a detector diode of idx has no DC load kept
// on the circuit (ac.KeepDetectorLoads): the solver would take it from the
// piece's DC paths, which an AGC line, AC ground but no DC return, joins
// to the rest of the set.
func (w *world) unkeptDetector(idx []int) bool {
	for _, ci := range idx {
		p := w.parts[ci]
		a := ""
		switch {
		case p.Kind == graph.Diode && p.Type != "varicap", p.Kind == graph.Valve && p.Type == "diode":
			a = ".a"
		case p.Kind == graph.Valve && p.Type == "double-diode":
			a = ".a1"
		default:
			continue
		}
		if _, ok := w.c.DetectorLoads[p.Ref+a]; !ok {
			return true
		}
	}
	return false
}

// pieceCircuit is the circuit of the parts idx (sorted) with their nets,
// and the declared inputs and outputs among those nets: the solver holds a
// declared input at 0 V in every transfer, in the piece as in the whole.
func (w *world) pieceCircuit(idx []int) *graph.Circuit {
	c := w.c
	sub := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Regions: c.Regions,
		DetectorLoads: c.DetectorLoads}
	sub.UseRegionIndex(w.rx)
	used := map[string]bool{}
	var names []string
	for _, ci := range idx {
		p := w.parts[ci]
		sub.Parts = append(sub.Parts, p)
		for _, pin := range p.Pins {
			if !used[pin.Net] {
				used[pin.Net] = true
				names = append(names, pin.Net)
			}
		}
	}
	sort.Strings(names)
	for _, name := range names {
		if n := c.Net(name); n != nil {
			sub.Nets = append(sub.Nets, n)
		}
	}
	for _, n := range c.Inputs {
		if used[n] {
			sub.Inputs = append(sub.Inputs, n)
		}
	}
	for _, n := range c.Outputs {
		if used[n] {
			sub.Outputs = append(sub.Outputs, n)
		}
	}
	return sub
}
