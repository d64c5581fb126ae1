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
