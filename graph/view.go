package graph

import (
	"gonum.org/v1/gonum/graph"
	"gonum.org/v1/gonum/graph/multi"
	"gonum.org/v1/gonum/graph/topo"
)

// View is the bipartite part–net graph of a circuit on gonum: one node per
// part, one per net, one line per terminal (a part with two terminals on the
// same net gets two parallel lines, hence a multigraph). Node IDs are
// assigned in sorted order, parts first, so results that list nodes by ID are
// deterministic. Our own structs keep the meaning; the view is for algorithms.
type View struct {
	*multi.UndirectedGraph
	c        *Circuit
	partID   map[string]int64
	netID    map[string]int64
	nodePart map[int64]*Part
	nodeNet  map[int64]*Net
}

// TermLine is a line of the view: the part's terminal Pin is on the net.
type TermLine struct {
	multi.Line
	Pin string
}

// NewView builds the part–net graph of c.
func NewView(c *Circuit) *View {
	v := &View{UndirectedGraph: multi.NewUndirectedGraph(), c: c,
		partID: map[string]int64{}, netID: map[string]int64{}, nodePart: map[int64]*Part{}, nodeNet: map[int64]*Net{}}
	id := int64(0)
	for _, p := range c.Parts {
		v.partID[p.Ref] = id
		v.nodePart[id] = p
		v.AddNode(multi.Node(id))
		id++
	}
	for _, n := range c.Nets {
		v.netID[n.Name] = id
		v.nodeNet[id] = n
		v.AddNode(multi.Node(id))
		id++
	}
	lineID := int64(0)
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			nid, ok := v.netID[pin.Net]
			if !ok {
				continue
			}
			v.SetLine(TermLine{Line: multi.Line{F: multi.Node(v.partID[p.Ref]), T: multi.Node(nid), UID: lineID}, Pin: pin.Name})
			lineID++
		}
	}
	return v
}

// PartNode and NetNode give the node IDs; ok is false for unknown names.
func (v *View) PartNode(ref string) (int64, bool) { id, ok := v.partID[ref]; return id, ok }

// NetNode gives the node ID of a net.
func (v *View) NetNode(name string) (int64, bool) { id, ok := v.netID[name]; return id, ok }

// PartOf and NetOf turn a node ID back into the model (nil if the node is the other sort).
func (v *View) PartOf(id int64) *Part { return v.nodePart[id] }

// NetOf returns the net behind a node ID.
func (v *View) NetOf(id int64) *Net { return v.nodeNet[id] }

// Components returns the connected groups of parts, each sorted by ref, the
// groups ordered by their first ref. Nets that are AC ground by role are left
// out of the graph first when acGroundSplits is set, because a common ground
// does not couple stages for the signal.
func Components(c *Circuit, acGroundSplits bool) [][]string {
	g := NewView(c)
	if acGroundSplits {
		for _, n := range c.Nets {
			if n.Role.IsACGround() {
				id, _ := g.NetNode(n.Name)
				g.RemoveNode(id)
			}
		}
	}
	var out [][]string
	for _, comp := range topo.ConnectedComponents(graph.Undirected(g)) {
		var refs []string
		for _, n := range comp {
			if p := g.PartOf(n.ID()); p != nil {
				refs = append(refs, p.Ref)
			}
		}
		if len(refs) == 0 {
			continue
		}
		sortStrings(refs)
		out = append(out, refs)
	}
	sortGroups(out)
	return out
}
