// Package dc computes the DC operating point of a whole (unreduced) circuit
// with nonlinear device laws: valves by the three-halves-power law, diodes by
// Shockley's law, bipolar transistors by Ebers–Moll, JFETs and MOSFETs by the square law,
// windings as their DC resistance and capacitors open (laws.go gives each law
// and default with its source). Rails are held at their declared volts.
//
// The operating point is found by damped Newton–Raphson on the sparse solver
// of graph/ac, with source stepping and gmin stepping when plain Newton does
// not settle (solve.go). Faults are simulated as small changes to the same
// system, warm-started from the fault-free solution (fault.go).
package dc

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/figure"
)

// Point is a solved operating point.
type Point struct {
	Circuit *graph.Circuit
	Nets    []NetV   // every net, sorted by name
	Parts   []PartDC // every part that carries DC current, sorted by ref
	Origins []Origin // where each law parameter came from
	Method  string   // "Newton", "source stepping" or "gmin stepping"
	Iter    int
	Notes   []string // rails without volts and the like
	// Estimates are the rails estimated from a captured rectifier and
	// reservoir (rectifier.go), sorted by net.
	Estimates []Estimate

	m    *model
	v    []float64           // free node voltages
	sys  *system             // the healthy system, for meter readings
	fsys *system             // one system shared by the faults that keep the topology
	sims map[Fault]simulated // each fault's solve, kept for the next Rank (simulated)
	osc  *[]Oscillator       // found on first use (oscillator.go)
}

// NetV is the DC voltage of one net.
type NetV struct {
	Name     string  `json:"name"`
	Volts    float64 `json:"volts"`
	Fixed    bool    `json:"fixed,omitempty"`    // held by declaration: chassis, rail, heater
	Floating bool    `json:"floating,omitempty"` // no DC path on this sheet: set elsewhere
	// AC marks an end of an estimated rectifier's winding: on the bench it
	// carries the secondary's AC, and its DC value here is only what the
	// reverse-biased junctions' leakage leaves (not a test point).
	AC bool `json:"ac,omitempty"`
}

// Solve finds the operating point of c.
func Solve(c *graph.Circuit) (*Point, error) {
	m, err := build(c)
	if err != nil {
		return nil, err
	}
	v, method, iter, err := m.solveRails()
	if err != nil {
		return nil, err
	}
	pt := &Point{Circuit: c, Origins: m.origins, Method: method, Iter: iter, Notes: m.warnings, m: m, v: v}
	pt.Estimates = append([]Estimate(nil), m.estimates...)
	sort.Slice(pt.Estimates, func(i, j int) bool { return pt.Estimates[i].Net < pt.Estimates[j].Net })
	pt.fill()
	pt.noteUnheldRails()
	pt.noteZeners()
	return pt, nil
}

// noteUnheldRails: a supply net that declares no volts is solved as an
// ordinary net. Fed from a rail through a choke, resistor or winding (the
// HT after the smoothing choke) that is what it is, and the chart lists it
// among the supply test points with what feeds it; only a rail nothing
// feeds so gets a note, since its volts then rest on whatever else
// reaches it.
func (p *Point) noteUnheldRails() {
	fed := map[string]bool{}
	for _, sp := range p.supplyWalk() {
		fed[sp.Net] = true
	}
	for _, name := range p.m.unheld {
		if !fed[name] {
			p.Notes = append(p.Notes, fmt.Sprintf("rail %s declares no volts and no rail feeds it through a resistor, choke or winding: it is solved as an ordinary net", name))
		}
	}
	p.noteOpenBiasLines()
}

// diodeFed says whether a diode on this sheet feeds net: one reached from
// it through resistors and windings, short of the rails and chassis (an AGC
// line filtered from the detector's load here, exported at a port).
func (p *Point) diodeFed(net string) bool {
	seen := map[string]bool{net: true}
	queue := []string{net}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		for _, k := range p.Circuit.ConnsOf(n) {
			q := k.Part
			if q == nil {
				continue
			}
			if q.Kind == graph.Diode || q.Kind == graph.Valve && strings.Contains(q.Type, "diode") {
				return true
			}
			if q.Kind != graph.Resistor && q.Kind != graph.Inductor && q.Kind != graph.Transformer {
				continue
			}
			for _, pn := range q.Pins {
				if r := p.Circuit.RoleOf(pn.Net); !seen[pn.Net] && r != graph.Supply && r != graph.Ground {
					seen[pn.Net] = true
					queue = append(queue, pn.Net)
				}
			}
		}
	}
	return false
}

