package symbol

import (
	"math"
	"strings"
)

// genericBody draws a two-terminal part the netlist gives only as a
// description ("fuse 500 mA", "dial lamp 6V3 0.3 A") by its standard
// symbol, where the description names one; nil otherwise (the plain box).
// A fuse on a mains diagram drawn as a plain rectangle reads as a
// resistor. Pins and box are the box's (generic), so the layout does not
// move with the symbol. The forms, from the standards' symbol tables as
// the trade knows them (from memory):
//   - fuse: IEC 60617 a rectangle with the lead running through it along
//     its length; IEEE 315 an S-shaped curve between the leads;
//   - lamp: IEC 60617 a circle with a diagonal cross (signal lamp); IEEE
//     315 a circle with the filament's loop inside.
func genericBody(label string, st Style) []Prim {
	switch genericForm(label) {
	case "fuse":
		if st == IEEE {
			return []Prim{line(pt(-3, 0), pt(-1.2, 0)), arc(pt(-1.2, 0), pt(0, 0), 0.6, true),
				arc(pt(0, 0), pt(1.2, 0), 0.6, false), line(pt(1.2, 0), pt(3, 0))}
		}
		return []Prim{poly(false, pt(-1.5, -0.6), pt(1.5, -0.6), pt(1.5, 0.6), pt(-1.5, 0.6)), line(pt(-3, 0), pt(3, 0))}
	case "lamp":
		r := 0.8
		prims := []Prim{line(pt(-3, 0), pt(-r, 0)), line(pt(r, 0), pt(3, 0)), circle(pt(0, 0), r)}
		if st == IEEE {
			return append(prims, line(pt(-r, 0), pt(-0.3, 0)), arc(pt(-0.3, 0), pt(0.3, 0), 0.3, true), line(pt(0.3, 0), pt(r, 0)))
		}
		d := r / math.Sqrt2
		return append(prims, line(pt(-d, -d), pt(d, d)), line(pt(-d, d), pt(d, -d)))
	}
	return nil
}

// genericForm is the standard form a description names: "fuse" for a
// fuse or fusible resistor's fuse link, "lamp" for a lamp or bulb; "" for
// anything else. Whole words only, so "refused" or "clamp" name nothing.
func genericForm(label string) string {
	for _, w := range strings.FieldsFunc(strings.ToLower(label), func(r rune) bool {
		return !('a' <= r && r <= 'z')
	}) {
		switch w {
		case "fuse", "fuses", "fuselink":
			return "fuse"
		case "lamp", "lamps", "bulb", "bulbs":
			return "lamp"
		}
	}
	return ""
}
