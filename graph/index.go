package graph

import "sort"

// Conn is one terminal of a part as seen from a net.
type Conn struct {
	Part *Part
	Pin  string
}

// connLess orders terminals by part ref, then pin name: the one order every
// list of terminals on a net is kept in, so that lookups can search and
// walks over a net are deterministic.
func connLess(a, b Conn) bool {
	if a.Part.Ref != b.Part.Ref {
		return a.Part.Ref < b.Part.Ref
	}
	return a.Pin < b.Pin
}

// Index is the connection index of a set of parts and nets: parts by ref,
// nets by name, and the terminals on each net. A circuit keeps one, built
// from scratch once (on first use after a load, a clone or Sort) and then
// kept current by every edit (edit.go), so a reduction that asks "what is
// on this net" thousands of times never rebuilds it.
type Index struct {
	parts map[string]*Part
	nets  map[string]*Net
	conns map[string][]Conn // sorted by connLess, unless the net is in unsorted
	// unsorted holds the long lists (lazyLen terminals or more) that edits
	// changed since they were last read: ground holds most terminals of a
	// whole set and is edited on nearly every step, so its list is edited
	// in any order and sorted when it is next read (Conns), not kept sorted
	// at the cost of moving it all on every edit.
	unsorted map[string]bool
	// kinds holds the parts of each kind by ref, for the questions a
	// whole set's reduction asks of a few parts of a kind (its crystals).
	kinds map[Kind]map[string]*Part
}

// NewIndex builds the index of parts and nets from scratch. Nets named only
// in a pin list have terminals but no *Net. Parts outside a circuit (the
// flags a drawing adds for its ends) may be indexed the same way.
func NewIndex(parts []*Part, nets []*Net) *Index {
	ix := &Index{
		parts:    make(map[string]*Part, len(parts)),
		nets:     make(map[string]*Net, len(nets)),
		conns:    make(map[string][]Conn, len(nets)),
		unsorted: map[string]bool{},
		kinds:    map[Kind]map[string]*Part{},
	}
	for _, n := range nets {
		ix.nets[n.Name] = n
	}
	for _, p := range parts {
		ix.addPart(p)
		for _, pin := range p.Pins {
			ix.conns[pin.Net] = append(ix.conns[pin.Net], Conn{Part: p, Pin: pin.Name})
		}
	}
	// Parts may come in any order and a part's pins come in terminal
	// order: sort fully, so that edits can search.
	for _, list := range ix.conns {
		sort.Slice(list, func(i, j int) bool { return connLess(list[i], list[j]) })
	}
	return ix
}

// Conns lists the terminals on a net by part ref, then pin name. The slice
// belongs to the index: read it, do not keep it across an edit.
func (ix *Index) Conns(net string) []Conn {
	if ix.unsorted[net] {
		list := ix.conns[net]
		sort.Slice(list, func(i, j int) bool { return connLess(list[i], list[j]) })
		delete(ix.unsorted, net)
	}
	return ix.conns[net]
}

// Count is the number of terminals on a net, len(Conns(net)) without
// putting a long list in order.
func (ix *Index) Count(net string) int { return len(ix.conns[net]) }

// lazyLen is the length from which a net's list is edited in any order
// and sorted when read (Index.unsorted).
const lazyLen = 64

// Part returns the part with the given ref, or nil.
func (ix *Index) Part(ref string) *Part { return ix.parts[ref] }

// Net returns the net with the given name, or nil.
func (ix *Index) Net(name string) *Net { return ix.nets[name] }

// NetNames lists every net that has a terminal or a *Net, sorted.
func (ix *Index) NetNames() []string {
	seen := make(map[string]bool, len(ix.conns)+len(ix.nets))
	var out []string
	for n := range ix.conns {
		if !seen[n] {
			seen[n] = true
			out = append(out, n)
		}
	}
	for n := range ix.nets {
		if !seen[n] {
			seen[n] = true
			out = append(out, n)
		}
	}
	sort.Strings(out)
	return out
}

