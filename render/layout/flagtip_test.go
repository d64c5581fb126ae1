package layout

import (
	"strings"
	"testing"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
)

// TestWireClearOfFlagLine: a flag's body is a line of its net running to
// its tip, and another net's run that starts a few steps beyond the tip,
// in line, reads as that line carried on (review19 b05: the tone control's
// feed began two steps past the extension speaker socket's flag). Flag F1
// on net s points right, its tip at x=7; net m runs from D1's pin above
// the line, (10,-8) facing down, to C1's pin on the line, (14,0) facing
// left. The plain L (down at x=10, along the line from 10) would start
// three steps past the tip; the router comes down at x=13 instead, six
// steps past it, where render/check (inLineGap, six steps) no longer reads
// the two as one wire. With F1 a plain one-pin part (no flag) the L is
// kept: only a flag draws a line to its tip.
func TestWireClearOfFlagLine(t *testing.T) {
	for _, tc := range []struct {
		kind   graph.Kind
		inLine bool
	}{
		{graph.Port, false},
		{graph.Generic, true},
	} {
		ly := handSheet(
			box{"F1", geom.R(0, -0.7, 7, 0.7), []geom.Pin{pinAt("s", 0, 0, geom.Left)}},
			box{"D1", geom.R(9, -10, 11, -8), []geom.Pin{pinAt("m", 10, -8, geom.Down)}},
			box{"C1", geom.R(14, -0.7, 16, 0.7), []geom.Pin{pinAt("m", 14, 0, geom.Left)}},
		)
		ly.cells[0].part.Kind = tc.kind
		g, _ := routeSheet(ly, true)
		g.Symbols[0].Kind = "port" // the checker reads F1 as the flag it is drawn as
		var got []string
		for _, f := range check.Measure(g).InLine {
			if strings.Contains(f, " s ") {
				got = append(got, f)
			}
		}
		if (len(got) > 0) != tc.inLine {
			t.Errorf("F1 a %s: wires in line with its tip %v, want in line %v (wires %v)", tc.kind, got, tc.inLine, g.Wires)
		}
	}
}
