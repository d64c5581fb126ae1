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
	"pare/render/symbol"
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
	// FrameIntruders are symbols inside a stage's frame that are parts of
	// another stage: a frame says "these parts are this stage", so one
	// enclosing another stage's transistor tells a wrong story.
	FrameIntruders []string
	// ForeignFrames are wires running through a stage's frame that holds
	// none of their net's pins: the wire reads as part of that stage.
	ForeignFrames []string
	// WireBoxes are nets whose wires run along three or four sides of a
	// stage title or a part: a box the eye reads as a loop round it.
	WireBoxes []string
	// FrameStrays are symbols of parts in no stage inside a frame: not
	// wrong (the part belongs to no other stage), but worth a look.
	FrameStrays []string
	// CloseWires are runs of two nets' wires side by side on neighbouring
	// grid lines (one grid step apart or less) for more than closeRun steps:
	// at print size they read as one thick line or a bus.
	CloseWires []string
	// FrameHugs are wires running along a frame edge less than a grid step
	// from it for more than closeRun steps: the dashed edge and the wire
	// blur into a double line.
	FrameHugs []string
	// Beside are wires of two nets parallel, overlapping in extent and
	// closer than apartMin: they read as joined or as a bus.
	Beside []string
	// InLine are wires of two nets on one line with a short empty gap
	// between their ends: they read as one wire.
	InLine []string
	// EndsNear are symbols' ends (a pin, a flag's tip) within a grid step
	// of a wire of a net the symbol has no pin on: they read as joined.
	EndsNear []string
	// EndsInLine are wires of two nets on one line whose ends are endGap
	// grid steps or less apart with a part beside the gap but none across
	// it (InLine passes them): they read as one wire all the same.
	EndsInLine []string
	// NearDots are crossings of two nets' wires closer than dotClear to a
	// junction dot of either net: the eye takes the crossing for part of
	// the junction.
	NearDots []string
	// DotPairs are junction dots of unrelated nets closer than two grid
	// steps on one line: they read as one joint (dotpairs.go).
	DotPairs []string
	// NearPins are crossings of two nets' wires closer than leadClear to
	// a part's pin on either net: the crossing wire reads as joined at the
	// pin, a part with pins on both nets as shorted (leads.go).
	NearPins []string
	// AlongParts are two-terminal parts with a wire of one of their own
	// nets drawn beside them, parallel and close, over most of their
	// length: the part reads as shorted by it (alongpart.go).
	AlongParts []string
	// CommonLeads are crossings on the run of wire leaving a device's
	// emitter, source or cathode: the crossing wire reads as joined to the
	// lead (leads.go).
	CommonLeads []string
	// LongWires are nets wired much longer than their stage is wide
	// (reported, not a fault).
	LongWires []string
	// SmallText are labels of a page of paper (geom.Sheet.PageMM) that
	// print under MinTextMM: a page drawn smaller than the paper's scale
	// to hold a row the page flow could not cut.
	SmallText []string
	// FarTanks are capacitors across a winding drawn more than tankReach
	// grid steps from it: a tuned circuit's L and C stand side by side.
	FarTanks []string
	// MixerOrder are frequency changers drawn out of the trade's order: an
	// IF transformer left of its mixer, an oscillator coil not below it.
	MixerOrder []string
	// FeedOrder are transformers drawn left of the device whose output
	// feeds them: the signal read right to left.
	FeedOrder []string
	// LocalsOn are earth symbols, rail tags and net flags touching another
	// net's wire or within half a grid step of its pin or junction dot:
	// they read as that net going to earth, the rail or the flag's net (a
	// finding). LocalsNear are those within a grid step: a reader may
	// take them so too.
	LocalsOn, LocalsNear []string
	// EarthsFacing are earth symbols whose bars face another net's wire
	// less than a grid step straight on (locals.go): the stub reads as
	// carried on through the bars, that net as earthed (review21 b05: an
	// earth over the aerial tank's hot junction).
	EarthsFacing []string
	// LooseEnds are pins alone on their net on the sheet with nothing
	// drawn at them: no wire, no earth, tag or flag (connect.go). A lead
	// that ends in the air reads as a wire left off the drawing (review21
	// b05's oscillator coil: its band-switched extension winding's free
	// end on the reduced sheet, where the switch no longer stands).
	LooseEnds []string
	// FiguresAstray are pin figures set where they read as another wire's
	// (pinfigs.go): in line past another net's wire end, or with a wire
	// between them and their pin.
	FiguresAstray []string
	// TagsOnParts are rail tags closer than half a grid step to a part's
	// body or pins (tags.go): the tag reads as the part's label.
	TagsOnParts    []string
	Crossings      int   // wire–wire crossings of different nets
	FrameCrossings []int // crossings inside each frame, in frame order
	Bends          int   // bends over all wires
	MaxBends       int   // most bends on one net
	Flagged        int   // nets drawn with net-name flags instead of wires
}

