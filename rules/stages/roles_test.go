package stages

import (
	"strings"
	"testing"
)

// Tuned amplifiers are named by their place in the signal path as the
// trade names them (common practice: "RF amplifier" before the frequency
// changer, "1st/2nd IF amplifier" after it at the IF), the topology kept
// after the role; a tuned amplifier whose load peaks away from the IF
// after the changer keeps its topology alone.
func TestTunedAmplifierRoles(t *testing.T) {
	cases := []struct {
		example string
		want    map[string]string // stage → title prefix
	}{
		{"club-receiver.toml", map[string]string{
			"ST3": "RF amplifier: tuned amplifier, tuned secondary",
			"ST5": "1st IF amplifier: tuned amplifier, common cathode",
			"ST6": "2nd IF amplifier: tuned amplifier, common cathode",
			"ST4": "Self-oscillating mixer", // the changer itself takes no role
		}},
		// An IF strip captured alone: an IF amplifier, its place unknown.
		{"if-detector-audio.toml", map[string]string{"S2": "IF amplifier: tuned amplifier"}},
		{"transistor-front-end.toml", map[string]string{"S4": "1st IF amplifier: tuned amplifier, collector on a tap"}},
	}
	for _, c := range cases {
		t.Run(c.example, func(t *testing.T) {
			full, reduced, log := reduceExample(t, c.example)
			got := map[string]Stage{}
			for _, s := range find(t, reduced, Options{Full: full, ACGround: log.ACGround}) {
				got[s.Name] = s
			}
			for name, prefix := range c.want {
				s := got[name]
				if !strings.HasPrefix(s.Title, prefix) {
					t.Errorf("%s: title %q, want it to start %q", name, s.Title, prefix)
				}
				if strings.Contains(prefix, "amplifier:") && !strings.Contains(strings.Join(s.Notes, "\n"), "named ") {
					t.Errorf("%s: the role is not explained in the notes: %q", name, s.Notes)
				}
			}
		})
	}
}

func TestOrdinal(t *testing.T) {
	for n, want := range map[int]string{1: "1st", 2: "2nd", 3: "3rd", 4: "4th", 11: "11th", 12: "12th", 13: "13th", 21: "21st", 22: "22nd"} {
		if got := ordinal(n); got != want {
			t.Errorf("ordinal(%d) = %q, want %q", n, got, want)
		}
	}
}
