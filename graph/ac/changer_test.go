package ac

import (
	"strings"
	"testing"

	"pare/graph"
)

// TestFrontEndComparedUpToTheChanger: in a superhet whose detector sits
// past the frequency change, the input-to-output pair is residue, and the
// proof once compared nothing but Z(aerial) in the signal band (blind
// review 17, item 5: aerial → RF valve → mixer grid uncovered). Now the
// transfer from the input to the first frequency changer's grid is a pair
// of its own over the input's band, and the note names the stretch that
// stays uncompared (the conversion itself: a linear model does not mix).
// The changer is found by behaviour, not by ref: the nearest valve from
// the aerial whose anode carries the IF region's band (V2 on osc_g, the
// grid C9 feeds, not the RF valve V1 whose anode works at the signal).
func TestFrontEndComparedUpToTheChanger(t *testing.T) {
	c, err := graph.LoadFile("../../examples/club-receiver.toml")
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Compare(c, c.Clone(), CompareOptions{Points: 12})
	if err != nil {
		t.Fatal(err)
	}
	if p, ok := pairLabels(rep)["V(osc_g)/V(aerial)"]; !ok || p.Bands != "540 kHz–1.6 MHz" {
		t.Errorf("the front end is not compared up to the mixer grid over the signal band: %v (present %v)", p.Bands, ok)
	}
	notes := strings.Join(rep.Notes, "\n")
	for _, want := range []string{
		"V(osc_g)/V(aerial) is compared there instead, through every stage up to frequency changer V2",
		"V2's conversion from osc_g to mix_a is not compared (a linear model does not mix)",
		"region if's pair covers the stages from mix_a on",
	} {
		if !strings.Contains(notes, want) {
			t.Errorf("notes lack %q:\n%s", want, notes)
		}
	}
	if strings.Contains(notes, "the regions' own pairs cover the stages between") {
		t.Errorf("the note still claims the regions cover a stretch no region holds:\n%s", notes)
	}
}
