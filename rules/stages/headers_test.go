package stages

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph/figure"
)

// The examples' header comments quote what `pare stages` prints, one
// "#   Sn: text" line per quote, so a reader of the netlist meets the same
// numbers as the tool gives; a header that claims otherwise (tracking
// points the values do not give) misleads the bench. Each quote must be
// part of that stage's figure line or one of its flags. The figures
// themselves are checked against their formulas in the tests above; this
// test keeps the prose in step with them.
func TestExampleHeadersQuoteStages(t *testing.T) {
	for _, name := range []string{"frequency-changer.toml", "if-detector-audio.toml", "transistor-front-end.toml", "club-receiver.toml"} {
		t.Run(name, func(t *testing.T) {
			quotes := headerQuotes(t, filepath.Join("..", "..", "examples", name))
			if len(quotes) == 0 {
				t.Fatal("the header quotes no stage figure")
			}
			full, reduced, log := reduceExample(t, name)
			texts := map[string]string{}
			for _, s := range find(t, reduced, Options{Full: full, ACGround: log.ACGround}) {
				texts[s.Name] = figure.Line(s.Figures, figure.Text) + "\n" + strings.Join(s.Flags, "\n")
			}
			for _, q := range quotes {
				if !strings.Contains(texts[q[0]], q[1]) {
					t.Errorf("header quotes %s: %q; pare stages prints %q", q[0], q[1], texts[q[0]])
				}
			}
		})
	}
}

// headerQuotes returns the (stage, text) quotes of a file's header: the
// comment block at the top, lines "#   S2: text".
func headerQuotes(t *testing.T, path string) [][2]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var out [][2]string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if !strings.HasPrefix(line, "#") {
			break // the header ends at the first line that is not a comment
		}
		rest, ok := strings.CutPrefix(line, "#   S")
		if !ok {
			continue
		}
		if stage, text, ok := strings.Cut(rest, ": "); ok {
			out = append(out, [2]string{"S" + stage, strings.TrimSpace(text)})
		}
	}
	return out
}
