// The frequency plan of a comparison: the bands of interest of each net,
// landmark frequencies (IF, crystal resonances) and the log-spaced sweep
// grids.

package ac

import (
	"math"
	"slices"
	"sort"

	"pare/graph"
	"pare/graph/device"
	"pare/graph/value"
)

// landmarks are frequencies worth a sweep point of their own: the named
// frequencies of the circuit (its IF) and each crystal's series and parallel
// resonance, whose width (a few hertz at Q 50 000) slips between the points
// of any log grid.
func landmarks(c *graph.Circuit) []float64 {
	var out []float64
	names := make([]string, 0, len(c.Freqs))
	for n := range c.Freqs {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		if f := c.Freqs[n]; f > 0 {
			out = append(out, f)
		}
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Crystal {
			continue
		}
		_, lm, cm, c0, err := device.Crystal(p)
		if err != nil {
			continue
		}
		fs := 1 / (2 * math.Pi * math.Sqrt(lm*cm))
		out = append(out, fs)
		if c0 > 0 {
			out = append(out, fs*math.Sqrt(1+cm/c0))
		}
	}
	return out
}

type setting struct {
	label string
	frac  float64
}

func hasVariable(c *graph.Circuit) bool {
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type == graph.CapVariable {
			return true
		}
	}
	return false
}

// bandsOf lists the circuit's default band and every region's band.
func bandsOf(c *graph.Circuit) []value.Range {
	var out []value.Range
	out = addBand(out, c.Band)
	for _, r := range c.Regions {
		out = addBand(out, r.Band)
	}
	return out
}

// addBand appends a valid band that is not in the list yet.
func addBand(list []value.Range, b value.Range) []value.Range {
	if b.Min <= 0 || b.Max < b.Min {
		return list
	}
	for _, x := range list {
		if x == b {
			return list
		}
	}
	return append(list, b)
}

// netBands returns, for a net, the bands the signal on it lives in: the band
// of every region that holds the net (names it as input, output or in its
// nets, or has a part on it), and the default band when a part on it belongs
// to no region. Port parts do not count: a port is where the sheet was cut,
// and it carries whatever the net carries. A small-signal transfer keeps frequency, so a transfer is
// judged over its input's bands and an impedance over its net's: the IF
// input of a strip is not asked to behave at audio frequencies, where its
// bypass capacitors were never meant to bypass.
func netBands(c *graph.Circuit) func(net string) []value.Range {
	all := bandsOf(c)
	// The regions holding each net, read once: a whole set has a region
	// per channel, and scanning them all per net made a comparison
	// quadratic in the set.
	held := map[string][]value.Range{}
	for _, r := range c.Regions {
		if r.Input != "" {
			held[r.Input] = append(held[r.Input], r.Band)
		}
		if r.Output != "" {
			held[r.Output] = append(held[r.Output], r.Band)
		}
		for _, n := range r.Nets {
			held[n] = append(held[n], r.Band)
		}
	}
	rx := c.RegionIndex()
	return func(net string) []value.Range {
		var out []value.Range
		for _, b := range held[net] {
			out = addBand(out, b)
		}
		for _, cn := range c.ConnsOf(net) {
			if cn.Part.Kind != graph.Port {
				out = addBand(out, rx.BandOf(cn.Part))
			}
		}
		if len(out) == 0 {
			return all
		}
		sort.Slice(out, func(i, j int) bool {
			if out[i].Min != out[j].Min {
				return out[i].Min < out[j].Min
			}
			return out[i].Max < out[j].Max
		})
		return out
	}
}

// logSweep returns n log-spaced frequencies from lo to hi inclusive.
func logSweep(lo, hi float64, n int) []float64 {
	if n < 2 || hi <= lo {
		return []float64{lo}
	}
	out := make([]float64, n)
	r := math.Log(hi / lo)
	for i := range out {
		out[i] = lo * math.Exp(r*float64(i)/float64(n-1))
	}
	out[n-1] = hi
	return out
}

// logSweepInner returns n log-spaced frequencies strictly between lo and hi.
func logSweepInner(lo, hi float64, n int) []float64 {
	if hi <= lo {
		return nil
	}
	out := make([]float64, 0, n)
	r := math.Log(hi / lo)
	for i := 1; i <= n; i++ {
		f := lo * math.Exp(r*float64(i)/float64(n+1))
		if f > lo && f < hi {
			out = append(out, f)
		}
	}
	return out
}

func sortUnique(f []float64) []float64 {
	slices.Sort(f)
	return slices.Compact(f)
}

// BandsOf returns the bands of interest of the signal on a net (see
// netBands): the regions that hold it, or the default band. Sweeps use it to
// choose their span.
func BandsOf(c *graph.Circuit, net string) []value.Range { return netBands(c)(net) }

// FormatHz prints a frequency for a report: "818 kHz", "1.17 MHz".
func FormatHz(f float64) string { return value.Format(f, value.Hertz, value.Symbol) }
