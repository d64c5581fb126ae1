package rules

import (
	"errors"

	"pare/graph"
)

// ErrInternal marks a failure of a rule itself (a panic caught by Reduce):
// pare's fault, never the input's, so commands exit with their own code.
var ErrInternal = errors.New("internal error")

// endsPos is where a message about the circuit as a whole points: the first
// declared output's net, else the first input's, else the top of the file.
// Every message carries file:line:col, even one about nothing being left.
func endsPos(c *graph.Circuit) graph.Pos {
	for _, list := range [][]string{c.Outputs, c.Inputs} {
		for _, name := range list {
			if n := c.Net(name); n != nil && n.Pos.IsValid() {
				return n.Pos
			}
		}
	}
	return graph.Pos{File: c.File, Line: 1, Col: 1}
}