// Problems lists every fatal finding: overlaps, wires through symbols,
// broken connectivity, bad junctions, text on paper under MinTextMM.
// LocalsOn is not among them yet: faded heater and suppressor pins of
// fixture sheets still hold some (cmd/pare's misreadCeiling counts them).
func (r *Report) Problems() []string {
	var out []string
	for _, l := range [][]string{r.SymbolOverlaps, r.WireThrough, r.LabelOverlaps, r.FrameCuts, r.FrameIntruders, r.Connectivity, r.Junctions, r.SmallText} {
		out = append(out, l...)
	}
	return out
}

// Misreadings lists what a reader would take for a connection that is not
// there: unrelated wires beside each other closer than apartMin, or in line
// across a short gap, a symbol's end close to an unrelated wire, and a frame
// holding another stage's part.
func (r *Report) Misreadings() []string {
	return append(append(append(append(append(append([]string{}, r.Beside...), r.InLine...), r.EndsNear...), r.EndsInLine...), r.NearDots...), r.FrameIntruders...)
}

// Crowding lists the readability findings that are not fatal to the
// geometry but spoil a printed sheet: wires side by side, wires hugging a
// frame edge.
func (r *Report) Crowding() []string {
	return append(append([]string{}, r.CloseWires...), r.FrameHugs...)
}

// Summary is one line of the measured qualities.
func (r *Report) Summary() string {
	return fmt.Sprintf("overlaps %d, wires through symbols %d, label overlaps %d, frame cuts %d, connectivity %d, junctions %d, close wires %d, frame hugs %d, wires beside %d, wires in line %d, long wires %d, crossings %d (per frame %v), bends %d (max %d per net), flagged nets %d",
		len(r.SymbolOverlaps), len(r.WireThrough), len(r.LabelOverlaps), len(r.FrameCuts), len(r.Connectivity), len(r.Junctions),
		len(r.CloseWires), len(r.FrameHugs), len(r.Beside), len(r.InLine), len(r.LongWires), r.Crossings, r.FrameCrossings, r.Bends, r.MaxBends, r.Flagged)
}

// notConnected is the netlist format's net for a terminal that is really not
// connected (docs/netlist.md): its pins are never joined to each other.
const notConnected = "nc"

