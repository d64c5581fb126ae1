package stages

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The textbook figures of a choke (or loudspeaker field coil) smoothing
// section taken as loaded (handbook second-order low pass, from memory;
// docs/references.md §24, §52): its winding L with its copper Rdc in
// series, into C2 with the load across it as the resistance V/I the DC
// operating point gives. H = RL/(RL + Rdc + s(L + Rdc·RL·C2) + s²·L·RL·C2).
var (
	byChokeCorner = figure.ByFormula("fc of L and Rdc into C2 ∥ RL, RL = V/I at the DC point")
	byChokeAtten  = figure.ByFormula("A = |Rdc + jX_L + Z|/|Z|, Z = C2 ∥ RL")
	byChokeQ      = figure.ByFormula("Q = ω0/(Rdc/L + 1/(RL·C2))")
)

// chokeSection is a choke section's textbook model; rl is +Inf where the
// DC point gives no load (or none is drawn).
type chokeSection struct{ l, rdc, c2, rl float64 }

// h is V(out)/V(in) of the model at f.
func (k chokeSection) h(f float64) complex128 {
	w := 2 * math.Pi * f
	z := complex(0, -1/(w*k.c2))
	if !math.IsInf(k.rl, 1) {
		rl := complex(k.rl, 0)
		z = z * rl / (z + rl)
	}
	return z / (complex(k.rdc, w*k.l) + z)
}

// level is |H| at DC: the load's share of the divider it makes with Rdc.
func (k chokeSection) level() float64 {
	if math.IsInf(k.rl, 1) {
		return 1
	}
	return k.rl / (k.rl + k.rdc)
}

// resonance is where the model's phase is −90° (H's denominator has no
// real part): ω0² = (1 + Rdc/RL)/(L·C2), the undamped 1/(2π√(LC2)) raised
// a little by the load.
func (k chokeSection) resonance() float64 {
	return math.Sqrt((1+k.rdc/k.rl)/(k.l*k.c2)) / (2 * math.Pi)
}

// q is the model's Q: ω0 over the sum of the winding's and the load's
// damping; a second-order low pass stands |H(f0)| = Q·|H(0)| at its
// −90° point, which is how the solver's Q is read.
func (k chokeSection) q() float64 {
	w0 := 2 * math.Pi * k.resonance()
	return w0 / (k.rdc/k.l + 1/(k.rl*k.c2))
}

// corner is where the model falls 3 dB below its DC level, above any peak.
func (k chokeSection) corner() float64 {
	lv := k.level() / math.Sqrt2
	f0 := k.resonance()
	top, best := f0/100, 0.0
	for i := 0; i <= 60; i++ {
		f := f0 / 100 * math.Pow(1000, float64(i)/60)
		if m := cmplx.Abs(k.h(f)); m > best {
			top, best = f, m
		}
	}
	f, _ := bisectLog(func(f float64) (bool, bool) { return cmplx.Abs(k.h(f)) >= lv, true }, top, f0*cornerSpan)
	return f
}

// atten is how far |H| lies below 1 at f, in decibels.
func (k chokeSection) atten(f float64) float64 { return -db(cmplx.Abs(k.h(f))) }

// chokeSectionOf is the model of choke s into c2 (farads) between nets in
// and out, its load read off the DC operating point: the choke's current
// (V(in) − V(out))/Rdc, and RL = V(out) over it. No copper declared, no
// DC point, or no current forward: unloaded.
func (x *figCtx) chokeSectionOf(s *graph.Part, c2 float64, in, out int) chokeSection {
	rdc, _ := s.Param("rdc")
	k := chokeSection{l: s.Inductance(), rdc: max(rdc, 0), c2: c2, rl: math.Inf(1)}
	op := x.dcPoint()
	if op == nil || !(k.rdc > 0) {
		return k
	}
	vi, ok1 := op.Volts(x.netName(in))
	vo, ok2 := op.Volts(x.netName(out))
	if i := (vi - vo) / k.rdc; ok1 && ok2 && i*vo > 0 {
		k.rl = vo / i
	}
	return k
}

