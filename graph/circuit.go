// Package graph holds pare's circuit model: parts with named terminals on
// named nets, the frequencies of interest, and where every piece was written
// in its netlist file. It loads and writes the TOML netlist format
// (docs/netlist.md), checks it for transcription mistakes, and offers a
// part–net graph view built on gonum for algorithms. It never knows how a
// circuit is reduced or drawn.
package graph

import (
	"sort"

	"pare/graph/value"
)

// Kind is a part's broad class. The names are the ones used in JSON output
// and messages; the netlist chooses a kind by the part's value key (r, c, l…).
type Kind string

// Part kinds.
const (
	Resistor    Kind = "resistor"
	Capacitor   Kind = "capacitor"
	Inductor    Kind = "inductor"
	Transformer Kind = "transformer" // coupled windings, IF transformers, output transformers
	Valve       Kind = "valve"
	BJT         Kind = "bjt"
	FET         Kind = "fet"
	Diode       Kind = "diode"
	Crystal     Kind = "crystal"
	Pot         Kind = "pot"
	Switch      Kind = "switch"
	Port        Kind = "port"
	Generic     Kind = "part" // anything else on a diagram: lamp, fuse, meter, plug
)

// Capacitor types (Part.Type for Kind Capacitor).
const (
	CapFixed        = "fixed"
	CapElectrolytic = "electrolytic"
	CapVariable     = "variable" // a tuning gang section: Value is min..max
	CapTrimmer      = "trimmer"  // preset: Value is min..max, Set is where it is set
)

// Inductor types (Part.Type for Kind Inductor).
const (
	IndPlain = "plain"
	IndChoke = "choke" // RF choke: meant to be open at signal frequency
)

// Active device active types (Part.Type) are listed in terminals.go.

// Role says what a net is for. Most nets are signal nets; the others carry
// supply or reference potentials that are AC ground for the small signal.
type Role string

// Net roles.
const (
	Signal Role = "signal"
	Ground Role = "ground" // chassis / 0 V
	Supply Role = "supply" // HT, B+, Vcc: Net.Volts holds the DC voltage
	Heater Role = "heater" // heater chain or heater winding
	Bias   Role = "bias"   // a fixed bias supply (negative grid bias, AGC reference)
	PortN  Role = "port"   // a connection to the rest of the set, cut away from this sheet
)

// IsACGround reports whether a net of this role sits at AC ground by
// declaration: rails and heater supplies are assumed stiff (well decoupled)
// for the signal, which is the assumption every hand reduction makes.
func (r Role) IsACGround() bool {
	return r == Ground || r == Supply || r == Heater || r == Bias
}

// Circuit is a netlist: parts, nets and the frequencies the circuit works at.
// Parts and Nets are kept sorted (by Ref and Name) so that every walk over a
// circuit is deterministic.
type Circuit struct {
	File    string             `json:"-"`
	Title   string             `json:"title,omitempty"`
	Note    string             `json:"note,omitempty"`
	Band    value.Range        `json:"band"`            // default band of interest, Hz
	Freqs   map[string]float64 `json:"freqs,omitempty"` // named frequencies, e.g. "if": 470e3
	Regions []*Region          `json:"regions,omitempty"`
	Inputs  []string           `json:"inputs,omitempty"`  // signal input nets
	Outputs []string           `json:"outputs,omitempty"` // signal output nets
	Nets    []*Net             `json:"nets"`
	Parts   []*Part            `json:"parts"`

	// Comments written above top-level keys, kept so `pare fmt` does not throw
	// away what the user typed. Keyed by key path ("title", "parts.R1", ...).
	Comments map[string]Comment `json:"-"`

	partIndex map[string]*Part
	netIndex  map[string]*Net
}

// Comment holds the comment lines above a key and the comment after it on its line.
type Comment struct {
	Above []string // without the leading '#'
	After string
}

