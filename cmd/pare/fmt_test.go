package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"pare/graph"
)

// fmtCopy copies a netlist into a fresh directory and returns its path.
func fmtCopy(t *testing.T, src, name string) string {
	t.Helper()
	data, err := os.ReadFile(src)
	if err != nil {
		t.Fatal(err)
	}
	dst := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(dst, data, 0o644); err != nil {
		t.Fatal(err)
	}
	return dst
}

// messy is a valid netlist in a layout fmt rewrites: unsorted parts, odd
// spacing, values in other notations.
const messy = `# a header comment

band="530k..1700k"
title =   "messy"
[parts]
R2 = { pins = ["b", "gnd"], r = 4700 } # after R2
# above R1
R1 = { r = "4.7 kΩ", pins = ["a", "b"] }
`

func TestFmtCheck(t *testing.T) {
	for _, src := range cliGlob(t, "examples/*.toml") {
		if code, out, errs := cliRun(t, "fmt", "--check", src); code != exitOK {
			t.Errorf("fmt --check %s: exit %d\n%s%s", src, code, out, errs)
		}
	}
	path := filepath.Join(t.TempDir(), "messy.toml")
	if err := os.WriteFile(path, []byte(messy), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, _ := cliRun(t, "fmt", "--check", path)
	if code != exitFound || !strings.Contains(out, "not in canonical layout") {
		t.Errorf("fmt --check on a messy file: exit %d, %q", code, out)
	}
	if data, _ := os.ReadFile(path); string(data) != messy {
		t.Error("fmt --check changed the file")
	}
}

// TestFmtRewrites: fmt rewrites a messy file into exactly graph.Write's
// output, keeps the comments, leaves no temporary file behind, and the
// result is then canonical.
func TestFmtRewrites(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "messy.toml")
	if err := os.WriteFile(path, []byte(messy), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, out, errs := cliRun(t, "fmt", path); code != exitOK {
		t.Fatalf("fmt: exit %d\n%s%s", code, out, errs)
	}
	got, _ := os.ReadFile(path)
	c, err := graph.Parse(path, []byte(messy))
	if err != nil {
		t.Fatal(err)
	}
	var want bytes.Buffer
	if err := graph.Write(&want, c); err != nil {
		t.Fatal(err)
	}
	if string(got) != want.String() {
		t.Errorf("fmt wrote\n%s\nwant\n%s", got, want.String())
	}
	for _, s := range []string{"# a header comment\n", "# above R1\nR1 = ", "# after R2\n", `r = "4k7"`} {
		if !strings.Contains(string(got), s) {
			t.Errorf("formatted file lacks %q:\n%s", s, got)
		}
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("directory holds %v, want only messy.toml (no temporary left over)", names)
	}
	if code, _, _ := cliRun(t, "fmt", "--check", path); code != exitOK {
		t.Errorf("after fmt the file is still not canonical")
	}
}

// TestFmtLeavesCanonicalAlone: an already canonical file is not rewritten
// (its modification time stays), so fmt on a clean tree touches nothing.
func TestFmtLeavesCanonicalAlone(t *testing.T) {
	path := fmtCopy(t, filepath.Join(root, "examples", "if-detector-audio.toml"), "strip.toml")
	old := time.Date(2001, 2, 3, 4, 5, 6, 0, time.UTC)
	if err := os.Chtimes(path, old, old); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := cliRun(t, "fmt", path); code != exitOK {
		t.Fatalf("fmt: exit %d %s", code, errs)
	}
	st, err := os.Stat(path)
	if err != nil {
		t.Fatal(err)
	}
	if !st.ModTime().Equal(old) {
		t.Errorf("fmt rewrote a canonical file (mtime %v)", st.ModTime())
	}
}

// TestFmtBadInput: a file that does not load is reported with positions,
// exit 2, and left exactly as it was.
func TestFmtBadInput(t *testing.T) {
	path := fmtCopy(t, filepath.Join(root, "testdata", "bad", "several-errors.toml"), "bad.toml")
	before, _ := os.ReadFile(path)
	code, _, errs := cliRun(t, "fmt", path)
	if code != exitBad || !strings.Contains(errs, path+":4:12: ") {
		t.Errorf("fmt of a bad file: exit %d, stderr:\n%s", code, errs)
	}
	if after, _ := os.ReadFile(path); !bytes.Equal(before, after) {
		t.Error("fmt changed a file it could not load")
	}
}

func TestFmtToStdoutAndOther(t *testing.T) {
	path := filepath.Join(t.TempDir(), "messy.toml")
	if err := os.WriteFile(path, []byte(messy), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, _ := cliRun(t, "fmt", "-o", "-", path)
	if code != exitOK || !strings.HasPrefix(out, "# a header comment\n\ntitle = \"messy\"\n") {
		t.Errorf("fmt -o -: exit %d\n%s", code, out)
	}
	other := filepath.Join(filepath.Dir(path), "clean.toml")
	if code, _, errs := cliRun(t, "fmt", "-o", other, path); code != exitOK {
		t.Fatalf("fmt -o FILE: exit %d %s", code, errs)
	}
	if data, _ := os.ReadFile(other); string(data) != out {
		t.Error("fmt -o FILE wrote something else than fmt -o -")
	}
	if data, _ := os.ReadFile(path); string(data) != messy {
		t.Error("fmt -o FILE changed the input")
	}
	if code, _, _ := cliRun(t, "fmt", path, path); code != exitBad {
		t.Errorf("fmt with two files: exit %d, want 2", code)
	}
}
