package stages

import (
	"math"

	"pare/graph"
)

// seriesWindings is the coil a tank sees when two windings of one
// transformer are wired end to end (a long-wave loading winding in
// series with the medium-wave one on a ferrite rod, switched in by the
// wavechange): from the first winding's free end through both to the
// second's free end, with their mutual inductance (joinSeries). The
// pattern must map the two windings as its first two.
func (x *figCtx) seriesWindings(i, ci int) (coilEnds, bool) {
	if len(x.m.coils[i]) < 2 {
		return coilEnds{}, false
	}
	p := x.w.parts[ci]
	c1 := x.w.coils[ci][x.m.coils[i][0]]
	c2 := x.w.coils[ci][x.m.coils[i][1]]
	e1, e2 := x.windingEnds(ci, c1), x.windingEnds(ci, c2)
	return joinSeries(p.Ref, e1, e2, p.K(c1.name, c2.name))
}

// loadedWinding is a transformer's winding in series with a separate
// loading coil (a long-wave loading coil off the rod): coil = ["T", "L"].
// The two share no core, so they add without mutual inductance.
func (x *figCtx) loadedWinding(first coilEnds, name string) (coilEnds, bool) {
	i := x.index(name)
	if i < 0 {
		return coilEnds{}, false
	}
	ci := x.m.parts[i]
	p := x.w.parts[ci]
	if p.Kind != graph.Inductor {
		return coilEnds{}, false
	}
	q := 0.0
	if len(p.Windings) > 0 {
		q = p.Windings[0].Q
	}
	l := coilEnds{ref: p.Ref, a: x.w.pinNet(ci, "1"), b: x.w.pinNet(ci, "2"), pinA: "1", pinB: "2", l: p.Inductance(), q: q}
	c, ok := joinSeries(first.ref, first, l, 0)
	if ok {
		c.ref = first.ref + "+" + p.Ref
	}
	return c, ok
}

func (x *figCtx) windingEnds(ci int, cl coil) coilEnds {
	first, last := cl.pins[0], cl.pins[len(cl.pins)-1]
	return coilEnds{a: x.w.pinNet(ci, first), b: x.w.pinNet(ci, last), pinA: first, pinB: last, l: cl.l, q: cl.q}
}

// joinSeries joins two coils that share exactly one net into one, from
// the first's free end to the second's. Its inductance is L1 + L2 ± 2M
// with M = k√(L1L2) (handbook: series inductors with mutual coupling),
// aiding when the current runs from start to finish (pin order) through
// both, opposing when it runs through one of them backwards. Its Q is the
// whole reactance over the sum of the two coils' loss resistances,
// ωL/Σ(ωLᵢ/Qᵢ) (the mutual reactance taken as lossless).
func joinSeries(ref string, e1, e2 coilEnds, k float64) (coilEnds, bool) {
	if e1.a == e1.b || e2.a == e2.b {
		return coilEnds{}, false // a section shorted (by the wavechange)
	}
	out := coilEnds{ref: ref}
	sign := 1.0
	switch {
	case e1.b == e2.a && e1.a != e2.b:
		out.a, out.pinA, out.b, out.pinB = e1.a, e1.pinA, e2.b, e2.pinB
	case e1.a == e2.b && e1.b != e2.a:
		out.a, out.pinA, out.b, out.pinB = e1.b, e1.pinB, e2.a, e2.pinA
	case e1.b == e2.b && e1.a != e2.a:
		out.a, out.pinA, out.b, out.pinB, sign = e1.a, e1.pinA, e2.a, e2.pinA, -1
	case e1.a == e2.a && e1.b != e2.b:
		out.a, out.pinA, out.b, out.pinB, sign = e1.b, e1.pinB, e2.b, e2.pinB, -1
	default:
		return coilEnds{}, false
	}
	m := k * math.Sqrt(e1.l*e2.l)
	out.l = e1.l + e2.l + 2*sign*m
	if out.l <= 0 || out.a == out.b {
		return coilEnds{}, false
	}
	if e1.q > 0 && e2.q > 0 {
		out.q = out.l / (e1.l/e1.q + e2.l/e2.q)
	}
	mid := e1.b
	if out.a == e1.b {
		mid = e1.a
	}
	out.sec = &coilSections{mid: mid, nA: (e1.l + sign*m) / out.l, nB: (e2.l + sign*m) / out.l}
	return out, true
}

// coilSections is where two windings in series join, and the share of
// the whole coil's voltage across each: (Lᵢ ± M)/L for series-coupled
// windings carrying one current (the tapped coil's voltage ratio,
// handbook), nA from the first winding's free end, nB from the second's.
type coilSections struct {
	mid    int
	nA, nB float64
}

