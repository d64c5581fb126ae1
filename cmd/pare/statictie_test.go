package main

import (
	"testing"

	"pare/render"
)

// TestStaticScreensNameTheirRail: a valve electrode the reduction made
// static is drawn on the reduced sheet with a stub to where it is held; a
// screen fed from the HT through its dropper is held at that line, not at
// chassis, so its stub ends at a rail bar and the valve's label names the
// line ("g2, g4 HT via R3"), as the sheet names every other decoupled line
// (the blind review could not read review19 a02's heptode screens, drawn
// as unlabelled chassis stubs). The expected rails are the netlists' own
// screen feeds (the notes beside R3 and R2).
func TestStaticScreensNameTheirRail(t *testing.T) {
	for _, c := range []struct {
		file, ref, pin string
		tie            render.Tie
		label          string
	}{
		{"../../testdata/review19/a02.toml", "V1b", "g2", render.TieRail, "g2, g4 HT via R3"},
		{"../../testdata/review19/a02.toml", "V1b", "g4", render.TieRail, "g2, g4 HT via R3"},
		{"../../testdata/review19/a02.toml", "V1b", "g5", render.TieCathode, "g2, g4 HT via R3"},
		{"../../examples/if-detector-audio.toml", "V1", "g2", render.TieRail, "g2 HT via R2"},
	} {
		s := cachedResult(t, c.file).Sheet(render.Reduced)
		if got := s.Ties[c.ref][c.pin]; got != c.tie {
			t.Errorf("%s %s.%s: tie %v, want %v", c.file, c.ref, c.pin, got, c.tie)
		}
		if got := s.TieLabels[c.ref]; got != c.label {
			t.Errorf("%s %s: tie label %q, want %q", c.file, c.ref, got, c.label)
		}
	}
}
