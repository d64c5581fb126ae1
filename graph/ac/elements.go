package ac

import "pare/graph"

// Element is one element of the small-signal circuit the solver stamps: the
// part it models, which piece of the part ("ra", "gm", "rpi", "ro", "rd", a
// winding's name, "" for a plain two-terminal part) and its value in SI
// units (Ω for resistances, F, S for transconductances). Inductive elements
// are left out: their value is not one number.
type Element struct {
	Ref, Piece string
	Value      float64
}

// Elements lists the resistive, capacitive and transconductance elements
// the solver stamps for c with the default options, in the order it stamps
// them. It lets a caller see the device values the solver really uses (a
// test holds the reduction's judgements to them), without a sweep.
func Elements(c *graph.Circuit) ([]Element, error) {
	nl, err := elaborate(c, Options{})
	if err != nil {
		return nil, err
	}
	var out []Element
	for _, p := range nl.prims {
		switch p.kind {
		case primR, primC, primVCCS:
			out = append(out, Element{Ref: p.ref, Piece: p.sub, Value: p.v})
		}
	}
	return out, nil
}
