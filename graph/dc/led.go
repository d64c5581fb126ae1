package dc

import (
	"math"
	"regexp"

	"pare/graph"
)

// An indicator LED is often captured as a generic part ("LED, red", pins a
// and k) since it is no signal part; on a battery set it draws more than
// the transistors (review18 b01: 7 mA of a 9.4 mA drain in ngspice, pare
// read 2.5 mA with it left out), and on a mains set's low-voltage line it
// loads the rectifier. So a generic part whose label says LED, with an
// anode and a cathode pin, is a Shockley junction in the DC model with an
// LED's forward voltage and ideality (Defaults, class "LED"; vf and n on
// the part override them). Any other generic part stays out of the DC
// model, as before.

// ledWord finds an LED in a generic part's label.
var ledWord = regexp.MustCompile(`\bLED\b|(?i)light[- ]emitting diode`)

// addLED adds p as a junction when it is an LED with pins a and k.
func (m *model) addLED(p *graph.Part, o *origins) error {
	if !ledWord.MatchString(p.Label) || p.NetOf("a") == "" || p.NetOf("k") == "" {
		return nil
	}
	a, okA := m.term(p, "a")
	k, okK := m.term(p, "k")
	if !okA || !okK {
		return nil
	}
	n := o.given(p, "n", "LED", "")
	vf := o.given(p, "vf", "LED", "V")
	is := 1e-3 * math.Exp(-vf/(n*VT))
	o.derived(p.Ref, "is", is, "A", "Is = 1 mA·exp(−vf/(n·VT)) (Shockley), an indicator LED")
	m.devices = append(m.devices, device{ref: p.Ref, kind: devDiode, pins: []string{"a", "k"}, t: []term{a, k}, is: is, n: n, emission: 1})
	return nil
}
