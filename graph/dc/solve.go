package dc

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"pare/graph/ac"
)

// The Newton–Raphson iteration. The unknowns are the free node voltages;
// F(v) is the current leaving each node (KCL residual) and J its Jacobian,
// assembled into the AC package's sparse system (ac.Sparse: same ordering,
// same LU; the pivot order is reused between iterations). A step is damped
// in two ways, both standard (Nagel, "SPICE2", UCB/ERL M520, 1975, §4):
// junction voltages of exponential devices may rise by at most about 2·VT
// per step above their critical voltage (the SPICE pnjlim rule, applied as a
// common step length so the linear parts stay consistent), and the residual
// must fall (backtracking on ‖F‖). When plain Newton does not settle the
// solver ramps the sources from zero (source stepping) and then, failing
// that, starts with a large gmin and lowers it (gmin stepping).

const (
	defaultMaxIter = 150
	vAbsTol        = 1e-9  // V: SPICE VNTOL is 1 µV; tighter, the cross-check wants 0.5 %
	vRelTol        = 1e-9  // of the node voltage
	iAbsTol        = 1e-12 // A: SPICE ABSTOL
	maxBack        = 12    // backtracking halvings per step
	maxChange      = 0.5   // largest node step as a fraction of the largest rail (at least 1 V)
)

// maxIter bounds one Newton run; a variable so that a test can force the
// failure path.
var maxIter = defaultMaxIter

// NoConvergence is returned when no method settles; Nets are the nets whose
// voltages were still moving, largest movement first.
type NoConvergence struct {
	File string
	Nets []string
}

func (e *NoConvergence) Error() string {
	return fmt.Sprintf("%s: the DC operating point does not settle; still moving: %s (check the values and connections of the parts on these nets)",
		e.File, strings.Join(e.Nets, ", "))
}

// system is the assembled Newton system of a model.
type system struct {
	m      *model
	sp     *ac.Sparse
	n      int
	bslots [][4]int    // per branch: aa, ab, ba, bb (−1 where a terminal is fixed)
	cslots [][4]int    // per capacitor
	dslots [][][]int   // per device: slot of (i, j) or −1
	diag   []int       // diagonal slot per node
	vj     [][]float64 // scratch per device: terminal voltages, currents, jacobian
	cur    [][]float64
	jac    [][][]float64
	f, dx  []float64
	vtry   []float64
	scale  float64 // source scale for source stepping
	gmin   float64
	extra  []branch // injected faults
	xslots [][4]int
	// A meter: a conductance from one free node to chassis, for one reading.
	meterAt int
	meterG  float64
}

// rebind points the system at a model of the same topology (a fault that
// changes values, not connections) and its extra branches, reusing the
// pattern, the ordering and the LU's pivot order. It reports false when an
// extra branch is not in the pattern; the caller then builds a new system.
func (s *system) rebind(m *model, extra []branch) bool {
	if len(m.nodeNet) != s.n {
		return false
	}
	xs := make([][4]int, len(extra))
	for i, b := range extra {
		for k, pr := range [4][2]term{{b.a, b.a}, {b.a, b.b}, {b.b, b.a}, {b.b, b.b}} {
			xs[i][k] = -1
			if pr[0] >= 0 && pr[1] >= 0 {
				sl, ok := s.sp.Slot(pr[0], pr[1])
				if !ok {
					return false
				}
				xs[i][k] = sl
			}
		}
	}
	s.m, s.extra, s.xslots = m, extra, xs
	return true
}

func pairSlots(entries *[][2]int, a, b term) [4]int {
	s := [4]int{-1, -1, -1, -1}
	add := func(k, i, j int) {
		if i >= 0 && j >= 0 {
			s[k] = len(*entries)
			*entries = append(*entries, [2]int{i, j})
		}
	}
	add(0, a, a)
	add(1, a, b)
	add(2, b, a)
	add(3, b, b)
	return s
}

