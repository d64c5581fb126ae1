// Package check measures a laid-out sheet (package geom, the same geometry
// the renderer writes): overlaps between symbols, wires through symbols,
// label overlaps, wire crossings, bends, junction dots and connectivity. The
// tests fail on any overlap, wire through a symbol or broken net; crossings
// and bends are measured and reported.
package check

import (
	"fmt"
	"math"
	"sort"

	"pare/render/geom"
)

// Report is what Measure found. The string lists hold one line per problem,
// sorted; the counts are qualities to keep low.
type Report struct {
	SymbolOverlaps []string // symbol or local symbol boxes sharing interior
	WireThrough    []string // a wire or stub through a symbol or local symbol
	LabelOverlaps  []string // label against label, symbol, local symbol or wire
	Connectivity   []string // nets not one connected tree, wires touching other nets or pins
	Junctions      []string // four-way junctions, missing or stray dots
	FrameCuts      []string // a frame edge through a symbol, local symbol or label
	// CloseWires are runs of two nets' wires side by side on neighbouring
	// grid lines (one grid step apart or less) for more than closeRun steps:
	// at print size they read as one thick line or a bus.
	CloseWires []string
	// FrameHugs are wires running along a frame edge less than a grid step
	// from it for more than closeRun steps: the dashed edge and the wire
	// blur into a double line.
	FrameHugs      []string
	Crossings      int   // wire–wire crossings of different nets
	FrameCrossings []int // crossings inside each frame, in frame order
	Bends          int   // bends over all wires
	MaxBends       int   // most bends on one net
	Flagged        int   // nets drawn with net-name flags instead of wires
}

// Problems lists every fatal finding: overlaps, wires through symbols,
// broken connectivity, bad junctions.
func (r *Report) Problems() []string {
	var out []string
	for _, l := range [][]string{r.SymbolOverlaps, r.WireThrough, r.LabelOverlaps, r.FrameCuts, r.Connectivity, r.Junctions} {
		out = append(out, l...)
	}
	return out
}

// Crowding lists the readability findings that are not fatal to the
// geometry but spoil a printed sheet: wires side by side, wires hugging a
// frame edge.
func (r *Report) Crowding() []string {
	return append(append([]string{}, r.CloseWires...), r.FrameHugs...)
}

// Summary is one line of the measured qualities.
func (r *Report) Summary() string {
	return fmt.Sprintf("overlaps %d, wires through symbols %d, label overlaps %d, frame cuts %d, connectivity %d, junctions %d, close wires %d, frame hugs %d, crossings %d (per frame %v), bends %d (max %d per net), flagged nets %d",
		len(r.SymbolOverlaps), len(r.WireThrough), len(r.LabelOverlaps), len(r.FrameCuts), len(r.Connectivity), len(r.Junctions),
		len(r.CloseWires), len(r.FrameHugs), r.Crossings, r.FrameCrossings, r.Bends, r.MaxBends, r.Flagged)
}

// notConnected is the netlist format's net for a terminal that is really not
// connected (docs/netlist.md): its pins are never joined to each other.
const notConnected = "nc"

type netSeg struct {
	net   string
	seg   geom.Seg
	local int // index of the local symbol whose stub this is, or -1
}

type box struct {
	what string
	r    geom.Rect
}

// bucketed is a coarse spatial index so that checking a 2,000-part sheet
// stays fast: every item is filed under the 8×8 grid squares it touches.
type bucketed struct{ m map[[2]int][]int }

const bucket = 8.0

func (b *bucketed) add(i int, r geom.Rect) {
	if b.m == nil {
		b.m = map[[2]int][]int{}
	}
	for x := int(math.Floor(r.X0 / bucket)); x <= int(math.Floor(r.X1/bucket)); x++ {
		for y := int(math.Floor(r.Y0 / bucket)); y <= int(math.Floor(r.Y1/bucket)); y++ {
			b.m[[2]int{x, y}] = append(b.m[[2]int{x, y}], i)
		}
	}
}

// near returns the items filed in the squares r touches, each once, sorted.
func (b *bucketed) near(r geom.Rect) []int {
	seen := map[int]bool{}
	var out []int
	for x := int(math.Floor(r.X0 / bucket)); x <= int(math.Floor(r.X1/bucket)); x++ {
		for y := int(math.Floor(r.Y0 / bucket)); y <= int(math.Floor(r.Y1/bucket)); y++ {
			for _, i := range b.m[[2]int{x, y}] {
				if !seen[i] {
					seen[i] = true
					out = append(out, i)
				}
			}
		}
	}
	sort.Ints(out)
	return out
}

func pt(p geom.Pt) string { return fmt.Sprintf("(%g,%g)", p.X, p.Y) }

