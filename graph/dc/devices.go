package dc

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
)

// valveDiodeClass is the defaults class of a valve diode's perveance.
const valveDiodeClass = "valve diode"

func (m *model) addDevice(p *graph.Part, o *origins) error {
	d := device{ref: p.Ref, emission: 1}
	need := func(pins ...string) bool {
		d.t = d.t[:0]
		d.pins = append(d.pins[:0], pins...)
		for _, pin := range pins {
			t, ok := m.term(p, pin)
			if !ok {
				return false
			}
			d.t = append(d.t, t)
		}
		return true
	}
	var err error
	switch p.Kind {
	case graph.Valve:
		switch p.Type {
		case "diode", "double-diode":
			return m.addValveDiodes(p, o)
		}
		d.kind = devValve
		if d.valve, err = resolveValve(p, o); err != nil {
			return err
		}
		pins := []string{"a", "g1", "k"}
		if d.valve.pentode {
			pins = []string{"a", "g1", "g2", "k"}
		}
		if !need(pins...) {
			return fmt.Errorf("%s: valve %s needs %v connected for the DC analysis", p.Pos, p.Ref, pins)
		}
	case graph.BJT:
		d.kind = devBJT
		if d.bjt, err = resolveBJT(p, o); err != nil {
			return err
		}
		if !need("b", "c", "e") {
			return fmt.Errorf("%s: transistor %s needs b, c and e connected", p.Pos, p.Ref)
		}
	case graph.FET:
		d.kind = devFET
		if d.fet, err = resolveFET(p, o); err != nil {
			return err
		}
		if !need("g", "d", "s") {
			return fmt.Errorf("%s: FET %s needs g, d and s connected", p.Pos, p.Ref)
		}
	case graph.Diode:
		d.kind = devDiode
		if d.is, d.n, err = diodeLaw(p, o); err != nil {
			return err
		}
		d.zener, d.breaks = zenerLaw(p, o)
		if !need("a", "k") {
			return fmt.Errorf("%s: diode %s needs a and k connected", p.Pos, p.Ref)
		}
	}
	m.devices = append(m.devices, d)
	return nil
}

// addValveDiodes adds one three-halves-law diode per anode (Child–Langmuir:
// Ia = K·Vak^1.5) with the default perveance.
func (m *model) addValveDiodes(p *graph.Part, o *origins) error {
	class := valveDiodeClass
	for _, r := range m.rects {
		if slices.Contains(r.parts, p.Ref) {
			class = "rectifier valve"
		}
	}
	if feedsSupply(m.circuit, p) {
		class = "rectifier valve"
	}
	perv := o.given(p, "perveance", class, "A/V^1.5")
	k, okK := m.term(p, "k")
	if !okK {
		return fmt.Errorf("%s: valve %s needs its cathode connected", p.Pos, p.Ref)
	}
	for _, an := range []string{"a", "a1", "a2"} {
		a, ok := m.term(p, an)
		if !ok {
			continue
		}
		m.devices = append(m.devices, device{ref: p.Ref, pins: []string{an, "k"}, kind: devValveDiode,
			t: []term{a, k}, is: perv, emission: 1})
	}
	return nil
}

// eval gives the currents flowing from the circuit into each terminal of the
// device at terminal voltages v, and their derivatives jac[i][j] = ∂I_i/∂V_j.
func (d *device) eval(v []float64, cur []float64, jac [][]float64) {
	for i := range cur {
		cur[i] = 0
		for j := range jac[i] {
			jac[i][j] = 0
		}
	}
	switch d.kind {
	case devValve:
		d.evalValve(v, cur, jac)
	case devValveDiode:
		i, g := threeHalves(d.is*d.emission, v[0]-v[1])
		twoTerm(cur, jac, i, g)
	case devDiode:
		i, g := shockley(d.is, (v[0]-v[1])/d.n)
		g /= d.n
		if d.breaks {
			// breakdown flows from cathode to anode: against the forward
			// current, rising as the cathode rises above the anode
			ir, gr := d.zener.Reverse(v[1] - v[0])
			i, g = i-ir, g+gr
		}
		twoTerm(cur, jac, i, g)
	case devBJT:
		d.evalBJT(v, cur, jac)
	case devFET:
		d.evalFET(v, cur, jac)
	}
}

