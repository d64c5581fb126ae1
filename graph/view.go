package graph

import (
	"slices"
	"sort"

	"gonum.org/v1/gonum/graph"
	"gonum.org/v1/gonum/graph/iterator"
	"gonum.org/v1/gonum/graph/simple"
)

// View is the part–net incidence graph of a set of parts as gonum sees it
// (graph.Undirected): one node per part, one per net, an edge where a part
// has a terminal on a net. It reads a connection index and copies nothing
// but the adjacency lists; our own structs keep the meaning (pin → net),
// the view is for gonum's algorithms (traverse, topo). Node IDs are the
// parts in the order given, then the nets by name, and every node list it
// returns is in ID order, never map order, so walks are deterministic.
type View struct {
	parts  []*Part
	nets   []string
	partID map[*Part]int64
	netID  map[string]int64
	adj    [][]graph.Node // node ID → neighbours in ID order
}

var _ graph.Undirected = (*View)(nil)

// NewView builds the view of parts over their index (the circuit's own, or
// NewIndex of a drawing's cells).
func NewView(ix *Index, parts []*Part) *View {
	v := &View{parts: parts, nets: ix.NetNames(), partID: make(map[*Part]int64, len(parts))}
	v.netID = make(map[string]int64, len(v.nets))
	for i, p := range parts {
		v.partID[p] = int64(i)
	}
	for i, n := range v.nets {
		v.netID[n] = int64(len(parts) + i)
	}
	// Neighbour IDs first, sorted and unique per node, then one backing
	// array of gonum nodes for all of them: building the view is what a
	// walk costs most (DEVELOPERS.md, "Graph algorithms").
	ids := make([][]int64, len(parts)+len(v.nets))
	total := 0
	for i, p := range parts {
		for _, pin := range p.Pins {
			if id, ok := v.netID[pin.Net]; ok {
				ids[i] = append(ids[i], id)
			}
		}
	}
	for i, n := range v.nets {
		id := len(parts) + i
		for _, cn := range ix.Conns(n) {
			if pid, ok := v.partID[cn.Part]; ok {
				ids[id] = append(ids[id], pid)
			}
		}
	}
	for i := range ids {
		slices.Sort(ids[i])
		ids[i] = slices.Compact(ids[i])
		total += len(ids[i])
	}
	backing := make([]graph.Node, 0, total)
	v.adj = make([][]graph.Node, len(ids))
	for i, list := range ids {
		start := len(backing)
		for _, id := range list {
			backing = append(backing, simple.Node(id))
		}
		v.adj[i] = backing[start:len(backing):len(backing)]
	}
	return v
}

// View returns the part–net view of the circuit, over its index.
func (c *Circuit) View() *View { return NewView(c.index(), c.Parts) }

// PartNode and NetNode give the node IDs; ok is false for unknown ones.
func (v *View) PartNode(p *Part) (int64, bool) { id, ok := v.partID[p]; return id, ok }

// NetNode gives the node ID of a net.
func (v *View) NetNode(name string) (int64, bool) { id, ok := v.netID[name]; return id, ok }

// PartOf returns the part behind a node ID, or nil if the node is a net.
func (v *View) PartOf(id int64) *Part {
	if id >= 0 && id < int64(len(v.parts)) {
		return v.parts[id]
	}
	return nil
}

// NetOf returns the net name behind a node ID, or "" if the node is a part.
func (v *View) NetOf(id int64) string {
	name, _ := v.netAt(id)
	return name
}

func (v *View) netAt(id int64) (string, bool) {
	if i := id - int64(len(v.parts)); i >= 0 && i < int64(len(v.nets)) {
		return v.nets[i], true
	}
	return "", false
}

func (v *View) has(id int64) bool { return id >= 0 && id < int64(len(v.adj)) }

// Node returns the node with the given ID, or nil.
func (v *View) Node(id int64) graph.Node {
	if !v.has(id) {
		return nil
	}
	return simple.Node(id)
}

// Nodes returns every node in ID order.
func (v *View) Nodes() graph.Nodes {
	all := make([]graph.Node, len(v.adj))
	for i := range all {
		all[i] = simple.Node(i)
	}
	return iterator.NewOrderedNodes(all)
}

// From returns the neighbours of a node in ID order.
func (v *View) From(id int64) graph.Nodes {
	if !v.has(id) {
		return graph.Empty
	}
	return iterator.NewOrderedNodes(v.adj[id])
}

// HasEdgeBetween reports whether a part has a terminal on a net.
func (v *View) HasEdgeBetween(xid, yid int64) bool {
	if !v.has(xid) || !v.has(yid) {
		return false
	}
	list := v.adj[xid]
	i := sort.Search(len(list), func(i int) bool { return list[i].ID() >= yid })
	return i < len(list) && list[i].ID() == yid
}

// Edge returns the edge from u to v, or nil.
func (v *View) Edge(uid, vid int64) graph.Edge {
	if !v.HasEdgeBetween(uid, vid) {
		return nil
	}
	return simple.Edge{F: simple.Node(uid), T: simple.Node(vid)}
}

// EdgeBetween returns the edge between x and y, or nil.
func (v *View) EdgeBetween(xid, yid int64) graph.Edge { return v.Edge(xid, yid) }
