package stages

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/rules"
)

// A built-in pattern that does not load is pare's fault: the error is an
// internal one (the commands exit 3 and ask for a report), it names the
// pattern file and its position, and never reads as the user's netlist.
func TestOwnLibraryFailureIsInternal(t *testing.T) {
	dir := t.TempDir()
	bad := "id = \"x\"\ntitle = \"X\"\ngroup = \"amplifier\"\n[calc]\nnot_a_key = 1\n"
	if err := os.WriteFile(filepath.Join(dir, "x.toml"), []byte(bad), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := ownLibrary(LoadDir(dir))
	if err == nil {
		t.Fatal("a broken pattern loaded")
	}
	if !errors.Is(err, rules.ErrInternal) {
		t.Errorf("error %q is not internal", err)
	}
	if !strings.Contains(err.Error(), "x.toml:") {
		t.Errorf("error %q does not name the pattern file", err)
	}
	if lib, err := ownLibrary(Builtin()); err != nil || len(lib.Patterns) == 0 {
		t.Errorf("the built-in library: %v", err)
	}
}
