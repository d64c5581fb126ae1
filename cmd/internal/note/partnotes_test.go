package note

import (
	"strings"
	"testing"

	"pare/graph"
)

// The parts' own notes reach the repair note: a kept part under its ref, a
// merged one under the part it is drawn as, a removed one in its own list,
// each with where it was written, and the user's text escaped so that it
// cannot turn into markup (CommonMark: '*' opens emphasis, '<' an HTML tag,
// '[' a link; a newline would end the list item).
func TestPartNotes(t *testing.T) {
	const src = `band = "530k..1.6M"
[parts]
R1 = { r = "47k", pins = ["g", "gnd"], note = "grid leak: about -8 V *here* when oscillating" }
C1 = { c = "100n", pins = ["ht_x", "gnd"], note = "bypass <check> [leaky?]" }
TC1 = { c = "5p..50p", set = "30p", pins = ["t", "gnd"], note = "trimmer: peak at\n1400 kHz" }
VC1 = { c = "12p..365p", pins = ["t", "gnd"] }
L1 = { l = "200u", pins = ["t", "gnd"] }
`
	orig, err := graph.Parse("set.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	reduced := orig.Clone()
	reduced.RemovePart("C1")
	reduced.RemovePart("TC1")
	reduced.Part("VC1").From = []string{"TC1", "VC1"}
	n := sampleNote()
	n.PartNotes, n.RemovedNotes = partNotes(orig, reduced)
	got := writeToString(t, n)
	want := "## Notes on parts\n\nOn the reduced sheet:\n\n" +
		"- `R1`, set.toml:3: grid leak: about -8 V \\*here\\* when oscillating\n" +
		"- `TC1` (in `VC1`), set.toml:5: trimmer: peak at 1400 kHz\n\n" +
		"Removed by the reduction (on the faded sheet):\n\n" +
		"- `C1`, set.toml:4: bypass \\<check\\> \\[leaky?\\]\n\n"
	if !strings.Contains(got, want) {
		t.Errorf("notes on parts:\n%s\nwant a section\n%s", got, want)
	}
	// No note on any part: no section at all.
	n.PartNotes, n.RemovedNotes = nil, nil
	if got := writeToString(t, n); strings.Contains(got, "Notes on parts") {
		t.Errorf("a section with nothing in it:\n%s", got)
	}
}
