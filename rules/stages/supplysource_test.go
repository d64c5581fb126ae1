package stages

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// A supply filter section delivers power, so its source is a supply, a
// bias rail with declared volts, or a power rectifier (a reservoir-sized
// capacitor on it, or a diode typed rectifier). An AGC line (a bias rail
// that declares no volts) fed from a signal detector is not one: the AGC
// filter after the detector and a tuned coil's AGC feed with its cold-end
// bypass are no supply decoupling filter, and a tuned coil with its gang
// section is no screen feed (common practice). Checked on every example
// and fixture: no supply stage has a part on an undeclared bias rail and
// none holds a variable or preset capacitor; and on the review fixtures
// the AGC filters are named as such.
func TestSupplyStagesHaveASource(t *testing.T) {
	files, _ := filepath.Glob("../../examples/*.toml")
	more, _ := filepath.Glob("../../testdata/good/*.toml")
	files = append(files, more...)
	agcFilters := map[string]string{ // fixture → the AGC filter's resistor
		"review17-acdc.toml":    "R10",
		"review17-battery.toml": "R6",
	}
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			continue // the bad fixtures are others' tests
		}
		st := findReduced(t, c)
		for _, s := range st {
			if !s.Supply {
				continue
			}
			for _, ref := range s.Parts {
				p := c.Part(ref)
				if p == nil {
					continue
				}
				if p.Kind == graph.Capacitor && (p.Value.Max > p.Value.Min || p.Set > 0) {
					t.Errorf("%s: supply stage %s %q holds the variable capacitor %s", f, s.Name, s.Title, ref)
				}
				for _, pin := range p.Pins {
					if n := c.Net(pin.Net); n != nil && n.Role == graph.Bias && n.Volts == 0 {
						t.Errorf("%s: supply stage %s %q has %s on the AGC line %s", f, s.Name, s.Title, ref, n.Name)
					}
				}
			}
		}
		if r, ok := agcFilters[filepath.Base(f)]; ok {
			named := false
			for _, s := range st {
				if strings.Contains(" "+strings.Join(s.Parts, " ")+" ", " "+r+" ") && s.Title == "AGC filter" {
					named = true
				}
			}
			if !named {
				t.Errorf("%s: %s is not named the AGC filter", f, r)
			}
		}
	}
}
