package main

import (
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// A batch over a folder: a set that verifies, one that fails verification
// and one that cannot be loaded. The bad set stops nothing, the exit status
// is the worst (2), every good set gets its pack, the index escapes the
// title, and stdout, stderr and every file are the same bytes with one
// core and with eight.
func TestBatch(t *testing.T) {
	root := t.TempDir()
	in := filepath.Join(root, "sets")
	if err := os.MkdirAll(filepath.Join(in, "club b"), 0o755); err != nil {
		t.Fatal(err)
	}
	edge, err := os.ReadFile(filepath.Join("testdata", "unverifiable", "floating-grid.toml"))
	if err != nil {
		t.Fatal(err)
	}
	files := map[string]string{
		"a-ok.toml":          "title = \"Stage <b>|one|</b> [x](y)\"\n" + triode,
		"b-bad.toml":         "title = \"broken\"\n[parts]\nR1 = { r = \"4k7\", pins = [\"a\"] }\n",
		"club b/c-fail.toml": string(edge),
	}
	for name, src := range files {
		if err := os.WriteFile(filepath.Join(in, name), []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	out := filepath.Join(root, "packs")
	var first []string
	for _, procs := range []int{1, 8} {
		old := runtime.GOMAXPROCS(procs)
		code, stdout, stderr := runJob(t, in, "-o", out, "--no-verify")
		runtime.GOMAXPROCS(old)
		if code != exitBad {
			t.Fatalf("GOMAXPROCS %d: exit %d, want 2\n%s\n%s", procs, code, stdout, stderr)
		}
		got := []string{stdout, stderr}
		for _, f := range []string{"index.md", "index.html", "a-ok.pare/notes.md", "a-ok.pare/notes.html", "a-ok.pare/reduced.svg", "c-fail.pare/notes.md"} {
			got = append(got, readString(t, filepath.Join(out, f)))
		}
		if first == nil {
			first = got
			continue
		}
		for i := range got {
			if got[i] != first[i] {
				t.Errorf("output %d differs between GOMAXPROCS 1 and 8", i)
			}
		}
	}
	md, page := first[2], first[3]
	for _, want := range []string{"[a\\-ok\\.toml](a-ok.pare/notes.md)", "Stage \\<b\\>\\|one\\|\\</b\\> \\[x\\]\\(y\\)", "b\\-bad\\.toml", "no band of interest"} {
		if !strings.Contains(md, want) {
			t.Errorf("index.md lacks %q:\n%s", want, md)
		}
	}
	if !strings.Contains(page, `<a href="a-ok.pare/notes.html">`) {
		t.Errorf("index.html does not link the HTML note:\n%s", page)
	}
	if strings.Contains(page, "<b>") || !strings.Contains(page, "Stage &lt;b&gt;|one|&lt;/b&gt;") {
		t.Errorf("index.html does not escape the title:\n%s", page)
	}
	if _, err := os.Stat(filepath.Join(out, "b-bad.pare")); err == nil {
		t.Error("a pack was written for the set that does not load")
	}
	// Without --no-verify the floating grid fails verification: exit 1
	// when nothing is worse.
	os.Remove(filepath.Join(in, "b-bad.toml"))
	if code, stdout, stderr := runJob(t, in, "-o", out); code != exitFound {
		t.Errorf("exit %d, want 1\n%s\n%s", code, stdout, stderr)
	}
}

// triode is a common-cathode stage with its coupling capacitor (the main
// job's smallest useful set).
const triode = `band = "20..20k"
inputs = ["in"]
outputs = ["out"]

[nets]
ht = { role = "supply", volts = 250 }

[parts]
V1 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "a", g1 = "in", k = "gnd" } }
R1 = { r = "47k", pins = ["a", "ht"] }
C1 = { c = "180n", pins = ["a", "out"] }
R2 = { r = "470k", pins = ["out", "gnd"] }
`

func TestCommonDir(t *testing.T) {
	cases := []struct {
		paths []string
		want  string
	}{
		{[]string{"a/b/x.toml", "a/b/y.toml"}, "a/b"},
		{[]string{"a/b/x.toml", "a/c/y.toml"}, "a"},
		{[]string{"a/b/x.toml", "z.toml"}, "."},
		{[]string{"/s/a/x.toml", "/s/ab/y.toml"}, "/s"}, // a prefix of a name is not a folder
	}
	for _, c := range cases {
		if got := commonDir(c.paths); got != c.want {
			t.Errorf("commonDir(%v) = %q, want %q", c.paths, got, c.want)
		}
	}
}
