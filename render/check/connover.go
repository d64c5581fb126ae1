package check

import (
	"fmt"
	"math"
	"sort"

	"pare/render/geom"
)

// overReach is how far, in grid steps, a connector's run may pass above or
// below a frame and still read as running over it, round the stage.
const overReach = 4.0

// ConnectorsOverFrames lists the off-row connectors of one page that stand
// on the wrong side of a stage: the connector's run (its net's wire from
// the connector to the first junction or pin, as ConnectorWires reads it)
// passes a whole stage frame on its way, the frame lying between the
// connector and the run's far end across the page and within overReach of
// the run up or down the page. A connector stands beside its net's
// nearest pin on the side its other end lies (review21 b04: "mid" and
// "spk" connectors at the left margin, their wires looped over the output
// pair's frame to the output capacitor on the right). One line per
// connector and frame, sorted.
func ConnectorsOverFrames(g *geom.Sheet) []string {
	var out []string
	for _, s := range g.Symbols {
		if _, _, ok := geom.ConnectorOf(s.Ref); !ok || len(s.Pins) != 1 {
			continue
		}
		segs := leadRun(g, s.Pins[0])
		if len(segs) == 0 {
			continue
		}
		run := segs[0].Box()
		for _, sg := range segs[1:] {
			run = run.Union(sg.Box())
		}
		from, to := s.Pins[0].At.X, segs[len(segs)-1].B.X
		lo, hi := math.Min(from, to), math.Max(from, to)
		for k, f := range g.Frames {
			b := f.Box
			if b.X0 > lo+geom.Eps && b.X1 < hi-geom.Eps && b.Y0 <= run.Y1+overReach && b.Y1 >= run.Y0-overReach {
				out = append(out, fmt.Sprintf("wire to connector %s runs over frame %d %q", s.Ref, k+1, first(f.Title.Lines)))
			}
		}
	}
	sort.Strings(out)
	return out
}
