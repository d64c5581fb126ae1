package stages

import (
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
)

// fullBypassC is the factor a capacitor is made larger by to stand for a
// perfect bypass in the solver.
const fullBypassC = 1e6

// bypassSolve is a common-electrode capacitor's effect in circuit: the
// stage's gain at the middle of its band as it is (a), with the capacitor
// a perfect bypass (full) and with none (open); the same two at the band's
// low edge lo (aLo, fullLo), where a bypass is weakest; and the corner
// where the gain falls 3 dB below a perfect bypass's at the same
// frequency (hasCorner false when it never does). solved is false when
// the solver cannot say.
type bypassSolve struct {
	f, a, full, open, corner float64
	lo, hi, aLo, fullLo      float64
	hasCorner, solved        bool
}

// bypassInCircuit solves a common-electrode capacitor ck on the whole
// reduced circuit. The corner compares the gain with the perfect bypass's
// at each frequency, so what else falls at low frequencies (a coupling
// capacitor into the next stage) is on both sides and drops out: the
// bypass's own corner, as the reviewer's ngspice deck of issue 10 defines
// it (|H|/|H with C → ∞| = 1/√2).
func (x *figCtx) bypassInCircuit(p, ck *graph.Part) bypassSolve {
	var b bypassSolve
	in, out := x.gainNets("common")
	band := x.w.c.BandOf(p)
	c := x.solverCircuit()
	if !x.solve || in == "" || out == "" || c.Net(in) == nil || c.Net(out) == nil || band.Min <= 0 || band.Max <= 0 || c.Part(ck.Ref) == nil {
		return b
	}
	b.f, b.lo, b.hi = math.Sqrt(band.Min*band.Max), band.Min, band.Max
	r, err1 := ac.NewTransfer(c, in, out, gangMid.options())
	rf, err2 := ac.NewTransfer(withPart(c, scaledCap(ck, fullBypassC)), in, out, gangMid.options())
	if err1 != nil || err2 != nil {
		return b
	}
	b.a, b.full = magnitude(r, b.f), magnitude(rf, b.f)
	b.aLo, b.fullLo = magnitude(r, b.lo), magnitude(rf, b.lo)
	if math.IsNaN(b.a) || math.IsNaN(b.full) || !(b.full > 0) || math.IsNaN(b.aLo) || !(b.fullLo > 0) {
		return b
	}
	b.solved = true
	if ro, err := ac.NewTransfer(withPart(c, scaledCap(ck, 1/fullBypassC)), in, out, gangMid.options()); err == nil {
		b.open = magnitude(ro, b.f)
	}
	b.corner, b.hasCorner = ratioCrossing(r, rf, 1/math.Sqrt2, b.f*cornerSpan, b.f/cornerSpan) // fullBypassC stays a perfect bypass over this span
	return b
}

// scaledCap is a copy of a capacitor with its value times k.
func scaledCap(ck *graph.Part, k float64) *graph.Part {
	out := *ck
	out.Value.Min, out.Value.Max = ck.Value.Min*k, ck.Value.Max*k
	return &out
}

// ratioCrossing is where |r|/|rf| falls through level between from (at or
// above it) and to (below it), by bisection on a log scale; ok is false
// when the ratio does not cross there.
func ratioCrossing(r, rf *ac.Response, level, from, to float64) (float64, bool) {
	above := func(f float64) (bool, bool) {
		hf, err := rf.At(f)
		h, err2 := r.At(f)
		if err != nil || err2 != nil || hf == 0 || cmplx.IsNaN(h) || cmplx.IsNaN(hf) {
			return false, false
		}
		return cmplx.Abs(h)/cmplx.Abs(hf) >= level, true
	}
	return bisectLog(above, from, to)
}

// bypassed tells whether the solved capacitor is a bypass across the band:
// the gain within bypassAgreement of a perfect bypass's at the middle and
// at the low edge, where a bypass is weakest.
func (b bypassSolve) bypassed() bool {
	return !b.solved || math.Abs(b.a-b.full) <= bypassAgreement*b.full && b.aLo >= (1-bypassAgreement)*b.fullLo
}