// Measure checks the sheet.
func Measure(g *geom.Sheet) *Report {
	r := &Report{Flagged: len(g.Failed)}
	var boxes []box
	for _, s := range g.Symbols {
		boxes = append(boxes, box{"symbol " + s.Ref, s.Box})
	}
	nSym := len(boxes)
	for _, l := range g.Locals {
		boxes = append(boxes, box{fmt.Sprintf("local %s at %s.%s", l.Net, l.Owner, l.Pin), l.Box})
	}
	var bix bucketed
	for i, b := range boxes {
		bix.add(i, b.r)
	}
	for i, a := range boxes {
		for _, j := range bix.near(a.r) {
			if j > i && a.r.Overlaps(boxes[j].r) {
				r.SymbolOverlaps = append(r.SymbolOverlaps, a.what+" overlaps "+boxes[j].what)
			}
		}
	}
	var segs []netSeg
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			segs = append(segs, netSeg{w.Net, s, -1})
		}
	}
	for i, l := range g.Locals {
		for _, s := range l.Stub {
			segs = append(segs, netSeg{l.Net, s, i})
		}
	}
	for _, s := range segs {
		for _, j := range bix.near(s.seg.Box()) {
			if s.local >= 0 && j == nSym+s.local {
				continue // a stub ends in its own symbol
			}
			if s.seg.CutsInterior(boxes[j].r) {
				r.WireThrough = append(r.WireThrough, fmt.Sprintf("wire of %s %s-%s runs through %s", s.net, pt(s.seg.A), pt(s.seg.B), boxes[j].what))
			}
		}
	}
	// labels
	var lix bucketed
	for i, l := range g.Labels {
		lix.add(i, l.Box)
	}
	for i, l := range g.Labels {
		name := fmt.Sprintf("label %q", first(l.Lines))
		for _, j := range lix.near(l.Box) {
			if j > i && l.Box.Overlaps(g.Labels[j].Box) {
				r.LabelOverlaps = append(r.LabelOverlaps, fmt.Sprintf("%s overlaps label %q", name, first(g.Labels[j].Lines)))
			}
		}
		for _, j := range bix.near(l.Box) {
			if l.Box.Overlaps(boxes[j].r) {
				r.LabelOverlaps = append(r.LabelOverlaps, name+" overlaps "+boxes[j].what)
			}
		}
	}
	for _, s := range segs {
		for _, j := range lix.near(s.seg.Box()) {
			if s.seg.Touches(g.Labels[j].Box) {
				r.LabelOverlaps = append(r.LabelOverlaps, fmt.Sprintf("wire of %s %s-%s touches label %q", s.net, pt(s.seg.A), pt(s.seg.B), first(g.Labels[j].Lines)))
			}
		}
	}
	r.frameEdges(g, boxes, segs)
	r.closeWires(segs)
	r.crossings(g, segs)
	r.connectivity(g, segs)
	for _, l := range [][]string{r.SymbolOverlaps, r.WireThrough, r.LabelOverlaps, r.FrameCuts, r.CloseWires, r.FrameHugs, r.Connectivity, r.Junctions} {
		sort.Strings(l)
	}
	return r
}

// closeRun is the longest run, in grid steps, two parallel lines may share
// closer than the spacing rule before it counts: a short jog beside another
// wire still reads as two wires.
const closeRun = 2

// edges are a box's four sides.
func edges(b geom.Rect) []geom.Seg {
	a, c := geom.Pt{X: b.X0, Y: b.Y0}, geom.Pt{X: b.X1, Y: b.Y1}
	return []geom.Seg{{A: a, B: geom.Pt{X: c.X, Y: a.Y}}, {A: geom.Pt{X: a.X, Y: c.Y}, B: c},
		{A: a, B: geom.Pt{X: a.X, Y: c.Y}}, {A: geom.Pt{X: c.X, Y: a.Y}, B: c}}
}

// alongside returns how far apart two parallel segments lie and how long
// they run side by side (0, 0 when they are not parallel or do not overlap).
func alongside(a, b geom.Seg) (gap, run float64) {
	if a.Horizontal() != b.Horizontal() {
		return 0, 0
	}
	ab, bb := a.Box(), b.Box()
	if a.Horizontal() {
		return math.Abs(ab.Y0 - bb.Y0), math.Min(ab.X1, bb.X1) - math.Max(ab.X0, bb.X0)
	}
	return math.Abs(ab.X0 - bb.X0), math.Min(ab.Y1, bb.Y1) - math.Max(ab.Y0, bb.Y0)
}

