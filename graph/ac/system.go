package ac

import (
	"cmp"
	"fmt"
	"math"
	"math/cmplx"
	"slices"
)

// Options chooses the setting of the circuit's adjustable parts.
type Options struct {
	// VarFrac sets variable capacitors (gang sections) at Min+VarFrac·(Max−Min).
	VarFrac float64
	// VarSet false: VarFrac is ignored and the sections sit at mid travel (0.5).
	VarSet bool
	// Terminate loads nets with a resistance to ground (ohms; 0 is a short),
	// e.g. a port's stated termination. Ports are open otherwise.
	Terminate map[string]float64
}

// Modified nodal analysis. Unknowns are the node voltages (ground and a
// driven node excluded) and one branch current per coupled winding; an
// uncoupled winding is an admittance 1/(R+jωL) and needs no branch. The
// matrix pattern is fixed for a circuit, so it is built once: every stamp is
// a (slot, value, sign) triple and a frequency point only recomputes values.

// valKind says how a stamp's value depends on ω.
type valKind int

const (
	valConst valKind = iota // a
	valJW                   // jω·a
	valRL                   // 1/(a + jω·b)
	valRLC                  // 1/(a + jω·b + 1/(jω·c))
	valZ                    // a + jω·b
)

type coef struct {
	kind    valKind
	a, b, c float64
}

func (k coef) at(w float64) complex128 {
	switch k.kind {
	case valConst:
		return complex(k.a, 0)
	case valJW:
		return complex(0, w*k.a)
	case valRL:
		return recip(complex(k.a, w*k.b))
	case valRLC:
		return recip(complex(k.a, w*k.b-1/(w*k.c)))
	case valZ:
		return complex(k.a, w*k.b)
	}
	return 0
}

// stamp adds sign·coefs[val] at a matrix slot, or, when the column is the
// driven node, subtracts it from the right-hand side row rhs.
type stamp struct {
	slot int32
	rhs  int32
	val  int32
	neg  bool
}

type system struct {
	nl     *netlist
	n      int
	unk    []int    // node -> unknown index; -1 ground or unused, -2 driven
	what   []string // unknown -> what it is, for messages
	coefs  []coef
	stamps []stamp
	a      csc
	f      *lu
	b, y   []complex128
	vals   []complex128 // coefficient values at the current frequency
	fixed  *statics     // solveAt's constant sums, from its first call
	bound  []float64    // solveRHSFrom's scratch
	watch  *watch       // the check of what the solve resolves (resolution.go); nil: none
}

const (
	unkGround = -1
	unkDriven = -2
)

// newSystem assembles the MNA pattern of nl with node driven held at 1 V
// (driven < 0: nothing driven) and the nodes in held at 0 V, as by ideal
// sources with no AC output.
func newSystem(nl *netlist, driven int, held ...int) (*system, error) {
	isHeld := heldSet(len(nl.nodes), driven, held)
	s := assemble(nl, driven, isHeld, nil)
	if err := s.checkFloating(driven, isHeld); err != nil {
		return nil, err
	}
	return s, nil
}

// heldSet marks the held nodes other than ground and the driven one.
func heldSet(n, driven int, held []int) []bool {
	isHeld := make([]bool, n)
	for _, h := range held {
		if h > 0 && h != driven {
			isHeld[h] = true
		}
	}
	return isHeld
}

// part is a piece of a netlist that no stamp joins to the rest: its nodes,
// primitives and winding groups, each in ascending order.
type part struct{ nodes, prims, groups []int }

// assemble builds the system of the piece sub of nl (nil: all of it).
// Numbering the unknowns in ascending node order, visiting the primitives
// and groups in their order and ordering each connected piece of the
// pattern on its own (rcm) makes the system of a piece the same block, to
// the last bit, as it is inside the system of the whole.
func assemble(nl *netlist, driven int, isHeld []bool, sub *part) *system {
	s := &system{nl: nl}
	s.unk = make([]int, len(nl.nodes))
	for i := range s.unk {
		s.unk[i] = unkGround
	}
	if driven > 0 {
		s.unk[driven] = unkDriven
	}
	prims, groups := s.numberUnknowns(driven, isHeld, sub)
	b := &builder{s: s, ents: make([]entry, 0, 4*len(prims)+8*len(groups))}
	b.stampPrims(prims)
	b.stampGroups(groups)
	if s.n == 0 {
		s.stamps = b.rhs
		return s
	}
	b.reorder()
	b.compress()
	identity := make([]int, s.n)
	for i := range identity {
		identity[i] = i
	}
	s.f = newLU(s.n, identity)
	s.b = make([]complex128, s.n)
	s.y = make([]complex128, s.n)
	return s
}

