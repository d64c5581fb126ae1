package stages

import (
	"encoding/json"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/figure"
	"pare/rules"
)

// number finds the numbers in a text; rawNumber tells one written with
// more significant digits than any medium gives a person (four at most, a
// whole ratio a few more): a value that escaped the formatter
// ("469912.34", "1.485939367e+06").
var number = regexp.MustCompile(`\d+(\.\d+)?`)

func rawNumber(text string) bool {
	for _, n := range number.FindAllString(text, -1) {
		digits := strings.TrimLeft(strings.ReplaceAll(n, ".", ""), "0")
		if len(digits) > 5 {
			return true
		}
	}
	return false
}

// Every figure of every example, of every fixture file and of every figure
// fixture goes through the one formatter: each has a unit the formatter
// knows, a label from the figure table, an origin, a text with its unit's
// symbol and no raw number, JSON keys ending in its unit; every figure a
// person reads is in its stage's line.
func TestEveryFigureFormats(t *testing.T) {
	seen := 0
	for name, st := range allFixtureStages(t) {
		for _, s := range st {
			for _, f := range s.Figures {
				seen++
				checkFigure(t, name+" "+s.Name+" "+s.Topology, f)
			}
			checkLine(t, name+" "+s.Name, s.Figures)
			checkJSON(t, name+" "+s.Name, s)
		}
	}
	// The examples and fixtures hold well over a hundred figures; far
	// fewer means the loop checked nothing.
	if seen < 100 {
		t.Errorf("only %d figures checked", seen)
	}
}

// allFixtureStages finds the stages of every example, every fixture file in
// testdata/ and every case of figureCases, as `pare stages` does.
func allFixtureStages(t *testing.T) map[string][]Stage {
	out := map[string][]Stage{}
	files, _ := filepath.Glob(filepath.Join("..", "..", "examples", "*.toml"))
	more, _ := filepath.Glob(filepath.Join("testdata", "*.toml"))
	for _, f := range append(files, more...) {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
		if err != nil {
			t.Fatalf("reduce %s: %v", f, err)
		}
		out[f] = find(t, r, Options{Full: c, ACGround: log.ACGround})
	}
	if len(files) == 0 || len(more) == 0 {
		t.Fatalf("no examples (%d) or fixture files (%d)", len(files), len(more))
	}
	for _, tc := range figureCases {
		c := circuit(t, tc.family, tc.parts, tc.extra)
		out["figureCases "+tc.name] = find(t, c, Options{Full: c})
	}
	return out
}

// valueName tells whether a built-in pattern's value calc names a figure
// so: those names are the pattern's, not the figure table's.
func valueName(t *testing.T, name string) bool {
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range lib.Patterns {
		for _, f := range p.Figures {
			if f.Calc == "value" && prefixed(f.Prefix, f.Args["name"][0]) == name {
				return true
			}
		}
	}
	return false
}

func checkFigure(t *testing.T, where string, f figure.Figure) {
	t.Helper()
	known := false
	for _, u := range figure.Units() {
		known = known || u == f.Unit
	}
	if !known {
		t.Errorf("%s: %s has unit %d, which the formatter does not know", where, f.Name, f.Unit)
	}
	base := f.Name
	if i := strings.Index(base, "_"); i > 0 && figureIndex(base, f.Unit) < 0 {
		base = base[i+1:] // a pattern's prefix
	}
	if figureIndex(f.Name, f.Unit) < 0 && figureIndex(base, f.Unit) < 0 && !valueName(t, f.Name) {
		t.Errorf("%s: figure %s (%v) is not in the figure table", where, f.Name, f.Unit)
	}
	if f.Label == "" || strings.Contains(f.Label, "_") {
		t.Errorf("%s: %s has label %q", where, f.Name, f.Label)
	}
	if f.Origin.Name == "" {
		t.Errorf("%s: %s says nothing of where it came from (%v)", where, f.Name, f.Origin)
	}
	for _, m := range []figure.Medium{figure.Text, figure.Sheet} {
		text := f.Text(m)
		if sym := f.Unit.Symbol(); sym != "" && !strings.Contains(text, sym) {
			t.Errorf("%s: %s reads %q, without its unit %s", where, f.Name, text, sym)
		}
		if rawNumber(text) || strings.Contains(text, "NaN") || strings.Contains(text, "Inf") {
			t.Errorf("%s: %s reads %q, a number the formatter did not write", where, f.Name, text)
		}
	}
	for _, e := range f.Entries() {
		if !strings.HasSuffix(e.Key, map[figure.Unit]string{figure.Hertz: "_hz", figure.Second: "_s", figure.Farad: "_f",
			figure.Henry: "_h", figure.Ohm: "_ohm", figure.Decibel: "_db"}[f.Unit]) {
			t.Errorf("%s: JSON key %s does not end in the unit of %v", where, e.Key, f.Unit)
		}
	}
}

// checkLine: every figure a person reads is in the stage's line, by its
// label, and the line leaks no key.
func checkLine(t *testing.T, where string, l figure.List) {
	t.Helper()
	line := figure.Line(l, figure.Text)
	for _, f := range l {
		if !f.Working && !strings.Contains(line, f.Label+" ") {
			t.Errorf("%s: %q lacks %s (%s)", where, line, f.Name, f.Label)
		}
	}
	if strings.Contains(line, "_") {
		t.Errorf("%s: %q shows a key", where, line)
	}
}

// checkJSON: the stage's JSON has every figure under its key and the
// origin of each under the same key.
func checkJSON(t *testing.T, where string, s Stage) {
	t.Helper()
	b, err := json.Marshal(s)
	if err != nil {
		t.Fatalf("%s: %v", where, err)
	}
	var doc struct {
		Figures map[string]float64 `json:"figures"`
		Origins map[string]string  `json:"origins"`
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatalf("%s: %v\n%s", where, err, b)
	}
	if len(doc.Figures) != len(doc.Origins) {
		t.Errorf("%s: %d figures, %d origins", where, len(doc.Figures), len(doc.Origins))
	}
	for _, f := range s.Figures {
		for _, e := range f.Entries() {
			if v, ok := doc.Figures[e.Key]; !ok || v != e.Value {
				t.Errorf("%s: JSON %s = %v (present %v), want %v", where, e.Key, v, ok, e.Value)
			}
			if doc.Origins[e.Key] == "" {
				t.Errorf("%s: JSON has no origin for %s", where, e.Key)
			}
		}
	}
}