// Region is a part of the set that works in its own band: the IF strip around
// the IF, the audio stages over 20 Hz–20 kHz. A part belongs to the region that
// names it, or else to a region that names one of its nets.
type Region struct {
	Name   string      `json:"name"`
	Band   value.Range `json:"band"`
	Parts  []string    `json:"parts,omitempty"`
	Nets   []string    `json:"nets,omitempty"`
	Input  string      `json:"input,omitempty"`
	Output string      `json:"output,omitempty"`
	Pos    Pos         `json:"-"`
}

// Net is a node of the circuit. Nets come into being by being named in a pin
// list; a [nets] entry only adds a role, a voltage or a label.
type Net struct {
	Name  string  `json:"name"`
	Role  Role    `json:"role"`
	Volts float64 `json:"volts,omitempty"` // DC voltage of a supply or bias net
	Label string  `json:"label,omitempty"` // text for the drawing, e.g. "HT +250 V"
	Pos   Pos     `json:"-"`               // where it was declared or first used
}

// Pin is one terminal of a part and the net it is on.
type Pin struct {
	Name string `json:"name"`
	Net  string `json:"net"`
	Pos  Pos    `json:"-"`
}

// Winding is one coil of an inductor or transformer, between two of the part's
// pins. A tapped coil is two windings meeting at the tap pin.
type Winding struct {
	Name string  `json:"name"`
	L    float64 `json:"l"`
	From string  `json:"from"` // pin names
	To   string  `json:"to"`
	Q    float64 `json:"q,omitempty"` // unloaded Q, 0 = lossless
}

// Coupling is the coupling factor k between two windings (M = k·√(La·Lb)).
type Coupling struct {
	A string  `json:"a"`
	B string  `json:"b"`
	K float64 `json:"k"`
}

// Part is one component. Value holds the main value in SI units: ohms,
// farads, henries, or a crystal's series frequency; a variable or trimmer
// capacitor has a span, everything else Min == Max.
type Part struct {
	Ref   string      `json:"ref"`
	Kind  Kind        `json:"kind"`
	Type  string      `json:"type,omitempty"` // sub-type: "trimmer", "triode", "npn", "njfet", ...
	Value value.Range `json:"value"`
	// Set is a trimmer's setting (farads), a pot's wiper fraction (0..1) or a
	// switch's selected position (1-based). 0 means unset.
	Set      float64            `json:"set,omitempty"`
	Pins     []Pin              `json:"pins"`
	Windings []Winding          `json:"windings,omitempty"`
	Coupling []Coupling         `json:"coupling,omitempty"`
	Closes   [][][2]string      `json:"closes,omitempty"` // switch: per position, the pin pairs closed
	Tol      value.Tolerance    `json:"tol"`
	Rating   float64            `json:"rating,omitempty"` // voltage rating
	Gang     string             `json:"gang,omitempty"`   // ganged tuning group
	Envelope string             `json:"envelope,omitempty"`
	Keep     bool               `json:"keep,omitempty"`
	Note     string             `json:"note,omitempty"`
	Label    string             `json:"label,omitempty"` // port text ("from RF stage") or generic part description
	Params   map[string]float64 `json:"params,omitempty"`
	// From names the original parts this part stands for after a reduction
	// (sorted). Empty means the part stands for itself.
	From []string `json:"from,omitempty"`
	Pos  Pos      `json:"-"`
}

// Origins returns the original refs a part stands for: From, or its own Ref.
func (p *Part) Origins() []string {
	if len(p.From) > 0 {
		return p.From
	}
	return []string{p.Ref}
}

// Pin returns the pin with the given terminal name, or nil.
func (p *Part) Pin(name string) *Pin {
	for i := range p.Pins {
		if p.Pins[i].Name == name {
			return &p.Pins[i]
		}
	}
	return nil
}

// NetOf returns the net on terminal name, or "" if the part has no such pin.
func (p *Part) NetOf(name string) string {
	if pin := p.Pin(name); pin != nil {
		return pin.Net
	}
	return ""
}