// twoTerm stamps a current i from terminal 0 to terminal 1 with slope g.
func twoTerm(cur []float64, jac [][]float64, i, g float64) {
	cur[0], cur[1] = i, -i
	jac[0][0], jac[0][1] = g, -g
	jac[1][0], jac[1][1] = -g, g
}

// threeHalves is K·max(u,0)^1.5 and its slope; both are continuous at 0,
// which Newton–Raphson needs across cut-off.
func threeHalves(k, u float64) (float64, float64) {
	if u <= 0 {
		return 0, 0
	}
	s := math.Sqrt(u)
	return k * u * s, 1.5 * k * s
}

// expLimit is e^x, continued as a straight line above x = 40 so that an
// intermediate Newton step can never overflow; converged junctions sit far
// below (0.65 V is x ≈ 25).
func expLimit(x float64) (float64, float64) {
	const xmax = 40
	if x > xmax {
		e := math.Exp(xmax)
		return e * (1 + x - xmax), e
	}
	e := math.Exp(x)
	return e, e
}

// shockley is Is·(e^(v/VT) − 1) and its slope.
func shockley(is, v float64) (float64, float64) {
	e, de := expLimit(v / VT)
	return is * (e - 1), is * de / VT
}

func (d *device) evalValve(v, cur []float64, jac [][]float64) {
	l := &d.valve
	k := l.k * d.emission
	if !l.pentode { // a, g1, k
		vak, vgk := v[0]-v[2], v[1]-v[2]
		ia, ga := threeHalves(k, vgk+vak/l.mu)
		cur[0] = ia
		jac[0][0], jac[0][1], jac[0][2] = ga/l.mu, ga, -ga*(1+1/l.mu)
		ig, gg := threeHalves(l.kg, vgk)
		cur[1] = ig
		jac[1][1], jac[1][2] = gg, -gg
		cur[2] = -ia - ig
		for j := 0; j < 3; j++ {
			jac[2][j] = -jac[0][j] - jac[1][j]
		}
		return
	}
	// a, g1, g2, k
	vak, vg1k, vg2k := v[0]-v[3], v[1]-v[3], v[2]-v[3]
	ik, gk := threeHalves(k, vg1k+vg2k/l.mu)
	dik := [4]float64{0, gk, gk / l.mu, -gk * (1 + 1/l.mu)}
	f, df := 0.0, 0.0
	if vak > 0 {
		f = math.Tanh(vak / l.vknee)
		df = (1 - f*f) / l.vknee
	}
	s := 1 - l.share
	ia := s * ik * f
	cur[0] = ia
	for j := 0; j < 4; j++ {
		jac[0][j] = s * f * dik[j]
	}
	jac[0][0] += s * ik * df
	jac[0][3] -= s * ik * df
	cur[2] = ik - ia
	for j := 0; j < 4; j++ {
		jac[2][j] = dik[j] - jac[0][j]
	}
	ig, gg := threeHalves(l.kg, vg1k)
	cur[1] = ig
	jac[1][1], jac[1][3] = gg, -gg
	cur[3] = -ik - ig
	for j := 0; j < 4; j++ {
		jac[3][j] = -jac[0][j] - jac[1][j] - jac[2][j]
	}
}

// earlyFloor is the least Early factor evalBJT takes: reached only with
// the base–collector junction forward by most of VA, never at a solution.
const earlyFloor = 0.01

// evalBJT: terminals b, c, e. A pnp is an npn with every voltage and current
// reversed.
func (d *device) evalBJT(v, cur []float64, jac [][]float64) {
	l := &d.bjt
	sg := l.sign
	vbe, vbc := sg*(v[0]-v[2]), sg*(v[0]-v[1])
	ef, def := expLimit(vbe / VT)
	er, der := expLimit(vbc / VT)
	if d.openBE {
		ef, def = 1, 0
	}
	if d.openBC {
		er, der = 1, 0
	}
	def, der = def/VT, der/VT
	is := l.is
	// The Early factor 1 − vbc/VA (Gummel–Poon's 1/qb with VAR and IKF
	// infinite), held above a small floor so a wild Newton step with the
	// collector far forward cannot turn the transport current round.
	early, dEarly := 1-vbc/l.va, -1/l.va
	if early < earlyFloor {
		early, dEarly = earlyFloor, 0
	}
	it := is * (ef - er)
	ic := it*early - is/l.br*(er-1)
	ib := is/l.bf*(ef-1) + is/l.br*(er-1)
	// Partial derivatives with respect to vbe and vbc.
	dicF, dicR := is*def*early, -is*der*early+it*dEarly-is/l.br*der
	dibF, dibR := is/l.bf*def, is/l.br*der
	// vbe = vb − ve, vbc = vb − vc (times sign; the sign cancels in the slopes).
	cur[0], cur[1] = sg*ib, sg*ic
	jac[1][0], jac[1][1], jac[1][2] = dicF+dicR, -dicR, -dicF
	jac[0][0], jac[0][1], jac[0][2] = dibF+dibR, -dibR, -dibF
	cur[2] = -cur[0] - cur[1]
	for j := 0; j < 3; j++ {
		jac[2][j] = -jac[0][j] - jac[1][j]
	}
}

