package graph

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

// goodFiles lists every netlist that must load: the examples and the good
// and warning fixtures.
func goodFiles(t testing.TB) []string {
	t.Helper()
	var files []string
	for _, pat := range []string{"examples/*.toml", "testdata/good/*.toml", "testdata/warn/*.toml"} {
		m, err := filepath.Glob(filepath.Join(repo, pat))
		if err != nil {
			t.Fatal(err)
		}
		files = append(files, m...)
	}
	sort.Strings(files)
	if len(files) < 4 {
		t.Fatalf("found only %d netlists to test", len(files))
	}
	return files
}

func mustLoad(t *testing.T, path string) *Circuit {
	t.Helper()
	c, err := LoadFile(path)
	if err != nil {
		t.Fatalf("load %s: %v", path, err)
	}
	return c
}

func writeString(t testing.TB, c *Circuit) string {
	t.Helper()
	var b bytes.Buffer
	if err := Write(&b, c); err != nil {
		t.Fatalf("write: %v", err)
	}
	return b.String()
}

// TestRoundTrip: Load → Write → Load gives the same circuit, and a second
// Write is byte-identical to the first (the canonical layout is a fixpoint).
func TestRoundTrip(t *testing.T) {
	for _, path := range goodFiles(t) {
		t.Run(filepath.Base(path), func(t *testing.T) {
			c1 := mustLoad(t, path)
			out1 := writeString(t, c1)
			c2, err := Parse(path, []byte(out1))
			if err != nil {
				t.Fatalf("written netlist does not load back: %v\n%s", err, out1)
			}
			if diffs := diffCircuits(c1, c2); len(diffs) > 0 {
				t.Errorf("circuit changed on the round trip:\n%s", strings.Join(diffs, "\n"))
			}
			out2 := writeString(t, c2)
			if out1 != out2 {
				t.Errorf("Write is not a fixpoint:\n%s", firstDiff(out1, out2))
			}
		})
	}
}

// TestLoadDeterministic: loading the same file twice gives byte-identical
// output, so nothing depends on map order.
func TestLoadDeterministic(t *testing.T) {
	for _, path := range goodFiles(t) {
		a := writeString(t, mustLoad(t, path))
		for i := 0; i < 5; i++ {
			if b := writeString(t, mustLoad(t, path)); a != b {
				t.Fatalf("%s: load %d wrote different output:\n%s", path, i+2, firstDiff(a, b))
			}
		}
	}
}

// TestExamplesCanonical: the examples are kept in `pare fmt` layout, so the
// file on disk is exactly what Write produces.
func TestExamplesCanonical(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join(repo, "examples", "*.toml"))
	if len(files) != 4 {
		t.Fatalf("want the four examples (three sections and the whole set), found %d", len(files))
	}
	for _, path := range files {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if got := writeString(t, mustLoad(t, path)); got != string(data) {
			t.Errorf("%s is not canonical:\n%s", path, firstDiff(string(data), got))
		}
	}
}

// TestExamplesClean: the examples pass graph.Check with no warnings
// (the brief for the examples: `pare check` exit 0, no warnings).
func TestExamplesClean(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join(repo, "examples", "*.toml"))
	for _, path := range files {
		if w := Check(mustLoad(t, path)); len(w) > 0 {
			t.Errorf("%s: unexpected warnings:\n%v", path, w)
		}
	}
}

