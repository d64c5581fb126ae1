package layout

import (
	"math"
	"strings"

	"pare/render/geom"
	"pare/render/symbol"
)

// growFrames widens each frame (a copy of the placed frames) to hold the
// wires of nets that lie wholly inside its stage, so that a detour never
// leaves its own frame.
func (ly *state) growFrames(g *geom.Sheet) []geom.Frame {
	frames := append([]geom.Frame(nil), ly.frames...)
	if len(frames) == 0 {
		return frames
	}
	stageOfNet := map[string]int{}
	for _, cl := range ly.cells {
		s, ok := ly.stageOf[cl.ref]
		if !ok || cl.edge != 0 {
			s = -1
		}
		for _, p := range cl.shape.Pins {
			if prev, seen := stageOfNet[p.Net]; seen && prev != s {
				s = -1
			}
			stageOfNet[p.Net] = s
		}
	}
	frameOf := map[int]int{}
	for i, s := range ly.frameStage {
		frameOf[s] = i
	}
	for _, w := range g.Wires {
		s, ok := stageOfNet[w.Net]
		f, drawn := frameOf[s]
		if !ok || s < 0 || !drawn {
			continue
		}
		// grow up or down only: frames stand side by side, so growing
		// sideways could run one into the next
		fb := &frames[f].Box
		for _, seg := range w.Segs {
			sb := seg.Box()
			if sb.X1 < fb.X0 || sb.X0 > fb.X1 {
				continue
			}
			// a grid step and a half: the edge never runs along the wire
			// half a step from it
			fb.Y0 = math.Min(fb.Y0, sb.Y0-framePad-0.5)
			fb.Y1 = math.Max(fb.Y1, sb.Y1+framePad+0.5)
		}
	}
	ly.liftTitles(frames, g)
	return frames
}

// makeFrames draws a frame round each stage's parts with its title inside
// the top edge.
func (ly *state) makeFrames() {
	for i, f := range ly.o.Frames {
		b := geom.Rect{}
		for _, cl := range ly.cells {
			if s, ok := ly.stageOf[cl.ref]; ok && s == i && cl.edge == 0 {
				b = b.Union(cl.footprint())
			}
		}
		if b == (geom.Rect{}) {
			continue
		}
		lines, head := titleLines(f, b.W())
		h := symbol.LineH * float64(len(lines))
		w := titleWidth(f, b.W()) - 2*framePad
		title := geom.Label{Owner: "frame:" + f.Title, Lines: lines, Small: true, Head: head,
			Box: geom.Rect{X0: b.X0, Y0: b.Y0 - 2.2 - h, X1: b.X0 + w, Y1: b.Y0 - 2.2}}
		box := halfGrid(b.Union(title.Box).Inset(framePad + 0.5))
		ly.frames = append(ly.frames, geom.Frame{Box: box, Title: title, Parts: f.Parts})
		ly.frameStage = append(ly.frameStage, i)
	}
}

// minTitleChars is the narrowest a frame title is wrapped to.
const minTitleChars = 24

// titleLines wraps a frame's title and figures to the width of its parts
// (but no narrower than minTitleChars); head is the number of title lines.
func titleLines(f Frame, width float64) (lines []string, head int) {
	chars := int(math.Max(minTitleChars, math.Floor(width/symbol.CharW)))
	lines = WrapWords(f.Title, chars)
	head = len(lines)
	if f.Subtitle != "" {
		lines = append(lines, WrapWords(f.Subtitle, int(float64(chars)/symbol.SmallScale))...)
	}
	return lines, head
}

// halfGrid rounds a box out to half-grid lines, so that a frame's edge
// never lies along a wire (wires run on whole grid lines).
func halfGrid(r geom.Rect) geom.Rect {
	return geom.Rect{X0: math.Floor(r.X0) - 0.5, Y0: math.Floor(r.Y0) - 0.5, X1: math.Ceil(r.X1) + 0.5, Y1: math.Ceil(r.Y1) + 0.5}
}

func titleWidth(f Frame, width float64) float64 {
	lines, head := titleLines(f, width)
	w := 0.0
	for i, l := range lines {
		lw := symbol.TextWidth(l)
		if i >= head {
			lw *= symbol.SmallScale
		}
		w = math.Max(w, lw)
	}
	return w + 2*framePad
}

// WrapWords breaks text into lines of at most n characters at spaces (frame
// titles here, the caution line in render).
func WrapWords(s string, n int) []string {
	var out []string
	line := ""
	for _, w := range strings.Fields(s) {
		if line != "" && len([]rune(line))+1+len([]rune(w)) > n {
			out = append(out, line)
			line = w
			continue
		}
		if line != "" {
			line += " "
		}
		line += w
	}
	if line != "" {
		out = append(out, line)
	}
	return out
}
