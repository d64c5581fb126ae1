package stages

import (
	"math"
	"os"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// lowCornerOfDeck is where a low-pass sweep's |V(out)| falls to its first
// point's level less 3 dB, interpolated in log f.
func lowCornerOfDeck(t *testing.T, deck, sweep string) float64 {
	t.Helper()
	f, v := ngspiceSweep(t, deck, sweep)
	level := v[0] / math.Sqrt2
	for i := 1; i < len(v); i++ {
		if v[i-1] >= level && v[i] < level {
			x := (db(level) - db(v[i-1])) / (db(v[i]) - db(v[i-1]))
			return math.Exp(math.Log(f[i-1]) + x*(math.Log(f[i])-math.Log(f[i-1])))
		}
	}
	t.Fatal("no −3 dB point in the sweep")
	return 0
}

// Supply filter sections as a class, on rules/stages/testdata/
// supply-filters.toml: a CRC smoothing section behind a half-wave
// rectifier's reservoir (60 Hz mains declared on T1, so the ripple is at
// 60 Hz) and a resistor and film-capacitor decoupler, which the old
// pattern (electrolytics at both ends) missed. Each figure is the solver's
// on the circuit as it is; the check values are ngspice .ac on the decks
// committed beside the fixture (supply-filters-*.cir), the formulas
// fc = 1/(2πRC) and A = √(R² + X_C²)/X_C beside them (handbook, from
// memory).
func TestSupplyFiltersAgainstNgspice(t *testing.T) {
	full, err := graph.LoadFile("testdata/supply-filters.toml")
	if err != nil {
		t.Fatal(err)
	}
	reduced, log, err := rules.Reduce(full, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	cases := []struct {
		deck, series, title string
		formula             float64 // Hz, 1/(2πRC) of the section alone
		feed                bool    // a decoupler: attenuation at its one stage's frequency
	}{
		{"testdata/supply-filters-smoothing.cir", "R1", "Smoothing filter", 1 / (2 * math.Pi * 1e3 * 16e-6), false},
		{"testdata/supply-filters-decoupling.cir", "R2", "Supply decoupling filter", 1 / (2 * math.Pi * 2.2e3 * 100e-9), true},
	}
	for _, tc := range cases {
		t.Run(tc.series, func(t *testing.T) {
			var s *Stage
			for i := range st {
				if strings.Contains(strings.Join(st[i].Parts, " "), tc.series) && st[i].Supply {
					s = &st[i]
				}
			}
			if s == nil || s.Title != tc.title {
				t.Fatalf("no %q holding %s: %s", tc.title, tc.series, topologies(st))
			}
			src, err := os.ReadFile(tc.deck)
			if err != nil {
				t.Fatal(err)
			}
			deck := string(src)
			if got, _ := formulaOf(s.Figures, "f_c_hz"); math.Abs(got/tc.formula-1) > 1e-9 {
				t.Errorf("formula corner %g Hz, want %g Hz", got, tc.formula)
			}
			want := lowCornerOfDeck(t, deck, "dec 400 0.01 100k") // from near DC: the pass level
			if got := fig(s.Figures, "f_c_hz"); math.Abs(got/want-1) > 0.005 {
				t.Errorf("corner %g Hz, ngspice %g Hz", got, want)
			}
			// 60 Hz: a half-wave rectifier on the 60 Hz mains T1 declares.
			if got := fig(s.Figures, "f_ripple_hz"); got != 60 {
				t.Errorf("ripple at %g Hz, want 60 Hz", got)
			}
			for _, at := range []struct {
				key string
				f   float64
			}{{"atten_ripple_db", 60}, {"atten_feed_db", 150e3}} { // 150 kHz: the band's low end
				if at.key == "atten_feed_db" && !tc.feed {
					// the smoothing section sits on the rectifier: it feeds the
					// whole line, no one stage's frequency
					if _, ok := s.Figures.Lookup(at.key); ok {
						t.Errorf("%s on the main smoothing filter", at.key)
					}
					continue
				}
				want := -20 * math.Log10(valueAt(t, deck, at.f))
				if got := fig(s.Figures, at.key); math.Abs(got-want) > 0.05 {
					t.Errorf("%s %.3f dB, ngspice %.3f dB", at.key, got, want)
				}
			}
		})
	}
}
