package graph

import (
	"os"
	"path/filepath"
	"testing"
)

// FuzzLoad feeds arbitrary bytes to Parse. Whatever happens, Parse must not
// panic; a refused input must come with positioned messages; and anything
// accepted must write out, load back, and write out the same text again (the
// canonical layout is a fixpoint), and survive Check, Clone and View.
//
// Seeds: the examples, every good, warning and bad fixture, and the tricky
// TOML forms under testdata/fuzz/netlists.
func FuzzLoad(f *testing.F) {
	for _, pat := range []string{"examples/*.toml", "testdata/good/*.toml", "testdata/warn/*.toml", "testdata/bad/*.toml", "testdata/fuzz/netlists/*.toml"} {
		files, err := filepath.Glob(filepath.Join(repo, pat))
		if err != nil {
			f.Fatal(err)
		}
		for _, path := range files {
			data, err := os.ReadFile(path)
			if err != nil {
				f.Fatal(err)
			}
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := Parse("fuzz.toml", data)
		if err != nil {
			list, ok := err.(ErrorList)
			if !ok || len(list) == 0 {
				t.Fatalf("refusal is not a non-empty ErrorList: %T %v", err, err)
			}
			for _, e := range list {
				if !e.Pos.IsValid() || e.Pos.File != "fuzz.toml" {
					t.Fatalf("message without a position: %v", e)
				}
			}
			if c != nil {
				t.Fatal("refused input returned a circuit")
			}
			return
		}
		out1 := writeString(t, c)
		c2, err := Parse("fuzz.toml", []byte(out1))
		if err != nil {
			t.Fatalf("accepted input writes a netlist that does not load: %v\n--- written\n%s", err, out1)
		}
		if d := diffCircuits(c, c2); len(d) > 0 {
			t.Fatalf("round trip changed the circuit: %v\n--- written\n%s", d, out1)
		}
		if out2 := writeString(t, c2); out2 != out1 {
			t.Fatalf("Write is not a fixpoint:\n%s", firstDiff(out1, out2))
		}
		Check(c)
		c.Clone().View()
	})
}
