package graph

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
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
			golden := strings.TrimSuffix(path, ".toml") + ".warn"
			if *update {
				if err := os.WriteFile(golden, []byte(got.String()), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("no golden file (run with -update and review it): %v", err)
			}
			if got.String() != string(want) {
				t.Errorf("warnings differ from %s\n--- got\n%s--- want\n%s", golden, got.String(), want)
			}
		})
	}
}
