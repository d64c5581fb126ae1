package graph

import "sort"

// The editing API. Every change to a circuit's parts, pins or nets goes
// through these methods, which keep Parts and Nets sorted and the
// connection index current; code that edits the slices directly must call
// Sort afterwards. The policies live here once: a net nothing uses any more
// goes at once (unless it is a declared end), a joined net takes the
// stronger role and a label of the same role, and a rename never leaves a
// net twice in an input, output or region list.

// index returns the connection index, building it on first use (after a
// load, a clone or Sort). Not safe for concurrent first use.
func (c *Circuit) index() *Index {
	if c.ix == nil {
		c.ix = NewIndex(c.Parts, c.Nets)
	}
	return c.ix
}

// Index returns the circuit's connection index, kept current by the edits.
func (c *Circuit) Index() *Index { return c.index() }

// ConnsOf lists the terminals on a net by part ref, then pin name. The
// slice belongs to the index: do not keep it across an edit.
func (c *Circuit) ConnsOf(net string) []Conn { return c.index().Conns(net) }

// IsEnd reports whether a net is a declared signal input or output of the
// circuit or of a region: such nets carry the signal by definition and are
// never pruned, grounded or merged away.
func (c *Circuit) IsEnd(net string) bool {
	for _, n := range c.Inputs {
		if n == net {
			return true
		}
	}
	for _, n := range c.Outputs {
		if n == net {
			return true
		}
	}
	for _, r := range c.Regions {
		if r.Input == net || r.Output == net {
			return true
		}
	}
	return false
}

// AddPart inserts a part in sorted place and creates any net its pins name
// that does not exist yet (with the default role for its name).
func (c *Circuit) AddPart(p *Part) {
	c.journal().savePart(p.Ref)
	for _, pin := range p.Pins {
		c.EnsureNet(pin.Net, pin.Pos)
	}
	c.placePart(p)
}

// placePart inserts a part in sorted place and indexes its terminals; the
// nets it names must exist.
func (c *Circuit) placePart(p *Part) {
	ix := c.index()
	i := sort.Search(len(c.Parts), func(i int) bool { return c.Parts[i].Ref >= p.Ref })
	c.Parts = append(c.Parts, nil)
	copy(c.Parts[i+1:], c.Parts[i:])
	c.Parts[i] = p
	ix.addPart(p)
	for _, pin := range p.Pins {
		ix.addConn(pin.Net, Conn{Part: p, Pin: pin.Name})
	}
}

// unplacePart takes a part out of Parts and the index, leaving its nets.
func (c *Circuit) unplacePart(p *Part) {
	ix := c.index()
	i := sort.Search(len(c.Parts), func(i int) bool { return c.Parts[i].Ref >= p.Ref })
	if i < len(c.Parts) && c.Parts[i] == p {
		c.Parts = append(c.Parts[:i], c.Parts[i+1:]...)
	}
	ix.delPart(p)
	for _, pin := range p.Pins {
		ix.delConn(pin.Net, p, pin.Name)
	}
}

// RemovePart takes the part with the given ref out of the circuit and
// returns the nets that this left empty and that were deleted with it
// (sorted); ok is false when there is no such part.
func (c *Circuit) RemovePart(ref string) (dropped []string, ok bool) {
	ix := c.index()
	i := sort.Search(len(c.Parts), func(i int) bool { return c.Parts[i].Ref >= ref })
	if i == len(c.Parts) || c.Parts[i].Ref != ref {
		return nil, false
	}
	c.journal().savePart(ref)
	p := c.Parts[i]
	c.Parts = append(c.Parts[:i], c.Parts[i+1:]...)
	ix.delPart(p)
	for _, pin := range p.Pins {
		if ix.delConn(pin.Net, p, pin.Name) && c.PruneNet(pin.Net) {
			dropped = append(dropped, pin.Net)
		}
	}
	sort.Strings(dropped)
	return dropped, true
}

// DropPin removes one terminal from a part (a static electrode no model
// needs) and returns the net it deleted if that was the net's last use.
func (c *Circuit) DropPin(ref, pin string) (dropped []string) {
	p := c.Part(ref)
	if p == nil {
		return nil
	}
	for i, pn := range p.Pins {
		if pn.Name == pin {
			c.journal().savePart(ref)
			p.Pins = append(p.Pins[:i], p.Pins[i+1:]...)
			if c.index().delConn(pn.Net, p, pin) && c.PruneNet(pn.Net) {
				dropped = append(dropped, pn.Net)
			}
			return dropped
		}
	}
	return nil
}

// NotConnected is the net a terminal that goes nowhere is written on.
const NotConnected = "nc"

// Unconnect moves a terminal to "nc", the netlist's "not connected", and
// returns the net it deleted if that was the net's last use.
func (c *Circuit) Unconnect(ref, pin string) (dropped []string) {
	p := c.Part(ref)
	if p == nil {
		return nil
	}
	for i, pn := range p.Pins {
		if pn.Name == pin && pn.Net != NotConnected {
			c.journal().savePart(ref)
			p.Pins[i].Net = NotConnected
			if c.index().delConn(pn.Net, p, pin) && c.PruneNet(pn.Net) {
				dropped = append(dropped, pn.Net)
			}
			c.EnsureNet(NotConnected, Pos{})
			c.index().addConn(NotConnected, Conn{Part: p, Pin: pin})
			return dropped
		}
	}
	return nil
}

// EnsureNet returns the net with the given name, creating it in sorted
// place with the default role for its name when it does not exist.
func (c *Circuit) EnsureNet(name string, pos Pos) *Net {
	ix := c.index()
	if n := ix.nets[name]; n != nil {
		return n
	}
	c.journal().saveNet(name)
	n := &Net{Name: name, Role: DefaultRole(name), Pos: pos}
	c.placeNet(n)
	return n
}

// placeNet inserts a net in sorted place and indexes it.
func (c *Circuit) placeNet(n *Net) {
	i := sort.Search(len(c.Nets), func(i int) bool { return c.Nets[i].Name >= n.Name })
	c.Nets = append(c.Nets, nil)
	copy(c.Nets[i+1:], c.Nets[i:])
	c.Nets[i] = n
	c.index().nets[n.Name] = n
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

// PruneNet deletes a net that no terminal uses and that is no declared end;
// it reports whether it did.
func (c *Circuit) PruneNet(name string) bool {
	ix := c.index()
	if len(ix.conns[name]) > 0 || c.IsEnd(name) {
		return false
	}
	return c.deleteNet(name)
}

// PruneNets deletes every net PruneNet would; it returns their names, sorted.
func (c *Circuit) PruneNets() []string {
	var gone []string
	for _, n := range append([]*Net(nil), c.Nets...) {
		if c.PruneNet(n.Name) {
			gone = append(gone, n.Name)
		}
	}
	return gone
}

func (c *Circuit) deleteNet(name string) bool {
	i := sort.Search(len(c.Nets), func(i int) bool { return c.Nets[i].Name >= name })
	if i == len(c.Nets) || c.Nets[i].Name != name {
		return false
	}
	c.journal().saveNet(name)
	c.Nets = append(c.Nets[:i], c.Nets[i+1:]...)
	delete(c.index().nets, name)
	return true
}
