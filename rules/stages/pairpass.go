package stages

import (
	"fmt"
	"math"

	"pare/graph/ac"
	"pare/graph/figure"
)

// The band a coupled pair passes, as the solver gives it: the −3 dB edges
// of the secondary's response, their centre, and the humps inside them.
// A technician aligning an IF reads the centre (where the cans, tuned
// alike, put the pass band) and, on an over-coupled pair, two humps either
// side of it; the primary's voltage at the anode peaks off the centre
// (the secondary's load pulls it), and read as the IF it sends him to
// retune a good can (review22 a02: 466.1 kHz at the anode, cans at
// 469.3 kHz).

// passband is a pair's solved pass band: the −3 dB edges lo and hi and the
// humps (the response's local maxima between them, lowest first).
type passband struct {
	lo, hi float64
	humps  []float64
	dipDB  float64 // how far the response between two humps falls below the lower hump
}

// centre is the middle of the pass band, √(lo·hi): a tuned pass band is
// symmetric on a log scale about its resonance (handbook, from memory).
func (p passband) centre() float64 { return math.Sqrt(p.lo * p.hi) }

// minDipDB is the least dip between two maxima for them to count as two
// humps: a tenth of a decibel, below what a meter on the bench shows
// (common practice, no source), so a flat top's rounding noise is one.
const minDipDB = 0.1

// humpsIn finds the local maxima of r between lo and hi on a fine grid,
// with the dip between the outer two.
func humpsIn(r *ac.Response, lo, hi float64) ([]float64, float64) {
	const n = 600
	fs, ms := make([]float64, n), make([]float64, n)
	for i := range fs {
		fs[i] = lo * math.Pow(hi/lo, float64(i)/(n-1))
		ms[i] = magnitude(r, fs[i])
	}
	var at []int
	for i := 1; i < n-1; i++ {
		if ms[i] > ms[i-1] && ms[i] >= ms[i+1] {
			at = append(at, i)
		}
	}
	if len(at) < 2 {
		if len(at) == 1 {
			return []float64{fs[at[0]]}, 0
		}
		return nil, 0
	}
	a, b := at[0], at[len(at)-1]
	low := ms[a]
	for i := a; i <= b; i++ {
		low = math.Min(low, ms[i])
	}
	dip := 20 * math.Log10(math.Min(ms[a], ms[b])/low)
	if dip < minDipDB {
		top := a
		if ms[b] > ms[a] {
			top = b
		}
		return []float64{fs[top]}, 0
	}
	return []float64{fs[a], fs[b]}, dip
}

// pairPassFigures puts the pass band's centre, and an over-coupled pair's
// humps, beside the pair's bandwidth.
func (x *figCtx) pairPassFigures(p passband) {
	at := figure.BySolver("−3 dB band of the secondary's response, its centre √(f lo·f hi)", gangMid.at)
	x.put(figure.Figure{Name: "pass_centre", Unit: figure.Hertz, Value: p.centre(), Origin: at})
	if len(p.humps) != 2 {
		return
	}
	hb := figure.BySolver("the response's maxima inside its −3 dB band", gangMid.at)
	x.put(figure.Figure{Name: "hump_lo", Unit: figure.Hertz, Value: p.humps[0], Origin: hb})
	x.put(figure.Figure{Name: "hump_hi", Unit: figure.Hertz, Value: p.humps[1], Origin: hb})
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("over-coupled: the response has two humps, %s and %s, %s dB above the dip between them, centred on %s",
		figure.Format(p.humps[0], figure.Hertz, figure.Text), figure.Format(p.humps[1], figure.Hertz, figure.Text),
		figure.Plain(p.dipDB), figure.Format(p.centre(), figure.Hertz, figure.Text)))
}