// capAcross is the capacitance the tank's formula counts across the coil:
// the named capacitors between its ends and, for two windings in series,
// a capacitor across one section as the whole coil sees it, C·n² with n
// that section's share of the voltage (energy kept: ½C(nV)² = ½(Cn²)V²).
// A section's capacitor counted between the ends too would count twice,
// so the ends' network leaves out everything on the junction.
func (c coilEnds) capAcross(w *world, caps []*graph.Part, frac float64) float64 {
	if c.sec == nil {
		return capBetween(w, caps, c.a, c.b, frac)
	}
	var whole, onA, onB []*graph.Part
	for _, p := range caps {
		ci, ok := w.index[p]
		if !ok || len(w.pins[ci]) != 2 {
			continue
		}
		n0, n1 := w.pins[ci][0], w.pins[ci][1]
		switch {
		case n0 != c.sec.mid && n1 != c.sec.mid:
			whole = append(whole, p)
		case n0 == c.a || n1 == c.a:
			onA = append(onA, p)
		case n0 == c.b || n1 == c.b:
			onB = append(onB, p)
		}
	}
	return capBetween(w, whole, c.a, c.b, frac) +
		c.sec.nA*c.sec.nA*capBetween(w, onA, c.a, c.sec.mid, frac) +
		c.sec.nB*c.sec.nB*capBetween(w, onB, c.sec.mid, c.b, frac)
}

// seriesCoilAcross is the inductance of two coils in series between the
// nets a tank's gang section is across (across says which ends count,
// after folding cold ends), for a signal tank whose coil is a winding and
// a loading winding or coil (a long-wave aerial circuit); 0 when there is
// none. Only coils with an end on the tank are tried, so a whole set's
// other windings cost nothing.
func seriesCoilAcross(w *world, a, b int, cold func(int) int, across func(n1, n2 int) bool) float64 {
	type segment struct {
		ci   int
		name string
		e    coilEnds
	}
	var segs []segment
	touches := func(e coilEnds) bool {
		for _, n := range []int{cold(e.a), cold(e.b)} {
			if n == a || n == b {
				return true
			}
		}
		return false
	}
	for ci, p := range w.parts {
		switch p.Kind {
		case graph.Inductor:
			e := coilEnds{a: w.pinNet(ci, "1"), b: w.pinNet(ci, "2"), l: p.Inductance()}
			if touches(e) {
				segs = append(segs, segment{ci: ci, e: e})
			}
		case graph.Transformer:
			for _, cl := range w.coils[ci] {
				e := coilEnds{a: w.pinNet(ci, cl.pins[0]), b: w.pinNet(ci, cl.pins[len(cl.pins)-1]), l: cl.l}
				if touches(e) {
					segs = append(segs, segment{ci: ci, name: cl.name, e: e})
				}
			}
		}
	}
	for i, s1 := range segs {
		for j, s2 := range segs {
			if i == j {
				continue
			}
			k := 0.0
			if s1.ci == s2.ci {
				k = w.parts[s1.ci].K(s1.name, s2.name)
			}
			if c, ok := joinSeries("", s1.e, s2.e, k); ok && c.sec.mid != groundNet && across(c.a, c.b) {
				return c.l
			}
		}
	}
	return 0
}

// extendToGround joins a tuned winding (name, of transformer ci) whose
// ends are both off chassis with another winding of the same transformer
// that runs from one of them to chassis: a long-wave extension winding
// the wavechange puts in series with the oscillator's tuned winding. The
// tank is then both, end to chassis (joinSeries); ok is false when the
// winding already returns to chassis or nothing continues it there.
func extendToGround(w *world, ci int, name string, oc coilEnds) (coilEnds, bool) {
	if oc.a == groundNet || oc.b == groundNet {
		return coilEnds{}, false
	}
	p := w.parts[ci]
	for _, cl := range w.coils[ci] {
		if cl.name == name {
			continue
		}
		e := coilEnds{a: w.pinNet(ci, cl.pins[0]), b: w.pinNet(ci, cl.pins[len(cl.pins)-1]), l: cl.l, q: cl.q}
		if e.a != groundNet && e.b != groundNet {
			continue
		}
		if j, ok := joinSeries(oc.ref, oc, e, p.K(name, cl.name)); ok && (j.a == groundNet || j.b == groundNet) {
			return j, true
		}
	}
	return coilEnds{}, false
}

// holds says whether a winding between nets a and b is the coil c or,
// for a coil of two sections in series, one of its sections.
func (c coilEnds) holds(a, b int) bool {
	if a == c.a && b == c.b {
		return true
	}
	if c.sec == nil {
		return false
	}
	on := func(n int) bool { return n == c.a || n == c.b || n == c.sec.mid }
	return on(a) && on(b) && (a == c.sec.mid || b == c.sec.mid)
}
