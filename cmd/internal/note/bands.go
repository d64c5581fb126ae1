package note

import (
	"bytes"
	"fmt"
	"strings"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/rules/stages"
)

// Band is another position of the set's wavechange switch: its label,
// the stages the gang tunes there with their figures, or why the band
// did not run.
type Band struct {
	Label  string
	Stages []Stage
	Err    string
}

// otherBands runs (or takes the main job's runs of) every other position
// of the wavechange switch and keeps the stages that hold a gang section:
// the aerial or RF circuit, the oscillator, the mixer. Those are what a
// band changes, and each figure is the solver's on that band's circuit,
// reduced and recognised as the shown band was: a long-wave aerial
// circuit's range is solved on its long-wave coil, not inferred from the
// oscillator's.
func otherBands(r *pipeline.Result) []Band {
	var out []Band
	for _, set := range align.BandSets(r.Circuit, r.Stages) {
		var refs []string
		pos := 0
		for _, p := range r.Circuit.Parts {
			if at, ok := set[p.Ref]; ok {
				refs, pos = append(refs, p.Ref), at
			}
		}
		b := Band{Label: fmt.Sprintf("Band %d: %s at position %d", pos, strings.Join(refs, ", "), pos)}
		bc, bsts, err := r.BandRun(set)
		if err != nil {
			b.Err = err.Error()
		} else {
			b.Stages = noteStages(ganged(bc, bsts))
		}
		out = append(out, b)
	}
	return out
}

// ganged keeps the top-level stages that hold a gang section.
func ganged(c *graph.Circuit, sts []stages.Stage) []stages.Stage {
	var out []stages.Stage
	for _, s := range sts {
		if strings.Contains(s.Name, ".") {
			continue
		}
		for _, ref := range s.Parts {
			if p := c.Part(ref); p != nil && p.Gang != "" {
				out = append(out, s)
				break
			}
		}
	}
	return out
}

const otherBandsLead = "The stages the gang tunes on each other band, with the wavechange switch turned there: " +
	"each band's circuit reduced, recognised and solved as the one shown above."

func writeOtherBands(b *bytes.Buffer, n *Note) {
	if len(n.OtherBands) == 0 {
		return
	}
	b.WriteString("## Other bands\n\n" + otherBandsLead + "\n\n")
	for _, band := range n.OtherBands {
		fmt.Fprintf(b, "### %s\n\n", mdText(band.Label))
		switch {
		case band.Err != "":
			fmt.Fprintf(b, "Not solved: %s\n\n", mdText(band.Err))
		case len(band.Stages) == 0:
			b.WriteString("No stage on this band holds a gang section.\n\n")
		default:
			writeStageTable(b, band.Stages)
			b.WriteString("\n")
			writeChecks(b, band.Stages)
		}
	}
}

func hOtherBands(b *bytes.Buffer, n *Note) {
	if len(n.OtherBands) == 0 {
		return
	}
	b.WriteString("<h2>Other bands</h2>\n<p>" + otherBandsLead + "</p>\n")
	for _, band := range n.OtherBands {
		fmt.Fprintf(b, "<h3>%s</h3>\n", h(band.Label))
		switch {
		case band.Err != "":
			fmt.Fprintf(b, "<p>Not solved: %s</p>\n", h(band.Err))
		case len(band.Stages) == 0:
			b.WriteString("<p>No stage on this band holds a gang section.</p>\n")
		default:
			hStageTable(b, band.Stages)
		}
	}
}