// chokeFigures writes what the solver shows a choke section do, on the
// circuit as it is with its rail driven: its resonance, where V(out)/V(in)
// lags its DC phase by 90°, and its Q there, |H(f0)|/|H(DC)| (both exact
// for a second-order section), each with the loaded model's beside it;
// and one note that reads the corner, the resonance, the Q and the
// ripple's attenuation together, so the words cannot contradict the
// figures (review23 a05: a field coil's corner 10.42 Hz printed beside
// words that put it above 25 Hz).
func (x *figCtx) chokeFigures(s *graph.Part, c2 float64, in, out int) {
	if s.Kind != graph.Inductor {
		return
	}
	var fcWhy *string
	var fc figure.Figure
	for i, f := range x.st.Figures {
		if f.Name == prefixed(x.spec.Prefix, "f_c") && f.Origin.Source == figure.Solver {
			fc = f
			if f.Why != "" {
				fcWhy = &x.st.Figures[i].Why
			}
		}
	}
	if fc.Origin.Source != figure.Solver {
		return
	}
	r, err := x.filterResponse(in, out)
	if err != nil {
		return
	}
	k := x.chokeSectionOf(s, c2, in, out)
	f0, q, ok := sectionResonance(r, k.resonance())
	if !ok {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s's section shows no resonance in circuit (its phase never lags 90°): its corner is read from its fall alone", s.Ref))
		return
	}
	transfer := "V(" + x.netName(out) + ")/V(" + x.netName(in) + ")"
	h0, _ := r.At(f0)
	load := k.loadWords(h0, f0)
	sv := &figure.Figure{Name: "f_res", Unit: figure.Hertz, Value: f0, Origin: figure.BySolver("−90° of "+transfer, "")}
	x.putChecked(sv, &figure.Figure{Name: "f_res", Unit: figure.Hertz, Value: resonance(k.l, c2), Origin: byChoke}, func() string {
		return fmt.Sprintf("the formula takes %s and the capacitor alone; %s", s.Ref, load)
	})
	sq := &figure.Figure{Name: "q_section", Unit: figure.Ratio, Value: q, Origin: figure.BySolver("|H(f0)|/|H(DC)| of "+transfer, hz(f0))}
	x.putChecked(sq, &figure.Figure{Name: "q_section", Unit: figure.Ratio, Value: k.q(), Origin: byChokeQ}, func() string {
		return fmt.Sprintf("the formula damps the section by %s's winding (%s) and its load as V/I; %s", s.Ref, figure.Format(k.rdc, figure.Ohm, figure.Text), load)
	})
	if fcWhy != nil {
		*fcWhy = "the formula takes " + s.Ref + "'s winding and the capacitor with the load as V/I; " + load
	}
	x.st.Notes = append(x.st.Notes, chokeWords(s.Ref, fc.Value, f0, q, x.rippleAtten()))
}

// sectionResonance is where r lags its phase at DC (read a hundredth of
// guess down) by 90°, searched between a tenth and ten times guess, and
// |r| there over |r| at DC.
func sectionResonance(r *ac.Response, guess float64) (f0, q float64, ok bool) {
	h0, err := r.At(guess / 100)
	if err != nil || h0 == 0 {
		return 0, 0, false
	}
	leads := func(f float64) (bool, bool) {
		h, err := r.At(f)
		if err != nil {
			return false, false
		}
		return real(h*cmplx.Conj(h0)) > 0, true
	}
	f0, ok = bisectLog(leads, guess/10, guess*10)
	if !ok {
		return 0, 0, false
	}
	return f0, magnitude(r, f0) / cmplx.Abs(h0), true
}

// chokeQuiet is the Q under which a second-order section has no peak
// (1/√2: maximally flat, Butterworth; handbook, from memory): below it the
// section falls from DC and its −3 dB corner lies below its resonance.
const chokeQuiet = 1 / math.Sqrt2

// chokeWords reads a choke section's solved figures together: damped (Q
// under 1/√2) it falls from DC, 3 dB down below its resonance; lighter
// it stands Q above its DC level at its resonance and falls past it, its
// corner above.
func chokeWords(ref string, fc, f0, q float64, ripple string) string {
	how := fmt.Sprintf("%s's section resonates at %s with Q %s in circuit: ", ref, hz(f0), figure.Plain(q))
	if q < chokeQuiet {
		how += fmt.Sprintf("damped (Q under 0.71), it has no peak and falls from DC, 3 dB down at %s, below its resonance", hz(fc))
	} else {
		how += fmt.Sprintf("it stands %.1f dB above its DC level there and falls past it, 3 dB below that level at %s", db(q), hz(fc))
	}
	return how + ripple
}

// rippleAtten is ", X dB down at the ripple's f" from the stage's solved
// attenuation at the ripple frequency, "" without one.
func (x *figCtx) rippleAtten() string {
	a, ok1 := x.st.Figures.Get(prefixed(x.spec.Prefix, "atten_ripple"))
	f, ok2 := x.st.Figures.Get(prefixed(x.spec.Prefix, "f_ripple"))
	if !ok1 || !ok2 {
		return ""
	}
	return fmt.Sprintf("; %.1f dB down at the %s ripple", a.Value, hz(f.Value))
}

// loadAcross is the load the solver's V(out)/V(in) = h at f puts across
// the section's capacitor: the section's own parts carry the current
// (V(in) − V(out))/(Rdc + jωL) into C2 and the load, so the load is
// what is left of V(out) over that current once C2 is taken away.
func (k chokeSection) loadAcross(h complex128, f float64) complex128 {
	w := 2 * math.Pi * f
	z := h * complex(k.rdc, w*k.l) / (1 - h)
	return 1 / (1/z - complex(0, w*k.c2))
}

// loadWords says what load the circuit puts across the section at f,
// read from the solver's response, against the model's V/I: a device's
// supply current hardly follows its supply's voltage, so a set of
// valves or transistors loads a smoothing section far less than V/I.
func (k chokeSection) loadWords(h complex128, f float64) string {
	y := 1 / k.loadAcross(h, f)
	if !(real(y) > 0) || cmplx.IsNaN(y) {
		return "in circuit what the line feeds loads it as the solver gives it"
	}
	in := "in circuit the load across the capacitor is " + figure.Format(1/real(y), figure.Ohm, figure.Text)
	if b := imag(y) / (2 * math.Pi * f); b > 0 {
		in += " with " + figure.Format(b, figure.Farad, figure.Text) + " across it"
	}
	in += " at " + hz(f) + " (from the solver's response and the section's own parts)"
	if math.IsInf(k.rl, 1) {
		return in
	}
	return fmt.Sprintf("%s, not the %s V/I the DC point gives: the devices' supply current hardly follows the line's voltage", in, figure.Format(k.rl, figure.Ohm, figure.Text))
}
