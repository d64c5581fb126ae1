package graph

import (
	"slices"
	"sort"
)

// Journal records what the editing API changes in a circuit from the moment
// it is started: the first time an edit touches a part, a net, a region,
// the declared ends or the retired rails, it keeps a copy of it as it was.
// A reduction step touches a handful of parts and nets where a set has
// thousands, so a step can be proven against the circuit as it was
// (Before, BeforeConns) and undone when refused (Undo) at the cost of what
// it touched, where a copy of the whole circuit per step made a whole
// set's reduction quadratic in its size.
//
// Only the editing API (edit.go, join.go, MarkDecoupled) is recorded: code
// that writes fields of a part or net in the circuit directly while a
// journal runs is not seen by it.
type Journal struct {
	c        *Circuit
	parts    map[string]*Part // ref → a copy of the part as it was; nil: there was none
	partPtr  map[string]*Part // ref → the part object that held it, restored in place by Undo
	nets     map[string]*Net  // name → a copy of the net as it was; nil: there was none
	netPtr   map[string]*Net
	regions  map[*Region]*Region // a copy of each region as it was
	inputs   []string
	outputs  []string
	endsSet  bool
	rails    []*Net
	railsSet bool
	// savedOn holds the saved parts by the nets of their pins, for
	// BeforeConns; built on first use, dropped by a later save.
	savedOn map[string][]*Part
}

// StartJournal begins recording the edits of c; a journal already running
// is replaced. Stop ends the recording.
func (c *Circuit) StartJournal() *Journal {
	j := &Journal{c: c, parts: map[string]*Part{}, partPtr: map[string]*Part{},
		nets: map[string]*Net{}, netPtr: map[string]*Net{}, regions: map[*Region]*Region{}}
	c.jr = j
	return j
}

// Stop ends the recording; the journal can still be read.
func (j *Journal) Stop() {
	if j.c.jr == j {
		j.c.jr = nil
	}
}

// Circuit is the circuit the journal records, as it is now.
func (j *Journal) Circuit() *Circuit { return j.c }

// journal is the running journal of c, or nil. A struct copy of a circuit
// (d := *c) shares the pointer but records nothing.
func (c *Circuit) journal() *Journal {
	if c.jr != nil && c.jr.c == c {
		return c.jr
	}
	return nil
}

func (j *Journal) savePart(ref string) {
	if j == nil {
		return
	}
	if _, ok := j.parts[ref]; ok {
		return
	}
	j.savedOn = nil
	p := j.c.index().parts[ref]
	if p == nil {
		j.parts[ref] = nil
		return
	}
	j.parts[ref], j.partPtr[ref] = p.Clone(), p
}

func (j *Journal) saveNet(name string) {
	if j == nil {
		return
	}
	if _, ok := j.nets[name]; ok {
		return
	}
	n := j.c.index().nets[name]
	if n == nil {
		j.nets[name] = nil
		return
	}
	cp := *n
	j.nets[name], j.netPtr[name] = &cp, n
}

func (j *Journal) saveRegion(r *Region) {
	if j == nil || j.regions[r] != nil {
		return
	}
	cp := *r
	cp.Parts = slices.Clone(r.Parts)
	cp.Nets = slices.Clone(r.Nets)
	j.regions[r] = &cp
}

func (j *Journal) saveEnds() {
	if j == nil || j.endsSet {
		return
	}
	j.inputs, j.outputs, j.endsSet = slices.Clone(j.c.Inputs), slices.Clone(j.c.Outputs), true
}

func (j *Journal) saveRails() {
	if j == nil || j.railsSet {
		return
	}
	j.rails, j.railsSet = slices.Clone(j.c.Rails), true
}

// Parts lists the refs of the parts the edits touched (added, removed or
// changed), sorted.
func (j *Journal) Parts() []string { return sortedKeysOf(j.parts) }

// Nets lists the names of the nets the edits touched (created, deleted or
// changed), sorted.
func (j *Journal) Nets() []string { return sortedKeysOf(j.nets) }

