package stages

import (
	"os"
	"strings"
	"testing"
)

// The embedded library must load without a single message: a broken
// built-in pattern is a build mistake, and users would see it on every run.
func TestBuiltinLoads(t *testing.T) {
	lib, err := Builtin()
	if err != nil {
		t.Fatalf("built-in patterns: %v", err)
	}
	if len(lib.Patterns) < 20 {
		t.Errorf("built-in library has %d patterns, the issue asks for at least 20", len(lib.Patterns))
	}
	for _, p := range lib.Patterns {
		t.Logf("%-34s %-10s variants %d", p.ID, p.Group, len(p.variants))
	}
}

// docs/patterns.md lists every built-in topology, so the page stays true.
func TestDocsListEveryPattern(t *testing.T) {
	doc, err := os.ReadFile("../../docs/patterns.md")
	if err != nil {
		t.Fatal(err)
	}
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range lib.Patterns {
		if !strings.Contains(string(doc), "`"+p.ID+"`") {
			t.Errorf("docs/patterns.md does not list %s", p.ID)
		}
	}
	for name := range calcs {
		if !strings.Contains(string(doc), "| `"+name+"` |") {
			t.Errorf("docs/patterns.md does not describe calc %s", name)
		}
	}
}

// Each built-in pattern lives in the file named after its id, so a message
// about a pattern points at the file a reader expects.
func TestPatternFilesNamedByID(t *testing.T) {
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range lib.Patterns {
		if want := "patterns/" + p.ID + ".toml"; p.Pos.File != want {
			t.Errorf("pattern %s is in %s, want %s", p.ID, p.Pos.File, want)
		}
	}
}
