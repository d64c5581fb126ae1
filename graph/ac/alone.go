package ac

import (
	"pare/graph"
	"pare/graph/device"
)

// A device's return ratio crosses 0° of loop phase wherever the circuit
// round it has a natural frequency near the jω axis, its own loop or not:
// an emitter follower fed from an RC oscillator's collector sees the
// oscillator's loop, closed through the other device, as a 0° crossing
// with a large "margin" of its own (Bode's Δ = Δ0·(1 + T): with the
// oscillator's loop already unstable, Δ0 has the root, not T). Whether a
// loop is the device's own is asked of the circuit with every other
// amplifying device made passive: a loop that the device closes by its own
// gain still reaches 0° there; one that only passes through it does not.

// quietGm is what an amplifying device keeps of its transconductance when
// made passive: small enough that no loop through it counts, not zero,
// which the valve model refuses (µ = gm·ra must make a model).
const quietGm = 1e-12

// Alone is a copy of c with every amplifying device but ref made passive:
// transconductance gone, input and output resistances kept, so each still
// loads the circuit as it does. Its other parts are c's own: a reader of
// the copy changes none of them.
func Alone(c *graph.Circuit, ref string) *graph.Circuit {
	// only the devices' parameters change: every other part is c's own
	out := c.CloneSharing(func(p *graph.Part) bool {
		return p.Kind == graph.Valve || p.Kind == graph.BJT || p.Kind == graph.FET
	})
	for _, p := range out.Parts {
		if p.Ref == ref || (p.Kind != graph.Valve && p.Kind != graph.BJT && p.Kind != graph.FET) {
			continue
		}
		s, err := device.Of(p)
		if err != nil {
			continue
		}
		params := map[string]float64{"gm": quietGm}
		switch p.Kind {
		case graph.Valve:
			params["ra"] = s.ROut
		case graph.BJT:
			params["beta"], params["ic"] = s.Beta, s.Ic
			params["rpi"], params["ro"] = s.RPi, s.ROut
		case graph.FET:
			params["rd"] = s.ROut
		}
		p.Params = params
	}
	return out
}

// OwnLoopFloorDB is how far below 0 dB a device's loop, the other devices
// made passive, may fall and still be its own: −20 dB, ten times short. A
// device whose loop the others' loading keeps from starting (an RC
// oscillator's collector loaded by a follower made passive, whose base
// then reads rπ instead of β times its emitter load) is an oscillator
// still; a follower, gain below 1, with no phase-shifting path of its own
// reaches 0° far below it or not at all (common practice, no source).
const OwnLoopFloorDB = -20.0

// OwnLoop reports whether ref closes a loop by its own gain: with every
// other amplifying device passive, its loop still reaches 0° of loop phase
// at a gain no lower than OwnLoopFloorDB.
func OwnLoop(c *graph.Circuit, ref string, o LoopOptions) (bool, error) {
	l, err := FindLoop(Alone(c, ref), ref, o)
	if err != nil {
		return false, err
	}
	for _, x := range l.Crossings {
		if x.GainDB >= OwnLoopFloorDB {
			return true, nil
		}
	}
	return false, nil
}

// InheritedSpan is how far apart, as a ratio, two devices' 0° crossings
// may be for one to be the other's loop seen through it: the follower's
// crossing sits where the oscillator's loop makes the circuit's natural
// frequency, a few per cent from the oscillator's own 0° point (2.7 % on
// testdata/review13/b01.toml); a factor 1.25 keeps independent
// oscillators of one set (a local oscillator and a BFO) apart.
const InheritedSpan = 1.25
