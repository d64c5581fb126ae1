package stages

import (
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// LevelTitle is the title of a pot stage working above the audio range.
const LevelTitle = "RF level control"

// nameLevel retitles a volume-control match whose potentiometer works
// above the audio range (its region's band, or the set's, lies wholly
// above audioTopHz): a pot across an RF or IF signal sets a level (a
// generator's output attenuator, an RF gain control), and a volume control
// is an audio one. The pattern stays the same; only the name follows the
// band the part is declared to work in. A pot a detector feeds is a
// receiver's volume control whatever band the file gives it (a set
// captured with one band for all its parts).
func nameLevel(tops []*found, c *graph.Circuit) {
	for _, f := range tops {
		if !strings.HasPrefix(f.Topology, "volume-control") {
			continue
		}
		for _, ref := range f.Parts {
			p := c.Part(ref)
			if p == nil || p.Kind != graph.Pot {
				continue
			}
			if b := c.BandOf(p); aboveAudio(b) && !detectorFed(c, p) {
				f.Title = LevelTitle
				f.Notes = append(f.Notes, fmt.Sprintf("named a level control, not a volume control: %s works in a band above the audio range (%s to %s)", ref, hz(b.Min), hz(b.Max)))
			}
			break
		}
	}
}

// aboveAudio tells whether a declared band lies wholly above the audio
// range (its low end above audioTopHz).
func aboveAudio(b value.Range) bool {
	return b.Max > 0 && b.Min > audioTopHz
}

// detectorFed tells whether a detector's DC output reaches one of p's
// terminals (graph.Circuit.DetectorFeeds: on it, or through the IF filter).
func detectorFed(c *graph.Circuit, p *graph.Part) bool {
	for _, pin := range p.Pins {
		if c.DetectorFeeds(pin.Net, "") {
			return true
		}
	}
	return false
}
