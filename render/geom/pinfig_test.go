package geom

import (
	"strings"
	"testing"
)

// TestFigureAstray: the review20 b01 placement (a base's volts in the gap
// between the emitter's connector stub and the base wire, on their line)
// and its neighbours, drawn on a small grid. The expected readings are
// what a reader takes the text for (common practice of service sheets:
// a figure belongs to the wire it sits by).
func TestFigureAstray(t *testing.T) {
	base := Pt{15, 17}                                                                          // the base pin's tip
	baseWire := []NetSeg{{"b", Seg{Pt{14, 17}, Pt{15, 17}}}, {"b", Seg{Pt{14, 8}, Pt{14, 37}}}} // stub to a junction on a vertical
	emitStub := NetSeg{"e", Seg{Pt{7, 17}, Pt{8, 17}}}                                          // the emitter connector's stub, ending at x=8
	for _, c := range []struct {
		name string
		r    Rect
		segs []NetSeg
		want string
	}{
		{"in the gap past the emitter stub's end", Rect{9, 16.5, 12, 17.5}, []NetSeg{emitStub}, "in line"},
		{"same box, its own net's wire between it and its pin", Rect{9, 16.5, 12, 17.5}, baseWire, ""},
		{"same box, another net's wire between it and its pin", Rect{9, 16.5, 12, 17.5}, []NetSeg{{"x", Seg{Pt{14, 8}, Pt{14, 37}}}}, "behind x"},
		{"three steps past the stub's end: out of reach", Rect{11.1, 16.5, 13.9, 17.5}, []NetSeg{emitStub}, ""},
		{"past a corner where another net's wire turns", Rect{9, 16.5, 12, 17.5}, []NetSeg{emitStub, {"e", Seg{Pt{8, 17}, Pt{8, 25}}}}, ""},
		{"past a junction on another net's wire", Rect{9, 16.5, 12, 17.5}, []NetSeg{emitStub, {"e", Seg{Pt{8, 9}, Pt{8, 25}}}}, "in line"},
		{"above the stub's line", Rect{9, 15.5, 12, 16.5}, []NetSeg{emitStub}, ""},
		{"beside its own pin, above its own wire", Rect{14.5, 15.5, 17.5, 16.5}, append(baseWire, emitStub), ""},
		{"past the end of its own net's wire", Rect{9, 16.5, 12, 17.5}, []NetSeg{{"b", Seg{Pt{7, 17}, Pt{8, 17}}}}, ""},
		{"along another net's wire on the way", Rect{18.6, 16.5, 21, 17.5}, []NetSeg{{"x", Seg{Pt{15.5, 17}, Pt{16.5, 17}}}}, "behind x"},
	} {
		if got := FigureAstray(c.r, base, "b", c.segs); !strings.HasPrefix(got, c.want) || (got == "") != (c.want == "") {
			t.Errorf("%s: got %q, want %q", c.name, got, c.want)
		}
	}
}
