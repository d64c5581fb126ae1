package ac

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"

	"pare/graph"
)

// Loop gain by the return ratio.
//
// An active part is stamped as a voltage-controlled current source
// gm·V(control, common) beside its passive elements (rπ, ra, rd stay in
// the circuit). Its return ratio (H. W. Bode, "Network Analysis and Feedback
// Amplifier Design", 1945, ch. IV; R. D. Middlebrook's and S. Rosenstark's
// later treatments of the same idea) is found by making that one source
// independent: it drives gm·1 V while every independent source of the
// circuit is zeroed, and the controlling voltage the circuit then returns,
// V(control) − V(common), is the loop gain L = −T. Nothing is cut: the
// control terminal keeps its own load (rπ, the grid leak, the tank), so the
// loop is broken with exactly the termination it sees in circuit, which a
// voltage injection at a cut wire only approximates. Bode's identity
// Δ = Δ0·(1 + T) = Δ0·(1 − L), Δ the circuit's determinant and Δ0 the same
// with this source set to zero, says the circuit's natural frequencies are
// the roots of L(s) = 1: Barkhausen's criterion, |L| = 1 at 0° of loop
// phase, is where a root crosses the jω axis. So where the loop phase is
// 0° the oscillation starts if |L| > 1 there (a margin above 0 dB) and dies
// away if |L| < 1.

// LoopOptions steer a loop-gain search.
type LoopOptions struct {
	Options
	// From and To bound the frequencies searched for 0° of loop phase;
	// zero takes 10 Hz and 1 GHz, which holds the audio, LF, MF and HF
	// oscillators of domestic sets.
	From, To float64
	// PerDecade is the density of the coarse search; 0 takes 200 (a 1.2 %
	// step: a tank of Q up to a few hundred turns its phase through 0°
	// over more than one step, so no crossing is skipped).
	PerDecade int
	// Inverted searches for 180° of loop phase instead: where the loop
	// feeds back against the signal (degeneration), as a reaction winding
	// connected the wrong way round does.
	Inverted bool
	// AtControl breaks the loop at the device's control electrode only:
	// its controlled current keeps following its common electrode (the
	// emitter, cathode or source), so a feedback loop that closes on the
	// common electrode (the gain-setting negative feedback of a Wien
	// bridge, returned to the first emitter) stays closed, and the return
	// ratio is that of the loops that close on the control electrode
	// alone, with everything else in place.
	AtControl bool
	// Lift, when set, breaks the loop at a part's end instead of at the
	// device (looplift.go): the device named in Find is then only the
	// loop's name, and every device stays in place.
	Lift *Lift
}

// Crossing is one frequency where the loop phase is 0°.
type Crossing struct {
	F      float64 `json:"f_hz"`    // Hz
	GainDB float64 `json:"gain_db"` // 20·log10|L| there: the start-up margin
}

// Loop is the loop gain of one active part at one gang setting.
type Loop struct {
	Ref       string     `json:"ref"`
	Frac      float64    `json:"gang"`      // gang setting, 0 (minimum) to 1 (maximum)
	Crossings []Crossing `json:"crossings"` // every 0° crossing in the range, ascending
	// F and MarginDB are those of the crossing with the highest loop gain,
	// the one that wins if several could run; F is 0 when there is none.
	F        float64 `json:"f_hz"`
	MarginDB float64 `json:"margin_db"`
}

// loopSystem is a circuit assembled for one active part's return ratio:
// the part's transconductances removed and driven as sources instead.
type loopSystem struct {
	s    *system
	srcs []loopSource
	sign float64  // 1, or −1 for the loop seen the other way round
	c, d int      // control, control reference
	lift *liftEnd // the part end lifted, for a loop broken there
}

// loopSource is one controlled current of the part: gm·1 V from node a
// through the source into node b. A valve with an oscillator anode (a
// heptode's g2) has two, both ruled by the one control grid: the loop is
// broken at that grid, so both are driven together.
type loopSource struct {
	gm   float64
	a, b int
}

