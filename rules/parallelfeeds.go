package rules

import (
	"pare/graph"
)

// apartOnSupply reports whether two resistors or chokes now across the same
// two nets must stay two parts on the sheet: they run from a supply node (a
// smoothed HT or Vcc that feeds devices and nothing else, the reduction
// unable to hold it at AC ground: feedsDevices) to AC ground. What meets
// there are feeds, decouplers and a bleeder, each to a line of its own that
// the reduction grounded: different parts doing different jobs, in
// parallel for the small signal only because those lines and chassis are
// all AC ground. Merged, the sheet drew "20k ≡ R21, R6", a resistor no set
// contains (review 21's a04: a 220 kΩ bleeder and a 22 kΩ HT decoupler),
// and framed it as the decoupling filter. The small-signal answer is the
// same either way, and the AC check proves the reduction with the parts
// apart. The test is on the circuit as it stands, so a reduced netlist read
// back reduces to itself. A bias divider's halves meet on a base, a grid or
// a tap whose winding leads to one, and still merge; so do capacitors
// across the supply (smoothing is one job).
func (x *Ctx) apartOnSupply(p *graph.Part, na, nb string) bool {
	if p.Kind == graph.Capacitor {
		return false
	}
	s := na
	switch {
	case x.IsACGround(na) && !x.IsACGround(nb):
		s = nb
	case x.IsACGround(nb) && !x.IsACGround(na):
	default:
		return false // not a node and a return: a plain parallel pair
	}
	supplied, _ := x.feedsDevices(s)
	return supplied
}
