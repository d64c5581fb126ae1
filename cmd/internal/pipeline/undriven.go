package pipeline

import (
	"strings"

	"pare/graph"
	"pare/graph/ac"
)

// undrivenWarnings warns, at the first terminal on one of them, about nets
// no part conducting at AC ties to ground, an input or a way in from
// outside (ac.Undriven): the main job's AC proof cannot solve such a
// circuit, and `pare check` is where the capture should be mended. A
// primary brought in on ports or an inlet part is not one of them: the
// model holds it at 0 V as an undriven source.
func undrivenWarnings(c *graph.Circuit) graph.ErrorList {
	var nets []string
	for _, n := range ac.Undriven(c) {
		// A net with one connection has graph.Check's plainer warning.
		if len(c.ConnsOf(n)) > 1 {
			nets = append(nets, n)
		}
	}
	if len(nets) == 0 {
		return nil
	}
	var w graph.ErrorList
	pos := graph.Pos{File: c.File, Line: 1, Col: 1}
	for _, n := range nets {
		if cs := c.ConnsOf(n); len(cs) > 0 {
			pos = cs[0].Part.Pin(cs[0].Pin).Pos
			break
		}
	}
	shown, more := nets, ""
	if len(shown) > 8 {
		shown, more = shown[:8], " and more"
	}
	w.Add(pos, "net(s) %s%s have no path to ground, an input or a port through any part that conducts at AC: a winding or stage left unconnected? The AC proof cannot solve them (wire them, or bring them in on a port)",
		strings.Join(shown, ", "), more)
	return w
}
