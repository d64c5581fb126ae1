package dc

import (
	"pare/graph"
)

// Single faults of the fault dictionary (simulation before test: Bandler
// and Salama, "Fault diagnosis of analog circuits", Proc. IEEE 73(8), 1985).
// Each is a small change to the elaborated model, solved warm-started from
// the fault-free point. The sizes are the trade's: carbon resistors drift
// high (common practice), so "high" is twice the marked value; a leaky
// capacitor is taken as 10 MΩ, a short as 1 Ω; a valve low in emission as
// 40 % of its perveance (a valve tester's "replace" region, from memory).
type Fault struct {
	Ref  string `json:"ref"`
	Kind string `json:"kind"` // open, high, short, leaky, winding W open, low emission, emitter open, collector open, b-e short, c-e short
}

// Fault sizes.
const (
	highFactor   = 2
	leakyOhms    = 10e6
	shortOhms    = 1
	lowEmission  = 0.4
	faultOpenTag = " (open)"
)

func (f Fault) String() string { return f.Ref + " " + f.Kind }

// Faults lists the single faults of c in part order.
func (p *Point) Faults() []Fault {
	var out []Fault
	for _, part := range p.Circuit.Parts {
		out = append(out, faultsOf(part)...)
	}
	return out
}

func faultsOf(p *graph.Part) []Fault {
	f := func(kinds ...string) []Fault {
		var out []Fault
		for _, k := range kinds {
			out = append(out, Fault{p.Ref, k})
		}
		return out
	}
	switch p.Kind {
	case graph.Resistor, graph.Pot:
		return f("open", "high")
	case graph.Capacitor:
		if len(p.Pins) == 2 {
			return f("short", "leaky")
		}
	case graph.Inductor:
		if len(p.Windings) == 0 {
			return f("open")
		}
		fallthrough
	case graph.Transformer:
		var out []Fault
		for _, w := range p.Windings {
			out = append(out, Fault{p.Ref, "winding " + w.Name + " open"})
		}
		return out
	case graph.Valve:
		if p.IsActive() {
			return f("low emission")
		}
	case graph.BJT:
		return f("emitter open", "collector open", "b-e short", "c-e short")
	}
	return nil
}

// faulty returns a copy of m with f applied, the extra branches it adds and
// the warm start extended to any node it adds.
func (m *model) faulty(f Fault, start []float64) (*model, []branch, []float64) {
	c := *m
	c.branches = append([]branch(nil), m.branches...)
	c.devices = append([]device(nil), m.devices...)
	c.nodeNet = append([]string(nil), m.nodeNet...)
	c.floating = append([]bool(nil), m.floating...)
	start = append([]float64(nil), start...)
	var extra []branch
	part := m.circuit.Part(f.Ref)
	switch f.Kind {
	case "open", "high":
		for i := range c.branches {
			if c.branches[i].ref == f.Ref {
				if f.Kind == "open" {
					c.branches[i].g = 0
				} else {
					c.branches[i].g /= highFactor
				}
			}
		}
	case "short", "leaky":
		for _, cp := range m.caps {
			if cp.ref == f.Ref {
				r := float64(shortOhms)
				if f.Kind == "leaky" {
					r = leakyOhms
				}
				extra = append(extra, branch{ref: f.Ref, a: cp.a, b: cp.b, g: 1 / r})
			}
		}
	case "low emission":
		c.eachDevice(f.Ref, func(d *device) { d.emission = lowEmission })
	case "emitter open", "collector open":
		pin := map[string]int{"emitter open": 2, "collector open": 1}[f.Kind]
		c.eachDevice(f.Ref, func(d *device) {
			d.t = append([]term(nil), d.t...)
			old := m.voltOf(start, d.t[pin])
			d.t[pin] = len(c.nodeNet)
			c.nodeNet = append(c.nodeNet, f.Ref+"."+d.pins[pin]+faultOpenTag)
			c.floating = append(c.floating, false)
			start = append(start, old)
		})
	case "b-e short", "c-e short":
		a := map[string]string{"b-e short": "b", "c-e short": "c"}[f.Kind]
		ta, _ := m.term(part, a)
		te, _ := m.term(part, "e")
		extra = append(extra, branch{ref: f.Ref, a: ta, b: te, g: 1 / shortOhms})
	default: // winding W open
		for i := range c.branches {
			if b := c.branches[i]; b.ref == f.Ref && "winding "+b.what+" open" == f.Kind {
				c.branches[i].g = 0
			}
		}
	}
	return &c, extra, start
}

func (m *model) eachDevice(ref string, fn func(d *device)) {
	for i := range m.devices {
		if m.devices[i].ref == ref {
			fn(&m.devices[i])
		}
	}
}

// Simulate solves the circuit with fault f, warm-started from p. A fault
// that changes values only reuses one system (pattern, ordering and pivot
// order) for every fault: a small change to the factored system rather than
// a new analysis.
func (p *Point) Simulate(f Fault) (*Faulted, error) {
	fm, extra, start := p.m.faulty(f, p.v)
	s, err := p.systemFor(fm, extra)
	if err != nil {
		return nil, err
	}
	v, _, _, err := s.solve(start)
	if err != nil {
		return nil, err
	}
	return &Faulted{Fault: f, p: p, m: fm, extra: extra, v: v}, nil
}

// systemFor rebinds the shared fault system to fm, or builds a new one when
// the fault changes the topology.
func (p *Point) systemFor(fm *model, extra []branch) (*system, error) {
	if p.fsys != nil && p.fsys.rebind(fm, extra) {
		return p.fsys, nil
	}
	s, err := newSystem(fm, extra)
	if err != nil {
		return nil, err
	}
	if len(fm.nodeNet) == len(p.m.nodeNet) && p.fsys == nil {
		// Declare every capacitor and device pair once, so later faults rebind.
		p.fsys = s
	}
	return s, nil
}

// Faulted is a solved faulty circuit.
type Faulted struct {
	Fault Fault
	p     *Point
	m     *model
	extra []branch
	v     []float64
}

// Volts is the unloaded voltage of net in the faulty circuit.
func (fd *Faulted) Volts(net string) float64 {
	return fd.m.voltOf(fd.v, fd.m.netTerm[net])
}

// Reading is what meter mt shows on net in the faulty circuit.
func (fd *Faulted) Reading(net string, mt Meter) (float64, error) {
	t := fd.m.netTerm[net]
	v := fd.m.voltOf(fd.v, t)
	if t < 0 || mt.IsIdeal() {
		return v, nil
	}
	s, err := fd.p.systemFor(fd.m, fd.extra)
	if err != nil {
		return 0, err
	}
	return s.reading(fd.v, t, v, mt)
}
