package render

import (
	"bytes"
	"encoding/xml"
	"errors"
	"flag"
	"io"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/safety"
	"pare/internal/golden"
	"pare/internal/reftool"
	"pare/render/check"
)

var update = flag.Bool("update", false, "rewrite the golden SVGs under testdata/")

func load(t testing.TB, path string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return c
}

// fixtureSheets are the sheets drawn from this package's own fixtures and
// the shared examples, in every view, without the reduction (that is
// cmd/pare's job and its tests draw the reduced examples): the circuit itself
// stands in for the reduced one, and the faded view fades the parts on
// ground or rails only, with one merge marker.
func fixtureSheets(t testing.TB) map[string]*Sheet {
	files, _ := filepath.Glob("testdata/*.toml")
	ex, _ := filepath.Glob("../examples/*.toml")
	files = append(files, ex...)
	if len(files) < 2 {
		t.Fatal("fixtures missing")
	}
	out := map[string]*Sheet{}
	for _, f := range files {
		c := load(t, f)
		faded := map[string]bool{}
		merged := map[string]string{}
		for _, p := range c.Parts {
			acOnly := true
			for _, pin := range p.Pins {
				if !c.RoleOf(pin.Net).IsACGround() {
					acOnly = false
				}
			}
			if acOnly {
				faded[p.Ref] = true
			}
		}
		if len(c.Parts) > 1 {
			merged[c.Parts[0].Ref] = c.Parts[1].Ref
		}
		// frames: the parts in thirds, in ref order (a stand-in for stages)
		var frames []Frame
		n := len(c.Parts)
		for i := 0; i < 3; i++ {
			f := Frame{Title: "S" + string(rune('1'+i)) + " test stage with a rather long title to wrap", Subtitle: "f 1 MHz"}
			for _, p := range c.Parts[i*n/3 : (i+1)*n/3] {
				f.Parts = append(f.Parts, p.Ref)
			}
			frames = append(frames, f)
		}
		base := strings.TrimSuffix(filepath.Base(f), ".toml")
		out[base+".full"] = &Sheet{Circuit: c, View: Full, Furniture: []string{"IF 470 kHz", "Level signal"}}
		if !strings.Contains(f, "examples") {
			// the examples' reduced sheets are drawn from the reduction, in cmd/pare
			out[base+".reduced"] = &Sheet{Circuit: c, View: Reduced, Frames: frames}
		}
		out[base+".faded"] = &Sheet{Circuit: c, View: Faded, Faded: faded, Merged: merged}
	}
	return out
}

func sortedKeys(m map[string]*Sheet) []string {
	var ks []string
	for k := range m {
		ks = append(ks, k)
	}
	for i := range ks {
		for j := i + 1; j < len(ks); j++ {
			if ks[j] < ks[i] {
				ks[i], ks[j] = ks[j], ks[i]
			}
		}
	}
	return ks
}

// TestSheetsPassTheChecker fails on any overlap, wire through a symbol,
// broken net or bad junction, in both symbol styles.
func TestSheetsPassTheChecker(t *testing.T) {
	sheets := fixtureSheets(t)
	for _, name := range sortedKeys(sheets) {
		for _, st := range []Style{IEC, IEEE} {
			g, err := Config{Style: st}.Geometry(sheets[name])
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			r := check.Measure(g)
			t.Logf("%s %s: %s", name, st, r.Summary())
			for _, p := range r.Problems() {
				t.Errorf("%s %s: %s", name, st, p)
			}
			if len(g.Symbols) == 0 {
				t.Errorf("%s: nothing drawn", name)
			}
		}
	}
}

