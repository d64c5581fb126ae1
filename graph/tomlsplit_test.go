package graph

import (
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// splitTexts is every TOML file of the repository (netlists, fixtures good
// and bad, patterns), a long ladder and the forms below.
func splitTexts(t *testing.T) map[string]string {
	t.Helper()
	texts := map[string]string{}
	err := filepath.WalkDir(repo, func(path string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() || !strings.HasSuffix(path, ".toml") {
			return err
		}
		data, err := os.ReadFile(path)
		texts[path] = string(data)
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	// A ladder as bench/gen writes it (internal/synth imports graph).
	var b strings.Builder
	b.WriteString("title = \"RC ladder\"\nband = \"10..1M\"\ninputs = [\"n0\"]\n\n[parts]\n")
	for i := 1; i <= 3000; i++ {
		fmt.Fprintf(&b, "C%d = { c = \"10n\", pins = [\"n%d\", \"gnd\"] }\n", i, i)
		fmt.Fprintf(&b, "R%d = { r = \"1k\", pins = [\"n%d\", \"n%d\"] }\n", i, i-1, i)
	}
	b.WriteString("\n[nets]\nn3000 = { label = \"out\" }\n")
	texts["ladder3000"] = b.String()
	for name, text := range splitForms {
		texts["form "+name] = text
	}
	for name, text := range refusedForms {
		texts["refused "+name] = text
	}
	return texts
}

// refusedForms are texts whose pieces must all be refused: the decoder
// refuses the first six whole; the last two name a table in two pieces,
// which the join leaves to the whole text.
var refusedForms = map[string]string{
	"part twice":         "[parts]\nR1 = { r = \"1k\" }\nR2 = { r = \"1k\" }\nR1 = { r = \"2k\" }\n",
	"table twice":        "[parts]\nR1 = { r = \"1k\" }\n[nets]\na = {}\n[parts]\nR2 = { r = \"1k\" }\n",
	"inline then header": "[parts]\nR1 = { r = \"1k\" }\nR2 = { r = \"1k\" }\n[parts.R1]\nc = 1\n",
	"value then table":   "x = 1\n[parts]\nR1 = 1\nR2 = 2\n[x]\ny = 2\n",
	"open string":        "[parts]\nR1 = \"\"\"\nR2 = 1\nR3 = 2\n",
	"open array":         "[parts]\nR1 = [1,\nR2 = 1\nR3 = 2\n",
	"sub tables":         "[a.b]\nx = 1\n[parts]\nR1 = 1\nR2 = 2\n[a.c]\ny = 2\n",
	"arrays of tables":   "[[a]]\nx = 1\n[parts]\nR1 = 1\nR2 = 2\n[[a]]\nx = 2\n",
}

// splitForms are texts some cut of which must be read in pieces, to the
// whole text's map (the decoder takes a dotted key into an inline table
// written before it; the join refuses it across pieces, which is then the
// decoder's call on the whole).
var splitForms = map[string]string{
	"header in string":   "[nets]\nx = \"\"\"\n[parts]\nR9 = 1\n\"\"\"\ny = 1\nz = 2\n",
	"header in literal":  "[nets]\nx = '''\n[parts]\nR9 = 1\n'''\ny = 1\nz = 2\n",
	"quotes closing":     "[parts]\nR1 = \"\"\"a\"\"\"\"\nR2 = '''b'''''\nR3 = \"x\\\"[y]\"\nR4 = 1\n",
	"array of lines":     "[parts]\nR1 = [\n  \"a\", # ] [\n  \"b\",\n]\nR2 = { r = \"1k\", pins = [\"a\", \"b\"] }\nR3 = 1\n",
	"dotted keys":        "[parts]\nR1.r = \"1k\"\nR1.pins = [\"a\"]\nR2.r = \"2k\"\nR3 = 1\n",
	"dotted into inline": "[parts]\nR1 = { r = \"1k\" }\nR2 = { r = \"1k\" }\nR1.c = 1\n",
	"crlf":               "[parts]\r\nR1 = 1\r\n# c\r\nR2 = 2\r\n[nets] # n\r\nn1 = {}\r\nn2 = {}\r\n",
	"spaced header":      "[ parts ] # the parts\nR1 = 1\n\nR2 = 2\n",
}

// TestSplitDecodeIsDecode: on every text, cut at each statement in turn
// (every few on a long one) and into 2 to 6 pieces, the pieces are either
// refused (the text is then decoded whole) or read to exactly the whole
// text's map; never accepted where the whole text is refused. Every form with a cut point, and the
// netlists, are read in pieces somewhere (the test cannot pass by refusing
// everything), and decodeTOML gives what toml.Decode gives, error and all.
func TestSplitDecodeIsDecode(t *testing.T) {
	joined := 0
	for name, src := range splitTexts(t) {
		var want map[string]any
		_, wantErr := toml.Decode(src, &want)
		try := func(what string, pieces []piece) bool {
			got, ok := decodePieces(pieces)
			switch {
			case ok && wantErr != nil:
				t.Errorf("%s %s: pieces read, whole refused: %v", name, what, wantErr)
			case ok && !reflect.DeepEqual(got, want):
				t.Errorf("%s %s: pieces read otherwise than the whole", name, what)
			}
			return ok
		}
		var every []int
		if len(src) < 64<<10 {
			for at := range cutPoints(src) {
				every = append(every, at)
			}
		}
		read := 0
		// At most some 100 cuts of a text: the statements of the larger
		// ones are alike.
		stride := 1 + len(every)/100
		for i := 0; i < len(every); i += stride {
			at := every[i]
			pieces := splitAt(src, at)
			if try("cut at "+src[at:min(len(src), at+12)], pieces) {
				read++
			}
		}
		for n := 2; n <= 6; n++ {
			if try("in pieces", splitTOML(src, n)) {
				read++
			}
		}
		if read > 0 {
			joined++
		}
		if strings.HasPrefix(name, "form ") && (wantErr != nil || read == 0) {
			t.Errorf("%s: never read in pieces (whole: %v)", name, wantErr)
		}
		if strings.HasPrefix(name, "refused ") && read > 0 {
			t.Errorf("%s: read in pieces", name)
		}
		got, err := decodeTOML(src)
		if (err == nil) != (wantErr == nil) || err != nil && err.Error() != wantErr.Error() || !reflect.DeepEqual(got, want) {
			t.Errorf("%s: decodeTOML differs from toml.Decode: %v against %v", name, err, wantErr)
		}
	}
	if joined < 100 {
		t.Errorf("only %d texts read in pieces", joined)
	}
}

// splitAt cuts src in two at a cut point, as splitTOML would there.
func splitAt(src string, at int) []piece {
	table := ""
	for p, name := range cutPoints(src) {
		if p == at {
			table = name
			break
		}
	}
	return []piece{{text: src[:at]}, {table: table, text: src[at:]}}
}
