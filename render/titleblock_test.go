package render

import (
	"bytes"
	"fmt"
	"strings"
	"testing"
)

// TestTitleBlockFixed: a paged sheet's title block has one size whatever
// the set (common practice: a drawing's title block is a fixed box in the
// corner, ISO 7200 gives its fields, not a list growing with the set), so
// a long legend neither raises the footer nor adds pages: the lines that
// fit are printed in order and the last row says how many more, which the
// repair note lists.
func TestTitleBlockFixed(t *testing.T) {
	for _, name := range []string{"A4", "A3", "letter"} {
		p, _ := ParsePaper(name)
		cfg := Config{Page: p}
		bare := chainSheet(4)
		bareFoot := (&drawer{cfg: cfg, sheet: bare}).footLayout()
		barePages, err := cfg.FprintPages(bare)
		if err != nil {
			t.Fatal(err)
		}
		s := chainSheet(4)
		const n = 200
		for i := 1; i <= n; i++ {
			s.Furniture = append(s.Furniture, fmt.Sprintf("Switch S%d at position 1 of 2", i))
		}
		fl := (&drawer{cfg: cfg, sheet: s}).footLayout()
		if fl.h != bareFoot.h {
			t.Errorf("%s: footer %.2f units high with %d legend lines, %.2f without", name, fl.h, n, bareFoot.h)
		}
		pages, err := cfg.FprintPages(s)
		if err != nil {
			t.Fatal(err)
		}
		if len(pages) != len(barePages) {
			t.Errorf("%s: %d pages with the legend, %d without", name, len(pages), len(barePages))
		}
		shown := fl.cols*legendRows - 1
		last := -1
		for i := 1; i <= shown; i++ {
			at := bytes.Index(pages[0], []byte(fmt.Sprintf(">Switch S%d at", i)))
			if at < last {
				t.Errorf("%s: legend line %d missing or out of order", name, i)
			}
			last = at
		}
		if bytes.Contains(pages[0], []byte(fmt.Sprintf(">Switch S%d at", shown+1))) {
			t.Errorf("%s: legend line %d printed beyond the block's %d rows", name, shown+1, shown+1)
		}
		if more := fmt.Sprintf(">+%d more in the repair note", n-shown); !bytes.Contains(pages[0], []byte(more)) {
			t.Errorf("%s: no %q", name, more)
		}
	}
}

// TestLegendByPage: a page lists the legend lines about the parts it
// draws and the lines about every page, not the others.
func TestLegendByPage(t *testing.T) {
	p, _ := ParsePaper("A4")
	cfg := Config{Page: p}
	s := chainSheet(4)
	s.Legend = []Legend{{Text: "IF 470 kHz"}, {Text: "Tuning S1: 1–2 MHz", Parts: []string{"V1"}},
		{Text: "Tuning S4: 3–4 MHz", Parts: []string{"V4"}}, {Text: "Region gone", Parts: []string{"X9"}}}
	pages, err := cfg.FprintPages(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := cfg.pageResults(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(pages) < 2 {
		t.Fatalf("%d pages, want the chain on several", len(pages))
	}
	for i, r := range res {
		on := map[string]bool{}
		for _, pl := range r.Placed {
			on[pl.Ref] = true
		}
		page := string(pages[i])
		for _, tc := range []struct {
			text string
			want bool
		}{{"IF 470 kHz", true}, {"Tuning S1:", on["V1"]}, {"Tuning S4:", on["V4"]}, {"Region gone", false}} {
			if got := strings.Contains(page, ">"+tc.text); got != tc.want {
				t.Errorf("page %d: %q listed %v, want %v", i+1, tc.text, got, tc.want)
			}
		}
	}
}

// TestFitLegend: a line wider than a column wraps within its column, and
// the row saying how many more counts lines, not rows.
func TestFitLegend(t *testing.T) {
	long := "Pin figures: DC volts to chassis, ideal meter, oscillators stopped"
	cases := []struct {
		name  string
		lines []string
		cols  int
		want  [][]string
	}{
		{"fits", []string{"a", "b"}, 2, [][]string{{"a", "b"}}},
		{"wrap stays in its column", []string{"a", "b", "c", long}, 2,
			[][]string{{"a", "b", "c"}, {"Pin figures: DC volts to chassis, ideal", "meter, oscillators stopped"}}},
		{"more", []string{"a", "b", "c", "d", "e", "f"}, 1, [][]string{{"a", "b", "c", "+3 more in the repair note's Legend"}}},
	}
	for _, tc := range cases {
		got := fitLegend(tc.lines, tc.cols, 4)
		if fmt.Sprint(got) != fmt.Sprint(tc.want) {
			t.Errorf("%s: %q, want %q", tc.name, got, tc.want)
		}
	}
}