// IsTwoTerminal reports whether the part is a plain two-terminal element.
func (p *Part) IsTwoTerminal() bool {
	switch p.Kind {
	case Resistor, Capacitor, Crystal, Diode:
		return len(p.Pins) == 2
	case Inductor:
		return len(p.Pins) == 2 && len(p.Windings) <= 1
	}
	return false
}

// Param returns a device parameter and whether it was given.
func (p *Part) Param(name string) (float64, bool) {
	v, ok := p.Params[name]
	return v, ok
}

// Inductance is the total inductance of an inductor between its outer pins,
// L1 + L2 + 2M for a tapped coil (windings aiding).
func (p *Part) Inductance() float64 {
	if len(p.Windings) == 0 {
		return p.Value.Max
	}
	total := 0.0
	for _, w := range p.Windings {
		total += w.L
	}
	for _, c := range p.Coupling {
		a, b := p.Winding(c.A), p.Winding(c.B)
		if a != nil && b != nil {
			total += 2 * c.K * sqrt(a.L*b.L)
		}
	}
	return total
}

// Winding returns the winding with the given name, or nil.
func (p *Part) Winding(name string) *Winding {
	for i := range p.Windings {
		if p.Windings[i].Name == name {
			return &p.Windings[i]
		}
	}
	return nil
}

// K returns the coupling factor between two windings (either order), 0 if none.
func (p *Part) K(a, b string) float64 {
	for _, c := range p.Coupling {
		if (c.A == a && c.B == b) || (c.A == b && c.B == a) {
			return c.K
		}
	}
	return 0
}

// Capacitance is the capacitance a capacitor presents at a setting of a
// variable section (frac 0 = minimum, 1 = maximum); a trimmer gives its set
// value, a fixed capacitor its value.
func (p *Part) Capacitance(frac float64) float64 {
	switch {
	case p.Type == CapTrimmer && p.Set > 0:
		return p.Set
	case p.Value.IsSpan():
		return p.Value.At(frac)
	}
	return p.Value.Max
}

// Part returns the part with the given ref, or nil.
func (c *Circuit) Part(ref string) *Part {
	c.index()
	return c.partIndex[ref]
}

// Net returns the net with the given name, or nil.
func (c *Circuit) Net(name string) *Net {
	c.index()
	return c.netIndex[name]
}

// RoleOf returns the role of a net; unknown nets are signal nets.
func (c *Circuit) RoleOf(name string) Role {
	if n := c.Net(name); n != nil {
		return n.Role
	}
	return Signal
}

func (c *Circuit) index() {
	if c.partIndex != nil && len(c.partIndex) == len(c.Parts) && len(c.netIndex) == len(c.Nets) {
		return
	}
	c.partIndex = make(map[string]*Part, len(c.Parts))
	for _, p := range c.Parts {
		c.partIndex[p.Ref] = p
	}
	c.netIndex = make(map[string]*Net, len(c.Nets))
	for _, n := range c.Nets {
		c.netIndex[n.Name] = n
	}
}

// Touch records that the circuit's parts or nets were changed in place by a
// caller that edits slices directly; the lookup index is rebuilt on next use.
func (c *Circuit) Touch() {
	c.partIndex, c.netIndex = nil, nil
}

// Conn is one terminal of a part as seen from a net.
type Conn struct {
	Part *Part
	Pin  string
}

// ConnsOf lists the terminals on a net in part-ref, then pin order.
func (c *Circuit) ConnsOf(net string) []Conn {
	var out []Conn
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			if pin.Net == net {
				out = append(out, Conn{p, pin.Name})
			}
		}
	}
	return out
}

// Conns maps every net to its terminals, built in one pass for rules that ask
// about many nets at once.
func (c *Circuit) Conns() map[string][]Conn {
	out := make(map[string][]Conn, len(c.Nets))
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			out[pin.Net] = append(out[pin.Net], Conn{p, pin.Name})
		}
	}
	return out
}

