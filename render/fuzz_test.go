package render

import (
	"bytes"
	"testing"

	"pare/graph"
	"pare/internal/fuzzgen"
)

// FuzzDraw draws generated circuits (every part kind, hostile titles,
// labels and notes; see fuzzgen) in both symbol styles, full and faded.
// Every sheet must be drawn without a panic, be well-formed XML and hold
// no raw control or bidi character. Regressions under testdata/fuzz/FuzzDraw.
func FuzzDraw(f *testing.F) {
	for _, seed := range []string{"", "\x05\x01\x02\x03\x04\x05\x06\x07\x08\x09", "\x08\x02\x01\x14\x00\x03\x04\x05\x13\x09\x04\x07\x00\x02\x01\x03\x05\x06"} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := graph.Parse("fuzz.toml", []byte(fuzzgen.Netlist(data)))
		if err != nil {
			return
		}
		faded := map[string]bool{}
		for i, p := range c.Parts {
			if i < len(data) && data[i]%3 == 0 {
				faded[p.Ref] = true
			}
		}
		for _, style := range []Style{IEC, IEEE} {
			for _, s := range []*Sheet{
				{Circuit: c, Title: c.Title, View: Full, Furniture: []string{c.Title}},
				{Circuit: c, Title: c.Title, View: Faded, Faded: faded},
			} {
				var buf bytes.Buffer
				if err := (Config{Style: style}).Fprint(&buf, s); err != nil {
					t.Fatalf("%v\n--- netlist\n%s", err, fuzzgen.Netlist(data))
				}
				if err := fuzzgen.WellFormedXML("sheet", buf.Bytes()); err != nil {
					t.Fatal(err)
				}
				if err := fuzzgen.Inert("sheet", buf.String()); err != nil {
					t.Fatal(err)
				}
			}
		}
	})
}
