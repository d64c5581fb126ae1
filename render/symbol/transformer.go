package symbol

import (
	"math"
	"slices"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

// transformer draws the first half of the coils (primary first) on the left,
// bulging right, the rest on the right bulging left; each coil's end and tap
// pins point outwards. An iron core is a pair of lines between the sides,
// one adjustable core under all the windings a dashed line.
func transformer(p *graph.Part, st Style, m Marks) Shape {
	// coils stand 0.9 either side of the centre so that their humps (0.4
	// deep) clear the core lines at ±0.2 and read at print size
	s := Shape{Turns: flipOnly}
	cs := coils(p)
	nLeft := (len(cs) + 1) / 2
	// the shorter side stands centred against the longer one (a single
	// secondary across a centre-tapped primary), on whole grid steps
	sideH := [2]float64{-2, -2}
	for i, c := range cs {
		k := 0
		if i >= nLeft {
			k = 1
		}
		sideH[k] += c.length() + 2
	}
	yl := math.Floor((math.Max(sideH[0], sideH[1]) - sideH[0]) / 2)
	yr := math.Floor((math.Max(sideH[0], sideH[1]) - sideH[1]) / 2)
	if len(cs) <= nLeft {
		yr = 0
	}
	for i, c := range cs {
		if i < nLeft {
			yl = s.addCoil(c, -1, yl, st, adjustable(p, cs, i, m.Tuned))
		} else {
			yr = s.addCoil(c, 1, yr, st, adjustable(p, cs, i, m.Tuned))
		}
	}
	height := math.Max(yl, yr) - 2
	switch {
	case ironCored(p):
		s.Prims = append(s.Prims, thick(pt(-0.2, 0), pt(-0.2, height)), thick(pt(0.2, 0), pt(0.2, height)))
	case slices.Contains(p.Adjust, graph.CoreWhole):
		// one adjustable dust or ferrite core under every winding (an
		// oscillator coil's tuned, feedback and link windings): one
		// dashed core line down the middle, the whole symbol's height,
		// so the windings either side read as one part on one core, not
		// as separate coils (review15 b05's T2)
		s.Prims = append(s.Prims, Prim{Kind: Line, Pts: []geom.Pt{pt(0, 0), pt(0, height)}, Dash: true})
	}
	s.Box = geom.R(-2, 0, 2, height)
	return s.Moved(pt(0, -math.Round(height/2)))
}

// addCoil draws one coil from row top down, on the left (side -1) or the
// right (side 1), and returns the row where the next coil on that side
// starts. The sections between a coil's taps are as long as their share of
// the turns (sections), so a tap stands at its true place along the coil.
func (s *Shape) addCoil(c coil, side, top float64, st Style, adjust bool) float64 {
	x, px, dir := -0.9, -2.0, geom.Left
	if side > 0 {
		x, px, dir = 0.9, 2, geom.Right
	}
	lens := c.sections()
	at := top
	for k, name := range c.pins {
		s.Pins = append(s.Pins, pin(name, px, at, dir))
		s.Prims = append(s.Prims, line(pt(px, at), pt(x, at)))
		if k < len(lens) {
			a, b := at, at+lens[k]
			// leads from the pin rows to the coil, then the turns along y,
			// 0.8 grid steps each, as an untapped winding
			n := int(math.Max(1, math.Round((b-a-0.8)/0.8)))
			s.Prims = append(s.Prims, line(pt(x, a), pt(x, a+0.4)), line(pt(x, b-0.4), pt(x, b)))
			s.Prims = append(s.Prims, turns(pt(x, a+0.4), pt(x, b-0.4), pt(-side, 0), n, st)...)
			at = b
		}
	}
	// the winding's start, by the dot convention (IEC 60617 / IEEE 315
	// polarity mark): the first pin of each winding as written
	dx := -0.45
	if side > 0 {
		dx = 0.45
	}
	s.Prims = append(s.Prims, Prim{Kind: Circle, Pts: []geom.Pt{pt(x+dx, top+0.5)}, R: 0.13, Fill: true})
	if adjust {
		// an adjustable core: the preset mark across this winding
		mid := top + c.length()/2
		s.Prims = append(s.Prims, presetMark(pt(x-side*0.6, mid+1.4), pt(x+side*0.8, mid-0.8))...)
	}
	return top + c.length() + 2
}

// adjustable says whether the i-th coil has a core the repairer turns: its
// own winding is named in the part's adjust list, or the part has one core
// for the whole, marked on the first coil with a capacitor across it (an
// oscillator coil's tuned winding, not its feedback winding drawn first),
// or on the first coil when none is tuned on the sheet.
func adjustable(p *graph.Part, cs []coil, i int, tuned [][2]string) bool {
	for _, a := range p.Adjust {
		if a == graph.CoreWhole && i == wholeCore(cs, tuned) {
			return true
		}
		for _, w := range cs[i].windings {
			if a == w.Name {
				return true
			}
		}
	}
	return false
}

// wholeCore is the coil a core adjusting the whole part is marked on: the
// first one spanning a tuned winding's two ends, else the first.
func wholeCore(cs []coil, tuned [][2]string) int {
	for i, c := range cs {
		for _, t := range tuned {
			if slices.Contains(c.pins, t[0]) && slices.Contains(c.pins, t[1]) {
				return i
			}
		}
	}
	return 0
}

// coils groups a transformer's windings into chains (a centre-tapped winding
// is two windings sharing its tap pin), sorted by first pin.
func coils(p *graph.Part) []coil {
	ws := append([]graph.Winding(nil), p.Windings...)
	sort.Slice(ws, func(i, j int) bool { return ws[i].Name < ws[j].Name })
	used := make([]bool, len(ws))
	var out []coil
	for i := range ws {
		if used[i] {
			continue
		}
		used[i] = true
		c := coil{pins: []string{ws[i].From, ws[i].To}, windings: []graph.Winding{ws[i]}}
		for grown := true; grown; {
			grown = false
			for j := range ws {
				if used[j] {
					continue
				}
				switch {
				case ws[j].From == c.pins[len(c.pins)-1]:
					c.pins = append(c.pins, ws[j].To)
					c.windings = append(c.windings, ws[j])
				case ws[j].To == c.pins[0]:
					c.pins = append([]string{ws[j].From}, c.pins...)
					c.windings = append([]graph.Winding{ws[j]}, c.windings...)
				default:
					continue
				}
				used[j], grown = true, true
			}
		}
		out = append(out, c)
	}
	return out
}

// coil is a chain of windings joined at taps, drawn as one vertical coil.
type coil struct {
	pins     []string
	windings []graph.Winding // in chain order: windings[k] runs pins[k]–pins[k+1]
}

// minSection is the shortest section between a coil's pins: the local
// ground and rail marks at neighbouring pins need three grid steps.
const minSection = 3

// maxCoil is the longest a coil grows so that a tap near one end keeps
// its section short and the other long.
const maxCoil = 12

// turnShares are the windings' shares of the coil's turns (√L: the halves
// of one tapped coil are tightly coupled, inductance goes with turns
// squared); equal shares when an inductance is unknown.
func (c coil) turnShares() []float64 {
	n := len(c.windings)
	out, sum := make([]float64, n), 0.0
	for k, w := range c.windings {
		out[k] = math.Sqrt(math.Max(w.L, 0))
		sum += out[k]
	}
	for k := range out {
		if sum > 0 && out[k] > 0 {
			out[k] /= sum
		} else {
			out[k] = 1 / float64(n)
		}
	}
	return out
}

// length is the coil's height in grid steps: four per section, as an
// untapped winding is drawn, or longer (up to maxCoil) when a tap near an
// end needs it to keep its section in proportion.
func (c coil) length() float64 {
	n := len(c.windings)
	l := 4 * float64(n)
	if n < 2 {
		return l
	}
	least := 1.0
	for _, s := range c.turnShares() {
		least = math.Min(least, s)
	}
	return math.Max(l, math.Min(maxCoil, math.Ceil(minSection/least)))
}

// sections shares the coil's length between its windings by turns, on
// whole grid steps and at least minSection each, so a tap stands near its
// true place along the coil and never mid-winding by default.
func (c coil) sections() []float64 {
	shares := c.turnShares()
	n := len(shares)
	total := c.length()
	out := make([]float64, n)
	if n == 1 {
		return []float64{total}
	}
	left := total
	for k, sh := range shares {
		rest := float64(n-1-k) * minSection // room the later sections need
		out[k] = math.Max(minSection, math.Min(left-rest, math.Round(total*sh)))
		if k == n-1 {
			out[k] = left // the last takes what is left: the coil's length is kept
		}
		left -= out[k]
	}
	return out
}