type netSeg struct {
	net   string
	seg   geom.Seg
	local int // index of the local symbol whose stub this is, or -1
	body  int // 1 + the index of the flag whose body this is (flagBodies), or 0
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
	boxes, nSym := symbolBoxes(g)
	var bix bucketed
	for i, b := range boxes {
		bix.add(i, b.r)
	}
	segs := sheetSegs(g)
	r.symbolOverlaps(boxes, &bix)
	r.wiresThrough(segs, boxes, &bix, nSym)
	r.labels(g, boxes, &bix, segs)
	r.frameEdges(g, boxes, segs)
	r.frameIntruders(g)
	r.foreignFrames(g)
	r.wireBoxes(g)
	r.closeWires(segs)
	r.misreadings(append(segs[:len(segs):len(segs)], flagBodies(g)...), boxes, &bix)
	r.endsNear(g, segs)
	r.localsNear(g, segs)
	r.earthsFacing(g, segs)
	r.tagsOnParts(g)
	r.figuresAstray(g)
	r.longWires(g)
	r.farTanks(g)
	r.mixerOrder(g)
	r.feedOrder(g)
	xs := r.crossings(g, segs)
	r.nearDots(g, segs, xs)
	r.dotPairs(g, segs)
	r.nearPins(g, xs)
	r.alongParts(g)
	r.commonLeads(g, xs)
	r.connectivity(g, segs)
	if g.PageMM > 0 {
		r.SmallText = TextHeights(g, g.PageMM, symbol.SmallScale, MinTextMM)
	}
	for _, l := range [][]string{r.SymbolOverlaps, r.WireThrough, r.LabelOverlaps, r.FrameCuts, r.FrameIntruders, r.ForeignFrames, r.WireBoxes, r.FrameStrays, r.CloseWires, r.FrameHugs, r.Beside, r.InLine, r.EndsNear, r.EndsInLine, r.NearDots, r.LocalsOn, r.LocalsNear, r.EarthsFacing, r.LooseEnds, r.TagsOnParts, r.LongWires, r.FarTanks, r.Connectivity, r.Junctions, r.AlongParts, r.CommonLeads} {
		sort.Strings(l)
	}
	return r
}

// symbolBoxes lists the symbols' boxes, then the local symbols' (so the
// local symbol i is box nSym+i, which lets a stub skip its own symbol).
func symbolBoxes(g *geom.Sheet) (boxes []box, nSym int) {
	for _, s := range g.Symbols {
		boxes = append(boxes, box{"symbol " + s.Ref, s.Box})
	}
	nSym = len(boxes)
	for _, l := range g.Locals {
		boxes = append(boxes, box{fmt.Sprintf("local %s at %s.%s", l.Net, l.Owner, l.Pin), l.Box})
	}
	return boxes, nSym
}

// sheetSegs lists every wire segment, then every local symbol's stub,
// each with its net: the checks treat both as wire.
func sheetSegs(g *geom.Sheet) []netSeg {
	var segs []netSeg
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			segs = append(segs, netSeg{net: w.Net, seg: s, local: -1})
		}
	}
	for i, l := range g.Locals {
		for _, s := range l.Stub {
			segs = append(segs, netSeg{net: l.Net, seg: s, local: i})
		}
	}
	return segs
}

// symbolOverlaps reports each pair of boxes sharing interior once.
func (r *Report) symbolOverlaps(boxes []box, bix *bucketed) {
	for i, a := range boxes {
		for _, j := range bix.near(a.r) {
			if j > i && a.r.Overlaps(boxes[j].r) {
				r.SymbolOverlaps = append(r.SymbolOverlaps, a.what+" overlaps "+boxes[j].what)
			}
		}
	}
}

// wiresThrough reports wires and stubs running through a symbol; a stub
// may end inside its own local symbol.
func (r *Report) wiresThrough(segs []netSeg, boxes []box, bix *bucketed, nSym int) {
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
}

// labels reports labels overlapping each other or a symbol, and wires
// touching a label: any of them makes the text hard to read.
func (r *Report) labels(g *geom.Sheet, boxes []box, bix *bucketed, segs []netSeg) {
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

// crossing is where two nets' wires cross.
type crossing struct {
	at   geom.Pt
	a, b string
}

// crossings counts perpendicular crossings of different nets and reports any
// other contact between them (overlap, a T onto another net's wire); it
// returns the crossings.
func (r *Report) crossings(g *geom.Sheet, segs []netSeg) []crossing {
	var xs []crossing
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
			xs = append(xs, crossing{p, a.net, b.net})
			for k, f := range g.Frames {
				if f.Box.Contains(p) {
					r.FrameCrossings[k]++
				}
			}
		}
	}
	return xs
}
