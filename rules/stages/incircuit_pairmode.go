package stages

import (
	"math"

	"pare/graph/ac"
)

// Two tanks a gang turns together are coupled in circuit (the signal
// injection capacitor, a shared valve), and a linear circuit has one set of
// resonances: each tank's |Z| shows its partner's resonance as well as its
// own, and where the coupling is strong the partner's can stand inside the
// window searched around a guess, even higher than the tank's own. The walk
// then puts both tanks on one resonance, and the tracking error it reports
// is about minus the IF (a reading far off the dial), or the oscillator's
// resonance is read as the signal's.

// sameMode is how close two tanks' peaks may stand before they are taken
// for one resonance of the pair: far below the ratio of an oscillator to
// its signal tank (at least 1.28 on a broadcast band, 1.6 on long waves),
// far above the spread of one resonance between two impedances (the
// damping moves a peak by parts in a thousand).
const sameMode = 0.01

// pairWindow is how far either side of the two guesses pairAt lists the
// resonances when it has to choose: the tanks' own lie within it, the IF
// transformer's (an oscillator to IF ratio of at least 2.1) mostly not.
const pairWindow = 1.5

// pairAt solves the signal tank sn and the oscillator tank on at gang
// setting th, each nearest its guess (gs, gosc). Where both land on one
// resonance, it lists the resonances of each tank's |Z| near the guesses
// and gives each tank the one it owns most: the signal tank the largest
// ratio |Zsig|/|Zosc|, the oscillator the smallest. A tank's own
// resonance is where its impedance stands highest against its partner's.
// ok is false when a tank is not found or both still share one.
func pairAt(c *ac.Responses, sn, on tankNets, th, gs, gosc float64) (fs, fo float64, ok bool) {
	fs, ok1 := tankAt(c, sn, th, gs)
	fo, ok2 := tankAt(c, on, th, gosc)
	if !ok1 || !ok2 {
		return 0, 0, false
	}
	if math.Abs(math.Log(fo/fs)) > sameMode {
		return fs, fo, true
	}
	rs, err1 := tankResponse(c, sn, gang{frac: th})
	ro, err2 := tankResponse(c, on, gang{frac: th})
	if err1 != nil || err2 != nil {
		return 0, 0, false
	}
	lo, hi := math.Min(gs, gosc)/pairWindow, math.Max(gs, gosc)*pairWindow
	own := func(f float64) float64 { return magnitude(rs, f) / magnitude(ro, f) }
	fs, ok1 = pickMode(localPeaks(rs, lo, hi), own, 1)
	fo, ok2 = pickMode(localPeaks(ro, lo, hi), own, -1)
	if !ok1 || !ok2 || math.Abs(math.Log(fo/fs)) <= sameMode {
		return 0, 0, false
	}
	return fs, fo, true
}

// pickMode is the peak among fs with the largest sign·own(f).
func pickMode(fs []float64, own func(float64) float64, sign float64) (float64, bool) {
	best, bestV := 0.0, math.Inf(-1)
	for _, f := range fs {
		if v := sign * own(f); v > bestV {
			best, bestV = f, v
		}
	}
	return best, best > 0
}

// modeScan is the log grid localPeaks scans: 300 points over a factor of
// about 2.8 put a step of 0.35 %, inside the −3 dB width of a tank of
// loaded Q up to about 140, so no broadcast tank's peak falls between two.
const modeScan = 300

// localPeaks are the local maxima of |r| in lo..hi, each refined by peakOf
// over the two grid cells around it.
func localPeaks(r *ac.Response, lo, hi float64) []float64 {
	step := math.Log(hi/lo) / (modeScan - 1)
	at := func(i int) float64 { return lo * math.Exp(float64(i)*step) }
	mags := make([]float64, modeScan)
	for i := range mags {
		mags[i] = magnitude(r, at(i))
	}
	var out []float64
	for i := 1; i < modeScan-1; i++ {
		if mags[i] > mags[i-1] && mags[i] >= mags[i+1] {
			if f, _, ok := peakOf(r, at(i-1), at(i+1)); ok {
				out = append(out, f)
			}
		}
	}
	return out
}
