package ac

import (
	"math"

	"pare/graph"
	"pare/graph/device"
)

// The DC load of a detector diode: the resistance its rectified current
// returns through, from the diode's anode round to its cathode. The
// default diode model (device.DiodeRd) makes a conducting signal diode
// with such a load a peak detector whose input resistance is half of it.

// dcNet is the circuit as DC sees it: windings and closed contacts are
// shorts, capacitors and the diodes themselves are open, amplifying parts
// draw no current from this network, and the nets that return DC by role
// (ground, supply, heater, a bias supply with a voltage: dcReturn) are the
// one return, as they are one node for the solver: a rail is a stiff
// source. A bias line with no voltage of its own (an AGC line) returns no
// DC: its filter resistor loads the detector's audio, not its DC. A reduction that grounds a filter line (a bypassed AGC line)
// would put its resistor across the detector here, though the line's
// capacitor passes no DC: so the loads are taken once from the circuit as
// written (KeepDetectorLoads) and the reduced circuit keeps them.
type dcNet struct {
	c       *graph.Circuit // the circuit it was built from (loopLoad)
	uf      *graph.NamedSets
	node    map[string]int // representative net -> unknown; -1 the return
	n       int
	entries []Entry
	loads   map[[2]string]float64 // load's answers so far
	// The network factored once for every load asked of it: a whole set
	// has a detector per channel, and a factorization per detector made
	// keeping their loads quadratic in the set.
	fac    *realFactors
	facErr error
}

// leak is a conductance from every node to the return, far below any
// resistor's: it keeps a net that no resistor reaches solvable, and puts a
// diode without a DC path at an "infinite" load.
const (
	leak       = 1e-13 // S
	noLoadOhms = 1e11  // a load this high is no DC path at all
)

func newDCNet(c *graph.Circuit, conducting ...section) *dcNet {
	uf := &graph.NamedSets{}
	for _, n := range c.Nets {
		if dcReturn(n) {
			uf.Union(groundName, n.Name)
		}
	}
	var rs []struct {
		a, b string
		r    float64
	}
	addR := func(p *graph.Part, pa, pb string, r float64) {
		a, b := p.NetOf(pa), p.NetOf(pb)
		if !usable(a) || !usable(b) {
			return
		}
		if r == 0 {
			uf.Union(a, b)
			return
		}
		rs = append(rs, struct {
			a, b string
			r    float64
		}{a, b, r})
	}
	for _, p := range c.Parts {
		switch p.Kind {
		case graph.Resistor:
			addR(p, "1", "2", p.Value.Max)
		case graph.Pot:
			addR(p, "1", "w", p.Set*p.Value.Max)
			addR(p, "w", "2", (1-p.Set)*p.Value.Max)
		case graph.Inductor, graph.Transformer:
			if len(p.Windings) == 0 {
				joinPins(uf, p, "1", "2")
			}
			for _, w := range p.Windings {
				joinPins(uf, p, w.From, w.To)
			}
		case graph.Switch:
			if pos := int(p.Set); pos >= 1 && pos <= len(p.Closes) {
				for _, pr := range p.Closes[pos-1] {
					joinPins(uf, p, pr[0], pr[1])
				}
			}
		}
	}
	for _, sc := range conducting {
		joinPins(uf, sc.p, sc.a, sc.k)
	}
	d := &dcNet{c: c, uf: uf, node: map[string]int{}, loads: map[[2]string]float64{}}
	ground := uf.Find(groundName)
	id := func(net string) int {
		r := uf.Find(net)
		if r == ground {
			return -1
		}
		if i, ok := d.node[r]; ok {
			return i
		}
		d.node[r] = d.n
		d.n++
		return d.n - 1
	}
	for _, n := range c.Nets {
		if usable(n.Name) {
			id(n.Name)
		}
	}
	for _, r := range rs {
		d.stamp(id(r.a), id(r.b), 1/r.r)
	}
	for i := 0; i < d.n; i++ {
		d.entries = append(d.entries, Entry{i, i, leak})
	}
	d.node[ground] = -1
	return d
}