// newLoopSystem elaborates c and removes ref's controlled source.
func newLoopSystem(c *graph.Circuit, ref string, o Options) (*loopSystem, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	return loopSystemOf(c, nl, ref, false)
}

// loopSystemOf removes ref's controlled source from the elaborated nl and
// assembles the blocks of the matrix that hold the source's four nodes: a
// set of many channels is block diagonal (model.go), and a block the
// source does not reach carries no current, so its voltages are zero
// whether it is solved or not. The blocks are numbered and ordered as they
// are inside the whole matrix, so a circuit of one block solves exactly as
// before, and a set of many costs the size of the source's channel.
//
// With atControl the source is made independent on its control side only:
// a controlled source gm·(0 − V(common)) stays in the circuit beside it,
// and the loop gain read is V(control) alone (Bode's return ratio for the
// control electrode's share of the controlling voltage: by the matrix
// determinant lemma its L = 1 is still the circuit's natural frequency).
func loopSystemOf(c *graph.Circuit, nl *netlist, ref string, atControl bool) (*loopSystem, error) {
	idx := slices.IndexFunc(nl.prims, func(p prim) bool { return p.kind == primVCCS && p.ref == ref })
	if idx < 0 {
		if c.Part(ref) == nil {
			return nil, fmt.Errorf("no part %s in %s", ref, circuitName(c))
		}
		return nil, fmt.Errorf("%s has no controlled source in the small-signal model (not an amplifying part, or its output is shorted to its common terminal)", ref)
	}
	src := nl.prims[idx]
	cp := *nl
	var srcs []loopSource
	cp.prims = nil
	for _, p := range nl.prims {
		if p.kind == primVCCS && p.ref == ref && p.c == src.c && p.d == src.d {
			srcs = append(srcs, loopSource{gm: p.v, a: p.a, b: p.b})
			if atControl && p.d > 0 {
				cp.prims = append(cp.prims, prim{kind: primVCCS, ref: p.ref, sub: p.sub + " common", a: p.a, b: p.b, c: 0, d: p.d, v: p.v})
			}
			continue
		}
		cp.prims = append(cp.prims, p)
	}
	m := indexModel(c, &cp)
	held := loopHeld(c, &cp, srcs, src.c, src.d)
	isHeld := heldSet(len(cp.nodes), -1, held)
	if err := m.floating(-1, held, isHeld); err != nil {
		return nil, err
	}
	sub := &part{}
	reach := []int{src.c, src.d}
	for _, q := range srcs {
		reach = append(reach, q.a, q.b)
	}
	for _, n := range reach {
		if n <= 0 || isHeld[n] || !m.used[n] {
			continue
		}
		if _, in := slices.BinarySearch(sub.nodes, n); in {
			continue
		}
		b := m.component(n, isHeld)
		sub.nodes = slices.Concat(sub.nodes, b.nodes)
		sub.prims = slices.Concat(sub.prims, b.prims)
		sub.groups = slices.Concat(sub.groups, b.groups)
		slices.Sort(sub.nodes) // blocks are disjoint: no duplicates
		slices.Sort(sub.prims)
		slices.Sort(sub.groups)
	}
	s := assemble(&cp, -1, isHeld, sub)
	ls := &loopSystem{s: s, srcs: srcs, sign: 1, c: src.c, d: src.d}
	if atControl {
		ls.d = 0 // the return read at the control electrode alone
	}
	return ls, nil
}

