package pipeline

import (
	"pare/graph"
	"pare/graph/safety"
)

// cautionHeader opens the top line sayCaution adds.
const cautionHeader = " The set's caution (from the original: this file has no supply or mains part to tell it from):"

// sayCaution writes the original's caution at the top of the reduced
// netlist when the reduced circuit alone would be given another: the
// reduction takes the supply out (AC ground for the signal), so a 9 V
// battery portable's reduced.toml reads as a set "that does not show what
// powers it" (review22 b05), and a command run on the file words its
// caution from that. The file cannot carry the supply without putting it
// back into the circuit; it says what the set is instead.
func sayCaution(c *graph.Circuit, orig safety.Caution) {
	if orig.Heading == "" || safety.For(c).Heading == orig.Heading {
		return
	}
	addHeader(c, cautionHeader+" "+orig.Heading)
}
