// Package golden compares what a test produced with a golden file checked
// into the repository. Messages, logs, warnings and drawings all have golden
// files; each package keeps its own -update flag, and this package does the
// writing, reading and comparing the same way everywhere.
package golden

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// shownLimit is the size up to which a differing file is printed in full in
// the failure (messages and logs); drawings are only named.
const shownLimit = 8 << 10

// Check compares got with the file at path; with update set it first writes
// got there (creating folders), so a reviewed change becomes the new golden
// file. A missing file or a difference fails the test; regen is the command
// that regenerates the file, for the failure message. It reports whether the
// two were equal.
func Check(t testing.TB, path string, got []byte, update bool, regen string) bool {
	t.Helper()
	if update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("no golden file %s (%s, then review it): %v", path, regen, err)
	}
	if bytes.Equal(want, got) {
		return true
	}
	if len(got) <= shownLimit && len(want) <= shownLimit {
		t.Errorf("%s differs from what the test produced (review, then %s)\n--- got\n%s--- want\n%s", path, regen, got, want)
	} else {
		t.Errorf("%s differs from what the test produced (review, then %s)", path, regen)
	}
	return false
}
