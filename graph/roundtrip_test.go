package graph

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"pare/graph/value"
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
	if len(files) != 3 {
		t.Fatalf("want the three examples, found %d", len(files))
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

// near compares two values within 1e-9 relative (values pass through decimal
// text on the way, so bit equality is not the contract).
func near(a, b float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b))
}

func nearRange(a, b value.Range) bool { return near(a.Min, b.Min) && near(a.Max, b.Max) }

// diffCircuits lists every way two circuits differ in meaning (positions and
// comment placement are not part of the meaning).
func diffCircuits(a, b *Circuit) []string {
	var d []string
	add := func(format string, args ...any) { d = append(d, fmt.Sprintf(format, args...)) }
	if a.Title != b.Title || a.Note != b.Note {
		add("title/note: %q/%q vs %q/%q", a.Title, a.Note, b.Title, b.Note)
	}
	if !nearRange(a.Band, b.Band) {
		add("band %v vs %v", a.Band, b.Band)
	}
	if fmt.Sprint(a.Inputs) != fmt.Sprint(b.Inputs) || fmt.Sprint(a.Outputs) != fmt.Sprint(b.Outputs) {
		add("inputs/outputs %v %v vs %v %v", a.Inputs, a.Outputs, b.Inputs, b.Outputs)
	}
	if len(a.Freqs) != len(b.Freqs) {
		add("freqs %v vs %v", a.Freqs, b.Freqs)
	}
	for k, v := range a.Freqs {
		if w, ok := b.Freqs[k]; !ok || !near(v, w) {
			add("freq %s: %g vs %g", k, v, w)
		}
	}
	if len(a.Regions) != len(b.Regions) {
		add("%d regions vs %d", len(a.Regions), len(b.Regions))
	} else {
		for i, r := range a.Regions {
			s := b.Regions[i]
			if r.Name != s.Name || !nearRange(r.Band, s.Band) || fmt.Sprint(r.Parts) != fmt.Sprint(s.Parts) ||
				fmt.Sprint(r.Nets) != fmt.Sprint(s.Nets) || r.Input != s.Input || r.Output != s.Output {
				add("region %s: %+v vs %+v", r.Name, *r, *s)
			}
		}
	}
	if len(a.Nets) != len(b.Nets) {
		add("%d nets vs %d", len(a.Nets), len(b.Nets))
	} else {
		for i, n := range a.Nets {
			m := b.Nets[i]
			if n.Name != m.Name || n.Role != m.Role || !near(n.Volts, m.Volts) || n.Label != m.Label {
				add("net %s: %+v vs %+v", n.Name, *n, *m)
			}
		}
	}
	if len(a.Parts) != len(b.Parts) {
		add("%d parts vs %d", len(a.Parts), len(b.Parts))
		return d
	}
	for i, p := range a.Parts {
		d = append(d, diffParts(p, b.Parts[i])...)
	}
	return d
}

func diffParts(p, q *Part) []string {
	var d []string
	add := func(format string, args ...any) { d = append(d, p.Ref+": "+fmt.Sprintf(format, args...)) }
	if p.Ref != q.Ref || p.Kind != q.Kind || p.Type != q.Type {
		add("ref/kind/type %s %s %s vs %s %s %s", p.Ref, p.Kind, p.Type, q.Ref, q.Kind, q.Type)
	}
	if !nearRange(p.Value, q.Value) || !near(p.Set, q.Set) {
		add("value %v set %g vs %v set %g", p.Value, p.Set, q.Value, q.Set)
	}
	if len(p.Pins) != len(q.Pins) {
		add("pins %v vs %v", p.Pins, q.Pins)
	} else {
		for i := range p.Pins {
			if p.Pins[i].Name != q.Pins[i].Name || p.Pins[i].Net != q.Pins[i].Net {
				add("pin %d %s=%s vs %s=%s", i, p.Pins[i].Name, p.Pins[i].Net, q.Pins[i].Name, q.Pins[i].Net)
			}
		}
	}
	if len(p.Windings) != len(q.Windings) {
		add("windings %v vs %v", p.Windings, q.Windings)
	} else {
		for i, w := range p.Windings {
			v := q.Windings[i]
			if w.Name != v.Name || w.From != v.From || w.To != v.To || !near(w.L, v.L) || !near(w.Q, v.Q) {
				add("winding %+v vs %+v", w, v)
			}
		}
	}
	if len(p.Coupling) != len(q.Coupling) {
		add("coupling %v vs %v", p.Coupling, q.Coupling)
	} else {
		for _, c := range p.Coupling {
			if !near(c.K, q.K(c.A, c.B)) {
				add("k %s-%s %g vs %g", c.A, c.B, c.K, q.K(c.A, c.B))
			}
		}
	}
	if fmt.Sprint(p.Closes) != fmt.Sprint(q.Closes) {
		add("closes %v vs %v", p.Closes, q.Closes)
	}
	if !near(p.Tol.Plus, q.Tol.Plus) || !near(p.Tol.Minus, q.Tol.Minus) || !near(p.Rating, q.Rating) {
		add("tol/rating %v %g vs %v %g", p.Tol, p.Rating, q.Tol, q.Rating)
	}
	if p.Gang != q.Gang || p.Envelope != q.Envelope || p.Keep != q.Keep || p.Note != q.Note || p.Label != q.Label {
		add("attributes %q %q %v %q %q vs %q %q %v %q %q", p.Gang, p.Envelope, p.Keep, p.Note, p.Label, q.Gang, q.Envelope, q.Keep, q.Note, q.Label)
	}
	if len(p.Params) != len(q.Params) {
		add("params %v vs %v", p.Params, q.Params)
	}
	for k, v := range p.Params {
		if w, ok := q.Params[k]; !ok || !near(v, w) {
			add("param %s %g vs %g", k, v, w)
		}
	}
	if fmt.Sprint(p.From) != fmt.Sprint(q.From) {
		add("from %v vs %v", p.From, q.From)
	}
	return d
}

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
