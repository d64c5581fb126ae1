package ac

import (
	"testing"

	"pare/graph"
)

// scaleCaps returns a copy of c with every fixed capacitor's value times k.
func scaleCaps(c *graph.Circuit, k float64) *graph.Circuit {
	d := c.Clone()
	for _, p := range d.Parts {
		if p.Kind == graph.Capacitor && p.Value.Min > 0 && p.Value.Min == p.Value.Max {
			p.Value.Min *= k
			p.Value.Max = p.Value.Min
		}
	}
	return d
}

// TestAboveRounding checks that leaving the deviation's rounding unrefined
// changes no verdict and no pair that deviates by more than rounding: a
// change of every fixed capacitor by 10⁻¹³ (rounding: both responses the
// same to twelve digits, by construction) and by 3 % and 30 % (real
// changes), on the examples and two fixtures.
func TestAboveRounding(t *testing.T) {
	// A pair whose worst deviation is under a millionth of a decibel and of
	// a degree deviates by rounding either way (prints as 0.000 dB, 0.00°);
	// any other must be found alike, to the bit. (At a floor of 3 %
	// instead of 10⁻⁹ the 3 % change of if-detector-audio fails here.)
	const rounded = 1e-6
	files := append([]string{"testdata/hartley-xtal.toml", "testdata/if-pair.toml"}, exampleFiles(t)...)
	for _, f := range files {
		c := load(t, f)
		for _, k := range []float64{1 + 1e-13, 1.03, 1.3} {
			changed := scaleCaps(c, k)
			full, err := Compare(c, changed, CompareOptions{})
			if err != nil {
				t.Fatalf("%s ×%g: %v", f, k, err)
			}
			fast, err := Compare(c, changed, CompareOptions{AboveRounding: true})
			if err != nil {
				t.Fatalf("%s ×%g above rounding: %v", f, k, err)
			}
			if full.OK != fast.OK || full.Broken() != fast.Broken() || len(full.Pairs) != len(fast.Pairs) {
				t.Fatalf("%s ×%g: verdict %v/%v broken %v/%v pairs %d/%d", f, k, full.OK, fast.OK, full.Broken(), fast.Broken(), len(full.Pairs), len(fast.Pairs))
			}
			for i, p := range full.Pairs {
				q := fast.Pairs[i]
				if p.MaxDB <= rounded && p.MaxDeg <= rounded {
					// Rounding both ways: where it peaks is no finding.
					if q.MaxDB > rounded || q.MaxDeg > rounded {
						t.Errorf("%s ×%g: %s: rounding %g dB %g° became %g dB %g°", f, k, p.Label(), p.MaxDB, p.MaxDeg, q.MaxDB, q.MaxDeg)
					}
					continue
				}
				if p != q {
					t.Errorf("%s ×%g: %s: refining every peak found %s, above rounding %s", f, k, p.Label(), p, q)
				}
			}
		}
	}
}
