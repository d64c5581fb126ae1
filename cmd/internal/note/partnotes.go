package note

import (
	"bytes"
	"fmt"

	"pare/graph"
)

// PartNote is a part's own `note` from the netlist: often the most useful
// bench fact there is ("grid leak: about -8 V here when oscillating"), so
// the repair note repeats it, for the parts on the reduced sheet and for
// those the reduction took out alike.
type PartNote struct {
	Ref  string
	At   string // "file:line" where the part was written
	Into string // the reduced part it is drawn as, when not under its own ref
	Text string
}

// partNotes splits the original parts' notes into those on the reduced
// sheet (drawn under their own ref or merged into another part) and those
// removed, each list in ref order (orig.Parts is sorted).
func partNotes(orig, reduced *graph.Circuit) (onSheet, removed []PartNote) {
	drawnAs := map[string]string{} // original ref → the reduced part standing for it
	for _, rp := range reduced.Parts {
		for _, o := range rp.Origins() {
			drawnAs[o] = rp.Ref
		}
	}
	for _, p := range orig.Parts {
		if p.Note == "" {
			continue
		}
		n := PartNote{Ref: p.Ref, Text: p.Note}
		if p.Pos.IsValid() {
			n.At = shortPos(p.Pos)
		}
		into, ok := drawnAs[p.Ref]
		if !ok {
			removed = append(removed, n)
			continue
		}
		if into != p.Ref {
			n.Into = into
		}
		onSheet = append(onSheet, n)
	}
	return onSheet, removed
}

// writePartNotes writes the "Notes on parts" section; nothing when no part
// carries a note. The text is the user's, so it is escaped for Markdown.
func writePartNotes(b *bytes.Buffer, n *Note) {
	if len(n.PartNotes) == 0 && len(n.RemovedNotes) == 0 {
		return
	}
	b.WriteString("## Notes on parts\n\n")
	for _, g := range []struct {
		head  string
		notes []PartNote
	}{
		{"On the reduced sheet:", n.PartNotes},
		{"Removed by the reduction (on the faded sheet):", n.RemovedNotes},
	} {
		if len(g.notes) == 0 {
			continue
		}
		b.WriteString(g.head + "\n\n")
		for _, p := range g.notes {
			fmt.Fprintf(b, "- `%s`", mdCode(p.Ref))
			if p.Into != "" {
				fmt.Fprintf(b, " (in `%s`)", mdCode(p.Into))
			}
			if p.At != "" {
				fmt.Fprintf(b, ", %s", mdText(p.At))
			}
			fmt.Fprintf(b, ": %s\n", mdText(p.Text))
		}
		b.WriteString("\n")
	}
}
