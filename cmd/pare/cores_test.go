package main

import (
	"os"
	"path/filepath"
	"runtime"
	"testing"

	"pare/internal/synth"
)

// TestJobSameOnEveryCore: one set's main job spreads its independent work
// (the two views' layouts, the stages' figures) over the processors free
// (internal/par), and its pack must not show it: every file, stdout and
// stderr are the same bytes with one processor, two and eight. The sets:
// the flagship (a wavechange set, several pages a view) and a bank of
// some 450 parts, large enough that its stages are solved on pieces.
func TestJobSameOnEveryCore(t *testing.T) {
	if testing.Short() {
		t.Skip("three main jobs per set")
	}
	root := t.TempDir()
	bank, err := synth.Bank(450, 1)
	if err != nil {
		t.Fatal(err)
	}
	bankPath := filepath.Join(root, "bank.toml")
	if err := os.WriteFile(bankPath, bank, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, set := range []string{filepath.Join("..", "..", "examples", "club-receiver.toml"), bankPath} {
		var first map[string]string
		for _, procs := range []int{1, 2, 8} {
			out := filepath.Join(root, "pack")
			old := runtime.GOMAXPROCS(procs)
			code, stdout, stderr := runJob(t, set, "-o", out)
			runtime.GOMAXPROCS(old)
			got := map[string]string{"exit": string(rune('0' + code)), "stdout": stdout, "stderr": stderr}
			entries, err := os.ReadDir(out)
			if err != nil {
				t.Fatal(err)
			}
			for _, e := range entries {
				got[e.Name()] = readString(t, filepath.Join(out, e.Name()))
			}
			if first == nil {
				first = got
				continue
			}
			if len(got) != len(first) {
				t.Errorf("%s: GOMAXPROCS %d wrote %d files, 1 wrote %d", set, procs, len(got)-3, len(first)-3)
			}
			for name, b := range got {
				if first[name] != b {
					t.Errorf("%s: %s differs between GOMAXPROCS 1 and %d", set, name, procs)
				}
			}
		}
	}
}
