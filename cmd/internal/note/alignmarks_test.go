package note

import (
	"slices"
	"testing"

	"pare/cmd/internal/align"
)

// TestAlignMarksList: one line a part turned, in the order of its first
// step, its steps counted as a reader says them, and a part no drawn sheet
// marks said to be on none rather than left out.
func TestAlignMarksList(t *testing.T) {
	g := &align.Guide{Steps: []align.Step{{N: 1, Part: "T7"}, {N: 2, Part: "T7"}, {N: 3, Part: "TC1"}, {N: 4, Part: "T7"}}}
	where := map[string]string{"T7": "the reduced sheet 2 of 3 and the faded sheet 5 of 8"}
	got := alignMarks(g, func(ref string) string { return where[ref] })
	want := []string{
		"T7, steps 1, 2 and 4: the reduced sheet 2 of 3 and the faded sheet 5 of 8.",
		"TC1, step 3: on no sheet drawn.",
	}
	if !slices.Equal(got, want) {
		t.Errorf("got %q\nwant %q", got, want)
	}
}
