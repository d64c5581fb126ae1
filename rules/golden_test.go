package rules

import (
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden logs in testdata/golden")

// The logs of our own fixtures are kept as golden files, read and agreed
// with by hand (the numbers in them are checked by the rule tests): a change
// in wording or in what a rule decides shows up here as a diff. The
// project's examples are left out because another engineer is still
// editing them. Run with -update after an intended change, and read the diff.
func TestGoldenLogs(t *testing.T) {
	files, _ := filepath.Glob("testdata/*.toml")
	if len(files) == 0 {
		t.Skip("no fixtures")
	}
	for _, path := range files {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, log := reduceChecked(t, c, Options{Level: lvl})
			got := logText(log) + "---\n" + written(t, r)
			name := filepath.Join("testdata", "golden", strings.TrimSuffix(filepath.Base(path), ".toml")+"."+lvl.String()+".log")
			if *update {
				if err := os.MkdirAll(filepath.Dir(name), 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(name, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				continue
			}
			want, err := os.ReadFile(name)
			if err != nil {
				t.Fatalf("%v (run go test ./rules -run TestGoldenLogs -update)", err)
			}
			if string(want) != got {
				t.Errorf("%s at %s: log differs from %s:\n--- got\n%s\n--- want\n%s", path, lvl, name, got, want)
			}
		}
	}
}
