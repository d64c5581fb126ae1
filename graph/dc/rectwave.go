package dc

import "math"

// The reservoir's periodic steady state. The conduction-angle formula
// (rectifier.go) takes the diodes' drop at their mean conduction current
// apart from the winding's: right for semiconductor diodes, whose drop is
// small, but a rectifier valve drops tens of volts and its drop widens the
// conduction angle, so with a valve at a full set's load the formula reads
// 4 % low. The estimate is therefore the reservoir's own equation stepped
// through the mains cycle until it repeats:
//
//	C·dV/dt = i(t) − I      i from e(t) − V = i·Rs + n·Vd(i), 0 when e(t) ≤ V
//
// with e(t) = Vp·|sin ωt| (full-wave: one half or one diode pair conducts
// at a time) or Vp·sin ωt (half-wave), I the DC solve's load current.
// Backward Euler, stepsPerCycle steps a mains cycle; the cycle's start
// voltage is found by the secant method on V(T) − V(0). The conduction-angle
// formula stays beside it as the named cross-check (Estimate.Formula).

// stepsPerCycle: steps per mains cycle (50 µs at 50 Hz; 1000 moves the mean by under 0.02 %).
const stepsPerCycle = 400

// sinTable is sin ωt at each step of a mains cycle.
var sinTable = func() []float64 {
	t := make([]float64, stepsPerCycle+1)
	for n := range t {
		t[n] = math.Sin(2 * math.Pi * float64(n) / stepsPerCycle)
	}
	return t
}()

// wave is the periodic steady state: mean, top and bottom of the
// reservoir, and its fundamental's peak-to-peak swing at the ripple
// frequency (the Fourier coefficient of the stepped cycle: a reservoir's
// ripple is no sawtooth, its fast recharge puts more of the swing in the
// fundamental than a sawtooth's 2/π, and the fundamental is what a
// smoothing section passes most of).
// rms is the charging current's RMS over the cycle: what heats a surge
// resistor in the pulses' path.
type wave struct{ mean, top, bottom, fundamental, rms float64 }

// steady finds the reservoir's periodic steady state at load current i:
// the secant method on the start voltage v of one ripple cycle, the
// cycle's end less v. The search starts from the last steady state this
// rectifier found, moved by the formula's change (v0 is the formula's
// mean at i); the rail iterations and a fault's bisection ask at nearby
// currents, so it settles in two or three cycles. It stops at 1e-11 of the
// peak (nanovolts), far below the microvolt the rail iterations settle to,
// so the estimate does not depend on where the search started.
func (r *rectifier) steady(i, v0 float64) wave {
	a := v0
	if r.warm.set {
		a = r.warm.start + v0 - r.warm.formula
	}
	a = math.Max(math.Min(a, r.peak), 0)
	fa, w := r.cycle(i, a)
	fa -= a
	b := a + fa // one cycle on: the first step of a fixed-point iteration
	for n := 0; n < 30 && math.Abs(fa) >= 1e-11*r.peak; n++ {
		var fb float64
		fb, w = r.cycle(i, b)
		fb -= b
		if math.Abs(fb) < 1e-11*r.peak || fb == fa {
			a = b
			break
		}
		a, b, fa = b, b-fb*(b-a)/(fb-fa), fb
		b = math.Max(math.Min(b, r.peak), 0)
	}
	r.warm.set, r.warm.start, r.warm.formula = true, a, v0
	return w
}

// cycle steps the reservoir through one ripple cycle (half the mains cycle
// full-wave: e(t) = Vp·|sin ωt| repeats) from v and returns where it ends
// and the cycle's mean, top and bottom.
func (r *rectifier) cycle(i, v float64) (float64, wave) {
	h := 1 / (r.hz * stepsPerCycle)
	steps := stepsPerCycle
	if r.full {
		steps /= 2
	}
	w := wave{top: v, bottom: v}
	sum, u, sq := 0.0, 0.0, 0.0
	re, im := 0.0, 0.0
	per := stepsPerCycle / steps // mains steps per ripple step in sinTable
	for n := 1; n <= steps; n++ {
		e := r.peak * sinTable[n]
		// Backward Euler: V = v + h·(j − i)/C and e − V = j·Rs + n·Vd(j).
		j := r.junctionCurrent(e-v+h*i/r.c, r.rs+h/r.c, &u)
		v += h * (j - i) / r.c
		sum += v
		sq += j * j
		k := (n * per) % stepsPerCycle
		re += v * sinTable[(k+stepsPerCycle/4)%stepsPerCycle] // cos of the ripple phase
		im += v * sinTable[k]
		w.top, w.bottom = math.Max(w.top, v), math.Min(w.bottom, v)
	}
	w.mean = sum / float64(steps)
	w.rms = math.Sqrt(sq / float64(steps))
	// amplitude 2/N·|Σ v·e^(−jθ)|, twice that peak to peak
	w.fundamental = 4 * math.Hypot(re, im) / float64(steps)
	return v, w
}

// junctionCurrent solves b = j·R + n·Vd(j) for the current j through the
// conducting path (n junctions in series with R), 0 when b ≤ 0, starting
// from junction voltage u (the previous step's). In u the left side
// R·j(u) + n·u is increasing and convex, so a Newton step from anywhere
// lands at or right of the root and the steps after it fall monotonically
// onto it; the upper bound keeps the first step from an overflowing
// exponential.
func (r *rectifier) junctionCurrent(b, res float64, u *float64) float64 {
	if !(b > 0) {
		return 0
	}
	n := float64(r.diodes)
	hi := b / n // at most the whole drive across the junctions
	if !r.valve {
		// Shockley's exponential overflows far above the root: bound u by
		// the current the resistance alone would pass.
		hi = math.Min(hi, r.drop(b/res))
	}
	x := math.Min(math.Max(*u, 0), hi)
	for k := 0; k < 100; k++ {
		j, dj := r.junctionI(x)
		f := res*j + n*x - b
		if math.Abs(f) <= 1e-9*b {
			break
		}
		x = math.Min(math.Max(x-f/(res*dj+n), 0), hi)
	}
	*u = x
	j, _ := r.junctionI(x)
	return j
}

// junctionI is one junction's current at forward voltage u and its slope.
func (r *rectifier) junctionI(u float64) (float64, float64) {
	if u <= 0 {
		return 0, 0
	}
	if r.valve {
		return r.perv * math.Pow(u, 1.5), 1.5 * r.perv * math.Sqrt(u)
	}
	ex := math.Exp(u / (r.n * VT))
	return r.is * (ex - 1), r.is * ex / (r.n * VT)
}
