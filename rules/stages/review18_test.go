package stages

import "testing"

// TestReview18Names: names a blind reviewer's circuits contradicted
// (review18, invented values). b03: a link winding with the 4.7 pF
// neutralising capacitor across it peaked at 21.4 MHz, Q 2.5, in a
// 455 kHz strip and was named "Single-tuned transformer"; a tank far
// outside every declared band and named frequency tunes nothing.
// b05: the audio driver's transformer primary returns to a decoupled line
// whose 100 µF is not a full bypass at 50 Hz (31.8 Ω against 218 Ω), and
// the driver was an unnamed "Q4 stage" with its emitter lead an "RC
// low-pass section"; the driver is named by the solver's antiphase drive
// whatever the rail.
func TestReview18Names(t *testing.T) {
	cases := []struct {
		file, part, topology string // part's stage must be topology ("" for none holding it as a tank)
		notTopology          string // no stage of this topology may hold part
	}{
		{"b03.toml", "C8", "", "tuned-winding"},
		{"b05.toml", "Q4", "driver-transformer", ""},
		{"b05.toml", "R16", "driver-transformer", "rc-low-pass"},
		{"a04.toml", "R4", "amp-common-feedback", "rc-low-pass"},
		{"b02.toml", "Q2", "mixer-common-injected-tapped", ""},
	}
	for _, tc := range cases {
		_, sts := findFixture(t, "review18", tc.file)
		found := false
		for _, s := range sts {
			if !contains(s.Parts, tc.part) {
				continue
			}
			if s.Topology == tc.notTopology {
				t.Errorf("%s: %s in %s %q", tc.file, tc.part, s.Name, s.Title)
			}
			if s.Topology == tc.topology {
				found = true
			}
		}
		if tc.topology != "" && !found {
			t.Errorf("%s: %s in no %s stage", tc.file, tc.part, tc.topology)
		}
	}
}