// numberUnknowns gives every node of the piece that is neither ground, held
// nor driven an unknown, in ascending node order, and returns the piece's
// primitives and winding groups.
func (s *system) numberUnknowns(driven int, isHeld []bool, sub *part) ([]prim, []group) {
	nl := s.nl
	number := func(i int) {
		if i != driven && !isHeld[i] && s.unk[i] == unkGround {
			s.unk[i] = s.n
			s.what = append(s.what, "net "+nl.nodes[i])
			s.n++
		}
	}
	if sub != nil {
		for _, i := range sub.nodes {
			if i > 0 {
				number(i)
			}
		}
		prims := make([]prim, len(sub.prims))
		for k, i := range sub.prims {
			prims[k] = nl.prims[i]
		}
		groups := make([]group, len(sub.groups))
		for k, i := range sub.groups {
			groups[k] = nl.groups[i]
		}
		return prims, groups
	}
	used := make([]bool, len(nl.nodes))
	for _, p := range nl.prims {
		used[p.a], used[p.b] = true, true
		if p.kind == primVCCS {
			used[p.c], used[p.d] = true, true
		}
	}
	for _, g := range nl.groups {
		for _, w := range g.winds {
			used[w.a], used[w.b] = true, true
		}
	}
	for i := 1; i < len(nl.nodes); i++ {
		if used[i] {
			number(i)
		}
	}
	return nl.prims, nl.groups
}

// entry is one coefficient's place in the matrix before compression; ord
// is the stamp order, which breaks ties so that sums come out the same on
// every run.
type entry struct {
	row, col, val, ord int32
	sign               float64
}

// builder collects a system's entries and driven right-hand sides.
type builder struct {
	s    *system
	ents []entry
	rhs  []stamp
}

func (b *builder) add(row, col, val int, sign float64) {
	if row < 0 {
		return
	}
	switch {
	case col >= 0:
		b.ents = append(b.ents, entry{int32(row), int32(col), int32(val), int32(len(b.ents)), sign})
	case col == unkDriven:
		b.rhs = append(b.rhs, stamp{slot: -1, rhs: int32(row), val: int32(val), neg: sign < 0})
	}
}

func (b *builder) newCoef(k coef) int {
	b.s.coefs = append(b.s.coefs, k)
	return len(b.s.coefs) - 1
}

// quad stamps a conductance-like value between the node pairs (p, q) and
// (r, t): a branch when they are the same pair, a VCCS when not.
func (b *builder) quad(p, q, r, t, val int) {
	u := b.s.unk
	b.add(u[p], u[r], val, 1)
	b.add(u[p], u[t], val, -1)
	b.add(u[q], u[r], val, -1)
	b.add(u[q], u[t], val, 1)
}

func (b *builder) stampPrims(prims []prim) {
	for _, p := range prims {
		var k coef
		switch p.kind {
		case primR:
			k = coef{kind: valConst, a: 1 / p.v}
		case primC:
			k = coef{kind: valJW, a: p.v}
		case primRL:
			k = coef{kind: valRL, a: p.r, b: p.l}
		case primRLC:
			k = coef{kind: valRLC, a: p.r, b: p.l, c: p.C}
		case primVCCS:
			b.quad(p.a, p.b, p.c, p.d, b.newCoef(coef{kind: valConst, a: p.v}))
			continue
		}
		b.quad(p.a, p.b, p.a, p.b, b.newCoef(k))
	}
}

// stampGroups adds a branch-current unknown per winding: coupled windings
// need their currents, since a mutual inductance ties one winding's voltage
// to another's current.
func (b *builder) stampGroups(groups []group) {
	s := b.s
	one := b.newCoef(coef{kind: valConst, a: 1})
	for _, g := range groups {
		base := s.n
		for _, w := range g.winds {
			s.what = append(s.what, fmt.Sprintf("current in %s winding %s", g.ref, w.name))
			s.n++
		}
		for i, w := range g.winds {
			br := base + i
			// KCL: the branch current leaves node a into the winding, enters b.
			b.add(s.unk[w.a], br, one, 1)
			b.add(s.unk[w.b], br, one, -1)
			// Branch: V(a) − V(b) − Σ Z_ij·I_j = 0.
			b.add(br, s.unk[w.a], one, 1)
			b.add(br, s.unk[w.b], one, -1)
			b.add(br, br, b.newCoef(coef{kind: valZ, a: w.r, b: w.l}), -1)
		}
		for _, m := range g.muts {
			z := b.newCoef(coef{kind: valZ, b: m.m})
			b.add(base+m.i, base+m.j, z, -1)
			b.add(base+m.j, base+m.i, z, -1)
		}
	}
}

