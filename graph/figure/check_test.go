package figure

import (
	"strings"
	"testing"

	"pare/graph/value"
)

// A solver figure with its formula cross-check: the sheet and the list
// show the solver's value alone, the check line both with how far apart
// (|−61.5 − (−58.3)|/58.3 = 5.49 %, derived) and why; within
// CheckAgreement (2 %, the figure package's) it says so; JSON carries the
// formula under NAME_formula keys, a range's at both ends.
func TestCheckLine(t *testing.T) {
	formula := Figure{Name: "gain", Unit: Ratio, Value: -61.5, Origin: ByFormula("A = −µ·RL/(ra+RL)")}
	g := Figure{Name: "gain", Label: "gain", Unit: Ratio, Value: -58.3, Origin: BySolver("V(a)/V(g)", "1 kHz"),
		Check: &formula, Why: "the load beyond C2"}
	cases := []struct {
		f    Figure
		want string
	}{
		{g, "gain -58.3 in circuit; formula A = −µ·RL/(ra+RL) gives -61.5, 5.49 % off: the load beyond C2"},
		{func() Figure { c := formula; c.Value = -58.9; h := g; h.Check = &c; return h }(),
			"gain -58.3 in circuit; formula A = −µ·RL/(ra+RL) gives -58.9, within 2 %"},
		{Figure{Name: "gain", Unit: Ratio, Value: -58.3}, ""},
	}
	for _, c := range cases {
		if got := c.f.CheckLine(Text); got != c.want {
			t.Errorf("CheckLine = %q, want %q", got, c.want)
		}
	}
	if got := g.Item(Sheet); got != "gain -58.3" {
		t.Errorf("on a sheet %q, want the solver's value alone", got)
	}
	if got := Checks(List{g, {Name: "tau", Unit: Second, Value: 1e-3}}, Text); len(got) != 1 || !strings.HasPrefix(got[0], "gain -58.3") {
		t.Errorf("Checks = %q, want the gain's line alone", got)
	}
	r := Figure{Name: "f", Unit: Hertz, Range: &value.Range{Min: 546e3, Max: 1.49e6}, Origin: BySolver("peak", ""),
		Check: &Figure{Unit: Hertz, Range: &value.Range{Min: 527e3, Max: 1.6e6}, Origin: ByFormula("f = 1/(2π√(LC))")}}
	b, err := List{r}.MarshalJSON()
	if err != nil || string(b) != `{"f_formula_max_hz":1600000,"f_formula_min_hz":527000,"f_max_hz":1490000,"f_min_hz":546000}` {
		t.Errorf("JSON %s (%v)", b, err)
	}
	if !r.CheckDiffers() {
		t.Error("a range 7 % off at its top end must differ")
	}
}
