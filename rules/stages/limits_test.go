package stages

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// Red-team item 10: a loose user pattern (four resistors on one net) on a
// 60-arm star held every one of its C(60,4) = 487,635 matches (counted by
// the binomial formula), 144 MB and 11 s, and exited 0 with no word. The
// search now stops at MaxMatches with the limit's error.
func TestMatchesHeldAreBounded(t *testing.T) {
	dir := t.TempDir()
	pat := `id = "user-star"
title = "Resistor star"
group = "amplifier"
rank = 1
[nets]
a = {}
b = {}
c = {}
d = {}
e = {}
[parts]
R1 = { device = "resistor", pins = ["a", "b"] }
R2 = { device = "resistor", pins = ["a", "c"] }
R3 = { device = "resistor", pins = ["a", "d"] }
R4 = { device = "resistor", pins = ["a", "e"] }
`
	if err := os.WriteFile(filepath.Join(dir, "star.toml"), []byte(pat), 0o644); err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	b.WriteString("band = \"1k..2k\"\ninputs = [\"hub\"]\noutputs = [\"o1\"]\n[parts]\n")
	for k := 1; k <= 60; k++ {
		fmt.Fprintf(&b, "R%d = { r = \"%dk\", pins = [\"hub\", \"o%d\"] }\nC%d = { c = \"%dn\", pins = [\"o%d\", \"gnd\"] }\n", k, k, k, k, k, k)
	}
	c, err := graph.Parse("star.toml", []byte(b.String()))
	if err != nil {
		t.Fatal(err)
	}
	_, err = Find(c, Options{PatternDir: dir})
	if !errors.Is(err, ErrSearchLimit) || !strings.Contains(err.Error(), "user-star matched more than 20000 times") {
		t.Fatalf("got %v, want the matches-held limit", err)
	}
}

// Item 11: a folder named x.toml and a link to /dev/zero in a pattern
// folder are reported at their names, and every other file is still read;
// before, the folder aborted the run and the device filled memory.
func TestPatternFolderRefusesOddFiles(t *testing.T) {
	dir := t.TempDir()
	os.Mkdir(filepath.Join(dir, "x.toml"), 0o755)
	os.Symlink("/dev/zero", filepath.Join(dir, "zero.toml"))
	os.WriteFile(filepath.Join(dir, "bad.toml"), []byte("id = 1\n"), 0o644)
	_, err := LoadDir(dir)
	var l graph.ErrorList
	if !errors.As(err, &l) {
		t.Fatalf("got %v, want positioned errors", err)
	}
	text := l.Error()
	for _, want := range []string{"x.toml:1:1: " + filepath.Join(dir, "x.toml") + " is a folder", "zero.toml:1:1: " + filepath.Join(dir, "zero.toml") + " is a device", "bad.toml:1:"} {
		if !strings.Contains(text, want) {
			t.Errorf("errors lack %q:\n%s", want, text)
		}
	}
}

// A supply rail shared by many stages, each fed through its own resistor
// and decoupled on its own side, with a bypass capacitor per stage on the
// rail: the supply filter section pattern (any element, a capacitor to
// ground on one end) tries every resistor with every bypass, 142 × 142 =
// 20,164 pairs (counted by the product rule), nearly all the wrong way
// round. The bound counts what the pattern's guards pass, so the search
// ends without the limit's error; before, it held every pair it tried and
// stopped at 20,000, as on the 5,020-part bank.
func TestSharedRailIsNotTheLimit(t *testing.T) {
	var b strings.Builder
	b.WriteString("band = \"1k..2k\"\ninputs = [\"in\"]\noutputs = [\"o1\"]\n[nets]\nvcc = { role = \"supply\", volts = 9 }\n[parts]\nR999 = { r = \"1k\", pins = [\"in\", \"gnd\"] }\n")
	for k := 1; k <= 142; k++ {
		fmt.Fprintf(&b, "R%d = { r = \"%dk\", pins = [\"vcc\", \"o%d\"] }\nC%d = { c = \"10n\", pins = [\"o%d\", \"gnd\"] }\nC%d = { c = \"100u\", pins = [\"vcc\", \"gnd\"] }\n", k, k, k, k, k, 1000+k)
	}
	c, err := graph.Parse("rail.toml", []byte(b.String()))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Find(c, Options{Full: c}); err != nil {
		t.Fatalf("got %v, want no limit on a shared rail", err)
	}
}
