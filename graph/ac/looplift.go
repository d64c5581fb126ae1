package ac

import (
	"fmt"
	"math/cmplx"
	"slices"

	"pare/graph"
)

// A loop broken where a technician breaks it: one end of a two-pin part
// lifted. A loop that closes through two devices (a Wien bridge's
// two-stage amplifier) has no single device whose return ratio is the
// loop's: breaking either device's controlled source also breaks the
// negative feedback that sets the amplifier's gain, and the ratio read is
// the open amplifier's (+35.8 dB on testdata/review23/b01.toml, whose
// loop broken at the Wien series arm has +0.8 dB). So the loop is broken
// at a part instead: the part's end on net A is lifted and driven with
// 1 V, and net A is loaded by the very current that end draws, so the
// stage driving A sees the load it had (the replica load of a bench
// measurement, exact here). The voltage returned to A is the loop gain T.
//
// With G the unbroken circuit's nodal matrix and the part an admittance y
// from A to M, the broken circuit is G − y·(e_A − e_M)·e_Aᵀ driven by
// −y·(e_A − e_M); by the Sherman–Morrison formula, with z_A the voltage at
// A for a unit current out of A into M in the unbroken circuit,
// T = −y·z_A / (1 − y·z_A), and 1 − T = det G / det G_broken: T = 1 exactly
// at the circuit's natural frequencies, as a return ratio must be
// (Bode's Δ = Δ0·(1 − T)).

// Lift names the part end a loop is broken at (LoopOptions.Lift).
type Lift struct {
	Part string // a two-pin resistor or capacitor
	Net  string // the net its lifted end leaves
}

// liftEnd is a lifted part in an assembled system: nodes A (the net the
// end leaves) and M (its other end), its conductance and capacitance.
type liftEnd struct {
	a, m   int
	g, cap float64
}

// liftSystem elaborates c at o and breaks it at lift.
func liftSystem(c *graph.Circuit, lift Lift, o Options) (*loopSystem, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	return liftSystemOf(c, nl, lift)
}

// liftSystemOf assembles the blocks of nl that hold the lifted part, the
// whole circuit with every device in place.
func liftSystemOf(c *graph.Circuit, nl *netlist, lift Lift) (*loopSystem, error) {
	a, err := nodeOf(c, nl, lift.Net)
	if err != nil {
		return nil, err
	}
	le, err := liftedPart(nl, lift, a)
	if err != nil {
		return nil, err
	}
	m := indexModel(c, nl)
	held := slices.DeleteFunc(otherInputs(c, nl, -1), func(n int) bool { return n == le.a || n == le.m })
	isHeld := heldSet(len(nl.nodes), -1, held)
	if a == 0 || isHeld[a] {
		return nil, fmt.Errorf("%s's end on %s: the net is AC ground, no loop to break there", lift.Part, lift.Net)
	}
	if err := m.floating(-1, held, isHeld); err != nil {
		return nil, err
	}
	sub := &part{}
	for _, n := range []int{le.a, le.m} {
		if _, in := slices.BinarySearch(sub.nodes, n); n <= 0 || isHeld[n] || !m.used[n] || in {
			continue
		}
		b := m.component(n, isHeld)
		sub.nodes = slices.Concat(sub.nodes, b.nodes)
		sub.prims = slices.Concat(sub.prims, b.prims)
		sub.groups = slices.Concat(sub.groups, b.groups)
		slices.Sort(sub.nodes)
		slices.Sort(sub.prims)
		slices.Sort(sub.groups)
	}
	s := assemble(nl, -1, isHeld, sub)
	return &loopSystem{s: s, sign: 1, c: a, lift: le}, nil
}

// liftedPart finds lift's part in nl: resistors and capacitors only, all
// between node a and one other node.
func liftedPart(nl *netlist, lift Lift, a int) (*liftEnd, error) {
	le := &liftEnd{a: a, m: -1}
	for _, p := range nl.prims {
		if p.ref != lift.Part {
			continue
		}
		other := p.b
		if p.b == a {
			other = p.a
		} else if p.a != a {
			return nil, fmt.Errorf("%s is not on net %s: no end of it to lift there", lift.Part, lift.Net)
		}
		if le.m >= 0 && other != le.m || other == a {
			return nil, fmt.Errorf("%s is not a two-pin part: the loop is broken at a resistor or capacitor", lift.Part)
		}
		le.m = other
		switch p.kind {
		case primR:
			le.g += 1 / p.v
		case primC:
			le.cap += p.v
		default:
			return nil, fmt.Errorf("%s is not a resistor or capacitor: the loop is broken at one", lift.Part)
		}
	}
	if le.m < 0 {
		return nil, fmt.Errorf("no resistor or capacitor %s in the small-signal model", lift.Part)
	}
	return le, nil
}

// liftAt is T at complex frequency sc for a system broken at a lifted
// part: one solve of the unbroken circuit, then Sherman–Morrison.
func (ls *loopSystem) liftAt(sc complex128) (complex128, error) {
	s, le := ls.s, ls.lift
	if err := s.assemble(sc); err != nil {
		return 0, err
	}
	for i := range s.b {
		s.b[i] = 0
	}
	if u := s.unk[le.a]; u >= 0 {
		s.b[u] = 1
	}
	if u := s.unk[le.m]; u >= 0 {
		s.b[u] = -1
	}
	if s.n > 0 {
		s.f.solve(s.b, s.y)
	}
	y := complex(le.g, 0) + sc*complex(le.cap, 0)
	za := s.voltage(le.a)
	t := complex(ls.sign, 0) * -y * za / (1 - y*za)
	if cmplx.IsNaN(t) || cmplx.IsInf(t) {
		return 0, fmt.Errorf("no finite loop gain at s = %v", sc)
	}
	return t, nil
}
