package check

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/render/geom"
	"pare/render/symbol"
)

// Two parts' labels set on one line with less than a character's width
// between them read as one label: the reader cannot tell where one part's
// text ends. A narrow standing part between them does not set them apart,
// the eye jumps its body (review21 b03 "C15 180pT1": T1's name against
// C15's plates on the line of C15's label; a02 "C8 100p T3 k=0.01": T3's
// name on the far side of C8 from C8's label).

// narrowBody is the widest symbol, in grid steps, the eye jumps between two
// labels on one line: a standing resistor's or capacitor's body with its
// lead room (symbol package: 1.6 to 2 steps), not a lying part or a device.
const narrowBody = 2.5

// runGap is how much empty room, in character widths, two labels on one
// line need between them, not counting the narrow bodies between them.
const runGap = 1.5

// textLine is one line of a label as the drawer sets it (render/draw.go:
// left-aligned at the box's left edge, one LineH per line).
type textLine struct {
	label int // index in the sheet's labels
	part  string
	text  string
	box   geom.Rect
}

// RunTogether lists the pairs of labels of different parts, once a pair, with a
// line of each on one text line (their line boxes overlap in height) and less than
// runGap character widths (symbol.CharW) of empty room between them once
// the narrow bodies in the gap are taken out, or overlapping. Frame
// titles are left out: the frame's edge sets them apart. A pin figure is
// its part's (its owner is "ref.pin").
func RunTogether(g *geom.Sheet) []string {
	var lines []textLine
	for li, l := range g.Labels {
		if !PartLabel(l) {
			continue
		}
		part := LabelPart(l)
		for i, box := range LineBoxes(l) {
			lines = append(lines, textLine{li, part, l.Lines[i], box})
		}
	}
	seen := map[[2]int]bool{} // one finding per pair of labels
	var out []string
	for i, a := range lines {
		for _, b := range lines[i+1:] {
			if a.part == b.part {
				continue
			}
			k := [2]int{a.label, b.label}
			if seen[k] || !linesRun(g, a.box, b.box) {
				continue
			}
			seen[k] = true
			out = append(out, fmt.Sprintf("%q (%s) and %q (%s) run together at %s", a.text, a.part, b.text, b.part, pt(geom.Pt{X: a.box.X0, Y: a.box.Y1})))
		}
	}
	return out
}

// PartLabel says whether l is a part's label or pin figure, the labels
// RunTogether weighs: not a frame's title, not an unowned text.
func PartLabel(l geom.Label) bool {
	return l.Owner != "" && !strings.HasPrefix(l.Owner, "frame:")
}

// LabelPart is the part a label is of: a pin figure's ("ref.pin") is its
// part's.
func LabelPart(l geom.Label) string {
	part, _, _ := strings.Cut(l.Owner, ".")
	return part
}

// LineBoxes are the boxes of a label's text lines as the drawer sets them
// (render/draw.go: left-aligned at the box's left edge, one LineH per
// line, lines after the first and small labels at SmallScale).
func LineBoxes(l geom.Label) []geom.Rect {
	out := make([]geom.Rect, len(l.Lines))
	for i, s := range l.Lines {
		w := symbol.TextWidth(s)
		if i > 0 || l.Small {
			w *= symbol.SmallScale
		}
		y := l.Box.Y0 + float64(i)*symbol.LineH
		out[i] = geom.Rect{X0: l.Box.X0, Y0: y, X1: l.Box.X0 + w, Y1: y + symbol.LineH}
	}
	return out
}

// LabelsRun says whether a line of label a and a line of label b run
// together on g: RunTogether's test for one pair, whatever their owners.
func LabelsRun(g *geom.Sheet, a, b geom.Label) bool {
	return LabelRoom(g, a, b) < runGap*symbol.CharW
}

// LabelRoom is the least empty room, in grid units, between a line of label
// a and a line of label b that share a text line, the narrow bodies between
// taken out (negative when they overlap); +Inf when no lines share one.
func LabelRoom(g *geom.Sheet, a, b geom.Label) float64 {
	room := math.Inf(1)
	bb := LineBoxes(b)
	for _, ra := range LineBoxes(a) {
		for _, rb := range bb {
			if math.Min(ra.Y1, rb.Y1)-math.Max(ra.Y0, rb.Y0) > geom.Eps {
				room = math.Min(room, emptyBetween(g, ra, rb))
			}
		}
	}
	return room
}

// linesRun says whether two text lines' boxes share a text line with less
// than runGap character widths of empty room between them.
func linesRun(g *geom.Sheet, a, b geom.Rect) bool {
	if math.Min(a.Y1, b.Y1)-math.Max(a.Y0, b.Y0) <= geom.Eps {
		return false
	}
	return emptyBetween(g, a, b) < runGap*symbol.CharW
}

// emptyBetween is the room between two text lines' boxes on one line less
// the width the narrow symbols standing across that line take of it;
// negative when the boxes overlap.
func emptyBetween(g *geom.Sheet, a, b geom.Rect) float64 {
	if a.X0 > b.X0 {
		a, b = b, a
	}
	lo, hi := a.X1, b.X0
	if hi-lo <= geom.Eps {
		return hi - lo
	}
	y0, y1 := math.Max(a.Y0, b.Y0), math.Min(a.Y1, b.Y1)
	var spans [][2]float64
	for _, s := range g.Symbols {
		r := s.Box
		if s.Kind == "" || r.W() > narrowBody || r.Y1 <= y0 || r.Y0 >= y1 || r.X1 <= lo || r.X0 >= hi {
			continue
		}
		spans = append(spans, [2]float64{math.Max(r.X0, lo), math.Min(r.X1, hi)})
	}
	return hi - lo - covered(spans)
}

// covered is the length of the union of the spans.
func covered(spans [][2]float64) float64 {
	slices.SortFunc(spans, func(p, q [2]float64) int { return cmp.Compare(p[0], q[0]) })
	total, end := 0.0, math.Inf(-1)
	for _, sp := range spans {
		if sp[0] > end {
			total += sp[1] - sp[0]
			end = sp[1]
		} else if sp[1] > end {
			total += sp[1] - end
			end = sp[1]
		}
	}
	return total
}
