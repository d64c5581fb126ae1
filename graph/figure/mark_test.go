package figure

import (
	"reflect"
	"strings"
	"testing"
)

// A figure of a kind the solver gives in circuit that comes from its
// formula alone carries FormulaMark wherever a list of figures shows it
// (stage table, note, sheet label); the solver's own and the plain
// formula quantities (a time constant, a ratio of parts) do not.
func TestFormulaOnlyMarked(t *testing.T) {
	l := List{
		{Name: "f_c", Unit: Hertz, Value: 3183, Origin: ByFormula("fc = 1/(2πRC)")},
		{Name: "tau", Unit: Second, Value: 50e-6, Origin: ByFormula("τ = RC")},
		{Name: "gain", Unit: Ratio, Value: -26.7, Origin: BySolver("V(c2)/V(b2)", "1 kHz")},
		{Name: "r_out", Unit: Ohm, Value: 362, Origin: ByFormula("Rout = ra/(µ+1) ∥ Rk")},
		{Name: "r_load", Unit: Ohm, Value: 4700, Origin: ByFormula("RL")},
		{Name: "grid_f_c", Unit: Hertz, Value: 33860, Origin: ByFormula("fc = 1/(2πRC)")},
	}
	want := []string{"f c 3.18 kHz (formula)", "tau 50 µs", "gain -26.7 at 1 kHz", "r out 362 Ω (formula)", "r load 4.7 kΩ", "grid f c 33.9 kHz (formula)"}
	if got := Items(l, Sheet); !reflect.DeepEqual(got, want) {
		t.Errorf("Items = %q,\nwant %q", got, want)
	}
}

// A solved gain says the frequency it was taken at, once for a run of
// gains at one frequency (an IF stage's grid-to-grid and anode gains at
// its load's peak); a formula's gain, a gain over a range and a figure
// that is no gain say none (common practice: a gain is quoted with its
// frequency).
func TestGainsSayTheirFrequency(t *testing.T) {
	solved := func(name string, v float64, at string) Figure {
		return Figure{Name: name, Unit: Ratio, Value: v, Origin: BySolver("V(a)/V(g)", at)}
	}
	l := List{
		solved("gain", 10.1, "563.7 kHz, gang at mid travel"),
		solved("gain_anode", 338, "563.7 kHz, gang at mid travel"),
		{Name: "f", Unit: Hertz, Value: 563.7e3, Origin: BySolver("peak of |Z|", "gang at mid travel")},
		solved("gain_formula", 380, "the tank's own Q"),
		{Name: "gain_db", Unit: Decibel, Value: 34.9, Origin: ByFormula("20·log10 |A|")},
	}
	// a gain that carries its own frequency (at each end of the band)
	// says it once
	lowEnd := solved("gain_low", -192, "531.1 kHz, gang at its low end")
	lowEnd.At = &Figure{Unit: Hertz, Value: 531.1e3}
	l = append(l, lowEnd)
	got := strings.Join(Items(l, Sheet), ", ")
	want := "gain 10.1, gain anode 338 at 563.7 kHz, f 564 kHz, gain formula 380, gain db 34.9 dB, gain low -192 at 531 kHz"
	if got != want {
		t.Errorf("Items = %q\nwant    %q", got, want)
	}
}
