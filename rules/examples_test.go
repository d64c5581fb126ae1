package rules

import (
	"path/filepath"
	"sort"
	"testing"

	"pare/graph"
)

// fixtures are every example of the project and every netlist in testdata.
func fixtures(t *testing.T) []string {
	t.Helper()
	var out []string
	for _, pat := range []string{"../examples/*.toml", "testdata/*.toml"} {
		m, _ := filepath.Glob(pat)
		out = append(out, m...)
	}
	sort.Strings(out)
	if len(out) == 0 {
		t.Skip("no fixtures found")
	}
	return out
}

func loadFile(t *testing.T, path string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return c
}

var levels = []Level{LevelTidy, LevelSignal, LevelIdeal}

func TestPrintExampleLogs(t *testing.T) {
	if !testing.Verbose() {
		t.Skip("prints the logs for reading with -v")
	}
	for _, path := range fixtures(t) {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, log := reduceChecked(t, c, Options{Level: lvl})
			t.Logf("== %s at %s: parts %d → %d, nets %d → %d\n%s", path, lvl, log.Before.Parts, log.After.Parts, log.Before.Nets, log.After.Nets, logText(log))
			_ = r
		}
	}
}
