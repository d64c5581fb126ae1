package graph

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

// TestKeyPositions: the key scanner finds where keys and values stand
// (1-based line and column, in runes), through quoted keys, table headers,
// multi-line strings and arrays.
func TestKeyPositions(t *testing.T) {
	src := "title = \"\"\"two\nlines\"\"\"\nband = \"1M..2M\"\n\n[parts]\n\"R1\" = { r = \"1k\", pins = [\n  \"a\", # µ\n  \"gnd\"] }\n[parts.C1]\nc = 'x'\n"
	ix := indexKeys("f.toml", src)
	cases := []struct {
		path      string
		key, val  [2]int
		hasKeyPos bool
	}{
		{"title", [2]int{1, 1}, [2]int{1, 9}, true},
		{"band", [2]int{3, 1}, [2]int{3, 8}, true},
		{"parts", [2]int{5, 1}, [2]int{5, 1}, true},
		{"parts.R1", [2]int{6, 1}, [2]int{6, 8}, true},
		{"parts.R1.r", [2]int{6, 10}, [2]int{6, 14}, true},
		{"parts.R1.pins", [2]int{6, 20}, [2]int{6, 27}, true},
		{"parts.R1.pins[1]", [2]int{}, [2]int{8, 3}, false},
		{"parts.C1.c", [2]int{10, 1}, [2]int{10, 5}, true},
	}
	for _, tc := range cases {
		v := ix.val(tc.path)
		if v.Line != tc.val[0] || v.Col != tc.val[1] {
			t.Errorf("%s value at %d:%d, want %d:%d", tc.path, v.Line, v.Col, tc.val[0], tc.val[1])
		}
		if !tc.hasKeyPos {
			continue
		}
		if k := ix.key(tc.path); k.Line != tc.key[0] || k.Col != tc.key[1] {
			t.Errorf("%s key at %d:%d, want %d:%d", tc.path, k.Line, k.Col, tc.key[0], tc.key[1])
		}
	}
	// A path never written falls back to its parent's key.
	if p := ix.key("parts.R1.nosuch"); p.Line != 6 || p.Col != 1 {
		t.Errorf("fallback position %v, want 6:1", p)
	}
}

// TestKeyScannerTerminates: the scanner walks text the decoder accepted,
// but whatever it is handed (cut-off strings, stray brackets, NUL bytes,
// multi-line strings closed by extra quotes) it must end, and not panic.
func TestKeyScannerTerminates(t *testing.T) {
	inputs := []string{
		"", "\x00", "a = [\x00", "a = {\x00", "a = [ } ]", "a = { ] }", "a = [[[[", "a = {{{{",
		"a = '''x'''', b = [1] }", "a = [ '''x'''', 1 ] }}}", "a = \"\"\"x\"\"\"\"\"", "a = \"\\", "a = '",
		"[", "[[", "[a", "[\"a", "= = =", "....", "a.\"b", "# only a comment", "a = 1 # c\n# d",
		"a = [\n# c\n]", "a = { b = [ { c = [ ] } ] }", "\"\"\"", "'''", "a = \"\"\"\n\\\n\"\"\"",
		strings.Repeat("[", 1000), strings.Repeat("{", 1000), strings.Repeat("a.", 1000),
	}
	for _, in := range inputs {
		done := make(chan struct{})
		go func() {
			defer close(done)
			indexKeys("f.toml", in)
		}()
		select {
		case <-done:
		case <-time.After(5 * time.Second):
			t.Fatalf("scanner did not finish on %q", in)
		}
	}
}

// TestElementRuns: an element of a keyed array, kept in its array's run
// rather than as a path, is found by its path (name[i]) and by elemVal as
// it was when every element was a path: on every example and fixture, and
// on text that writes a keyed array twice (the decoder refuses it, the
// scanner still reads it: the second array's elements win, the first's
// beyond them stay).
func TestElementRuns(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.toml")
	more, _ := filepath.Glob("../testdata/*/*.toml")
	srcs := map[string]string{"twice": "a = [1, 2, 3]\na = [\n 4]\nb = { c = [[5], [6, 7]] }\n"}
	for _, f := range append(files, more...) {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		srcs[f] = string(data)
	}
	for name, src := range srcs {
		ix := indexKeys(name, src)
		for path, a := range ix.at {
			for i := 0; i < int(a.nElems)+1; i++ {
				ep := path + "[" + strconv.Itoa(i) + "]"
				if got, want := ix.elemVal(path, i), ix.val(ep); got != want {
					t.Errorf("%s: elemVal(%s, %d) = %v, val = %v", name, path, i, got, want)
				}
				if _, ok := ix.lookup(ep); ok != (i < int(a.nElems)) && !ix.rescans {
					t.Errorf("%s: %s found %v with %d elements", name, ep, ok, a.nElems)
				}
				if _, ok := ix.lookup(path + "[0" + strconv.Itoa(i) + "]"); ok {
					t.Errorf("%s: %s[0%d] found: only Itoa's spelling names an element", name, path, i)
				}
			}
		}
	}
	ix := indexKeys("twice", srcs["twice"])
	for path, want := range map[string][2]int{"a[0]": {3, 2}, "a[1]": {1, 9}, "a[2]": {1, 12}, "b.c[1]": {4, 17}, "b.c[1][1]": {4, 21}} {
		if p := ix.val(path); p.Line != want[0] || p.Col != want[1] {
			t.Errorf("twice: %s at %d:%d, want %d:%d", path, p.Line, p.Col, want[0], want[1])
		}
	}
}