// AddPart inserts a part, keeping Parts sorted, and creates any net its pins
// name that does not exist yet.
func (c *Circuit) AddPart(p *Part) {
	i := sort.Search(len(c.Parts), func(i int) bool { return c.Parts[i].Ref >= p.Ref })
	c.Parts = append(c.Parts, nil)
	copy(c.Parts[i+1:], c.Parts[i:])
	c.Parts[i] = p
	for _, pin := range p.Pins {
		c.EnsureNet(pin.Net, pin.Pos)
	}
	c.Touch()
}

// RemovePart deletes a part by ref; it reports whether the part was there.
// Nets it leaves empty stay until PruneNets.
func (c *Circuit) RemovePart(ref string) bool {
	for i, p := range c.Parts {
		if p.Ref == ref {
			c.Parts = append(c.Parts[:i], c.Parts[i+1:]...)
			c.Touch()
			return true
		}
	}
	return false
}

// EnsureNet returns the net with the given name, creating a signal net (or a
// ground net for the conventional ground names) when it does not exist.
func (c *Circuit) EnsureNet(name string, pos Pos) *Net {
	if n := c.Net(name); n != nil {
		return n
	}
	n := &Net{Name: name, Role: DefaultRole(name), Pos: pos}
	i := sort.Search(len(c.Nets), func(i int) bool { return c.Nets[i].Name >= name })
	c.Nets = append(c.Nets, nil)
	copy(c.Nets[i+1:], c.Nets[i:])
	c.Nets[i] = n
	c.Touch()
	return n
}

// DefaultRole is the role of a net nobody declared: "gnd", "0" and "chassis"
// are ground, anything else a signal net.
func DefaultRole(name string) Role {
	switch name {
	case "gnd", "0", "chassis", "ground":
		return Ground
	}
	return Signal
}

// JoinNets moves every terminal on net gone onto net keep and deletes gone.
// The kept net takes the stronger role (ground over rails over signal), so a
// signal net shorted to ground by a reduction becomes ground.
func (c *Circuit) JoinNets(keep, gone string) {
	if keep == gone {
		return
	}
	k := c.EnsureNet(keep, Pos{})
	if g := c.Net(gone); g != nil {
		if roleRank(g.Role) > roleRank(k.Role) {
			k.Role, k.Volts = g.Role, g.Volts
			if k.Label == "" {
				k.Label = g.Label
			}
		}
	}
	for _, p := range c.Parts {
		for i := range p.Pins {
			if p.Pins[i].Net == gone {
				p.Pins[i].Net = keep
			}
		}
	}
	for i, name := range c.Inputs {
		if name == gone {
			c.Inputs[i] = keep
		}
	}
	for i, name := range c.Outputs {
		if name == gone {
			c.Outputs[i] = keep
		}
	}
	for _, r := range c.Regions {
		if r.Input == gone {
			r.Input = keep
		}
		if r.Output == gone {
			r.Output = keep
		}
		for i, name := range r.Nets {
			if name == gone {
				r.Nets[i] = keep
			}
		}
	}
	c.removeNet(gone)
}

func roleRank(r Role) int {
	switch r {
	case Ground:
		return 5
	case Supply:
		return 4
	case Bias:
		return 3
	case Heater:
		return 2
	case PortN:
		return 1
	}
	return 0
}

func (c *Circuit) removeNet(name string) {
	for i, n := range c.Nets {
		if n.Name == name {
			c.Nets = append(c.Nets[:i], c.Nets[i+1:]...)
			c.Touch()
			return
		}
	}
}

// PruneNets deletes nets that no terminal uses and that are not declared
// signal inputs or outputs; it returns their names, sorted.
func (c *Circuit) PruneNets() []string {
	used := map[string]bool{}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			used[pin.Net] = true
		}
	}
	for _, n := range c.Inputs {
		used[n] = true
	}
	for _, n := range c.Outputs {
		used[n] = true
	}
	var gone []string
	kept := c.Nets[:0]
	for _, n := range c.Nets {
		if used[n.Name] {
			kept = append(kept, n)
		} else {
			gone = append(gone, n.Name)
		}
	}
	c.Nets = kept
	c.Touch()
	return gone
}

