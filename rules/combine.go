package rules

import (
	"strconv"

	"pare/graph"
	"pare/graph/value"
)

// Exact worst-case combination of toleranced values. Series sums and
// parallel combinations are monotonic in every part, so the limits of the
// result are the result of the limits (docs/references.md §4: 10k ±5 % +
// 22k ±10 % → ±8.4375 %; in parallel 6419.80–7322.77 Ω).

// limits is a nominal value with its lowest and highest values.
type limits struct{ nom, lo, hi float64 }

func limitsOf(v float64, t value.Tolerance) limits {
	return limits{v, v * (1 - t.Minus), v * (1 + t.Plus)}
}

func (l limits) tolerance() value.Tolerance {
	if l.nom == 0 {
		return value.Tolerance{}
	}
	t := value.Tolerance{Plus: round12(l.hi/l.nom - 1), Minus: round12(1 - l.lo/l.nom)}
	if approxEqual(t.Plus, t.Minus) {
		t.Minus = t.Plus // a symmetric result is written "±8.4375%", not as two sides differing in the 16th digit
	}
	return t
}

// round12 drops the binary noise below twelve significant digits.
func round12(v float64) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return r
}

func sum(a, b float64) float64 { return a + b }

// recip is the combination of reciprocals: resistors or inductors in
// parallel, capacitors in series.
func recip(a, b float64) float64 {
	if a == 0 || b == 0 {
		return 0
	}
	return a * b / (a + b)
}

func combine(a, b limits, f func(a, b float64) float64) limits {
	return limits{f(a.nom, b.nom), f(a.lo, b.lo), f(a.hi, b.hi)}
}

// combineTol combines two parts' values and tolerances; tolOK is false when
// either part has no tolerance given, and then the result carries none.
func combineTol(p, q *graph.Part, v1, v2 float64, f func(a, b float64) float64) (float64, value.Tolerance, bool) {
	if p.Tol == (value.Tolerance{}) || q.Tol == (value.Tolerance{}) {
		return f(v1, v2), value.Tolerance{}, false
	}
	l := combine(limitsOf(v1, p.Tol), limitsOf(v2, q.Tol), f)
	return l.nom, l.tolerance(), true
}

// tolNote explains the result's tolerance for the why.
func tolNote(v float64, t value.Tolerance, ok bool, u value.Unit, p, q *graph.Part) string {
	if !ok {
		missing := p.Ref
		if p.Tol != (value.Tolerance{}) {
			missing = q.Ref
		}
		return " (tolerance not combined: " + missing + " has none given)"
	}
	lo := value.FormatPrec(v*(1-t.Minus), u, value.Symbol, 6)
	hi := value.FormatPrec(v*(1+t.Plus), u, value.Symbol, 6)
	if approxEqual(t.Plus, t.Minus) {
		return " " + "±" + pct(t.Plus)[:len(pct(t.Plus))-2] + " % worst case (" + lo + "–" + hi + ")"
	}
	return " worst case " + lo + "–" + hi + " (−" + pct(t.Minus) + " / +" + pct(t.Plus) + ")"
}

func approxEqual(a, b float64) bool {
	d := a - b
	if d < 0 {
		d = -d
	}
	return d <= 1e-12*(a+b+1e-300)
}
