package stages

import (
	"math"
	"strconv"
	"strings"
	"testing"

	model "pare/graph/device"
	"pare/graph/figure"
)

// num writes a number for a deck at full precision.
func num(v float64) string { return strconv.FormatFloat(v, 'g', 12, 64) }

// valueAt is |V(out)| at one frequency from a deck.
func valueAt(t *testing.T, deck string, f float64) float64 {
	_, v := ngspiceSweep(t, deck, "lin 1 "+num(f)+" "+num(f))
	if len(v) != 1 {
		t.Fatalf("ngspice gave %d points, want 1", len(v))
	}
	return v[0]
}

// peakOfDeck is the frequency of the largest |V(out)| of a sweep, refined
// by a parabola through the best three points (in f and dB).
func peakOfDeck(t *testing.T, deck, sweep string) float64 {
	f, v := ngspiceSweep(t, deck, sweep)
	best := 0
	for i := range v {
		if v[i] > v[best] {
			best = i
		}
	}
	if best == 0 || best == len(v)-1 {
		t.Fatalf("ngspice peak at the sweep's end (%g Hz)", f[best])
	}
	y0, y1, y2 := db(v[best-1]), db(v[best]), db(v[best+1])
	return f[best] + 0.5*(f[best+1]-f[best])*(y0-y2)/(y0-2*y1+y2)
}

// cornerOfDeck is where a high-pass sweep's |V(out)| first reaches its
// last point's level less 3 dB, interpolated in log f.
func cornerOfDeck(t *testing.T, deck, sweep string) float64 {
	f, v := ngspiceSweep(t, deck, sweep)
	level := v[len(v)-1] / math.Sqrt2
	for i := 1; i < len(v); i++ {
		if v[i-1] < level && v[i] >= level {
			x := (db(level) - db(v[i-1])) / (db(v[i]) - db(v[i-1]))
			return math.Exp(math.Log(f[i-1]) + x*(math.Log(f[i])-math.Log(f[i-1])))
		}
	}
	t.Fatal("no −3 dB point in the sweep")
	return 0
}