// at returns L at complex frequency sc (rad/s): the controlling voltage the
// circuit returns for a unit controlling voltage at the source.
func (ls *loopSystem) at(sc complex128) (complex128, error) {
	if ls.lift != nil {
		return ls.liftAt(sc)
	}
	s := ls.s
	if err := s.assemble(sc); err != nil {
		return 0, err
	}
	for i := range s.b {
		s.b[i] = 0
	}
	// Each source carries gm·1 V out of node a, through itself, into node b.
	for _, q := range ls.srcs {
		g := complex(ls.sign*q.gm, 0)
		if u := s.unk[q.a]; u >= 0 {
			s.b[u] -= g
		}
		if u := s.unk[q.b]; u >= 0 {
			s.b[u] += g
		}
	}
	if s.n > 0 {
		s.f.solve(s.b, s.y)
	}
	l := s.voltage(ls.c) - s.voltage(ls.d)
	if cmplx.IsNaN(l) || cmplx.IsInf(l) {
		return 0, fmt.Errorf("no finite loop gain at s = %v", sc)
	}
	return l, nil
}

// atF is L at the real frequency f (Hz).
func (ls *loopSystem) atF(f float64) (complex128, error) {
	return ls.at(complex(0, 2*math.Pi*f))
}

// assemble fills and factors the matrix at complex frequency sc (rad/s).
func (s *system) assemble(sc complex128) error {
	for i := range s.a.x {
		s.a.x[i] = 0
	}
	if len(s.vals) != len(s.coefs) {
		s.vals = make([]complex128, len(s.coefs))
	}
	for i, k := range s.coefs {
		s.vals[i] = k.atS(sc)
	}
	for _, st := range s.stamps {
		if st.slot < 0 {
			continue // no node is driven in a loop-gain solve
		}
		v := s.vals[st.val]
		if st.neg {
			v = -v
		}
		s.a.x[st.slot] += v
	}
	if s.n == 0 {
		return nil
	}
	return s.factor(imag(sc) / (2 * math.Pi))
}

// atS is the coefficient at complex frequency sc: at(ω) with jω → s.
func (k coef) atS(sc complex128) complex128 {
	switch k.kind {
	case valConst:
		return complex(k.a, 0)
	case valJW:
		return sc * complex(k.a, 0)
	case valRL:
		return 1 / (complex(k.a, 0) + sc*complex(k.b, 0))
	case valRLC:
		return 1 / (complex(k.a, 0) + sc*complex(k.b, 0) + 1/(sc*complex(k.c, 0)))
	case valZ:
		return complex(k.a, 0) + sc*complex(k.b, 0)
	}
	return 0
}

