package check

import (
	"fmt"
	"sort"

	"pare/render/geom"
)

type unionFind []int

func (u unionFind) find(i int) int {
	for u[i] != i {
		u[i] = u[u[i]]
		i = u[i]
	}
	return i
}

func (u unionFind) join(a, b int) { u[u.find(a)] = u.find(b) }

// pinRef is a symbol pin as the connectivity check sees it.
type pinRef struct {
	what string // REF.PIN
	net  string
	at   geom.Pt
}

// sheetNets is the sheet filed by net once, so that each net's check looks
// up its own wires, pins and local symbols instead of scanning the sheet.
type sheetNets struct {
	g        *geom.Sheet
	segs     []netSeg
	pins     []pinRef
	nets     []string         // every net with a wire or a pin, sorted
	segsOf   map[string][]int // indices into segs
	pinsOf   map[string][]int // indices into pins
	localsOf map[string][]int // indices into g.Locals
	dots     map[geom.Pt]bool // the drawn junction dots
	usedDots map[geom.Pt]bool // dots found on a three-way junction
}

// connectivity checks each net: its wires and stubs form connected pieces
// that reach every one of its pins; there is one piece, or every piece ends
// in a local symbol (ground, rail, net-name flag) of the net; no wire touches
// another net's pin; junctions have dots and at most three arms.
func (r *Report) connectivity(g *geom.Sheet, segs []netSeg) {
	sn := &sheetNets{g: g, segs: segs, pins: sheetPins(g), segsOf: map[string][]int{},
		pinsOf: map[string][]int{}, localsOf: map[string][]int{}, dots: map[geom.Pt]bool{},
		usedDots: map[geom.Pt]bool{}}
	r.fileSegs(sn)
	sn.filePins()
	for i, l := range g.Locals {
		sn.localsOf[l.Net] = append(sn.localsOf[l.Net], i)
	}
	for _, d := range g.Dots {
		sn.dots[d] = true
	}
	sort.Strings(sn.nets)
	for _, net := range sn.nets {
		r.checkNet(sn, net)
	}
	// a dot no junction claimed is drawn where nothing branches
	for _, d := range g.Dots {
		if !sn.usedDots[d] {
			r.Junctions = append(r.Junctions, "dot at "+pt(d)+" is not on a junction")
		}
	}
}

// sheetPins lists the pins that must be wired; a pin on the not-connected
// net is a bare lead: nothing to wire, nothing to touch.
func sheetPins(g *geom.Sheet) []pinRef {
	var pins []pinRef
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			if p.Net == notConnected {
				continue
			}
			pins = append(pins, pinRef{s.Ref + "." + p.Name, p.Net, p.At})
		}
	}
	return pins
}

// fileSegs files the wires by net and, while it visits each wire, reports
// any that touches another net's pin (found through a spatial index, so a
// large sheet is not checked wire against pin).
func (r *Report) fileSegs(sn *sheetNets) {
	var pix bucketed
	for i, p := range sn.pins {
		pix.add(i, geom.Rect{X0: p.at.X, Y0: p.at.Y, X1: p.at.X, Y1: p.at.Y})
	}
	for i, s := range sn.segs {
		if _, ok := sn.segsOf[s.net]; !ok {
			sn.nets = append(sn.nets, s.net)
		}
		sn.segsOf[s.net] = append(sn.segsOf[s.net], i)
		for _, j := range pix.near(s.seg.Box()) {
			p := sn.pins[j]
			if p.net != s.net && s.seg.HasPoint(p.at) {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("wire of %s touches pin %s of %s", s.net, p.what, p.net))
			}
		}
	}
}

// filePins files the pins by net and adds the nets that have pins but no
// wire, so an unwired net is still checked.
func (sn *sheetNets) filePins() {
	for i, p := range sn.pins {
		if _, ok := sn.segsOf[p.net]; !ok {
			if _, seen := sn.pinsOf[p.net]; !seen {
				sn.nets = append(sn.nets, p.net)
			}
		}
		sn.pinsOf[p.net] = append(sn.pinsOf[p.net], i)
	}
}

// netCheck is one net's wiring as a graph. Its nodes are the segment ends
// and the pins; a node lying inside a segment joins it (a T). arms counts
// the lines leaving each node (a pin's lead is one), which tells a bend from
// a junction and a wired pin from a bare one.
type netCheck struct {
	sn        *sheetNets
	net       string
	ss, ps    []int // the net's segments and pins
	idx       map[geom.Pt]int
	pts       []geom.Pt
	uf        unionFind
	arms      []int
	withLocal map[int]bool // pieces (by root) that end in a local symbol
}

// checkNet runs the per-net checks on one net's graph.
func (r *Report) checkNet(sn *sheetNets, net string) {
	nc := &netCheck{sn: sn, net: net, ss: sn.segsOf[net], ps: sn.pinsOf[net]}
	if len(nc.ps) == 0 && len(nc.ss) == 0 {
		return
	}
	nc.build()
	r.pieces(nc)
	r.unwiredPins(nc)
	r.junctions(nc)
	r.bends(nc)
}

