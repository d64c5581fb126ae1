package figure

import (
	"reflect"
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
	want := []string{"f c 3.18 kHz (formula)", "tau 50 µs", "gain -26.7", "r out 362 Ω (formula)", "r load 4.7 kΩ", "grid f c 33.9 kHz (formula)"}
	if got := Items(l, Sheet); !reflect.DeepEqual(got, want) {
		t.Errorf("Items = %q,\nwant %q", got, want)
	}
}
