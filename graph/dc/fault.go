package dc

import (
	"pare/graph"
)

// Single faults of the fault dictionary (simulation before test: Bandler
// and Salama, "Fault diagnosis of analog circuits", Proc. IEEE 73(8), 1985).
// Each is a small change to the elaborated model, solved warm-started from
// the fault-free point. The sizes are the trade's: carbon resistors drift
// high (common practice), so "high" is twice the marked value; a short is
// 1 Ω; a valve low in emission keeps 40 % of its perveance (a valve tester's
// "replace" region, from memory).
//
// A leaky capacitor is tried at three levels, each its own entry: 10 MΩ (a
// paper coupling capacitor just starting to leak, enough to pull a grid
// positive behind a 1 MΩ leak), 100 kΩ (a bad paper or electrolytic
// coupling capacitor) and 1 kΩ (an electrolytic or ceramic decoupler
// breaking down) (common practice). Two decades apart, they put any leak
// within a factor of ten of one entry, and the misfit of the readings is
// smooth in the logarithm of the leak, so a leak between two levels ranks
// its capacitor first at the nearer one. A fitted leak (an iterative solve
// per capacitor and ranking) would fit some value to every capacitor and so
// blur the ranking it is meant to sharpen; the dictionary stays a fixed
// list, simulated before the test.
type Fault struct {
	Ref  string `json:"ref"`
	Kind string `json:"kind"` // open, high, short, leaky 10M, leaky 100k, leaky 1k, winding W open, low emission, emitter open, collector open, b-e short, c-e short
}

// Fault sizes.
const (
	highFactor   = 2
	shortOhms    = 1
	lowEmission  = 0.4
	faultOpenTag = " (open)"
)

// leakLevels are the leaky-capacitor entries, in the IEC 60062 code their
// kind names carry.
var leakLevels = []struct {
	kind string
	ohms float64
}{{"leaky 10M", 10e6}, {"leaky 100k", 100e3}, {"leaky 1k", 1e3}}

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
			out := f("short")
			for _, l := range leakLevels {
				out = append(out, Fault{p.Ref, l.kind})
			}
			return out
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
	case graph.Diode:
		return f("open", "short")
	case graph.Valve:
		if p.IsActive() {
			return f("low emission")
		}
		return f("open", "short") // a valve diode: no emission, or a cathode–anode short
	case graph.BJT:
		return f("emitter open", "collector open", "b-e short", "c-e short")
	}
	return nil
}

// faultEdit is a model being changed into a faulty one.
type faultEdit struct {
	m, c  *model
	extra []branch
	start []float64
}

// faulty returns a copy of m with f applied, the extra branches it adds and
// the warm start extended to any node it adds.
func (m *model) faulty(f Fault, start []float64) (*model, []branch, []float64) {
	c := m.clone()
	e := &faultEdit{m: m, c: c, start: append([]float64(nil), start...)}
	switch f.Kind {
	case "open", "high":
		e.resistor(f)
	case "short", "leaky 10M", "leaky 100k", "leaky 1k":
		e.capacitor(f)
	case "low emission":
		e.c.eachDevice(f.Ref, func(d *device) { d.emission = lowEmission })
	case "emitter open", "collector open":
		e.openLead(f)
	case "b-e short", "c-e short":
		a := map[string]string{"b-e short": "b", "c-e short": "c"}[f.Kind]
		part := m.circuit.Part(f.Ref)
		ta, _ := m.term(part, a)
		te, _ := m.term(part, "e")
		e.extra = append(e.extra, branch{ref: f.Ref, a: ta, b: te, g: 1 / shortOhms})
	default: // winding W open
		for i := range c.branches {
			if b := c.branches[i]; b.ref == f.Ref && "winding "+b.what+" open" == f.Kind {
				c.branches[i].g = 0
			}
		}
	}
	e.rectifierFault(f)
	e.collapseRails()
	return c, e.extra, e.start
}

// clone copies what a fault or a cut-off changes.
func (m *model) clone() *model {
	c := *m
	c.branches = append([]branch(nil), m.branches...)
	c.devices = append([]device(nil), m.devices...)
	c.nodeNet = append([]string(nil), m.nodeNet...)
	c.floating = append([]bool(nil), m.floating...)
	c.fixedV = append([]float64(nil), m.fixedV...)
	c.rects = append([]rectifier(nil), m.rects...)
	c.estimates = append([]Estimate(nil), m.estimates...)
	return &c
}