func (ix *Index) addPart(p *Part) {
	ix.parts[p.Ref] = p
	m := ix.kinds[p.Kind]
	if m == nil {
		m = map[string]*Part{}
		ix.kinds[p.Kind] = m
	}
	m[p.Ref] = p
}

func (ix *Index) delPart(p *Part) {
	delete(ix.parts, p.Ref)
	if m := ix.kinds[p.Kind]; m[p.Ref] == p {
		delete(m, p.Ref)
	}
}

// OfKind lists the parts of a kind, by ref.
func (ix *Index) OfKind(k Kind) []*Part {
	m := ix.kinds[k]
	out := make([]*Part, 0, len(m))
	for _, p := range m {
		out = append(out, p)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Ref < out[j].Ref })
	return out
}

func (ix *Index) addConn(net string, cn Conn) {
	list := ix.conns[net]
	if len(list) >= lazyLen || ix.unsorted[net] {
		ix.conns[net] = append(list, cn)
		ix.unsorted[net] = true
		return
	}
	i := sort.Search(len(list), func(i int) bool { return !connLess(list[i], cn) })
	list = append(list, Conn{})
	copy(list[i+1:], list[i:])
	list[i] = cn
	ix.conns[net] = list
}

// delConn takes one terminal off a net and reports whether the net is now
// empty (its entry is then gone from the index).
func (ix *Index) delConn(net string, p *Part, pin string) (empty bool) {
	list := ix.conns[net]
	if len(list) >= lazyLen || ix.unsorted[net] {
		// a long list: the last entry takes the place of the one that
		// goes. The search runs from the end, where the terminals a join
		// or an add just put are, which a reduction often removes next
		// (a bypass capacitor once its net is grounded).
		for i := len(list) - 1; i >= 0; i-- {
			if list[i].Part == p && list[i].Pin == pin {
				last := len(list) - 1
				list[i], list[last] = list[last], Conn{}
				list = list[:last]
				ix.unsorted[net] = true
				break
			}
		}
	} else {
		key := Conn{Part: p, Pin: pin}
		i := sort.Search(len(list), func(i int) bool { return !connLess(list[i], key) })
		for ; i < len(list) && list[i].Part.Ref == p.Ref; i++ { // sorted by ref and pin: a short look
			if list[i].Part == p && list[i].Pin == pin {
				list = append(list[:i], list[i+1:]...)
				break
			}
		}
	}
	if len(list) == 0 {
		delete(ix.conns, net)
		delete(ix.unsorted, net)
		return true
	}
	ix.conns[net] = list
	return false
}

// moveConns puts every terminal of net gone on net keep. Ground collects
// most terminals of a circuit and is joined to over and over: a long list
// takes the short one at its end, to be sorted when read (unsorted); short
// ones are merged in place, from the back, each entry of the short list
// finding its place by binary search and the entries after it moving up as
// one block.
func (ix *Index) moveConns(keep, gone string) {
	b := ix.conns[gone]
	delete(ix.conns, gone)
	if len(b) == 0 {
		delete(ix.unsorted, gone)
		return
	}
	a := ix.conns[keep]
	if len(a)+len(b) >= lazyLen || ix.unsorted[keep] || ix.unsorted[gone] {
		ix.conns[keep] = append(a, b...)
		ix.unsorted[keep] = true
		delete(ix.unsorted, gone)
		return
	}
	n := len(a)
	a = append(a, b...) // room; the tail is overwritten by the merge below
	end := n            // a[:end] holds the entries of keep not yet moved
	for j := len(b) - 1; j >= 0; j-- {
		cn := b[j]
		// the first entry of a[:end] that sorts after cn (an equal one
		// stays before it, as the merge always kept it)
		i := sort.Search(end, func(k int) bool { return connLess(cn, a[k]) })
		copy(a[i+j+1:end+j+1], a[i:end])
		a[i+j] = cn
		end = i
	}
	ix.conns[keep] = a
}