// TestGoldenSheets compares the fixtures' sheets with the committed ones
// (byte-identical; -update rewrites them), checks they are well-formed SVG
// and that rsvg-convert renders them.
func TestGoldenSheets(t *testing.T) {
	sheets := fixtureSheets(t)
	for _, name := range sortedKeys(sheets) {
		if !strings.HasPrefix(name, "all-symbols") {
			continue // the examples' sheets are checked by cmd/pare
		}
		for _, st := range []Style{IEC, IEEE} {
			var buf bytes.Buffer
			if err := (Config{Style: st}).Fprint(&buf, sheets[name]); err != nil {
				t.Fatal(err)
			}
			wellFormed(t, buf.Bytes())
			file := filepath.Join("testdata", name+"."+st.String()+".svg")
			golden.Check(t, file, buf.Bytes(), *update, "look at the PNG, then go test ./render -update")
			renders(t, file)
		}
	}
}

// TestDeterministic draws every sheet twice, and once more from a clone, and
// wants the same bytes.
func TestDeterministic(t *testing.T) {
	sheets := fixtureSheets(t)
	for _, name := range sortedKeys(sheets) {
		s := sheets[name]
		var a, b, c bytes.Buffer
		Config{}.Fprint(&a, s)
		Config{}.Fprint(&b, s)
		s2 := *s
		s2.Circuit = s.Circuit.Clone()
		Config{}.Fprint(&c, &s2)
		if !bytes.Equal(a.Bytes(), b.Bytes()) || !bytes.Equal(a.Bytes(), c.Bytes()) {
			t.Errorf("%s: output differs between runs", name)
		}
	}
}

func wellFormed(t *testing.T, data []byte) {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	first := true
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			return
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok {
			if first && (se.Name.Local != "svg" || se.Name.Space != "http://www.w3.org/2000/svg") {
				t.Fatalf("root is %v, want svg in the SVG namespace", se.Name)
			}
			first = false
			if strings.EqualFold(se.Name.Local, "script") {
				t.Fatal("a script element in the output")
			}
			for _, a := range se.Attr {
				if strings.HasPrefix(strings.ToLower(a.Name.Local), "on") {
					t.Fatalf("event attribute %s in the output", a.Name.Local)
				}
			}
		}
	}
}

// renders runs rsvg-convert (Debian librsvg2-bin) on a file.
func renders(t *testing.T, file string) { t.Helper(); reftool.RenderSVG(t, file) }