// Each class of figure the formulas got wrong, on a circuit written for
// the test (rules/stages/testdata/incircuit-*.toml), against ngspice on a
// deck written by hand for the same circuit: the figure is the solver's
// in circuit, and the formula stays beside it. Valves are the fixtures'
// triode (µ 20, ra 10 kΩ: gm 2 mA/V) as a VCCS with ra; a transistor is
// rπ = β/gm with gm = Ic/VT (docs/references.md §5; graph/device); a
// winding's Q is the series resistance ω0·L/Q at the middle of the band,
// as graph/ac models it. Tolerances: 0.1 % on solved points, 0.5 % on
// swept ones (the sweep's step).
func TestInCircuitAgainstNgspice(t *testing.T) {
	t.Run("VFO: every capacitance across the tank", func(t *testing.T) {
		_, st := reduceFixture(t, "incircuit-vfo.toml")
		s := stageOf(st, "hartley-common-tap")
		if s == nil {
			t.Fatalf("no Hartley: %s", topologies(st))
		}
		// The valve quiet: its ra from the cathode tap to the anode at AC
		// ground. The gang's ends: 50 pF (low f) and 10 pF (high f).
		deck := func(vc string) string {
			return `I1 0 out DC 0 AC 1
L1 out tap 16u
L2 tap 0 4u
K1 L1 L2 0.5
C1 out 0 100p
C2 out g 100p
R1 g 0 100k
Rra tap 0 10k
C3 out bs 47p
CVC1 bs 0 ` + vc
		}
		lo := peakOfDeck(t, deck("50p"), "lin 4001 2.5meg 3.0meg")
		hi := peakOfDeck(t, deck("10p"), "lin 4001 2.7meg 3.2meg")
		f, _ := s.Figures.Get("f")
		if f.Range == nil || !within(f.Range.Min, lo, 1e-3) || !within(f.Range.Max, hi, 1e-3) {
			t.Errorf("f = %v, ngspice %g–%g Hz", f.Text(figure.Text), lo, hi)
		}
		// The formula counts the bandspread branch and the fixed capacitor
		// straight across the coil: 1/(2π√(LC)) with L = 16 + 4 +
		// 2·0.5·√64 µH = 28 µH and 100 pF plus 47 pF in series with
		// 10..50 pF (derived), 108.246 pF at the top.
		if c := f.Check; c == nil || c.Range == nil || !within(c.Range.Max, 1/(2*math.Pi*math.Sqrt(28e-6*(100+47.0*10/57)*1e-12)), 1e-6) {
			t.Errorf("formula cross-check %v, want 1/(2π√(28 µH · 108.246 pF)) at the top", c)
		}
	})
	t.Run("gain: a cathode capacitor that is no bypass", func(t *testing.T) {
		_, st := reduceFixture(t, "incircuit-bypass.toml")
		s := stageWith(st, "V1")
		if s == nil {
			t.Fatalf("no stage with V1: %s", topologies(st))
		}
		const deck = `V1 in 0 DC 0 AC 1
G1 out k in k 2m
Ra out k 10k
R1 out 0 47k
R2 k 0 1.5k
C1 k 0 `
		f := math.Sqrt(300 * 3000) // the band's middle
		want := valueAt(t, deck+"100n", f)
		if g := fig(s.Figures, "gain"); !within(-g, want, 1e-3) {
			t.Errorf("gain %g, ngspice %g", g, -want)
		}
		full := valueAt(t, deck+"100m", f) // a perfect bypass
		if !strings.Contains(s.Title, "partly bypassed") || (full-want)/full < bypassAgreement {
			t.Errorf("%q: gain %g against %g with a perfect bypass (ngspice)", s.Title, want, full)
		}
	})
	t.Run("gain: the load beyond the coupling capacitor", func(t *testing.T) {
		_, st := reduceFixture(t, "incircuit-loaded.toml")
		s := stageOf(st, "amp-common")
		if s == nil {
			t.Fatalf("no amplifier: %s", topologies(st))
		}
		want := valueAt(t, `V1 in 0 DC 0 AC 1
G1 out 0 in 0 2m
Ra out 0 10k
R1 out 0 47k
C1 out g2 100n
R2 g2 0 100k`, math.Sqrt(1e3*10e3))
		if g := fig(s.Figures, "gain"); !within(-g, want, 1e-3) {
			t.Errorf("gain %g, ngspice %g", g, -want)
		}
	})
	t.Run("corner: rπ beside the bias resistor", func(t *testing.T) {
		_, st := reduceFixture(t, "incircuit-rpi.toml")
		s := stageOf(st, "coupling-capacitor")
		if s == nil {
			t.Fatalf("no coupling capacitor: %s", topologies(st))
		}
		rpi := 100 / (1e-3 / model.VT) // β/gm, gm = Ic/VT
		want := cornerOfDeck(t, `V1 in 0 DC 0 AC 1
C1 in out 1u
R1 out 0 18k
Rpi out 0 `+num(rpi), "dec 2000 1 100k")
		if fc := fig(s.Figures, "f_c_hz"); !within(fc, want, 5e-3) {
			t.Errorf("f c %g Hz, ngspice %g Hz", fc, want)
		}
	})
	t.Run("bandwidth: a pair below critical coupling", func(t *testing.T) {
		_, st := reduceFixture(t, "incircuit-pair.toml")
		s := stageOf(st, "double-tuned")
		if s == nil {
			t.Fatalf("no pair: %s", topologies(st))
		}
		r := 2 * math.Pi * math.Sqrt(445e3*465e3) * 1e-3 / 100 // ω0·L/Q at the band's middle
		f, v := ngspiceSweep(t, `I1 0 in DC 0 AC 1
L1 in p1 1m
Rp p1 0 `+num(r)+`
C1 in 0 122.354p
L2 out s1 1m
Rs s1 0 `+num(r)+`
C2 out 0 122.354p
K1 L1 L2 0.0072`, "lin 8001 445k 465k")
		if bw, want := fig(s.Figures, "bw_hz"), band3dB(f, v); !within(bw, want, 5e-3) {
			t.Errorf("bandwidth %g Hz, ngspice %g Hz", bw, want)
		}
	})
}

// Names the circuit contradicts take the plainer name, with the reason.
func TestNamesCheckedAgainstBehaviour(t *testing.T) {
	cases := []struct{ fixture, topology, title, note string }{
		// an output transformer with a top-cut capacitor: a broad hump, Q < 2
		{"incircuit-audio-ot.toml", "amp-tuned", "Transformer-coupled amplifier, common cathode (valve)", "below the 2 a tuned stage has"},
		// a battery set: no rectifier anywhere
		{"incircuit-battery.toml", "smoothing-filter", "Supply decoupling filter", "no rectifier feeds it"},
		// 100 nF in the cathode at 300 Hz–3 kHz
		{"incircuit-bypass.toml", "amp-common-bypassed", "Common-cathode amplifier, cathode resistor partly bypassed (valve)", "C1 is no bypass at the band"},
	}
	for _, tc := range cases {
		_, st := reduceFixture(t, tc.fixture)
		s := stageOf(st, tc.topology)
		if s == nil {
			t.Fatalf("%s: no %s: %s", tc.fixture, tc.topology, topologies(st))
		}
		if s.Title != tc.title || !strings.Contains(strings.Join(s.Notes, "\n"), tc.note) {
			t.Errorf("%s: %q, notes %q; want %q and a note with %q", tc.fixture, s.Title, s.Notes, tc.title, tc.note)
		}
	}
	// The near misses keep their names: the example's 100 µF bypass, the
	// IF stage's tuned load, a rectifier's reservoir.
	_, st := reduceFixture(t, "triode-bypassed.toml")
	if s := stageWith(st, "V1"); s == nil || strings.Contains(s.Title, "partly") {
		t.Errorf("a 100 µF cathode bypass lost its name: %v", s)
	}
	c := circuit(t, "valve", `@Q1(in, gnd, o)
T1 = { windings = { p = "1m", s = "1m" }, k = 0.01, q = 100, pins = { p1 = "o", p2 = "ht", s1 = "s", s2 = "gnd" } }
C1 = { c = "122.354p", pins = ["o", "ht"] }
C2 = { c = "122.354p", pins = ["s", "gnd"] }`)
	if s := stageOf(find(t, c, Options{}), "amp-tuned"); s == nil || !strings.HasPrefix(s.Title, "Tuned amplifier") {
		t.Errorf("an IF stage lost its tuned name: %v", s)
	}
}

