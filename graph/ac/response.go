package ac

import (
	"fmt"
	"math"

	"pare/graph"
)

// Response is one response of one circuit, assembled once and solved at any
// frequency: what a search for a peak or a −3 dB point asks for point by
// point (the stage figures in rules/stages), without assembling the
// circuit again for each point.
type Response struct {
	s       *system
	in, out int
	current bool // 1 A into in (a transimpedance), else 1 V on in
	zero    bool // read at AC ground: 0
	// back, when set (not ground), is where the current leaves (a current
	// driven from back to in) and the node read against out: V(out) −
	// V(back). 0: ground.
	back int
}

// NewTransfer is V(out)/V(in) with in driven by an ideal 1 V source, as
// Transfer solves it.
func NewTransfer(c *graph.Circuit, in, out string, o Options) (*Response, error) {
	return NewResponses(c).Transfer(in, out, o)
}

// NewTransimpedance is V(out)/I for a current I of 1 A driven into net in
// from ground, the circuit's other declared inputs held at 0 V by their
// ideal sources and nothing else driven: a tank or a winding driven so, as
// the anode or collector that feeds it would (a current source), keeps
// its damping, which an ideal voltage source would short. With out = in it
// is the driving-point impedance (Impedance).
func NewTransimpedance(c *graph.Circuit, in, out string, o Options) (*Response, error) {
	return NewResponses(c).Transimpedance(in, out, o)
}

// NewAcross is the impedance between nets a and b: V(a) − V(b) for 1 A
// driven into a and out of b, with the circuit's declared inputs held at
// 0 V and nothing else driven. It is a tank's own impedance where neither
// end is at AC ground (a secondary whose cold end returns through a
// capacitor); with b at AC ground it is the driving-point impedance of a.
func NewAcross(c *graph.Circuit, a, b string, o Options) (*Response, error) {
	return NewResponses(c).Across(a, b, o)
}

func twoNodes(c *graph.Circuit, nl *netlist, in, out string) (int, int, error) {
	n, err := nodeOf(c, nl, in)
	if err != nil {
		return 0, 0, err
	}
	m, err := nodeOf(c, nl, out)
	return n, m, err
}

// At solves the response at f hertz.
func (r *Response) At(f float64) (complex128, error) {
	if !(f > 0) || math.IsInf(f, 0) {
		return 0, fmt.Errorf("frequency %g: must be a positive number of hertz", f)
	}
	if r.zero {
		return 0, nil
	}
	if err := r.s.solveAt(f); err != nil {
		return 0, err
	}
	if r.current {
		for i := range r.s.b {
			r.s.b[i] = 0
		}
		r.s.b[r.s.unk[r.in]] = 1
		if r.back > 0 {
			r.s.b[r.s.unk[r.back]] = -1
		}
	}
	if err := r.s.solveRHS(f); err != nil {
		return 0, err
	}
	return r.s.voltage(r.out) - r.s.voltage(r.back), nil
}

// Transimpedance is NewTransimpedance solved at each frequency.
func Transimpedance(c *graph.Circuit, in, out string, freqs []float64, o Options) ([]complex128, error) {
	r, err := NewTransimpedance(c, in, out, o)
	if err != nil {
		return nil, err
	}
	res := make([]complex128, len(freqs))
	for k, f := range freqs {
		if res[k], err = r.At(f); err != nil {
			return nil, err
		}
	}
	return res, nil
}