// frameEdges finds frame edges through symbols, local symbols and labels
// other than the frame's own title, and wires hugging an edge.
func (r *Report) frameEdges(g *geom.Sheet, boxes []box, segs []netSeg) {
	for k, f := range g.Frames {
		name := fmt.Sprintf("frame %d %q", k+1, first(f.Title.Lines))
		for _, e := range edges(f.Box) {
			for _, b := range boxes {
				if e.CutsInterior(b.r) {
					r.FrameCuts = append(r.FrameCuts, fmt.Sprintf("edge of %s runs through %s", name, b.what))
				}
			}
			for _, l := range g.Labels {
				if (l.Owner == "" || l.Owner != f.Title.Owner) && e.CutsInterior(l.Box) {
					r.FrameCuts = append(r.FrameCuts, fmt.Sprintf("edge of %s runs through label %q", name, first(l.Lines)))
				}
			}
			for _, s := range segs {
				if s.local >= 0 {
					continue
				}
				if gap, run := alongside(e, s.seg); gap < 1-geom.Eps && run > closeRun+geom.Eps {
					r.FrameHugs = append(r.FrameHugs, fmt.Sprintf("wire of %s %s-%s runs %g from the edge of %s", s.net, pt(s.seg.A), pt(s.seg.B), gap, name))
				}
			}
		}
	}
}

// closeWires finds wires of different nets side by side one grid step apart
// or closer (wires on the same line are an overlap, reported as broken
// connectivity).
func (r *Report) closeWires(segs []netSeg) {
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box().Inset(1))
	}
	for i, a := range segs {
		if a.local >= 0 {
			continue
		}
		for _, j := range six.near(a.seg.Box().Inset(1)) {
			b := segs[j]
			if j <= i || b.local >= 0 || a.net == b.net {
				continue
			}
			if gap, run := alongside(a.seg, b.seg); gap > geom.Eps && gap < 1+geom.Eps && run > closeRun+geom.Eps {
				r.CloseWires = append(r.CloseWires, fmt.Sprintf("wires of %s %s-%s and %s %s-%s run %g apart for %g", a.net, pt(a.seg.A), pt(a.seg.B), b.net, pt(b.seg.A), pt(b.seg.B), gap, run))
			}
		}
	}
}

func first(l []string) string {
	if len(l) == 0 {
		return ""
	}
	return l[0]
}

// crossings counts perpendicular crossings of different nets and reports any
// other contact between them (overlap, a T onto another net's wire).
func (r *Report) crossings(g *geom.Sheet, segs []netSeg) {
	r.FrameCrossings = make([]int, len(g.Frames))
	var six bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	for i, a := range segs {
		for _, j := range six.near(a.seg.Box()) {
			if j <= i {
				continue
			}
			b := segs[j]
			if a.net == b.net || !a.seg.Box().Inset(geom.Eps).Overlaps(b.seg.Box().Inset(geom.Eps)) {
				continue
			}
			ah, bh := a.seg.Horizontal(), b.seg.Horizontal()
			if ah == bh {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("wires of %s and %s overlap at %s", a.net, b.net, pt(a.seg.A)))
				continue
			}
			h, v := a.seg, b.seg
			if !ah {
				h, v = v, h
			}
			p := geom.Pt{X: v.A.X, Y: h.A.Y}
			if p == h.A || p == h.B || p == v.A || p == v.B {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("wires of %s and %s touch at %s", a.net, b.net, pt(p)))
				continue
			}
			r.Crossings++
			for k, f := range g.Frames {
				if f.Box.Contains(p) {
					r.FrameCrossings[k]++
				}
			}
		}
	}
}

type unionFind []int

func (u unionFind) find(i int) int {
	for u[i] != i {
		u[i] = u[u[i]]
		i = u[i]
	}
	return i
}

func (u unionFind) join(a, b int) { u[u.find(a)] = u.find(b) }