// resistor opens a resistor, a diode (no current either way) or a valve
// diode (no emission), or doubles a resistor's value.
func (e *faultEdit) resistor(f Fault) {
	// an open zener loses its breakdown with its junction
	e.c.eachDevice(f.Ref, func(d *device) { d.emission, d.is, d.breaks = 0, 0, false })
	for i := range e.c.branches {
		if e.c.branches[i].ref == f.Ref {
			if f.Kind == "open" {
				e.c.branches[i].g = 0
			} else {
				e.c.branches[i].g /= highFactor
			}
		}
	}
}

// capacitor shorts or leaks a capacitor, or shorts a diode from anode to
// cathode.
func (e *faultEdit) capacitor(f Fault) {
	r := float64(shortOhms)
	for _, l := range leakLevels {
		if l.kind == f.Kind {
			r = l.ohms
		}
	}
	for _, cp := range e.m.caps {
		if cp.ref == f.Ref {
			e.extra = append(e.extra, branch{ref: f.Ref, a: cp.a, b: cp.b, g: 1 / r})
		}
	}
	for _, d := range e.m.devices {
		if d.ref == f.Ref && (d.kind == devDiode || d.kind == devValveDiode) {
			e.extra = append(e.extra, branch{ref: f.Ref, a: d.t[0], b: d.t[1], g: 1 / r})
		}
	}
}

// openLead disconnects a transistor's emitter or collector: the lead moves
// to a node of its own.
func (e *faultEdit) openLead(f Fault) {
	pin := map[string]int{"emitter open": 2, "collector open": 1}[f.Kind]
	c := e.c
	c.eachDevice(f.Ref, func(d *device) {
		d.t = append([]term(nil), d.t...)
		old := e.m.voltOf(e.start, d.t[pin])
		d.t[pin] = len(c.nodeNet)
		c.nodeNet = append(c.nodeNet, f.Ref+"."+d.pins[pin]+faultOpenTag)
		c.floating = append(c.floating, false)
		e.start = append(e.start, old)
	})
}

// collapseRails: a short straight across a declared rail (both ends held)
// would have to pass any current the supply can give; no battery or
// supply holds its voltage into 1 Ω (the fuse blows, the battery's
// internal resistance takes it all: common practice), so the rail reads 0
// V, and every reading on the set with it. A leak across a declared rail
// only draws current the supply gives: the rail holds, and the fault
// shows nowhere but in the supply current.
func (e *faultEdit) collapseRails() {
	for _, b := range e.extra {
		if b.a >= 0 || b.b >= 0 || b.g < 1/float64(shortOhms)/2 {
			continue
		}
		for _, t := range []term{b.a, b.b} {
			if !e.c.isEstimated(t) {
				e.c.fixedV[-1-t] = 0
			}
		}
	}
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
	v, err := p.solveFaultRails(s, fm, extra, start)
	if err != nil {
		return nil, err
	}
	return &Faulted{Fault: f, p: p, m: fm, extra: extra, v: v}, nil
}

// CutOff is the same circuit (faulty or not) with the channel current of
// every valve and FET in refs cut off, as it reads when an oscillator's
// rectified bias drives it to cut-off: the far end of the range a running
// oscillator moves its anode or drain and its cathode or source over.
func (fd *Faulted) CutOff(refs []string) (*Faulted, error) {
	cm := fd.m.clone()
	for _, ref := range refs {
		cm.eachDevice(ref, func(d *device) {
			d.emission = 0
			d.fet.beta = 0
		})
	}
	s, err := fd.p.systemFor(cm, fd.extra)
	if err != nil {
		return nil, err
	}
	v, err := fd.p.solveFaultRails(s, cm, fd.extra, fd.v)
	if err != nil {
		return nil, err
	}
	return &Faulted{Fault: fd.Fault, p: fd.p, m: cm, extra: fd.extra, v: v}, nil
}

// healthy is the fault-free circuit as a Faulted, for CutOff.
func (p *Point) healthy() *Faulted {
	return &Faulted{p: p, m: p.m.clone(), v: p.v}
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
	// read keeps each loaded reading: a meter's load is a nonlinear solve,
	// and Rank asks every candidate for every reading, so ranking several
	// sets of readings taken with the same meter solves each reading once.
	read map[faultRead]readResult
}

type faultRead struct {
	net string
	mt  Meter
}

type readResult struct {
	v   float64
	err error
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
	k := faultRead{net, mt}
	if r, ok := fd.read[k]; ok {
		return r.v, r.err
	}
	s, err := fd.p.systemFor(fd.m, fd.extra)
	if err != nil {
		return 0, err
	}
	r, err := s.reading(fd.v, t, v, mt)
	if fd.read == nil {
		fd.read = map[faultRead]readResult{}
	}
	fd.read[k] = readResult{r, err}
	return r, err
}
