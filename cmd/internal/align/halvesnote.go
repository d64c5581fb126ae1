package align

import (
	"fmt"
	"math/cmplx"
	"strings"

	"pare/graph"
	"pare/graph/ac"
)

// A push-pull pair is one stage: its two halves are driven side by side,
// in antiphase, and work in parallel for the signal (halves, inject.go). A
// row at one half says so and gains past the pair; a row whose gain is
// taken to one half's control electrode says what the solver gives the
// other half, and in which phase, so nobody reads the pair as two stages
// in a row.

// halvesNote is the row's words about a pair: "" when neither the point
// nor its gain target is one of a pair's halves.
func halvesNote(c *graph.Circuit, pts []point, i int, in Injection) string {
	if h := pts[i].halves; h != "" {
		if len(otherHalves(pts, i)) == 0 {
			// the other half's control electrode is held at AC ground
			// (dropDecoupled): a long-tailed pair driven on one grid
			return fmt.Sprintf("the driven half of the pair %s (the other half's control electrode is at AC ground, so the pair is driven from here alone): the pair is one stage, so its gain is taken past both halves", h)
		}
		return fmt.Sprintf("one half of the push-pull pair %s (the other half on %s, driven beside it): the pair is one stage, so its gain is taken past both halves", h, strings.Join(otherHalves(pts, i), ", "))
	}
	j := pointOn(pts, in.GainTo)
	if j < 0 || pts[j].halves == "" {
		return ""
	}
	var parts []string
	for _, n := range otherHalves(pts, j) {
		h1, err1 := transferAt(c, in.Net, in.GainTo, in)
		h2, err2 := transferAt(c, in.Net, n, in)
		if err1 != nil || err2 != nil || cmplx.Abs(h1) == 0 {
			continue
		}
		phase := "in phase"
		if real(h2/h1) < 0 {
			phase = "in antiphase"
		}
		parts = append(parts, fmt.Sprintf("%s, gets ×%.3g %s", n, cmplx.Abs(h2), phase))
	}
	if len(parts) == 0 {
		return ""
	}
	return fmt.Sprintf("one half of the push-pull pair %s; the other half, %s (the solver's): the pair is one stage", pts[j].halves, strings.Join(parts, "; "))
}

// otherHalves are the nets of the other halves of point k's pair.
func otherHalves(pts []point, k int) []string {
	var out []string
	for j := range pts {
		if j != k && pts[j].halves == pts[k].halves {
			out = append(out, pts[j].net)
		}
	}
	return out
}

// pointOn is the index of the point on net, or -1.
func pointOn(pts []point, net string) int {
	for j := range pts {
		if pts[j].net == net {
			return j
		}
	}
	return -1
}

// transferAt is the complex V(out)/V(in) at the row's frequency and gang.
func transferAt(c *graph.Circuit, in, out string, row Injection) (complex128, error) {
	r, err := ac.NewTransfer(c, in, out, row.Options())
	if err != nil {
		return 0, err
	}
	return r.At(row.Freq)
}
