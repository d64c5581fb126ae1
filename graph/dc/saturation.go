package dc

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/value"
)

// nearSaturation is the collector–emitter voltage under which a conducting
// transistor is called near saturation at rest: a silicon transistor's
// Vce(sat) is some 0.1–0.3 V, and below about 0.5 V its collector–base
// junction nears forward bias and its gain falls away (common practice).
// A base forward of its collector (Vbc > 0 for an NPN) is the saturation
// region's textbook mark, whatever Vce reads.
const nearSaturation = 0.5

// conducting is the collector current above which a transistor's low Vce
// says saturation, not a stage with no supply: a microamp, as the stage
// finder's cut-off test (rules/stages cutOffAtRest).
const conducting = 1e-6

// Saturation is a transistor's state at rest when it is at or near
// saturation: its collector–emitter and base–collector volts, signed so
// that an NPN and a PNP read alike (Vce positive in the active region, Vbc
// positive when the collector–base junction is forward biased).
type Saturation struct {
	Ref      string
	Vce, Vbc float64
}

// Saturated reports whether transistor ref conducts at this point with
// its Vce under nearSaturation or its base–collector junction forward
// biased.
func (p *Point) Saturated(ref string) (Saturation, bool) {
	part := p.Circuit.Part(ref)
	if part == nil || part.Kind != graph.BJT || !part.IsActive() {
		return Saturation{}, false
	}
	vb, okb := p.Volts(part.NetOf("b"))
	vc, okc := p.Volts(part.NetOf("c"))
	ve, oke := p.Volts(part.NetOf("e"))
	if !okb || !okc || !oke || math.Abs(p.Current(ref, "c")) < conducting {
		return Saturation{}, false
	}
	sign := 1.0
	if part.Type == "pnp" {
		sign = -1
	}
	s := Saturation{Ref: ref, Vce: sign * (vc - ve), Vbc: sign * (vb - vc)}
	return s, s.Vce < nearSaturation || s.Vbc > 0
}

// String is the state in a repairer's words: "Q1 rests near saturation
// (Vce 450 mV; its base 200 mV above its collector, the collector–base
// junction forward biased)".
func (s Saturation) String() string {
	word := "near saturation"
	switch {
	case s.Vce < 0:
		word = "with its collector the wrong side of its emitter (its pins as captured?)"
	case s.Vce < 0.3:
		word = "saturated"
	}
	out := fmt.Sprintf("%s rests %s (Vce %s", s.Ref, word, value.FormatPrec(s.Vce, value.Volt, value.Symbol, 3))
	if s.Vbc > 0 {
		out += fmt.Sprintf("; its base %s above its collector, the collector–base junction forward biased", value.FormatPrec(s.Vbc, value.Volt, value.Symbol, 3))
	}
	return out + ")"
}

// saturationWarning warns of a transistor at or near saturation at rest:
// it has little gain left there and a signal clips at once, so the stage
// as captured does not work as drawn (a collector load or bias resistor
// misread, or a part gone high).
func (p *Point) saturationWarning(ch *Chart, part *graph.Part) {
	s, ok := p.Saturated(part.Ref)
	if !ok {
		return
	}
	ch.Warnings = append(ch.Warnings, s.String()+" at the DC operating point as captured: it has little gain left and clips at once; check the collector load and the base bias against the drawing (a value misread or a resistor gone high)")
}
