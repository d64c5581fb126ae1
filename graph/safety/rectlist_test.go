package safety

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// TestRectifierListTakesSupplyRectifiers: the caution's basis lists the
// supply rectifiers only. review23 a05's double-diode-triode detector V3a
// has its spare anode strapped to chassis, where the HT winding's centre
// tap also sits: it was listed beside the full-wave rectifier V5 ("rectifiers
// V3a, V5", reviewer A of the twelfth review). A diode anode on chassis is
// driven by no winding (common practice: an unused detector diode is
// strapped to chassis or to its cathode). Near miss: the same diode with
// that anode moved onto the HT winding's end rectifies, and is listed.
func TestRectifierListTakesSupplyRectifiers(t *testing.T) {
	b, err := os.ReadFile(filepath.Join(repo, "testdata/review23/a05.toml"))
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	spare := `a1 = "det_a", a2 = "gnd", k = "v3k"`
	if !strings.Contains(text, spare) {
		t.Fatal("fixture changed: V3a's spare anode is no longer on chassis")
	}
	for _, tc := range []struct {
		name, text string
		want       string
	}{
		{"spare anode on chassis", text, "; rectifier V5;"},
		{"anode on the HT winding", strings.Replace(text, spare, `a1 = "det_a", a2 = "rect_a1", k = "v3k"`, 1), "; rectifiers V3a, V5;"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse("a05.toml", []byte(tc.text))
			if err != nil {
				t.Fatal(err)
			}
			ev := strings.Join(Assess(c).Evidence, "; ")
			if !strings.Contains(ev, tc.want) {
				t.Errorf("evidence %q lacks %q", ev, tc.want)
			}
		})
	}
}