// reorder orders the unknowns (reverse Cuthill–McKee on the symmetric
// pattern) and renumbers them in that order, so that the factorisation walks
// the matrix's storage front to back instead of jumping about in it.
func (b *builder) reorder() {
	s := b.s
	adj := make([][]int, s.n)
	for _, e := range b.ents {
		i, j := int(e.row), int(e.col)
		if i != j {
			adj[i] = append(adj[i], j)
			adj[j] = append(adj[j], i)
		}
	}
	for i := range adj {
		adj[i] = dedupe(adj[i])
	}
	order := rcm(adj)
	perm := make([]int32, s.n)
	for k, old := range order {
		perm[old] = int32(k)
	}
	for i := range b.ents {
		b.ents[i].row, b.ents[i].col = perm[b.ents[i].row], perm[b.ents[i].col]
	}
	for i := range b.rhs {
		b.rhs[i].rhs = perm[b.rhs[i].rhs]
	}
	for node, u := range s.unk {
		if u >= 0 {
			s.unk[node] = int(perm[u])
		}
	}
	what := make([]string, s.n)
	for old, w := range s.what {
		what[perm[old]] = w
	}
	s.what = what
}

// compress stores the entries as CSC, merging duplicates into one slot. The
// stamp order breaks ties, so the sums are added in the same order on every
// run.
func (b *builder) compress() {
	s, ents := b.s, b.ents
	slices.SortFunc(ents, func(x, y entry) int {
		if x.col != y.col {
			return cmp.Compare(x.col, y.col)
		}
		if x.row != y.row {
			return cmp.Compare(x.row, y.row)
		}
		return cmp.Compare(x.ord, y.ord)
	})
	s.a = csc{n: s.n, p: make([]int, s.n+1), i: make([]int, 0, len(ents))}
	s.stamps = make([]stamp, 0, len(ents)+len(b.rhs))
	for i, e := range ents {
		if i == 0 || e.row != ents[i-1].row || e.col != ents[i-1].col {
			s.a.i = append(s.a.i, int(e.row))
			s.a.p[e.col+1]++
		}
		s.stamps = append(s.stamps, stamp{slot: int32(len(s.a.i) - 1), rhs: -1, val: e.val, neg: e.sign < 0})
	}
	for j := 0; j < s.n; j++ {
		s.a.p[j+1] += s.a.p[j]
	}
	s.a.x = make([]complex128, len(s.a.i))
	s.stamps = append(s.stamps, b.rhs...)
}

func dedupe(a []int) []int {
	slices.Sort(a)
	return slices.Compact(a)
}

// solveAt assembles and solves the system at frequency f (Hz); the solution
// is left in s.b, indexed by unknown.
func (s *system) solveAt(f float64) error {
	s.assembleAt(f)
	if s.n == 0 {
		return nil
	}
	return s.factor(f)
}

// assembleAt fills the matrix and the right-hand side at frequency f.
func (s *system) assembleAt(f float64) {
	w := 2 * math.Pi * f
	if s.fixed == nil {
		s.vals = make([]complex128, len(s.coefs))
		for i, k := range s.coefs {
			s.vals[i] = k.at(w)
		}
		s.fixed = s.makeStatics(s.vals)
	}
	fx, vals := s.fixed, s.vals
	copy(s.a.x, fx.ax)
	copy(s.b, fx.b)
	for _, i := range fx.coefs {
		vals[i] = s.coefs[i].at(w)
	}
	for _, st := range fx.stamps {
		v := vals[st.val]
		if st.neg {
			v = -v
		}
		if st.slot >= 0 {
			s.a.x[st.slot] += v
		} else {
			s.b[st.rhs] -= v // driven node at 1 V
		}
	}
}

func (s *system) factor(f float64) error {
	if err := s.f.decompose(&s.a); err != nil {
		if e, ok := err.(*errSingular); ok {
			return fmt.Errorf("singular at %s: the equations do not fix the %s (an undamped resonance exactly on a sweep point, or a loop of windings with nothing to set it)", hz(f), s.what[e.col])
		}
		return err
	}
	return nil
}

// solveRHS solves with the right-hand side already in s.b.
func (s *system) solveRHS(f float64) error {
	if s.n == 0 {
		return nil
	}
	s.f.solve(s.b, s.y)
	return s.finite(f)
}

// finite refuses a solution with an unknown infinite or NaN.
func (s *system) finite(f float64) error {
	// One comparison per part (false for an infinite or NaN one) instead
	// of the four tests of IsNaN and IsInf; they name the unknown after.
	bad := false
	for _, v := range s.b {
		if !(math.Abs(real(v)) <= math.MaxFloat64 && math.Abs(imag(v)) <= math.MaxFloat64) {
			bad = true
			break
		}
	}
	if !bad {
		return nil
	}
	for i, v := range s.b {
		if cmplx.IsNaN(v) || cmplx.IsInf(v) {
			return fmt.Errorf("no finite solution at %s for the %s", hz(f), s.what[i])
		}
	}
	return nil
}

// voltage returns the solved voltage of a node.
func (s *system) voltage(node int) complex128 {
	switch u := s.unk[node]; {
	case u >= 0:
		return s.b[u]
	case u == unkDriven:
		return 1
	}
	return 0
}
