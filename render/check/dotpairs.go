package check

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"pare/render/geom"
)

// dotPairs finds junction dots of nets with nothing in common less than
// dotClear apart on one line (one above the other or side by side): at
// print size the two dots, a dot-width or two apart, read as one joint,
// the two nets as joined (review20 a04: the HT line's dot at a
// decoupler's foot a grid step above the grid line's dot at the coupling
// capacitor's top, read as HT on the grid).
func (r *Report) dotPairs(g *geom.Sheet, segs []netSeg) {
	var six, dix bucketed
	for i, s := range segs {
		six.add(i, s.seg.Box())
	}
	nets := make([][]string, len(g.Dots)) // the nets through each dot, sorted
	for i, d := range g.Dots {
		here := geom.Rect{X0: d.X, Y0: d.Y, X1: d.X, Y1: d.Y}
		dix.add(i, here)
		seen := map[string]bool{}
		for _, j := range six.near(here) {
			if n := segs[j].net; !seen[n] && pointSeg(d, segs[j].seg) < geom.Eps {
				seen[n] = true
				nets[i] = append(nets[i], n)
			}
		}
		sort.Strings(nets[i])
	}
	for i, d := range g.Dots {
		for _, j := range dix.near(geom.Rect{X0: d.X, Y0: d.Y, X1: d.X, Y1: d.Y}.Inset(dotClear)) {
			e := g.Dots[j]
			dd := math.Hypot(d.X-e.X, d.Y-e.Y)
			inLine := math.Abs(d.X-e.X) < geom.Eps || math.Abs(d.Y-e.Y) < geom.Eps
			if j <= i || !inLine || dd >= dotClear-geom.Eps || len(nets[i]) == 0 || len(nets[j]) == 0 || shareNet(nets[i], nets[j]) {
				continue
			}
			r.DotPairs = append(r.DotPairs, fmt.Sprintf("junction dots of %s at %s and of %s at %s, %g apart on one line",
				strings.Join(nets[i], "+"), pt(d), strings.Join(nets[j], "+"), pt(e), dd))
		}
	}
	sort.Strings(r.DotPairs)
}

func shareNet(a, b []string) bool {
	for _, x := range a {
		for _, y := range b {
			if x == y {
				return true
			}
		}
	}
	return false
}