func (d *dcNet) stamp(a, b int, g float64) {
	if a >= 0 {
		d.entries = append(d.entries, Entry{a, a, g})
	}
	if b >= 0 {
		d.entries = append(d.entries, Entry{b, b, g})
	}
	if a >= 0 && b >= 0 {
		d.entries = append(d.entries, Entry{a, b, -g}, Entry{b, a, -g})
	}
}

// load is the DC resistance between two nets; +Inf when no DC path joins
// them, 0 when DC sees them as one node.
func (d *dcNet) load(a, b string) float64 {
	if !usable(a) || !usable(b) {
		return math.Inf(1)
	}
	na, oka := d.node[d.uf.Find(a)]
	nb, okb := d.node[d.uf.Find(b)]
	if !oka || !okb {
		return math.Inf(1)
	}
	if na == nb {
		return 0
	}
	k := [2]string{a, b}
	if r, ok := d.loads[k]; ok {
		return r
	}
	r := d.solveLoad(na, nb)
	d.loads[k] = r
	return r
}

// solveLoad is the DC resistance between unknowns na and nb (-1 the return).
func (d *dcNet) solveLoad(na, nb int) float64 {
	rhs := make([]float64, d.n)
	if na >= 0 {
		rhs[na] = 1
	}
	if nb >= 0 {
		rhs[nb] = -1
	}
	if d.fac == nil && d.facErr == nil {
		d.fac, d.facErr = factorReal(d.n, d.entries)
	}
	if d.facErr != nil {
		return math.Inf(1)
	}
	v, err := d.fac.solve(rhs)
	if err != nil {
		return math.Inf(1)
	}
	at := func(i int) float64 {
		if i < 0 {
			return 0
		}
		return v[i]
	}
	r := at(na) - at(nb)
	if r > noLoadOhms {
		return math.Inf(1)
	}
	return r
}

// detectorLoad is the DC load of one section of a detector diode: the one
// kept from the circuit as written (KeepDetectorLoads), else the one this
// circuit's DC paths give.
func (st *stamper) detectorLoad(p *graph.Part, anodes []string, a, cathode string) float64 {
	l, ok := st.c.DetectorLoads[p.Ref+"."+a]
	if !ok {
		if st.dc.net == nil {
			st.dc.net = newDCNet(st.c)
		}
		l = st.dc.net.sectionLoad(p, a, cathode)
	}
	return float64(sharing(p, anodes, a)) * l
}

// sharing counts the sections on anode a's net: they share its load, so
// each takes it as many times over.
func sharing(p *graph.Part, anodes []string, a string) int {
	shared := 0
	for _, b := range anodes {
		if p.NetOf(b) == p.NetOf(a) {
			shared++
		}
	}
	return shared
}

// dcReturn says whether a net is the DC return for a detector's current: a
// rail or heater supply (a stiff source), or a bias supply with a voltage
// of its own. A bias net without one (an AGC line) is held by its filter
// capacitor, which passes no DC: the detector's current returns only
// through the resistors that reach a real return from it.
func dcReturn(n *graph.Net) bool {
	switch n.Role {
	case graph.Ground, graph.Supply, graph.Heater:
		return true
	case graph.Bias:
		return n.Volts != 0
	}
	return false
}

// diodeSections names a diode's anodes and cathode as the stamper stamps
// them (a double diode valve has two anodes on one cathode).
func diodeSections(p *graph.Part) (anodes []string, cathode string) {
	switch {
	case p.Kind == graph.Diode:
		return []string{"a"}, "k"
	case p.Kind == graph.Valve && p.Type == "diode":
		return []string{"a"}, "k"
	case p.Kind == graph.Valve && p.Type == "double-diode":
		return []string{"a1", "a2"}, "k"
	}
	return nil, ""
}

