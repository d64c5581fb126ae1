package stages

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// A broken pattern file is reported at file:line:col with a message that
// says what to write instead; every problem at once.
func TestPatternErrors(t *testing.T) {
	for _, c := range []struct {
		name, src string
		want      []string
	}{
		{"syntax", "id = \"x\"\ntitle = \n", []string{"bad.toml:2:"}},
		{"unknown top key", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\nranks = 3\n[nets]\na = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"a\"] }\n",
			[]string{`bad.toml:4:1: unknown key "ranks" (did you mean "rank"?)`}},
		{"unknown device", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\nb = {}\n[parts]\nC = { device = \"capacitr\", pins = [\"a\", \"b\"] }\n",
			[]string{`bad.toml:8:7: device "capacitr" is not known (did you mean "capacitor"?)`}},
		{"undeclared net", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"b\"] }\n",
			[]string{`bad.toml:7:1: part C names net "b", which [nets] does not declare`}},
		{"bad at", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = { at = \"grnd\" }\nb = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"b\"] }\n",
			[]string{`bad.toml:5:7: at "grnd" is not known`}},
		{"wrong pin count", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\"] }\n",
			[]string{`bad.toml:7:`, "a capacitor has 2 terminals, not 1"}},
		{"bad role", "id = \"x\"\ntitle = \"X\"\ngroup = \"amplifier\"\n[nets]\ng = {}\n[parts]\nQ = { device = \"active\", pins = { contrl = \"g\" } }\n",
			[]string{`bad.toml:7:`, `unknown key "contrl" (did you mean "control"?)`}},
		{"figure part", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\nb = {}\n[parts]\nL = { device = \"inductor\", pins = [\"a\", \"b\"] }\n[[figure]]\ncalc = \"tank\"\ncoil = \"L\"\ncaps = [\"C9\"]\n",
			[]string{`bad.toml:9:1: figure tank: caps names part "C9", which [parts] does not declare`}},
		{"figure calc", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\nb = {}\n[parts]\nL = { device = \"inductor\", pins = [\"a\", \"b\"] }\n[[figure]]\ncalc = \"tnk\"\n",
			[]string{`bad.toml:10:1: calc "tnk" is not known (did you mean "tank"?)`}},
		{"no id", "title = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"a\"] }\n",
			[]string{"bad.toml:1:1: pattern has no id"}},
		{"bad value", "id = \"x\"\ntitle = \"X\"\ngroup = \"tuned\"\n[nets]\na = {}\nb = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"b\"], max = \"10q\" }\n",
			[]string{"bad.toml:8:"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := ParsePattern("bad.toml", []byte(c.src))
			var l graph.ErrorList
			if !errors.As(err, &l) {
				t.Fatalf("want a positioned error list, got %v", err)
			}
			msg := err.Error()
			if c.name == "unknown device" && strings.Count(msg, "\n") > 0 {
				t.Errorf("one mistake, one message; got:\n%s", msg)
			}
			for _, w := range c.want {
				if !strings.Contains(msg, w) {
					t.Errorf("message %q lacks %q", msg, w)
				}
			}
		})
	}
}

// Users' pattern directories load with positions, add to the library and
// replace a built-in pattern of the same id.
func TestPatternDir(t *testing.T) {
	dir := t.TempDir()
	own := `id = "series-rc"
title = "Series RC to ground"
group = "coupling"
rank = 4
[nets]
a = {}
m = {}
gnd = { at = "ground" }
[parts]
R = { device = "resistor", pins = ["a", "m"] }
C = { device = "capacitor", pins = ["m", "gnd"] }
[[figure]]
calc = "rc"
r = "R"
c = "C"
`
	if err := os.WriteFile(filepath.Join(dir, "series-rc.toml"), []byte(own), 0o644); err != nil {
		t.Fatal(err)
	}
	c := circuit(t, "valve", `R1 = { r = "10k", pins = ["in", "m"] }
C1 = { c = "100n", pins = ["m", "gnd"] }`)
	st := find(t, c, Options{PatternDir: dir})
	s := stageOf(st, "series-rc")
	if s == nil {
		t.Fatalf("user pattern not used: %s", topologies(st))
	}
	// τ = 10 kΩ × 100 nF = 1 ms (docs/references.md §4 formula).
	if got := fig(s.Figures, "tau_s"); got < 0.999e-3 || got > 1.001e-3 {
		t.Errorf("tau_s = %g, want 1 ms", got)
	}
	if err := os.WriteFile(filepath.Join(dir, "broken.toml"), []byte("id = \"b\"\ntitle = \"B\"\ngroup = \"tuned\"\n[nets]\na = {}\n[parts]\nC = { device = \"capacitor\", pins = [\"a\", \"q\"] }\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, err := Find(c, Options{PatternDir: dir})
	if err == nil || !strings.Contains(err.Error(), filepath.Join(dir, "broken.toml")+":7:1:") {
		t.Errorf("broken user pattern: got %v, want a file:line:col message", err)
	}
	if _, err := Find(c, Options{PatternDir: filepath.Join(dir, "missing")}); err == nil {
		t.Error("a missing pattern directory is not an error")
	}
}
