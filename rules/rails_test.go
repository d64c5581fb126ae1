package rules

import "testing"

// TestRailReturnsSurviveTheReduction: after the reduction ties every rail to
// AC ground, each terminal that returned to a rail still names it: a
// declared rail directly, a decoupled line or feed (a signal net fed from a
// rail through a resistor and bypassed) as a rail of its own with the
// feeding rail's label less its voltage (the line's own is lower by the
// drop: the sheet adds the DC solution's, cmd/internal/pipeline). A bypassed cathode or a grid leak returns to
// chassis. Expected returns read off the examples' netlists
// (examples/*.toml).
func TestRailReturnsSurviveTheReduction(t *testing.T) {
	tests := []struct {
		file, part, pin string
		rail, label     string // the net returned to and its label; "" for chassis
	}{
		{"../examples/frequency-changer.toml", "T2", "p2", "ht_if", "HT via R2"},       // decoupled by R2, C6
		{"../examples/frequency-changer.toml", "C5", "2", "agc", "AGC line"},           // a declared bias rail
		{"../examples/frequency-changer.toml", "R1", "2", "", ""},                      // grid leak to chassis
		{"../examples/if-detector-audio.toml", "R9", "2", "ht_pre", "HT via R10"},      // anode load, R10 and C14
		{"../examples/if-detector-audio.toml", "R8", "2", "", ""},                      // cathode resistor
		{"../examples/transistor-front-end.toml", "C5", "2", "vcc_mix", "+9 V via R7"}, // decoupled by R7 from a rail labelled only by its +9 V: named by that voltage
		{"../examples/transistor-front-end.toml", "R6", "2", "", ""},                   // emitter resistor to 0 V
		{"../testdata/good/review-bjt-if.toml", "T2", "p1", "vcc", "+9 V"},             // straight to the rail
	}
	for _, tc := range tests {
		r, _ := reduceChecked(t, loadFile(t, tc.file), Options{Level: LevelSignal})
		p := r.Part(tc.part)
		if p == nil || p.Pin(tc.pin) == nil {
			t.Errorf("%s: %s.%s is not on the reduced circuit", tc.file, tc.part, tc.pin)
			continue
		}
		pin := *p.Pin(tc.pin)
		label := ""
		if n := r.ReturnOf(pin); n != nil && n.Role.IsRail() {
			label = n.Label
		}
		if pin.Rail != tc.rail || label != tc.label {
			t.Errorf("%s: %s.%s returns to %q %q, want %q %q", tc.file, tc.part, tc.pin, pin.Rail, label, tc.rail, tc.label)
		}
	}
}
