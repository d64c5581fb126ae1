package rules

import (
	"flag"
	"path/filepath"
	"strings"
	"testing"

	"pare/internal/golden"
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
		t.Fatal("no fixtures found under testdata")
	}
	for _, path := range files {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, log := reduceChecked(t, c, Options{Level: lvl})
			got := logText(log) + "---\n" + written(t, r)
			name := filepath.Join("testdata", "golden", strings.TrimSuffix(filepath.Base(path), ".toml")+"."+lvl.String()+".log")
			golden.Check(t, name, []byte(got), *update, "go test ./rules -run TestGoldenLogs -update")
		}
	}
}