// newSystem declares the pattern: every branch, every capacitor (for a
// short or leak injected as a fault), every device's terminal pairs, and the
// extra branches given.
func newSystem(m *model, extra []branch) (*system, error) {
	s := &system{m: m, n: len(m.nodeNet), scale: 1, gmin: m.gmin, extra: extra, meterAt: -1}
	var entries [][2]int
	for _, b := range m.branches {
		s.bslots = append(s.bslots, pairSlots(&entries, b.a, b.b))
	}
	for _, c := range m.caps {
		s.cslots = append(s.cslots, pairSlots(&entries, c.a, c.b))
	}
	for _, b := range extra {
		s.xslots = append(s.xslots, pairSlots(&entries, b.a, b.b))
	}
	for _, d := range m.devices {
		k := len(d.t)
		sl := make([][]int, k)
		for i := range sl {
			sl[i] = make([]int, k)
			for j := range sl[i] {
				sl[i][j] = -1
				if d.t[i] >= 0 && d.t[j] >= 0 {
					sl[i][j] = len(entries)
					entries = append(entries, [2]int{d.t[i], d.t[j]})
				}
			}
		}
		s.dslots = append(s.dslots, sl)
		jac := make([][]float64, k)
		for i := range jac {
			jac[i] = make([]float64, k)
		}
		s.vj = append(s.vj, make([]float64, k))
		s.cur = append(s.cur, make([]float64, k))
		s.jac = append(s.jac, jac)
	}
	for i := 0; i < s.n; i++ {
		entries = append(entries, [2]int{i, i})
	}
	sp, slots, err := ac.NewSparse(s.n, entries)
	if err != nil {
		return nil, err
	}
	s.sp = sp
	remap := func(x *int) {
		if *x >= 0 {
			*x = slots[*x]
		}
	}
	for i := range s.bslots {
		for k := range s.bslots[i] {
			remap(&s.bslots[i][k])
		}
	}
	for i := range s.cslots {
		for k := range s.cslots[i] {
			remap(&s.cslots[i][k])
		}
	}
	for i := range s.xslots {
		for k := range s.xslots[i] {
			remap(&s.xslots[i][k])
		}
	}
	for _, sl := range s.dslots {
		for i := range sl {
			for j := range sl[i] {
				remap(&sl[i][j])
			}
		}
	}
	s.diag = slots[len(slots)-s.n:]
	s.f = make([]float64, s.n)
	s.dx = make([]float64, s.n)
	s.vtry = make([]float64, s.n)
	return s, nil
}

// volt is the voltage of a terminal given the free node voltages.
func (s *system) volt(v []float64, t term) float64 {
	if t >= 0 {
		return v[t]
	}
	return s.m.fixedV[-1-t] * s.scale
}

// residual computes F(v) into s.f and, when stamp is set, the Jacobian into
// the sparse matrix. It returns ‖F‖∞.
func (s *system) residual(v []float64, stamp bool) float64 {
	f := s.f
	for i := range f {
		f[i] = s.gmin * v[i]
	}
	if s.meterAt >= 0 {
		f[s.meterAt] += s.meterG * v[s.meterAt]
	}
	if stamp {
		s.sp.Zero()
		for _, d := range s.diag {
			s.sp.Add(d, s.gmin)
		}
		if s.meterAt >= 0 {
			s.sp.Add(s.diag[s.meterAt], s.meterG)
		}
	}
	lin := func(b branch, sl [4]int) {
		if b.g == 0 {
			return
		}
		i := b.g * (s.volt(v, b.a) - s.volt(v, b.b))
		if b.a >= 0 {
			f[b.a] += i
		}
		if b.b >= 0 {
			f[b.b] -= i
		}
		if stamp {
			for k, sign := range [4]float64{1, -1, -1, 1} {
				if sl[k] >= 0 {
					s.sp.Add(sl[k], sign*b.g)
				}
			}
		}
	}
	for i, b := range s.m.branches {
		lin(b, s.bslots[i])
	}
	for i, c := range s.m.caps {
		lin(c, s.cslots[i])
	}
	for i, b := range s.extra {
		lin(b, s.xslots[i])
	}
	for di := range s.m.devices {
		s.device(v, di, stamp)
	}
	worst := 0.0
	for _, x := range f {
		worst = math.Max(worst, math.Abs(x))
	}
	return worst
}

func (s *system) device(v []float64, di int, stamp bool) {
	d := &s.m.devices[di]
	vt := s.vj[di]
	for i, t := range d.t {
		vt[i] = s.volt(v, t)
	}
	cur, jac := s.cur[di], s.jac[di]
	d.eval(vt, cur, jac)
	sl := s.dslots[di]
	for i, t := range d.t {
		if t < 0 {
			continue
		}
		s.f[t] += cur[i]
		if !stamp {
			continue
		}
		for j := range d.t {
			if sl[i][j] >= 0 && jac[i][j] != 0 {
				s.sp.Add(sl[i][j], jac[i][j])
			}
		}
	}
}

