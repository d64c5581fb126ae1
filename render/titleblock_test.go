package render

import (
	"strings"
	"testing"

	"pare/graph"
)

// TestTitleBlockKeepsTheWholeTitle: the title block names the set in full
// (common practice: a drawing's title block identifies it), so a title
// longer than a line takes two, the sheet's number and symbol style sharing
// one so the block keeps its four lines; only a title longer than two lines
// is cut. review16 a04's 77-character title was cut to 60 with an ellipsis
// and its reviewer took the block for clipped.
func TestTitleBlockKeepsTheWholeTitle(t *testing.T) {
	long := "Amplifier: push-pull pentode output stage with cathodyne and overall feedback"
	cases := []struct {
		title string
		want  []string
	}{
		{"Test oscillator", []string{"Test oscillator", "sheet 2 of 3", "view: reduced", "symbols: IEC 60617"}},
		{long, []string{"Amplifier: push-pull pentode output stage with cathodyne and", "overall feedback", "sheet 2 of 3, symbols: IEC 60617", "view: reduced"}},
		{strings.Repeat("word ", 30), nil},
	}
	for _, c := range cases {
		d := &drawer{sheet: &Sheet{Circuit: &graph.Circuit{}, Title: c.title}}
		got := d.sheetLines(2, 3)
		if len(got) != legendRows {
			t.Errorf("%q: %d lines, want %d: %q", c.title, len(got), legendRows, got)
			continue
		}
		for _, l := range got {
			if n := len([]rune(l)); n > titleChars && !strings.HasPrefix(l, "view:") {
				t.Errorf("%q: line %q is %d characters, over %d", c.title, l, n, titleChars)
			}
		}
		if c.want != nil && strings.Join(got, "|") != strings.Join(c.want, "|") {
			t.Errorf("%q: lines %q, want %q", c.title, got, c.want)
		}
	}
}
