package outfile

import (
	"os"
	"path/filepath"
	"testing"
)

// The hand-made renameat2 call really swaps two folders on Linux, so
// WriteDir's one-step swap is what runs there, not the two-rename fallback.
func TestExchangeSwapsFolders(t *testing.T) {
	d := t.TempDir()
	a, b := filepath.Join(d, "a"), filepath.Join(d, "b")
	for _, dir := range []string{a, b} {
		if err := os.Mkdir(dir, 0o755); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.WriteFile(filepath.Join(a, "from-a"), nil, 0o644); err != nil {
		t.Fatal(err)
	}
	if err := exchange(a, b); err != nil {
		t.Fatalf("exchange: %v", err)
	}
	if _, err := os.Stat(filepath.Join(b, "from-a")); err != nil {
		t.Errorf("b does not hold a's file after the swap: %v", err)
	}
	if _, err := os.Stat(filepath.Join(a, "from-a")); err == nil {
		t.Error("a still holds its own file after the swap")
	}
}
