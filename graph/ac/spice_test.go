package ac

import (
	"bytes"
	"os"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/value"
)

// The sweep card: linear below an octave, logarithmic above, and at least
// MinSpicePoints (101) points either way. Expected densities are derived:
// ceil(100 / log10(f2/f1)) points per decade gives 100 intervals over the
// band; a linear card's points are ceil(ppd·log10(f2/f1)) + 1 when that is
// more than 101.
func TestACCard(t *testing.T) {
	cases := []struct {
		name     string
		min, max float64
		ppd      int
		want     string
	}{
		{"FM IF band, 0.0081 decade", 10.6e6, 10.8e6, 50, ".ac lin 101 10600000 10800000"},
		{"AM IF band", 430e3, 480e3, 50, ".ac lin 101 430000 480000"},
		{"narrow band at a high density: ceil(10000·0.04777)+1", 430e3, 480e3, 10000, ".ac lin 479 430000 480000"},
		{"one octave: ceil(100/0.30103) per decade", 1e6, 2e6, 50, ".ac dec 333 1000000 2000000"},
		{"medium wave, 0.47985 decade: ceil(100/0.47985)", 530e3, 1.6e6, 50, ".ac dec 209 530000 1600000"},
		{"audio, four decades at 50 per decade is 200 points", 10, 100e3, 50, ".ac dec 50 10 100000"},
		{"audio at 10 per decade is raised to 25", 10, 100e3, 10, ".ac dec 25 10 100000"},
		{"a single frequency", 455e3, 455e3, 50, ".ac lin 1 455000 455000"},
	}
	for _, tc := range cases {
		if got := acCard(value.Range{Min: tc.min, Max: tc.max}, tc.ppd); got != tc.want {
			t.Errorf("%s: %q, want %q", tc.name, got, tc.want)
		}
	}
}

// The deck's header lists the renamed nodes under a header that says what
// they are, and prints no empty list when nothing was renamed.
func TestSpiceNodeNameHeader(t *testing.T) {
	deck := func(path string) string {
		var b bytes.Buffer
		if err := WriteSpice(&b, load(t, path), SpiceOptions{}); err != nil {
			t.Fatal(err)
		}
		return b.String()
	}
	plain := deck("testdata/if-pair.toml") // every net name is already a deck node name
	if !strings.Contains(plain, "* Node names are pare's net names; ground is node 0.\n") || strings.Contains(plain, "except") {
		t.Errorf("a deck without renamings should say so in one line:\n%s", plain)
	}
	src, err := os.ReadFile("testdata/if-pair.toml")
	if err != nil {
		t.Fatal(err)
	}
	c, err := graph.Parse("if-pair.toml", bytes.ReplaceAll(src, []byte(`"s"`), []byte(`"S-top"`)))
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := WriteSpice(&b, c, SpiceOptions{}); err != nil {
		t.Fatal(err)
	}
	renamed := b.String()
	if !strings.Contains(renamed, "except (pare net -> deck node):\n*   S-top -> smtop\n") {
		t.Errorf("the renaming of S-top should be listed under the header:\n%s", renamed)
	}
}
