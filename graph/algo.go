package graph

import (
	"slices"
	"strings"

	"gonum.org/v1/gonum/graph"
	"gonum.org/v1/gonum/graph/iterator"
	"gonum.org/v1/gonum/graph/simple"
	"gonum.org/v1/gonum/graph/traverse"
)

// Walk measures distances from the inputs: a breadth-first walk over the
// part–net incidence graph (gonum's traverse.BreadthFirst on a View). A
// part's distance is the number of parts the signal passes before it: the
// parts on a starting net are at the starting distance, the parts that
// share a net with one of them one further, and so on. A net's distance is
// that of the parts reached through it. Successive walks (FromNets,
// FromPart) share what was visited, so a later walk ranks only what the
// earlier ones did not reach.
type Walk struct {
	// Follow reports whether the walk may go on from a part onto a net (nil:
	// every net). The starting nets are entered regardless.
	Follow func(net string) bool
	// Enter reports whether the walk may step from a net onto part p
	// through its terminal pin (nil: always).
	Enter func(p *Part, pin string) bool
	// Leave reports whether the walk may step from part p onto the net of
	// its terminal pin (nil: always). With Enter it says which way the
	// signal crosses a device (control to output, not back).
	Leave func(p *Part, pin string) bool

	v    *View
	bf   traverse.BreadthFirst
	part map[*Part]int
	net  map[string]int
}

// NewWalk starts a walk on a view; set the filters before walking.
func NewWalk(v *View) *Walk {
	w := &Walk{v: v, part: map[*Part]int{}, net: map[string]int{}}
	w.bf.Traverse = w.traverse
	return w
}

// PartDist is a part's distance, and whether a walk reached it.
func (w *Walk) PartDist(p *Part) (int, bool) { d, ok := w.part[p]; return d, ok }

// NetDist is a net's distance, and whether a walk reached it.
func (w *Walk) NetDist(net string) (int, bool) { d, ok := w.net[net]; return d, ok }

// Parts lists the parts the walks reached, in the view's order: what a
// loop over every part asking PartDist finds, at the cost of the walk.
func (w *Walk) Parts() []*Part {
	out := make([]*Part, 0, len(w.part))
	for p := range w.part {
		out = append(out, p)
	}
	slices.SortFunc(out, func(a, b *Part) int { return int(w.v.partID[a] - w.v.partID[b]) })
	return out
}

// rooted adds one node to a view, joined to the starting nets, so that one
// breadth-first walk starts from all of them at once.
type rooted struct {
	*View
	root   int64
	starts []graph.Node
}

func (r rooted) From(id int64) graph.Nodes {
	if id == r.root {
		return iterator.NewOrderedNodes(r.starts)
	}
	return r.View.From(id)
}

func (r rooted) Edge(uid, vid int64) graph.Edge {
	if uid == r.root {
		return simple.Edge{F: simple.Node(uid), T: simple.Node(vid)}
	}
	return r.View.Edge(uid, vid)
}

// FromNets walks from nets: the parts on them are at distance base.
// Unknown names are skipped.
func (w *Walk) FromNets(nets []string, base int) {
	root := int64(len(w.v.adj))
	var starts []graph.Node
	for _, n := range nets {
		if id, ok := w.v.netID[n]; ok {
			starts = append(starts, simple.Node(id))
		}
	}
	// The root stands where a part would, one step before the nets.
	w.walk(rooted{View: w.v, root: root, starts: starts}, simple.Node(root), base-1)
}

// FromPart walks from a part, which is at distance base, unless an earlier
// walk reached it.
func (w *Walk) FromPart(p *Part, base int) {
	if _, done := w.part[p]; done {
		return
	}
	if id, ok := w.v.partID[p]; ok {
		w.walk(w.v, simple.Node(id), base)
	}
}

// walk runs one breadth-first walk. Parts and nets alternate, so a node at
// depth d is a part at origin+d/2 when d is even, a net whose parts are at
// origin+(d+1)/2 when d is odd.
func (w *Walk) walk(g traverse.Graph, from graph.Node, origin int) {
	w.bf.Walk(g, from, func(n graph.Node, depth int) bool {
		if p := w.v.PartOf(n.ID()); p != nil {
			w.part[p] = origin + depth/2
		} else if net, ok := w.v.netAt(n.ID()); ok {
			w.net[net] = origin + (depth+1)/2
		}
		return false
	})
}