// build numbers the nodes (segment ends first, then pins, in that order, so
// a piece's root and the point reported for it do not change between runs)
// and joins them along the segments.
func (nc *netCheck) build() {
	segs, pins := nc.sn.segs, nc.sn.pins
	nc.idx = map[geom.Pt]int{}
	node := func(p geom.Pt) {
		if _, ok := nc.idx[p]; !ok {
			nc.idx[p] = len(nc.idx)
		}
	}
	for _, i := range nc.ss {
		node(segs[i].seg.A)
		node(segs[i].seg.B)
	}
	for _, i := range nc.ps {
		node(pins[i].at)
	}
	nc.pts = make([]geom.Pt, len(nc.idx))
	for p, i := range nc.idx {
		nc.pts[i] = p
	}
	nc.uf = make(unionFind, len(nc.idx))
	for i := range nc.uf {
		nc.uf[i] = i
	}
	nc.arms = make([]int, len(nc.idx))
	for _, i := range nc.ps {
		nc.arms[nc.idx[pins[i].at]]++ // the pin's lead
	}
	for _, i := range nc.ss {
		s := segs[i].seg
		a, b := nc.idx[s.A], nc.idx[s.B]
		nc.uf.join(a, b)
		nc.arms[a]++
		nc.arms[b]++
		for k, p := range nc.pts {
			if k != a && k != b && s.HasPoint(p) {
				nc.uf.join(a, k)
				nc.arms[k] += 2
			}
		}
	}
}

// pieces reports a net drawn in several pieces where a piece has no local
// symbol to say where it goes (a ground, rail or flag joins pieces by name),
// a local symbol off the net's wires, and a net of several pins with no
// wire at all.
func (r *Report) pieces(nc *netCheck) {
	pieces := map[int]bool{}
	for k := range nc.pts {
		pieces[nc.uf.find(k)] = true
	}
	nc.withLocal = map[int]bool{}
	for _, li := range nc.sn.localsOf[nc.net] {
		at := nc.sn.g.Locals[li].At
		if k, ok := nc.idx[at]; ok {
			nc.withLocal[nc.uf.find(k)] = true
		} else {
			r.Connectivity = append(r.Connectivity, fmt.Sprintf("local symbol of %s at %s is not on a wire", nc.net, pt(at)))
		}
	}
	// an off-row connector names where its piece goes, as a flag does
	for _, pi := range nc.sn.pinsOf[nc.net] {
		p := nc.sn.pins[pi]
		if _, _, ok := geom.ConnectorOf(p.what); ok {
			if k, ok := nc.idx[p.at]; ok {
				nc.withLocal[nc.uf.find(k)] = true
			}
		}
	}
	// Measure sorts the findings, so visiting the map in any order is fine.
	if len(pieces) > 1 {
		for k := range pieces {
			if !nc.withLocal[k] {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("net %s is in %d pieces and the one at %s has no ground, rail or flag", nc.net, len(pieces), pt(nc.pts[k])))
			}
		}
	}
	if len(pieces) == 1 && len(nc.ps) > 1 && len(nc.ss) == 0 {
		r.Connectivity = append(r.Connectivity, fmt.Sprintf("net %s has no wires", nc.net))
	}
}

// unwiredPins reports the pins of a net of several pins that no wire
// reaches, unless the net is drawn with local symbols and the pin's piece
// has one (a pin sitting on its own ground symbol is wired).
func (r *Report) unwiredPins(nc *netCheck) {
	if len(nc.ps) < 2 {
		r.looseEnd(nc)
		return
	}
	hasLocals := len(nc.sn.localsOf[nc.net]) > 0
	for _, i := range nc.ps {
		p := nc.sn.pins[i]
		k := nc.idx[p.at]
		if nc.arms[k] >= 2 || hasLocals && nc.withLocal[nc.uf.find(k)] {
			continue
		}
		r.Connectivity = append(r.Connectivity, fmt.Sprintf("pin %s of %s is not wired", p.what, nc.net))
	}
}

// looseEnd reports a net's only pin when nothing is drawn at it: no wire
// leaves its lead and no local symbol of the net ends its piece.
func (r *Report) looseEnd(nc *netCheck) {
	if len(nc.ps) != 1 {
		return
	}
	p := nc.sn.pins[nc.ps[0]]
	k := nc.idx[p.at]
	if nc.arms[k] >= 2 || nc.withLocal[nc.uf.find(k)] {
		return
	}
	r.LooseEnds = append(r.LooseEnds, fmt.Sprintf("pin %s of %s ends in the air", p.what, nc.net))
}

// junctions reports four-way junctions (drawn, they read as a crossing) and
// three-way ones without a dot, and marks the dots it finds in use.
func (r *Report) junctions(nc *netCheck) {
	for k, p := range nc.pts {
		switch {
		case nc.arms[k] >= 4:
			r.Junctions = append(r.Junctions, fmt.Sprintf("four-way junction of %s at %s", nc.net, pt(p)))
		case nc.arms[k] == 3:
			if !nc.sn.dots[p] {
				r.Junctions = append(r.Junctions, fmt.Sprintf("junction of %s at %s has no dot", nc.net, pt(p)))
			}
			nc.sn.usedDots[p] = true
		}
	}
}

// bends counts the net's bends: one horizontal and one vertical segment end
// meeting at a point with no other arm (so no pin there).
func (r *Report) bends(nc *netCheck) {
	ends := map[geom.Pt][2]int{}
	for _, i := range nc.ss {
		s := nc.sn.segs[i].seg
		for _, p := range []geom.Pt{s.A, s.B} {
			e := ends[p]
			if s.Horizontal() {
				e[0]++
			} else {
				e[1]++
			}
			ends[p] = e
		}
	}
	nb := 0
	for p, e := range ends {
		if e[0] == 1 && e[1] == 1 && nc.arms[nc.idx[p]] == 2 {
			nb++
		}
	}
	r.Bends += nb
	r.MaxBends = max(r.MaxBends, nb)
}