// LoopGain returns the loop gain L(jω) of part ref at each frequency (Hz).
func LoopGain(c *graph.Circuit, ref string, freqs []float64, o Options) ([]complex128, error) {
	ls, err := newLoopSystem(c, ref, o)
	if err != nil {
		return nil, err
	}
	out := make([]complex128, len(freqs))
	for i, f := range freqs {
		if !(f > 0) || math.IsInf(f, 0) {
			return nil, fmt.Errorf("frequency %g: must be a positive number of hertz", f)
		}
		if out[i], err = ls.atF(f); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// FindLoop searches the loop gain of part ref for every frequency where its
// phase is 0° and reports the gain there.
func FindLoop(c *graph.Circuit, ref string, o LoopOptions) (Loop, error) {
	return NewLoops(c).Find(ref, o)
}

// Find is FindLoop of part ref.
func (l *Loops) Find(ref string, o LoopOptions) (Loop, error) {
	frac := 0.5
	if o.VarSet {
		frac = o.VarFrac
	}
	res := Loop{Ref: ref, Frac: frac}
	var ls *loopSystem
	var err error
	switch {
	case o.Lift != nil:
		ls, err = liftSystem(l.c, *o.Lift, o.Options)
	case o.AtControl:
		ls, err = atControlSystem(l.c, ref, o.Options)
	default:
		ls, err = l.system(ref, o.Options)
	}
	if err != nil {
		return res, err
	}
	e := cachedLoop(ls.key(o, 0), func(e *loopEntry) bool {
		e.loop, err = ls.find(o)
		return err == nil
	})
	res.Crossings, res.F, res.MarginDB = slices.Clone(e.loop.Crossings), e.loop.F, e.loop.MarginDB
	return res, err
}

// atControlSystem is ref's loop system broken at its control electrode
// only (LoopOptions.AtControl), elaborated afresh: few loops ask for it.
func atControlSystem(c *graph.Circuit, ref string, o Options) (*loopSystem, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	return loopSystemOf(c, nl, ref, true)
}

// searchGrid is the coarse frequency grid: PerDecade points a decade from
// From to To, with a dense patch around every crystal's motional
// resonance. A crystal turns the loop phase through 0° and back between its
// series and parallel resonances, a window only C_m/(2·C_0) wide (0.2 %
// with the default 20 fF and 5 pF), which a coarse grid steps over.
func searchGrid(ls *loopSystem, o LoopOptions) ([]float64, error) {
	from, to, ppd := o.From, o.To, o.PerDecade
	if from == 0 {
		from = 10
	}
	if to == 0 {
		to = 1e9
	}
	if ppd == 0 {
		ppd = 200
	}
	if !(from > 0) || !(to > from) || math.IsInf(to, 0) || ppd < 1 {
		return nil, fmt.Errorf("loop search from %g Hz to %g Hz at %d points a decade: give 0 < from < to", from, to, ppd)
	}
	n := int(math.Ceil(math.Log10(to/from) * float64(ppd)))
	grid := make([]float64, 0, n+1)
	for i := 0; i <= n; i++ {
		grid = append(grid, from*math.Pow(10, float64(i)/float64(ppd)))
	}
	for _, p := range ls.s.nl.prims {
		if p.kind != primRLC {
			continue
		}
		fs := 1 / (2 * math.Pi * math.Sqrt(p.l*p.C))
		// From well below series resonance to a few times the
		// series–parallel spacing above it, whatever C0 is.
		lo, hi := fs*(1-0.002), fs*(1+0.02)
		if fs < from || fs > to {
			continue
		}
		const dense = 2000
		for i := 0; i <= dense; i++ {
			grid = append(grid, lo*math.Pow(hi/lo, float64(i)/dense))
		}
	}
	slices.Sort(grid)
	return slices.Compact(grid), nil
}

// Pole is the natural frequency s = σ + jω of the linear circuit nearest to
// the 0° crossing at f (Hz): the root of L(s) = 1 found by Newton's method
// from s = j2πf. σ > 0 is a growing oscillation (the linear circuit's
// amplitude rises as e^{σt} until the device limits it); ω/2π is the
// frequency of that growing or dying ring, which differs from f by as much
// as the margin detunes it.
func Pole(c *graph.Circuit, ref string, f float64, o Options) (complex128, error) {
	return NewLoops(c).Pole(ref, f, o)
}

// pole solves k·L(s) = 1 near s = j2πf: the natural frequency with the
// part's transconductance scaled by k (L is linear in it).
func (ls *loopSystem) pole(f, k float64) (complex128, error) {
	w0 := 2 * math.Pi * f
	sc := complex(0, w0)
	for range 100 {
		l, err := ls.at(sc)
		if err != nil {
			return 0, err
		}
		h := complex(0, 1e-7*cmplx.Abs(sc))
		l2, err := ls.at(sc + h)
		if err != nil {
			return 0, err
		}
		d := complex(k, 0) * (l2 - l) / h
		if d == 0 {
			return 0, fmt.Errorf("loop gain flat near %s: no pole to find", hz(f))
		}
		step := (complex(k, 0)*l - 1) / d
		// Damp the step: the root sought lies near the crossing.
		if a := cmplx.Abs(step); a > 0.1*w0 {
			step *= complex(0.1*w0/a, 0)
		}
		sc -= step
		if imag(sc) < w0/4 || imag(sc) > 4*w0 {
			break
		}
		if cmplx.Abs(step) < 1e-12*cmplx.Abs(sc) {
			return sc, nil
		}
	}
	return 0, fmt.Errorf("no natural frequency of the loop found near %s", hz(f))
}