// TestCommentsKept: fmt keeps comments above entries and after them.
func TestCommentsKept(t *testing.T) {
	src := `# header line
title = "t" # after title
band = "1M..2M"

[parts]
# above R1
R1 = { r = "1k", pins = ["a", "gnd"] } # after R1
R2 = { r = "1k", pins = ["a", "gnd"] }
`
	c, err := Parse("c.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	out := writeString(t, c)
	for _, want := range []string{"# header line\ntitle = \"t\" # after title\n", "# above R1\nR1 = ", "] } # after R1\n"} {
		if !strings.Contains(out, want) {
			t.Errorf("comment lost: want %q in\n%s", want, out)
		}
	}
}

func firstDiff(a, b string) string {
	la, lb := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := 0; i < len(la) || i < len(lb); i++ {
		var x, y string
		if i < len(la) {
			x = la[i]
		}
		if i < len(lb) {
			y = lb[i]
		}
		if x != y {
			return fmt.Sprintf("line %d:\n- %s\n+ %s", i+1, x, y)
		}
	}
	return "(no line differs)"
}

// diffCircuits is the writer's own round-trip comparison.
func diffCircuits(a, b *Circuit) []string { return Differences(a, b) }

// TestDiffCircuitsNotices makes sure the round-trip comparison can fail: each
// edit below changes the meaning of the circuit and must be reported.
func TestDiffCircuitsNotices(t *testing.T) {
	base := mustLoad(t, filepath.Join(repo, "testdata", "good", "every-kind.toml"))
	edits := map[string]func(c *Circuit){
		"value 1e-6 relative": func(c *Circuit) { c.Part("R1").Value.Max *= 1 + 1e-6 },
		"pin net":             func(c *Circuit) { c.Part("C1").Pins[0].Net = "gnd" },
		"winding L":           func(c *Circuit) { c.Part("T1").Windings[0].L *= 1.01 },
		"coupling":            func(c *Circuit) { c.Part("L3").Coupling[0].K = 0.5 },
		"net role":            func(c *Circuit) { c.Net("h").Role = Signal },
		"region band":         func(c *Circuit) { c.Region("audio").Band.Min = 30 },
		"param":               func(c *Circuit) { c.Part("Q1").Params["beta"] = 61 },
		"freq":                func(c *Circuit) { c.Freqs["if"] = 455e3 },
		"closes":              func(c *Circuit) { c.Part("S1").Closes[0] = nil },
	}
	for name, edit := range edits {
		c := base.Clone()
		edit(c)
		if len(diffCircuits(base, c)) == 0 {
			t.Errorf("%s: change not noticed", name)
		}
	}
	if d := diffCircuits(base, base.Clone()); len(d) > 0 {
		t.Errorf("a clone differs: %v", d)
	}
}

// TestValuesWrittenExactly: a value that needs more digits than its usual
// letter-code form keeps them all (found by FuzzLoad: 70010 F was written
// "70k"). The expected text is the letter code of IEC 60062 with the digits
// the value has.
func TestValuesWrittenExactly(t *testing.T) {
	cases := []struct {
		r    string
		want string
	}{
		{"4702", `r = "4k702"`},
		{"4.7k", `r = "4k7"`},
		{"1.0001M", `r = "1M0001"`},
		{"0.47", `r = "R47"`},
		{"123456789", `r = "123M456789"`},
	}
	for _, tc := range cases {
		c, err := Parse("t.toml", []byte(`band = "1M..2M"`+"\n[parts]\nR1 = { r = \""+tc.r+"\", pins = [\"a\", \"gnd\"] }\n"))
		if err != nil {
			t.Fatal(err)
		}
		out := writeString(t, c)
		if !strings.Contains(out, tc.want) {
			t.Errorf("r = %q written as\n%s\nwant %s", tc.r, out, tc.want)
		}
	}
}

// TestBlankLinesKept: a blank line the user put between groups of entries
// in a table is a grouping fmt keeps (one blank line, however many were
// written); the first entry of a table and the top of the file get none, as
// the writer parts tables itself, and the result is canonical.
func TestBlankLinesKept(t *testing.T) {
	src := `title = "t"

band = "1M..2M"

[parts]

R1 = { r = "1k", pins = ["a", "gnd"] }
R2 = { r = "1k", pins = ["a", "gnd"] }


# second group
R3 = { r = "1k", pins = ["a", "b"] }
R4 = { r = "1k", pins = ["b", "gnd"] }
`
	want := `title = "t"

band = "1M..2M"

[parts]
R1 = { r = "1k", pins = ["a", "gnd"] }
R2 = { r = "1k", pins = ["a", "gnd"] }

# second group
R3 = { r = "1k", pins = ["a", "b"] }
R4 = { r = "1k", pins = ["b", "gnd"] }
`
	c, err := Parse("c.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	out := writeString(t, c)
	if out != want {
		t.Errorf("written:\n%s\nwant:\n%s", out, want)
	}
	again, err := Parse("c.toml", []byte(out))
	if err != nil {
		t.Fatal(err)
	}
	if twice := writeString(t, again); twice != out {
		t.Errorf("not canonical: a second write gives\n%s", twice)
	}
}
