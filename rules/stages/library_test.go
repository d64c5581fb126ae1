package stages

import "testing"

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
