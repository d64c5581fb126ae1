package stages

import "math"

// grid reads the S-curve at sCurvePoints frequencies spaced evenly in log f
// from lo to hi.
func (s sCurveResp) grid(lo, hi float64) (fs, vs []float64) {
	fs = make([]float64, sCurvePoints)
	vs = make([]float64, sCurvePoints)
	for i := range fs {
		fs[i] = lo * math.Pow(hi/lo, float64(i)/(sCurvePoints-1))
		vs[i] = s.at(fs[i])
	}
	return fs, vs
}

// zeroNearest is the S-curve's sign change nearest f0 (in log f), found by
// bisection to a part in 10⁷; ok is false where the grid shows none.
func zeroNearest(s sCurveResp, fs, vs []float64, f0 float64) (float64, bool) {
	at, best := -1, math.Inf(1)
	for i := 0; i+1 < len(fs); i++ {
		if math.IsNaN(vs[i]) || math.IsNaN(vs[i+1]) || (vs[i] > 0) == (vs[i+1] > 0) {
			continue
		}
		if d := math.Abs(math.Log(math.Sqrt(fs[i]*fs[i+1]) / f0)); d < best {
			at, best = i, d
		}
	}
	if at < 0 {
		return 0, false
	}
	a, b, va := fs[at], fs[at+1], vs[at]
	for b/a > 1+1e-7 {
		m := math.Sqrt(a * b)
		vm := s.at(m)
		if math.IsNaN(vm) {
			return 0, false
		}
		if (vm > 0) == (va > 0) {
			a, va = m, vm
		} else {
			b = m
		}
	}
	return math.Sqrt(a * b), true
}

// extreme is the frequency of the largest |S| strictly between lo and hi
// on the grid, refined by a golden-section search over the cells either
// side; ok is false where the largest sits at an end (no peak inside).
func (s sCurveResp) extreme(fs, vs []float64, lo, hi float64) (float64, bool) {
	first, last, at := -1, -1, -1
	for i, f := range fs {
		if f <= lo || f >= hi || math.IsNaN(vs[i]) {
			continue
		}
		if first < 0 {
			first = i
		}
		last = i
		if at < 0 || math.Abs(vs[i]) > math.Abs(vs[at]) {
			at = i
		}
	}
	if at <= first || at >= last {
		return 0, false
	}
	mag := func(f float64) float64 { return math.Abs(s.at(f)) }
	a, b := math.Log(fs[at-1]), math.Log(fs[at+1])
	const g = 0.6180339887498949 // (√5 − 1)/2
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := mag(math.Exp(c)), mag(math.Exp(d))
	for b-a > 1e-8 {
		if fc > fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = mag(math.Exp(c))
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = mag(math.Exp(d))
		}
	}
	return math.Exp((a + b) / 2), true
}
