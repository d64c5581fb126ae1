package graph

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/internal/golden"
)

// TestCheckWarnings loads each fixture under testdata/warn (each holds one
// transcription mistake that loads fine) and compares graph.Check's warnings
// with NAME.warn. The expected warnings were written from the checks' intent
// (docs/netlist.md, "Messages"; the plausible ranges are common practice) and
// reviewed by eye; -update rewrites them.
func TestCheckWarnings(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(repo, "testdata", "warn", "*.toml"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 9 {
		t.Fatalf("only %d warning fixtures", len(files))
	}
	for _, path := range files {
		name := filepath.ToSlash(strings.TrimPrefix(path, repo+string(filepath.Separator)))
		t.Run(strings.TrimSuffix(filepath.Base(path), ".toml"), func(t *testing.T) {
			data, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			c, err := Parse(name, data)
			if err != nil {
				t.Fatalf("a warning fixture must load: %v", err)
			}
			warnings := Check(c)
			if len(warnings) == 0 {
				t.Fatalf("no warning for %s", name)
			}
			var got strings.Builder
			for _, w := range warnings {
				got.WriteString(w.Error())
				got.WriteByte('\n')
			}
			golden.Check(t, strings.TrimSuffix(path, ".toml")+".warn", []byte(got.String()), *update, "go test ./graph -update")
		})
	}
}

// A gang of one tuning capacitor is normal where no other variable
// capacitor stands outside a gang (a single-section VFO capacitor: common
// practice); it is a note, not a warning. With a loose variable capacitor
// beside it the lost mark is likely, and Check warns
// (testdata/warn/gang-one-member.toml).
func TestGangOfOneIsANote(t *testing.T) {
	const vfo = `title = "one-section VFO tank"
band = "3.4M..4.1M"
[parts]
L1 = { l = "4u7", pins = ["tank", "gnd"] }
C1 = { c = "10p..60p", gang = "vfo", pins = ["tank", "gnd"] }
TC1 = { c = "3p..30p", set = "15p", pins = ["tank", "gnd"] }
P1 = { port = "to grid", pins = ["tank"] }
`
	for _, tc := range []struct {
		name, text   string
		warns, notes int
	}{
		{"single section", vfo, 0, 1},
		{"a loose section beside it", vfo + `C2 = { c = "10p..60p", pins = ["tank", "gnd"] }` + "\n", 1, 0},
	} {
		c, err := Parse("vfo.toml", []byte(tc.text))
		if err != nil {
			t.Fatal(err)
		}
		warns := 0
		for _, w := range Check(c) {
			if strings.Contains(w.Msg, "gang") {
				warns++
			}
		}
		if notes := len(CheckNotes(c)); warns != tc.warns || notes != tc.notes {
			t.Errorf("%s: %d gang warnings, %d notes, want %d and %d", tc.name, warns, notes, tc.warns, tc.notes)
		}
	}
}