// evalFET: terminals g, d, s. The channel is symmetric: with vds < 0 the
// roles of drain and source swap.
func (d *device) evalFET(v, cur []float64, jac [][]float64) {
	l := &d.fet
	sg := l.sign
	vgs, vgd := sg*(v[0]-v[2]), sg*(v[0]-v[1])
	vds := vgs - vgd
	// Channel current from d to s and its slopes in (vgs, vgd).
	var id, dGs, dGd float64
	if vds >= 0 {
		i, gm, gds := shichman(l.beta, vgs-l.vto, vds)
		id, dGs, dGd = i, gm+gds, -gds
	} else {
		i, gm, gds := shichman(l.beta, vgd-l.vto, -vds)
		id, dGs, dGd = -i, gds, -(gm + gds)
	}
	igs, ggs := shockley(l.is, vgs)
	igd, ggd := shockley(l.is, vgd)
	// Currents into terminals (n-channel terms, then the sign).
	cur[0] = sg * (igs + igd)
	cur[1] = sg * (id - igd)
	cur[2] = sg * (-id - igs)
	// ∂/∂(vg, vd, vs): vgs = vg − vs, vgd = vg − vd.
	row := func(a, b float64) [3]float64 { return [3]float64{a + b, -b, -a} }
	g := row(ggs, ggd)
	dd := row(dGs, dGd)
	dd[1] -= -ggd
	dd[0] -= ggd
	s := row(-dGs-ggs, -dGd)
	for j := 0; j < 3; j++ {
		jac[0][j], jac[1][j], jac[2][j] = g[j], dd[j], s[j]
	}
}

// shichman is the square law for vds ≥ 0: current, ∂/∂vgs and ∂/∂vds.
func shichman(beta, vgst, vds float64) (float64, float64, float64) {
	switch {
	case vgst <= 0:
		return 0, 0, 0
	case vds < vgst:
		return beta * vds * (2*vgst - vds), 2 * beta * vds, 2 * beta * (vgst - vds)
	}
	return beta * vgst * vgst, 2 * beta * vgst, 0
}

// feedsSupply tells whether a valve diode's cathode charges a supply: a
// supply net, or a reservoir-sized capacitor (1 µF and more, common
// practice) to chassis on a net where no amplifying valve or transistor
// has its cathode, emitter or source (a double-diode-triode's diodes share
// its bypassed cathode: a detector, not a rectifier). Such a diode is an
// HT rectifier however it is fed (a winding, or the mains straight through
// a surge resistor in an AC/DC set, which no rectifier estimate covers), so
// it takes the rectifier valve's law, not a signal diode's.
func feedsSupply(c *graph.Circuit, p *graph.Part) bool {
	k := p.NetOf("k")
	if k == "" || c.RoleOf(k) == graph.Ground {
		return false
	}
	for _, cn := range c.ConnsOf(k) {
		q := cn.Part
		if q != p && q.IsActive() && graph.RoleOfPin(q.Kind, cn.Pin) == graph.RoleCommon && !isValveDiode(q) {
			return false
		}
	}
	return c.RoleOf(k) == graph.Supply || reservoir(c, k) >= reservoirMin
}

// reservoirMin is the least capacitance to chassis that makes a diode's
// load a reservoir rather than a detector's RF bypass (hundreds of
// picofarads) or an AGC filter (tens of nanofarads): common practice.
const reservoirMin = 1e-6

// isValveDiode tells a valve that is only a diode (its DC law is the
// three-halves law of addValveDiodes).
func isValveDiode(p *graph.Part) bool {
	return p.Kind == graph.Valve && (p.Type == "diode" || p.Type == "double-diode")
}