// traverse is the edge filter: Follow and Leave from a part to a net,
// Enter from a net to a part; edges from the root always.
func (w *Walk) traverse(e graph.Edge) bool {
	uid, vid := e.From().ID(), e.To().ID()
	if !w.v.has(uid) {
		return true // the root of FromNets
	}
	if p := w.v.PartOf(uid); p != nil {
		net := w.v.NetOf(vid)
		if net == NotConnected {
			// "nc" is no net: the reduction moves every static electrode
			// there, so following it would put every valve one step from
			// the first (the output stage beside the RF stage).
			return false
		}
		if w.Follow != nil && !w.Follow(net) {
			return false
		}
		return w.Leave == nil || anyPin(p, net, w.Leave)
	}
	return w.Enter == nil || anyPin(w.v.PartOf(vid), w.v.NetOf(uid), w.Enter)
}

// anyPin reports whether ok holds for some terminal of p on net (a part may
// have several there: a pentode's suppressor strapped to its cathode).
func anyPin(p *Part, net string, ok func(*Part, string) bool) bool {
	for _, pin := range p.Pins {
		if pin.Net == net && ok(p, pin.Name) {
			return true
		}
	}
	return false
}

// Components returns the connected groups of parts, each sorted by ref, the
// groups ordered by their first ref: gonum's depth-first WalkAll over the
// view, which is what topo.ConnectedComponents runs, here with an edge
// filter. With acGroundSplits the nets that are AC ground by role join
// nothing, because a common ground or rail does not couple stages for the
// signal.
func Components(c *Circuit, acGroundSplits bool) [][]string {
	v := c.View()
	var dfs traverse.DepthFirst
	if acGroundSplits {
		dfs.Traverse = func(e graph.Edge) bool {
			for _, id := range []int64{e.From().ID(), e.To().ID()} {
				if n, ok := v.netAt(id); ok && c.RoleOf(n).IsACGround() {
					return false
				}
			}
			return true
		}
	}
	var out [][]string
	var cur []string
	dfs.WalkAll(v, nil, func() {
		if len(cur) > 0 {
			slices.Sort(cur)
			out = append(out, cur)
		}
		cur = nil
	}, func(n graph.Node) {
		if p := v.PartOf(n.ID()); p != nil {
			cur = append(cur, p.Ref)
		}
	})
	slices.SortFunc(out, func(a, b []string) int { return strings.Compare(a[0], b[0]) })
	return out
}

// DisjointSets is a union–find over small non-negative integers (solver
// nodes), growing as members are named: the one place the model groups
// things that are joined. The least member of a set represents it, so the
// grouping names nodes the same way on every run. The zero value is empty
// and ready. It is slice-backed: a map-backed one cost 50 times as much on
// the solver's 100k-node benchmark circuit (DEVELOPERS.md, "Graph algorithms").
type DisjointSets struct {
	parent []int
	less   func(a, b int) bool // the order of members; nil: by number
}

// Find returns the representative of x's set (x itself if it was never
// joined), halving the path on the way.
func (s *DisjointSets) Find(x int) int {
	if x >= len(s.parent) {
		return x
	}
	for s.parent[x] != x {
		s.parent[x] = s.parent[s.parent[x]]
		x = s.parent[x]
	}
	return x
}

// Union joins the sets of a and b.
func (s *DisjointSets) Union(a, b int) {
	for n := max(a, b); len(s.parent) <= n; {
		s.parent = append(s.parent, len(s.parent))
	}
	ra, rb := s.Find(a), s.Find(b)
	if ra == rb {
		return
	}
	if s.less != nil && s.less(rb, ra) || s.less == nil && rb < ra {
		ra, rb = rb, ra
	}
	s.parent[rb] = ra
}

// NamedSets is DisjointSets over names (nets): the smallest name of a set
// represents it.
type NamedSets struct {
	sets  DisjointSets
	id    map[string]int
	names []string
}

func (n *NamedSets) intern(name string) int {
	if n.id == nil {
		n.id = map[string]int{}
		n.sets.less = func(a, b int) bool { return n.names[a] < n.names[b] }
	}
	id, ok := n.id[name]
	if !ok {
		id = len(n.names)
		n.id[name] = id
		n.names = append(n.names, name)
	}
	return id
}

// Find returns the representative name of name's set.
func (n *NamedSets) Find(name string) string {
	id, ok := n.id[name]
	if !ok {
		return name
	}
	return n.names[n.sets.Find(id)]
}

// Union joins the sets of a and b.
func (n *NamedSets) Union(a, b string) { n.sets.Union(n.intern(a), n.intern(b)) }
