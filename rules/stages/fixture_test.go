package stages

import (
	"fmt"
	"regexp"
	"strings"
	"testing"

	"pare/graph"
	"pare/rules"
)

// Fixtures are reduced circuits written as netlist part lines. An amplifying
// device is written @Q1(control, common, output) and expands per family, so
// one fixture tests a pattern on valves, BJTs and FETs alike. The device
// parameters are the invented ones of docs/references.md §5.
var devicePattern = regexp.MustCompile(`@(\w+)\(\s*(\w+)\s*,\s*(\w+)\s*,\s*(\w+)\s*\)`)

func expandDevices(parts, family string) string {
	return devicePattern.ReplaceAllStringFunc(parts, func(m string) string {
		g := devicePattern.FindStringSubmatch(m)
		ref, ctl, com, out := g[1], g[2], g[3], g[4]
		switch family {
		case "valve":
			return fmt.Sprintf(`%s = { valve = "triode", pins = { g1 = %q, k = %q, a = %q }, mu = 20, ra = "10k" }`, ref, ctl, com, out)
		case "bjt":
			return fmt.Sprintf(`%s = { bjt = "npn", pins = { b = %q, e = %q, c = %q }, beta = 100, ic = "1m" }`, ref, ctl, com, out)
		case "fet":
			return fmt.Sprintf(`%s = { fet = "njfet", pins = { g = %q, s = %q, d = %q }, gm = "5m" }`, ref, ctl, com, out)
		}
		panic("unknown family " + family) // test table mistake
	})
}

// circuit builds a reduced fixture: rails declared, a band, the IF if given.
func circuit(t testing.TB, family, parts string, extra ...string) *graph.Circuit {
	t.Helper()
	src := `title = "fixture"
band = "530k..1.6M"
`
	if strings.Contains(expandDevices(parts, family), `"in"`) {
		src += "inputs = [\"in\"]\n"
	}
	src += strings.Join(extra, "\n") + `
[nets]
ht = { role = "supply", volts = 250 }
agc_line = { role = "bias" }
[parts]
` + expandDevices(parts, family) + "\n"
	c, err := graph.Parse("fixture.toml", []byte(src))
	if err != nil {
		t.Fatalf("fixture does not load: %v\n%s", err, src)
	}
	return c
}

func find(t testing.TB, c *graph.Circuit, o Options) []Stage {
	t.Helper()
	st, err := Find(c, o)
	if err != nil {
		t.Fatalf("Find: %v", err)
	}
	return st
}

// findReduced reduces c at the signal level and finds its stages with the
// original beside it, as the main job does (AC grounds from the log).
func findReduced(t testing.TB, c *graph.Circuit) []Stage {
	t.Helper()
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatalf("reduce: %v", err)
	}
	return find(t, r, Options{Full: c, ACGround: log.ACGround})
}

func stageOf(stages []Stage, topology string) *Stage {
	for i := range stages {
		if stages[i].Topology == topology {
			return &stages[i]
		}
	}
	return nil
}

func topologies(stages []Stage) string {
	var out []string
	for _, s := range stages {
		out = append(out, s.Name+":"+s.Topology+fmt.Sprint(s.Parts))
	}
	return strings.Join(out, " ")
}