// newton iterates from v (updated in place). It reports whether it settled
// and the per-node size of the last step, for the message when it did not.
func (s *system) newton(v []float64, limit int) (bool, error) {
	maxStep := 1.0
	for _, x := range s.m.fixedV {
		maxStep = math.Max(maxStep, maxChange*math.Abs(x))
	}
	// The residual and Jacobian at the accepted point are the next
	// iteration's system: one evaluation per step unless it backtracks.
	norm := s.residual(v, true)
	for iter := 0; iter < limit; iter++ {
		for i := range s.f {
			s.dx[i] = -s.f[i]
		}
		if err := s.sp.Solve(s.dx, s.dx); err != nil {
			return false, err
		}
		alpha := s.stepLength(v, maxStep)
		// Backtrack until the residual falls (or the step is tiny).
		old := norm
		for k := 0; ; k++ {
			for i := range v {
				s.vtry[i] = v[i] + alpha*s.dx[i]
			}
			norm = s.residual(s.vtry, true)
			if k >= maxBack || norm <= old*(1-1e-4*alpha) || old < iAbsTol {
				break
			}
			alpha /= 2
		}
		done := true
		for i := range v {
			if math.Abs(alpha*s.dx[i]) > vAbsTol+vRelTol*math.Abs(v[i]) {
				done = false
			}
			v[i] = s.vtry[i]
		}
		if done && norm < iAbsTol*1e3 {
			return true, nil
		}
	}
	return false, nil
}

// stepLength limits the Newton step: no node moves more than maxStep, and
// no forward-biased exponential junction rises by more than the pnjlim rule
// allows.
func (s *system) stepLength(v []float64, maxStep float64) float64 {
	alpha := 1.0
	for _, d := range s.dx {
		if a := math.Abs(d); a > maxStep {
			alpha = math.Min(alpha, maxStep/a)
		}
	}
	for _, d := range s.m.devices {
		for _, j := range junctions(&d) {
			vo := s.volt(v, d.t[j[0]]) - s.volt(v, d.t[j[1]])
			dv := s.delta(d.t[j[0]]) - s.delta(d.t[j[1]])
			dv *= j.sign()
			vo *= j.sign()
			lim := pnjlim(vo+dv, vo)
			if dv > 0 && lim < vo+dv-1e-9 {
				alpha = math.Min(alpha, math.Max((lim-vo)/dv, 1e-3))
			}
		}
	}
	return alpha
}

func (s *system) delta(t term) float64 {
	if t >= 0 {
		return s.dx[t]
	}
	return 0
}

// junction is a pair of terminal indexes of an exponential junction
// (anode side first) and its polarity.
type junction [3]int

func (j junction) sign() float64 { return float64(j[2]) }

func junctions(d *device) []junction {
	switch d.kind {
	case devDiode:
		return []junction{{0, 1, 1}}
	case devBJT:
		sg := int(d.bjt.sign)
		return []junction{{0, 2, sg}, {0, 1, sg}}
	case devFET:
		sg := int(d.fet.sign)
		return []junction{{0, 2, sg}, {0, 1, sg}}
	}
	return nil
}

// pnjlim is SPICE's junction voltage limit (Nagel 1975): above the critical
// voltage a rise is taken logarithmically.
func pnjlim(vnew, vold float64) float64 {
	const vcrit = 0.6
	if vnew > vcrit && math.Abs(vnew-vold) > 2*VT {
		if vold > 0 {
			arg := 1 + (vnew-vold)/VT
			if arg > 0 {
				return vold + VT*math.Log(arg)
			}
			return vcrit
		}
		return VT * math.Log(vnew/VT)
	}
	return vnew
}

// unsettled names the nets whose last step was largest.
func (s *system) unsettled() []string {
	type mv struct {
		net string
		d   float64
	}
	var list []mv
	for i, d := range s.dx {
		if math.Abs(d) > vAbsTol {
			list = append(list, mv{s.m.nodeNet[i], math.Abs(d)})
		}
	}
	sort.SliceStable(list, func(i, j int) bool {
		if list[i].d != list[j].d {
			return list[i].d > list[j].d
		}
		return list[i].net < list[j].net
	})
	out := []string{}
	for i, x := range list {
		if i == 8 {
			break
		}
		out = append(out, x.net)
	}
	if len(out) == 0 {
		for i, n := range s.m.nodeNet {
			if i == 8 {
				break
			}
			out = append(out, n)
		}
	}
	return out
}