// inCircuitKinds are the figures the solver gives in circuit, by their
// name without a pattern's prefix, and the unit that makes them so (a
// gain in decibels follows its ratio).
var inCircuitKinds = map[string]figure.Unit{
	"f": figure.Hertz, "f1": figure.Hertz, "f2": figure.Hertz, "osc_f": figure.Hertz, "ift_f": figure.Hertz,
	"sig_f": figure.Hertz, "image_f": figure.Hertz, "bw": figure.Hertz, "gain": figure.Ratio, "f_c": figure.Hertz,
}

// formulaOnly are the corners still from their formula alone, by the
// stage's topology and the figure's name, each with why the small-signal
// solver cannot give it: a known gap, kept short.
var formulaOnly = map[[2]string]string{
	{"smoothing-filter", "f_c"}:            "a supply filter sits between nets the small-signal model holds at AC ground",
	{"agc-filter", "f_c"}:                  "an AGC line's time constant filters a DC level, not a signal",
	{"diode-detector-cold-end", "f_c"}:     "a detector's load is charged in pulses the small-signal diode does not show",
	{"diode-detector", "f_c"}:              "a detector's load is charged in pulses the small-signal diode does not show",
	{"grid-leak-detector", "f_c"}:          "a grid-leak detector rectifies at the grid: the time constant of a DC level",
	{"hartley-common-tap", "grid_f_c"}:     "an oscillator's grid-leak bias time constant, not a corner the signal passes",
	{"self-oscillating-mixer", "grid_f_c"}: "an oscillator's grid-leak bias time constant, not a corner the signal passes",
	{"grid-leak-detector-reaction", "f_c"}: "a grid-leak detector rectifies at the grid: the time constant of a DC level",
	{"grid-stopper", "f_c"}:                "the solver has no interelectrode capacitances: the stopper's corner is a check value on typical ones, its Miller gain the solver's",
	// A mixer found by its loop: osc_f is the solver's (the loop's 0°
	// frequency across the gang) and sig_f follows from it; their formula
	// check is the tank's f = 1/(2π√(LC)) when a pattern names the tank the
	// feedback goes through, and a padded tank no pattern names has none.
	{"self-oscillating-mixer-loop", "osc_f"}: "the loop's solver figure: its check needs a stage that names the tank (known gap for a padded tank)",
	{"self-oscillating-mixer-loop", "sig_f"}: "oscillator − IF from the loop: its check needs a stage that names the tank (known gap for a padded tank)",
	// An oscillator found by its loop whose tank no pattern names: f is
	// the loop's, with no formula to check it by.
	{"oscillator-loop", "f"}:                   "the loop's solver figure: its check needs a stage that names the tank (known gap)",
	{"self-oscillating-mixer-loop", "image_f"}: "oscillator + IF from the loop: its check needs a stage that names the tank (known gap for a padded tank)",
}

// Every figure of the kinds the solver gives, on every example and
// fixture a person reads, is the solver's in circuit with its formula
// beside it: none is left to a formula where the solver could reach it.
func TestSheetFiguresAreInCircuit(t *testing.T) {
	seen := 0
	for name, st := range allFixtureStages(t) {
		if strings.HasPrefix(name, "figureCases") {
			continue
		}
		for _, s := range st {
			for _, f := range s.Figures {
				bare := f.Name
				if i := strings.Index(bare, "_"); i > 0 && f.Name != "osc_f" && f.Name != "ift_f" && f.Name != "sig_f" && f.Name != "image_f" {
					if _, known := inCircuitKinds[bare[i+1:]]; known {
						bare = bare[i+1:]
					}
				}
				u, ok := inCircuitKinds[bare]
				tracking := strings.HasPrefix(f.Name, "track_") || strings.HasPrefix(f.Name, "pad_")
				_, gap := formulaOnly[[2]string{s.Topology, f.Name}]
				if f.Working || !ok || u != f.Unit || tracking || gap {
					continue
				}
				seen++
				if f.Origin.Source != figure.Solver || f.Check == nil {
					t.Errorf("%s %s %s: %s from %s, with no solver figure and its cross-check", name, s.Name, s.Topology, f.Name, f.Origin)
				}
			}
		}
	}
	if seen < 30 {
		t.Errorf("only %d in-circuit figures seen: the loop checked nothing", seen)
	}
}
