package stages

import (
	"errors"
	"strings"
	"testing"

	"pare/graph"
)

// drawBase is a small amplifier pattern; each case adds a [draw] table.
const drawBase = "id = \"x\"\ntitle = \"X\"\ngroup = \"amplifier\"\n[nets]\ng = {}\no = {}\nk = {}\ngnd = { at = \"ground\" }\n" +
	"[parts]\nQ = { device = \"active\", pins = { control = \"g\", common = \"k\", output = \"o\" } }\n" +
	"RL = { device = \"resistor\", pins = [\"o\", \"gnd\"] }\n" +
	"Rk = { device = \"resistor\", pins = [\"k\", \"gnd\"], optional = \"open\" }\n" // lines 1-12

// TestDrawErrors: a bad [draw] table is reported at the entry or key that
// is wrong, file:line:col, as every other pattern mistake.
func TestDrawErrors(t *testing.T) {
	for _, c := range []struct{ name, draw, want string }{
		{"entry not a table", "[draw]\nQ = 1\n", `bad.toml:14:1: draw entry Q must be a table`},
		{"unknown key", "[draw]\nQ = { col = 0, row = 0, rwo = 1 }\n", `bad.toml:14:25: unknown key "rwo"`},
		{"not whole", "[draw]\nQ = { col = 0.5, row = 0 }\n", `bad.toml:14:7: col must be a whole number of slots`},
		{"too far", "[draw]\nQ = { col = 0, row = 0 }\nRL = { col = 9, row = 0 }\n", `bad.toml:15:8: col 9 is out of range`},
		{"bad stand", "[draw]\nQ = { col = 0, row = 0 }\nRL = { col = 1, row = -1, stand = \"upright\" }\n", `bad.toml:15:27: stand "upright" is not known`},
		{"no such part", "[draw]\nQ = { col = 0, row = 0 }\nR9 = { col = 1, row = -1 }\n", `bad.toml:15:1: draw entry R9 names no part of [parts]`},
		{"same slot", "[draw]\nQ = { col = 0, row = 0 }\nRL = { col = 0, row = 1 }\nRk = { col = 0, row = 1 }\n", `bad.toml:16:1: draw entry Rk takes the slot of RL (col 0, row 1)`},
		{"no anchor", "[draw]\nRL = { col = 1, row = -1 }\n", `bad.toml:13:1: [draw] has no anchor`},
		{"optional anchor", "[draw]\nRk = { col = 0, row = 0 }\n", `bad.toml:14:1: draw entry Rk: the anchor (col 0, row 0) must be a part the stage always has`},
		{"not a table", "!draw = 3\n", `bad.toml:1:1: [draw] must be a table`},
	} {
		t.Run(c.name, func(t *testing.T) {
			src := drawBase + c.draw
			if top, ok := strings.CutPrefix(c.draw, "!"); ok {
				src = top + drawBase // a top-level key, before the tables
			}
			_, err := ParsePattern("bad.toml", []byte(src))
			var l graph.ErrorList
			if !errors.As(err, &l) {
				t.Fatalf("want a positioned error list, got %v", err)
			}
			if !strings.Contains(err.Error(), c.want) {
				t.Errorf("message %q lacks %q", err.Error(), c.want)
			}
		})
	}
}

// TestDrawOrder: a template keeps the file's order (a block of several
// parts takes the slot of the first listed), the anchor is the part at
// column 0, row 0, and a stage gets the template by circuit ref, anchor
// first.
func TestDrawOrder(t *testing.T) {
	src := drawBase + "[draw]\nRL = { col = 1, row = -1, stand = \"vertical\" }\nQ = { col = 0, row = 0 }\nRk = { col = 0, row = 1 }\n"
	p, err := ParsePattern("ok.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, pl := range p.Draw {
		got = append(got, pl.Part)
	}
	if strings.Join(got, " ") != "RL Q Rk" || p.Anchor() != "Q" {
		t.Fatalf("draw order %v, anchor %q; want RL Q Rk, anchor Q", got, p.Anchor())
	}
	lib := &Library{Patterns: []*Pattern{p}}
	c, err := graph.Parse("amp.toml", []byte(`title = "triode stage (invented)"
band = "20..20k"
inputs = ["in"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "o", g1 = "g", k = "k" }, mu = 20, ra = "10k" }
R1 = { r = "100k", pins = ["ht", "o"] }
R3 = { r = "1k5", pins = ["k", "gnd"] }
R2 = { r = "10k", pins = ["in", "g"] }
`))
	if err != nil {
		t.Fatal(err)
	}
	found, err := Find(c, Options{Library: lib})
	if err != nil {
		t.Fatal(err)
	}
	if len(found) != 1 {
		t.Fatalf("want one stage, got %d", len(found))
	}
	var draw []string
	for _, pl := range found[0].Draw {
		draw = append(draw, pl.Part)
	}
	if strings.Join(draw, " ") != "V1 R1 R3" || found[0].Draw[1].Col != 1 || found[0].Draw[1].Stand != "vertical" {
		t.Errorf("stage draw %+v; want V1 at the anchor, then R1 at col 1, vertical, then R3", found[0].Draw)
	}
}