// KeepDetectorLoads records on c the DC load of every diode section as c
// is wired (the circuit as written, before any reduction), so the reduced
// circuit's detectors keep it: grounding an AGC line for the signal puts
// its filter resistor across the detector for AC, not for DC (the line's
// capacitor passes no DC), and the detector's rd = Rdc/2 rests on the DC
// load (docs/devices.md).
func KeepDetectorLoads(c *graph.Circuit) {
	var d *dcNet
	loads := map[string]float64{}
	for _, p := range c.Parts {
		anodes, cathode := diodeSections(p)
		if len(anodes) == 0 || p.Type == "varicap" {
			continue
		}
		if d == nil {
			d = newDCNet(c)
		}
		for _, a := range anodes {
			loads[p.Ref+"."+a] = d.sectionLoad(p, a, cathode)
		}
	}
	c.DetectorLoads = loads
}

// DetectorLoad is the DC load on a diode's first anode in c (all the
// sections on that anode together): the one kept from the circuit as
// written, else computed on c; +Inf when none. The stage figures print it,
// so they show the load the solver's rd rests on.
func DetectorLoad(c *graph.Circuit, p *graph.Part) float64 {
	anodes, cathode := diodeSections(p)
	if len(anodes) == 0 {
		return math.Inf(1)
	}
	if l, ok := c.DetectorLoads[p.Ref+"."+anodes[0]]; ok {
		return l
	}
	return newDCNet(c).sectionLoad(p, anodes[0], cathode)
}

// withDetectorLoads is reduced with the detector loads of orig when it
// keeps none of its own (a caller that reduced without the pipeline): the
// reduced circuit's detectors are solved on the original wiring's DC
// loads, as the pipeline's are. orig is not changed.
func withDetectorLoads(orig, reduced *graph.Circuit) *graph.Circuit {
	if reduced.DetectorLoads != nil {
		return reduced
	}
	src := orig
	if src.DetectorLoads == nil {
		src = orig.Clone()
		KeepDetectorLoads(src)
	}
	if len(src.DetectorLoads) == 0 {
		return reduced
	}
	out := reduced.Clone()
	out.DetectorLoads = src.DetectorLoads
	return out
}

// KeptDetectorRd is the rd the solver gives diode p of c from the loads
// kept from the circuit as written, when every section takes the same one:
// written into a reduced netlist as the diode's own rd, the file solves as
// the reduced circuit does (loaded alone, it would take its detector load
// from its own, reduced, DC paths). ok is false for a diode with its own
// rd, without kept loads, or whose sections differ.
func KeptDetectorRd(c *graph.Circuit, p *graph.Part) (rd float64, ok bool) {
	if _, own := p.Param("rd"); own || c.DetectorLoads == nil {
		return 0, false
	}
	anodes, cathode := diodeSections(p)
	for i, a := range anodes {
		if InverseParallel(c, p, a, cathode) {
			return 0, false // a limiter's pair is open, never a detector
		}
		l, kept := c.DetectorLoads[p.Ref+"."+a]
		if !kept {
			return 0, false
		}
		r, _ := device.DiodeRd(p, float64(sharing(p, anodes, a))*l)
		if i > 0 && math.Abs(r-rd) > 1e-9*math.Abs(rd) {
			return 0, false
		}
		rd = r
	}
	return rd, rd > 0
}

// DetectorLoads is the DC load of every section of the diodes among ps as
// the solver takes it when it elaborates c (the stamper's detectorLoad):
// the load kept on c (KeepDetectorLoads), else the one c's DC paths give,
// keyed as Circuit.DetectorLoads is. A caller that solves a piece of c cut
// at AC ground gives the piece these loads, so its diodes take the rd they
// have in c, whose DC paths run on past the piece's edge through the
// rails; one DC network of c serves them all.
func DetectorLoads(c *graph.Circuit, ps []*graph.Part) map[string]float64 {
	out := map[string]float64{}
	var d *dcNet
	for _, p := range ps {
		anodes, cathode := diodeSections(p)
		if _, own := p.Param("rd"); own || len(anodes) == 0 || p.Type == "varicap" {
			continue
		}
		for _, a := range anodes {
			k := p.Ref + "." + a
			if l, ok := c.DetectorLoads[k]; ok {
				out[k] = l
				continue
			}
			if d == nil {
				d = newDCNet(c)
			}
			out[k] = d.sectionLoad(p, a, cathode)
		}
	}
	return out
}
