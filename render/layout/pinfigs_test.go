package layout

import (
	"strings"
	"testing"

	"pare/render/check"
	"pare/render/geom"
	"pare/render/symbol"
)

// A common-cathode triode and an emitter follower, each with its electrode
// voltages: every figure is either beside its own pin (nearer it than any
// other pin of the part, within reach) or left in the part's DC line, the
// sheet stays clean by the checker in both symbol styles, and the drawing is
// the same on a second run.
const pinFigCircuit = `title = "pin figures"
band = "1k..2k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250 }
vcc = { role = "supply", volts = 12 }
[parts]
C1 = { c = "22n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "k" } }
R2 = { r = "100k", pins = ["ht", "a"] }
R3 = { r = "1k5", pins = ["k", "gnd"] }
C2 = { c = "22n", pins = ["a", "b"] }
R4 = { r = "100k", pins = ["b", "gnd"] }
Q1 = { bjt = "npn", pins = { b = "b", c = "vcc", e = "out" } }
R5 = { r = "2k2", pins = ["out", "gnd"] }
`

func TestPinFigures(t *testing.T) {
	c := parse(t, pinFigCircuit)
	volts := map[string]map[string]string{
		"V1": {"a": "171", "g1": "0", "k": "1.52"},
		"Q1": {"b": "3.9", "e": "3.25"}, // the collector sits on the rail: no figure asked
	}
	for _, st := range []symbol.Style{symbol.IEC, symbol.IEEE} {
		r1, err := Layout(c, Options{Style: st, PinVolts: volts})
		if err != nil {
			t.Fatal(err)
		}
		r2, _ := Layout(c, Options{Style: st, PinVolts: volts})
		if !sameLabels(r1.Geom.Labels, r2.Geom.Labels) {
			t.Errorf("style %v: pin figures differ between two runs", st)
		}
		for _, p := range check.Measure(&r1.Geom).Problems() {
			t.Errorf("style %v: %s", st, p)
		}
		placed := 0
		for ref, pins := range volts {
			sym := symbolOf(t, &r1.Geom, ref)
			line := dcLineOf(r1.Geom.Labels, ref)
			for pin, v := range pins {
				fig, ok := figureOf(r1.Geom.Labels, ref+"."+pin)
				switch {
				case ok:
					placed++
					if fig.Lines[0] != v+" V" {
						t.Errorf("%s.%s: figure %q, want %q", ref, pin, fig.Lines[0], v+" V")
					}
					checkNearest(t, sym, pin, fig.Box)
					if strings.Contains(line, " "+pin+" ") {
						t.Errorf("%s.%s is both beside its pin and in the DC line %q", ref, pin, line)
					}
				case !strings.Contains(line, " "+pin+" "+v+" "):
					t.Errorf("%s.%s: no figure and not in the DC line %q", ref, pin, line)
				}
			}
		}
		if placed < 3 {
			t.Errorf("style %v: only %d of 5 figures beside their pins", st, placed)
		}
	}
}

func figureOf(ls []geom.Label, owner string) (geom.Label, bool) {
	for _, l := range ls {
		if l.Owner == owner && l.Small {
			return l, true
		}
	}
	return geom.Label{}, false
}

// dcLineOf is the DC line of ref's label ("" when every figure found room),
// with a space at the end so a test can look for " PIN VALUE ".
func dcLineOf(ls []geom.Label, ref string) string {
	for _, l := range ls {
		if l.Owner == ref && len(l.Lines) > 1 && strings.HasPrefix(l.Lines[len(l.Lines)-1], "DC ") {
			return strings.TrimSuffix(l.Lines[len(l.Lines)-1], "V") + " "
		}
	}
	return ""
}

func checkNearest(t *testing.T, sym geom.Symbol, pin string, box geom.Rect) {
	t.Helper()
	var own geom.Pt
	for _, p := range sym.Pins {
		if p.Name == pin {
			own = p.At
		}
	}
	d := rectDist(box, own)
	if d > pinFigReach {
		t.Errorf("%s.%s: figure %.2f grid steps from its pin", sym.Ref, pin, d)
	}
	for _, p := range sym.Pins {
		if p.Name != pin && p.At != own && rectDist(box, p.At) <= d {
			t.Errorf("%s.%s: figure as near pin %s as its own", sym.Ref, pin, p.Name)
		}
	}
}

func sameLabels(a, b []geom.Label) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].Owner != b[i].Owner || a[i].Box != b[i].Box || strings.Join(a[i].Lines, "\n") != strings.Join(b[i].Lines, "\n") {
			return false
		}
	}
	return true
}