func sortedKeysOf[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// BeforePart is the part of that ref as it was when the journal started,
// or nil. The result is read only.
func (j *Journal) BeforePart(ref string) *Part {
	if p, ok := j.parts[ref]; ok {
		return p
	}
	return j.c.index().parts[ref]
}

// BeforeNet is the net of that name as it was when the journal started, or
// nil. The result is read only.
func (j *Journal) BeforeNet(name string) *Net {
	if n, ok := j.nets[name]; ok {
		return n
	}
	return j.c.index().nets[name]
}

// BeforeConns lists the terminals that were on a net when the journal
// started, by ref then pin (the order of Circuit.ConnsOf). On a net the
// edits did not reach it is the circuit's own list: read it, do not keep
// it across an edit.
func (j *Journal) BeforeConns(net string) []Conn {
	now := j.c.index().Conns(net)
	if j.savedOn == nil {
		// a step that grounds a rail touches a part in every channel:
		// the saved parts by net, once, rather than all of them per net
		j.savedOn = map[string][]*Part{}
		for _, p := range j.parts {
			if p == nil {
				continue
			}
			for _, pin := range p.Pins {
				if l := j.savedOn[pin.Net]; len(l) == 0 || l[len(l)-1] != p {
					j.savedOn[pin.Net] = append(l, p)
				}
			}
		}
	}
	was := j.savedOn[net]
	reached := len(was) > 0
	for i := 0; i < len(now) && !reached; i++ {
		_, reached = j.parts[now[i].Part.Ref]
	}
	if !reached {
		return now
	}
	var out []Conn
	for _, cn := range now {
		if _, touched := j.parts[cn.Part.Ref]; !touched {
			out = append(out, cn)
		}
	}
	for _, p := range was {
		for _, pin := range p.Pins {
			if pin.Net == net {
				out = append(out, Conn{Part: p, Pin: pin.Name})
			}
		}
	}
	sort.Slice(out, func(a, b int) bool { return connLess(out[a], out[b]) })
	return out
}

// BeforeOfKind lists the parts of a kind as they were when the journal
// started, by ref (Index.OfKind).
func (j *Journal) BeforeOfKind(k Kind) []*Part {
	var out []*Part
	for _, p := range j.c.index().OfKind(k) {
		if _, touched := j.parts[p.Ref]; !touched {
			out = append(out, p)
		}
	}
	for _, p := range j.parts {
		if p != nil && p.Kind == k {
			out = append(out, p)
		}
	}
	sort.Slice(out, func(a, b int) bool { return out[a].Ref < out[b].Ref })
	return out
}

// BeforeDeclared is the circuit's declarations as they were when the
// journal started: band, named frequencies, ends and regions, with no parts
// or nets. It costs the regions.
func (j *Journal) BeforeDeclared() *Circuit {
	c := j.c
	d := &Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Inputs: c.Inputs, Outputs: c.Outputs,
		DetectorLoads: c.DetectorLoads}
	if j.endsSet {
		d.Inputs, d.Outputs = j.inputs, j.outputs
	}
	d.Regions = j.beforeRegions()
	return d
}

func (j *Journal) beforeRegions() []*Region {
	out := make([]*Region, len(j.c.Regions))
	for i, r := range j.c.Regions {
		if old := j.regions[r]; old != nil {
			out[i] = old
		} else {
			out[i] = r
		}
	}
	return out
}

// Before is the circuit as it was when the journal started, sharing the
// parts, nets and regions no edit touched with the circuit as it is: read
// only, and only until the next edit. It costs a walk over the circuit;
// a step's proof reads BeforePart, BeforeNet and BeforeConns instead.
func (j *Journal) Before() *Circuit {
	c := j.c
	b := *c
	b.ix, b.jr = nil, nil
	b.Parts = beforeList(c.Parts, j.parts, func(p *Part) string { return p.Ref })
	b.Nets = beforeList(c.Nets, j.nets, func(n *Net) string { return n.Name })
	b.Regions = j.beforeRegions()
	if j.endsSet {
		b.Inputs, b.Outputs = j.inputs, j.outputs
	}
	if j.railsSet {
		b.Rails = j.rails
	}
	return &b
}

// beforeList is a sorted list of parts or nets with the touched ones as
// they were: the untouched of now, and every saved copy that existed.
func beforeList[T any](now []*T, saved map[string]*T, key func(*T) string) []*T {
	out := make([]*T, 0, len(now)+len(saved))
	for _, x := range now {
		if _, touched := saved[key(x)]; !touched {
			out = append(out, x)
		}
	}
	for _, x := range saved {
		if x != nil {
			out = append(out, x)
		}
	}
	sort.Slice(out, func(a, b int) bool { return key(out[a]) < key(out[b]) })
	return out
}

// Undo puts the circuit back as it was when the journal started, in place
// (a part or net that was there keeps its object, so pointers held across
// the step stay good), and stops the journal.
func (j *Journal) Undo() {
	j.Stop()
	c, ix := j.c, j.c.index()
	for ref := range j.parts {
		if p := ix.parts[ref]; p != nil {
			c.unplacePart(p)
		}
	}
	for name, old := range j.nets {
		if ix.nets[name] != nil {
			c.deleteNet(name)
		}
		if old != nil {
			n := j.netPtr[name]
			*n = *old
			c.placeNet(n)
		}
	}
	for ref, old := range j.parts {
		if old != nil {
			p := j.partPtr[ref]
			*p = *old
			c.placePart(p)
		}
	}
	for r, old := range j.regions {
		*r = *old
	}
	if j.endsSet {
		c.Inputs, c.Outputs = j.inputs, j.outputs
	}
	if j.railsSet {
		c.Rails = j.rails
	}
}