// connectivity checks each net: its wires and stubs form connected pieces
// that reach every one of its pins; there is one piece, or every piece ends
// in a local symbol (ground, rail, net-name flag) of the net; no wire touches
// another net's pin; junctions have dots and at most three arms.
func (r *Report) connectivity(g *geom.Sheet, segs []netSeg) {
	type pinRef struct {
		what string
		net  string
		at   geom.Pt
		dir  geom.Dir
	}
	var pins []pinRef
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			if p.Net == notConnected {
				continue // a bare lead: nothing to wire, nothing to touch
			}
			pins = append(pins, pinRef{s.Ref + "." + p.Name, p.Net, p.At, p.Dir})
		}
	}
	var pix bucketed
	for i, p := range pins {
		pix.add(i, geom.Rect{X0: p.at.X, Y0: p.at.Y, X1: p.at.X, Y1: p.at.Y})
	}
	byNet := map[string][]int{}
	var nets []string
	for i, s := range segs {
		if _, ok := byNet[s.net]; !ok {
			nets = append(nets, s.net)
		}
		byNet[s.net] = append(byNet[s.net], i)
		for _, j := range pix.near(s.seg.Box()) {
			if pins[j].net != s.net && s.seg.HasPoint(pins[j].at) {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("wire of %s touches pin %s of %s", s.net, pins[j].what, pins[j].net))
			}
		}
	}
	pinsOf := map[string][]int{}
	for i, p := range pins {
		if _, ok := byNet[p.net]; !ok {
			if _, seen := pinsOf[p.net]; !seen {
				nets = append(nets, p.net)
			}
		}
		pinsOf[p.net] = append(pinsOf[p.net], i)
	}
	localsOf := map[string][]int{}
	for i, l := range g.Locals {
		localsOf[l.Net] = append(localsOf[l.Net], i)
	}
	dots := map[geom.Pt]bool{}
	for _, d := range g.Dots {
		dots[d] = true
	}
	usedDots := map[geom.Pt]bool{}
	sort.Strings(nets)
	for _, net := range nets {
		ss := byNet[net]
		ps := pinsOf[net]
		if len(ps) == 0 && len(ss) == 0 {
			continue
		}
		// nodes: segment ends, pins; a node on a segment's inside joins it
		idx := map[geom.Pt]int{}
		node := func(p geom.Pt) int {
			if i, ok := idx[p]; ok {
				return i
			}
			idx[p] = len(idx)
			return idx[p]
		}
		for _, i := range ss {
			node(segs[i].seg.A)
			node(segs[i].seg.B)
		}
		for _, i := range ps {
			node(pins[i].at)
		}
		pts := make([]geom.Pt, len(idx))
		for p, i := range idx {
			pts[i] = p
		}
		uf := make(unionFind, len(idx))
		for i := range uf {
			uf[i] = i
		}
		arms := make([]int, len(idx))
		for _, i := range ps {
			arms[idx[pins[i].at]]++ // the pin's lead
		}
		for _, i := range ss {
			s := segs[i].seg
			a, b := idx[s.A], idx[s.B]
			uf.join(a, b)
			arms[a]++
			arms[b]++
			for k, p := range pts {
				if k != a && k != b && s.HasPoint(p) {
					uf.join(a, k)
					arms[k] += 2
				}
			}
		}
		pieces := map[int]bool{}
		for k := range pts {
			pieces[uf.find(k)] = true
		}
		withLocal := map[int]bool{}
		for _, li := range localsOf[net] {
			if k, ok := idx[g.Locals[li].At]; ok {
				withLocal[uf.find(k)] = true
			} else {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("local symbol of %s at %s is not on a wire", net, pt(g.Locals[li].At)))
			}
		}
		if len(pieces) > 1 {
			for k := range pieces {
				if !withLocal[k] {
					r.Connectivity = append(r.Connectivity, fmt.Sprintf("net %s is in %d pieces and the one at %s has no ground, rail or flag", net, len(pieces), pt(pts[k])))
				}
			}
		}
		if len(pieces) == 1 && len(ps) > 1 && len(ss) == 0 {
			r.Connectivity = append(r.Connectivity, fmt.Sprintf("net %s has no wires", net))
		}
		for _, i := range ps {
			k := idx[pins[i].at]
			if len(ps) > 1 && arms[k] < 2 && len(localsOf[net]) == 0 {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("pin %s of %s is not wired", pins[i].what, net))
			}
			if len(ps) > 1 && arms[k] < 2 && len(localsOf[net]) > 0 && !withLocal[uf.find(k)] {
				r.Connectivity = append(r.Connectivity, fmt.Sprintf("pin %s of %s is not wired", pins[i].what, net))
			}
		}
		for k, p := range pts {
			switch {
			case arms[k] >= 4:
				r.Junctions = append(r.Junctions, fmt.Sprintf("four-way junction of %s at %s", net, pt(p)))
			case arms[k] == 3:
				if !dots[p] {
					r.Junctions = append(r.Junctions, fmt.Sprintf("junction of %s at %s has no dot", net, pt(p)))
				}
				usedDots[p] = true
			}
		}
		// bends: two perpendicular segment ends meeting, no pin there
		nb := 0
		ends := map[geom.Pt][2]int{}
		for _, i := range ss {
			s := segs[i].seg
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
		for p, e := range ends {
			if e[0] == 1 && e[1] == 1 && arms[idx[p]] == 2 {
				nb++
			}
		}
		r.Bends += nb
		r.MaxBends = max(r.MaxBends, nb)
	}
	for _, d := range g.Dots {
		if !usedDots[d] {
			r.Junctions = append(r.Junctions, "dot at "+pt(d)+" is not on a junction")
		}
	}
}
