package ac

import (
	"slices"

	"pare/graph"
)

// The inputs a loop search holds. A declared input is where a generator
// goes when the signal path is measured, and every transfer holds the
// others at 0 V through their ideal sources, the generators idle. A loop
// is asked of the circuit as drawn, so a generator held on an electrode of
// the device whose loop is sought would answer for another circuit: its
// zero impedance ties that electrode to AC ground and cuts the feedback
// the device closes through it. An RC phase-shift oscillator captured with
// its input at the base (testdata/review14/b01.toml) showed "no 0° loop
// phase" for its held base, where ngspice, with nothing on the base, finds
// it running at 1.17 kHz with a margin of +7.7 dB. So an input on one of
// the device's own nets (its control, its common, the nets its controlled
// current flows between) is left free; any other stays held, as the
// transfers hold it.

// loopHeld are the nodes of c's declared inputs that the loop of the
// controlled sources srcs, ruled by V(cn) − V(dn), holds at 0 V.
func loopHeld(c *graph.Circuit, nl *netlist, srcs []loopSource, cn, dn int) []int {
	own := []int{cn, dn}
	for _, q := range srcs {
		own = append(own, q.a, q.b)
	}
	return slices.DeleteFunc(otherInputs(c, nl, -1), func(n int) bool { return slices.Contains(own, n) })
}
