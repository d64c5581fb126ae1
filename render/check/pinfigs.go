package check

import (
	"fmt"
	"sort"
	"strings"

	"pare/render/geom"
)

// figuresAstray lists the pin figures (small labels owned "REF.PIN") that
// read as another wire's by geom.FigureAstray: set in line past another
// net's wire end, or with a wire between them and their own pin (review20
// b01: a base's volts in line with the emitter's connector read as the
// emitter fed to the base).
func (r *Report) figuresAstray(g *geom.Sheet) {
	pins := map[string]geom.Pin{}
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			pins[s.Ref+"."+p.Name] = p
		}
	}
	segs := geom.NetSegs(g)
	for _, l := range g.Labels {
		if !l.Small || !strings.Contains(l.Owner, ".") {
			continue
		}
		p, ok := pins[l.Owner]
		if !ok {
			continue
		}
		reach := l.Box.Inset(5)
		var near []geom.NetSeg
		for _, s := range segs {
			if s.Touches(reach) {
				near = append(near, s)
			}
		}
		if why := geom.FigureAstray(l.Box, p.At, p.Net, near); why != "" {
			r.FiguresAstray = append(r.FiguresAstray, fmt.Sprintf("%s's figure %q at %s reads as another wire's: %s", l.Owner, strings.Join(l.Lines, " "), pt(geom.Pt{X: l.Box.X0, Y: l.Box.Y0}), why))
		}
	}
	sort.Strings(r.FiguresAstray)
}