// noteOpenBiasLines: a bias line that declares no volts and comes in at a
// port (an AGC line from a detector off this sheet) is solved drawing no
// current, at whatever its own resistors give; the readings of the devices
// it biases rest on that, and a set's line sits where its source holds it
// (an AGC line near 0 V with no signal: common practice). Said plainly, so
// that the chart is not read as the set's: a blind reviewer's RF stage read
// 714 µA of collector current where ngspice, with the line at 0 V, gives
// 519 µA, and nothing said why.
func (p *Point) noteOpenBiasLines() {
	for _, n := range p.Circuit.Nets {
		if n.Role != graph.Bias || n.HasVolts() {
			continue
		}
		var port string
		for _, k := range p.Circuit.ConnsOf(n.Name) {
			if k.Part != nil && k.Part.Kind == graph.Port {
				port = k.Part.Ref
			}
		}
		v, ok := p.Volts(n.Name)
		if port == "" || !ok || p.diodeFed(n.Name) {
			continue
		}
		p.Notes = append(p.Notes, fmt.Sprintf("bias line %s declares no volts and comes in at %s from off this sheet: it is solved drawing no current (%s here), and the readings of what it biases rest on that; give the line's no-signal volts (volts = ...) to hold it where its source does",
			n.Name, port, figure.Format(v, figure.Volt, figure.Text)))
	}
}

// solve runs the strategies in turn. start, when given, is a warm start (a
// fault simulated from the fault-free point); extra are added branches.
func (m *model) solve(start []float64, extra []branch) ([]float64, string, int, error) {
	s, err := newSystem(m, extra)
	if err != nil {
		return nil, "", 0, err
	}
	return s.solve(start)
}

// solve runs the strategies on s.
func (s *system) solve(start []float64) ([]float64, string, int, error) {
	m := s.m
	v := make([]float64, s.n)
	if start != nil {
		copy(v, start)
	}
	if ok, err := s.newton(v, maxIter); err == nil && ok {
		return v, "Newton", 1, nil
	}
	// Source stepping: ramp every rail from a tenth up, each step warm-started.
	for i := range v {
		v[i] = 0
	}
	settled := true
	for k := 1; k <= 20 && settled; k++ {
		s.scale = float64(k) / 20
		ok, err := s.newton(v, maxIter)
		settled = ok && err == nil
	}
	s.scale = 1
	if settled {
		return v, "source stepping", 20, nil
	}
	// Gmin stepping: start with every net tied to chassis by 10 mS, divide by 10.
	for i := range v {
		v[i] = 0
	}
	settled = true
	for g := 1e-2; g >= m.gmin && settled; g /= 10 {
		s.gmin = g
		ok, err := s.newton(v, maxIter)
		settled = ok && err == nil
	}
	s.gmin = m.gmin
	if settled {
		if ok, err := s.newton(v, maxIter); ok && err == nil {
			return v, "gmin stepping", 11, nil
		}
	}
	return nil, "", 0, &NoConvergence{File: m.circuit.File, Nets: s.unsettled()}
}

// IsNoConvergence reports whether err is a failure to settle.
func IsNoConvergence(err error) bool {
	var nc *NoConvergence
	return errors.As(err, &nc)
}

// Volts returns the voltage of a net and whether the net exists.
func (p *Point) Volts(net string) (float64, bool) {
	t, ok := p.m.netTerm[net]
	if !ok {
		return 0, false
	}
	return p.m.voltOf(p.v, t), true
}

func (m *model) voltOf(v []float64, t term) float64 {
	if t >= 0 {
		return v[t]
	}
	return m.fixedV[-1-t]
}

func (p *Point) fill() {
	for _, n := range p.Circuit.Nets {
		t := p.m.netTerm[n.Name]
		nv := NetV{Name: n.Name, Volts: clean(p.m.voltOf(p.v, t)), Fixed: t < 0, AC: p.m.isWindingEnd(n.Name)}
		if t >= 0 {
			nv.Floating = p.m.floating[t]
		}
		p.Nets = append(p.Nets, nv)
	}
	p.Parts = partCurrents(p.m, p.v)
}

// clean turns −0 and sub-nanovolt dust into 0, so charts never print "-0.0".
func clean(x float64) float64 {
	if math.Abs(x) < 1e-9 {
		return 0
	}
	return x
}