// Sort restores the sorted order of Parts and Nets after direct edits.
func (c *Circuit) Sort() {
	sort.Slice(c.Parts, func(i, j int) bool { return c.Parts[i].Ref < c.Parts[j].Ref })
	sort.Slice(c.Nets, func(i, j int) bool { return c.Nets[i].Name < c.Nets[j].Name })
	sort.Slice(c.Regions, func(i, j int) bool { return c.Regions[i].Name < c.Regions[j].Name })
	c.Touch()
}

// Clone returns a deep copy that shares nothing with c, for reductions that
// must leave the loaded circuit as it was.
func (c *Circuit) Clone() *Circuit {
	d := *c
	d.partIndex, d.netIndex = nil, nil
	d.Freqs = make(map[string]float64, len(c.Freqs))
	for k, v := range c.Freqs {
		d.Freqs[k] = v
	}
	d.Inputs = append([]string(nil), c.Inputs...)
	d.Outputs = append([]string(nil), c.Outputs...)
	d.Regions = make([]*Region, len(c.Regions))
	for i, r := range c.Regions {
		rr := *r
		rr.Parts = append([]string(nil), r.Parts...)
		rr.Nets = append([]string(nil), r.Nets...)
		d.Regions[i] = &rr
	}
	d.Nets = make([]*Net, len(c.Nets))
	for i, n := range c.Nets {
		nn := *n
		d.Nets[i] = &nn
	}
	d.Parts = make([]*Part, len(c.Parts))
	for i, p := range c.Parts {
		d.Parts[i] = p.Clone()
	}
	if c.Comments != nil {
		d.Comments = make(map[string]Comment, len(c.Comments))
		for k, v := range c.Comments {
			d.Comments[k] = v
		}
	}
	return &d
}

// Clone returns a deep copy of the part.
func (p *Part) Clone() *Part {
	q := *p
	q.Pins = append([]Pin(nil), p.Pins...)
	q.Windings = append([]Winding(nil), p.Windings...)
	q.Coupling = append([]Coupling(nil), p.Coupling...)
	q.From = append([]string(nil), p.From...)
	if p.Closes != nil {
		q.Closes = make([][][2]string, len(p.Closes))
		for i, pos := range p.Closes {
			q.Closes[i] = append([][2]string(nil), pos...)
		}
	}
	if p.Params != nil {
		q.Params = make(map[string]float64, len(p.Params))
		for k, v := range p.Params {
			q.Params[k] = v
		}
	}
	return &q
}

// RegionOf returns the region a part works in, or nil for the default band.
// A region that names the part wins; otherwise the first region (by name) that
// names one of its nets.
func (c *Circuit) RegionOf(p *Part) *Region {
	for _, r := range c.Regions {
		for _, ref := range r.Parts {
			if ref == p.Ref {
				return r
			}
			for _, o := range p.From {
				if o == ref {
					return r
				}
			}
		}
	}
	for _, r := range c.Regions {
		for _, n := range r.Nets {
			for _, pin := range p.Pins {
				if pin.Net == n {
					return r
				}
			}
		}
	}
	return nil
}

// BandOf returns the band of interest for a part: its region's band, or the
// circuit's default band.
func (c *Circuit) BandOf(p *Part) value.Range {
	if r := c.RegionOf(p); r != nil {
		return r.Band
	}
	return c.Band
}

// Region returns the region with the given name, or nil.
func (c *Circuit) Region(name string) *Region {
	for _, r := range c.Regions {
		if r.Name == name {
			return r
		}
	}
	return nil
}

// FullBand is the span from the lowest to the highest frequency of interest
// over the default band and all regions.
func (c *Circuit) FullBand() value.Range {
	b := c.Band
	for _, r := range c.Regions {
		if b.Max == 0 || (r.Band.Min > 0 && r.Band.Min < b.Min) {
			if b.Max == 0 {
				b = r.Band
				continue
			}
			b.Min = r.Band.Min
		}
		if r.Band.Max > b.Max {
			b.Max = r.Band.Max
		}
	}
	return b
}