// TestUserTextIsEscaped puts markup into every user string that reaches the
// sheet: it must come out as text, never as elements or attributes.
func TestUserTextIsEscaped(t *testing.T) {
	src := `title = "<script>alert(1)</script> & co"
band = "1k..2k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", label = "HT \"+250\" <b>&</b>" }
out = { label = "out <i onload=x>" }
[parts]
R1 = { r = "1k", pins = ["in", "out"] }
R2 = { r = "1k", pins = ["out", "ht"] }
X1 = { part = "<img src=x onerror=alert(1)>", pins = { a = "out", b = "gnd" } }
P1 = { port = "from <stage> & \"more\"", pins = ["in"] }
`
	c, err := graph.Parse("escape.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	s := &Sheet{Circuit: c, View: Faded, Faded: map[string]bool{"R2": true}, Merged: map[string]string{"R1": `"><script>`},
		Frames:  []Frame{{Title: "S1 <svg onload=alert(1)>", Subtitle: "a & b", Parts: []string{"R1", "X1"}}},
		Caution: "Caution </text><script>", Furniture: []string{"IF <470> kHz"}}
	var buf bytes.Buffer
	if err := (Config{}).Fprint(&buf, s); err != nil {
		t.Fatal(err)
	}
	wellFormed(t, buf.Bytes())
	out := buf.String()
	for _, text := range []string{"&lt;script&gt;alert(1)&lt;/script&gt; &amp; co", "&lt;img src=x onerror=alert(1)&gt;",
		"from &lt;stage&gt; &amp;", "S1 &lt;svg", "IF &lt;470&gt; kHz"} {
		if !strings.Contains(out, text) {
			t.Errorf("escaped text %q not found", text)
		}
	}
	if strings.Contains(out, "<script") || strings.Contains(out, "<img") || strings.Contains(out, "<i ") {
		t.Error("user markup reached the SVG as markup")
	}
}

func TestBadSheet(t *testing.T) {
	if err := (Config{}).Fprint(io.Discard, &Sheet{}); err == nil {
		t.Error("a sheet without a circuit drew without error")
	}
	if err := (Config{}).Fprint(io.Discard, nil); err == nil {
		t.Error("a nil sheet drew without error")
	}
}

func TestParseViewAndStyle(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want View
		ok   bool
	}{{"reduced", Reduced, true}, {"FULL", Full, true}, {"faded", Faded, true}, {"", Reduced, true}, {"side", Reduced, false}} {
		v, err := ParseView(tc.in)
		if (err == nil) != tc.ok || (tc.ok && v != tc.want) {
			t.Errorf("ParseView(%q) = %v, %v", tc.in, v, err)
		}
	}
	if s, err := ParseStyle("ieee"); err != nil || s != IEEE {
		t.Errorf("ParseStyle(ieee) = %v, %v", s, err)
	}
	if _, err := ParseStyle("din"); err == nil {
		t.Error("ParseStyle accepted din")
	}
}

// TestReducedCaution: a reduced view says it is small-signal only, every
// view carries the safety caution (common practice for repair notes); a
// sheet without a caution of its own gets its circuit's from graph/safety,
// and a given caution is printed as given.
func TestReducedCaution(t *testing.T) {
	given := "Caution: a line the caller worded."
	var own bytes.Buffer
	Config{}.Fprint(&own, &Sheet{Circuit: load(t, "testdata/all-symbols.toml"), View: Reduced, Caution: given})
	if !strings.Contains(own.String(), given+"</text>") {
		t.Errorf("the given caution is not printed as given")
	}
	c := load(t, "testdata/all-symbols.toml")
	for _, v := range []View{Reduced, Full} {
		var buf bytes.Buffer
		Config{}.Fprint(&buf, &Sheet{Circuit: c, View: v})
		out := buf.String()
		if !strings.Contains(out, safety.For(c).Sheet(false)) {
			t.Errorf("%s view: no safety caution", v)
		}
		if got := strings.Contains(out, "Small-signal only"); got != (v == Reduced) {
			t.Errorf("%s view: small-signal note present = %v", v, got)
		}
	}
}

// TestOddParts draws parts a reduction or a hand-made circuit may produce
// with unusual terminals: a port with no pin, a transformer without
// windings, a valve with only a heater, a switch closing unknown contacts.
// None may panic, and the sheet must still pass the checker.
func TestOddParts(t *testing.T) {
	c := &graph.Circuit{Title: "odd parts", Inputs: []string{"in"}, Outputs: []string{"out"}}
	c.EnsureNet("gnd", graph.Pos{})
	add := func(p *graph.Part) { c.AddPart(p) }
	pins := func(kv ...string) []graph.Pin {
		var out []graph.Pin
		for i := 0; i+1 < len(kv); i += 2 {
			out = append(out, graph.Pin{Name: kv[i], Net: kv[i+1]})
		}
		return out
	}
	add(&graph.Part{Ref: "P1", Kind: graph.Port, Label: "nowhere"})
	add(&graph.Part{Ref: "T1", Kind: graph.Transformer, Pins: pins("p1", "in", "p2", "gnd", "s1", "mid", "s2", "gnd")})
	add(&graph.Part{Ref: "V1", Kind: graph.Valve, Type: "triode", Pins: pins("h1", "gnd", "h2", "gnd")})
	add(&graph.Part{Ref: "S1", Kind: graph.Switch, Set: 3, Closes: [][][2]string{{{"x", "y"}}}, Pins: pins("c", "mid", "1", "out")})
	add(&graph.Part{Ref: "X1", Kind: graph.Generic, Label: "meter"})
	for _, v := range []View{Reduced, Full, Faded} {
		s := &Sheet{Circuit: c, View: v, Faded: map[string]bool{"X1": true}}
		var buf bytes.Buffer
		if err := (Config{}).Fprint(&buf, s); err != nil {
			t.Fatalf("%s: %v", v, err)
		}
		wellFormed(t, buf.Bytes())
		g, err := Config{}.Geometry(s)
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range check.Measure(g).Problems() {
			t.Errorf("%s: %s", v, p)
		}
	}
}
