package rules

import (
	"io/fs"
	"math"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
)

// netlistFixtures lists every netlist the repository holds: the examples
// and every *.toml under a testdata directory (the loader's good, warning
// and fuzz-seed inputs and each package's own fixtures), sorted. Pattern
// files live outside testdata and are not netlists.
func netlistFixtures(t *testing.T) []string {
	t.Helper()
	var out []string
	err := filepath.WalkDir("..", func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && strings.HasPrefix(d.Name(), ".") && path != ".." {
			return filepath.SkipDir
		}
		if d.IsDir() && strings.HasPrefix(d.Name(), "patterns-") {
			return filepath.SkipDir // a folder of pattern files a test loads, not netlists
		}
		slash := filepath.ToSlash(path)
		if !d.IsDir() && strings.HasSuffix(path, ".toml") &&
			(strings.Contains(slash, "/testdata/") || strings.HasPrefix(slash, "../examples/")) {
			out = append(out, path)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	sort.Strings(out)
	return out
}

// solverRefuses lists the fixtures the AC solver rejects on purpose (a
// valve whose grid is wired to nothing has no small-signal model): there is
// no stamped value to hold the judgement to.
var solverRefuses = map[string]bool{
	"../cmd/pare/testdata/unverifiable/floating-grid.toml": true,
	"../testdata/warn/unconnected-terminal.toml":           true,
}

// The reduction's judgements and the AC solver use one device model: for
// every active part of every example and fixture, the gm, output resistance
// (ra, ro, rd), µ and rπ that the bypass judgement's terminal impedances
// imply equal the values the solver stamps, and a diode's given rd is the
// same in both. The judgement's figures are read back from its impedances
// by the formulas of graph/device (ZOutput(0) = rout, ZControl(0) = rπ,
// 1/ZCommon(0) = gm + 1/rout + 1/rπ), so a private table or a different
// formula in either place fails here. Agreement is to rounding (1e-9).
func TestJudgementUsesSolverModel(t *testing.T) {
	compared := 0
	for _, path := range netlistFixtures(t) {
		c, err := graph.LoadFile(path)
		if err != nil {
			if slash := filepath.ToSlash(path); strings.Contains(slash, "/testdata/bad/") || strings.Contains(slash, "/testdata/fuzz/") {
				continue // bad input or a fuzz seed: the loader's tests cover them
			}
			t.Errorf("%s: %v", path, err)
			continue
		}
		elems, err := ac.Elements(c)
		if err != nil {
			if !solverRefuses[path] {
				t.Errorf("%s: the solver refuses it: %v", path, err)
			}
			continue
		}
		stamped := map[string]float64{}
		for _, e := range elems {
			stamped[e.Ref+"."+e.Piece] = e.Value
		}
		for _, p := range c.Parts {
			compared += compareDevice(t, path, p, stamped)
		}
	}
	// 125 values when this test was written: the examples alone hold five
	// active parts, the fixtures many more.
	if compared < 100 {
		t.Errorf("only %d device values compared: the fixtures were not found", compared)
	}
	t.Logf("%d device values compared", compared)
}

// compareDevice checks one part and returns how many values it compared.
func compareDevice(t *testing.T, path string, p *graph.Part, stamped map[string]float64) int {
	t.Helper()
	n := 0
	same := func(what string, judged, solver float64, ok bool) {
		if !ok {
			return // the solver stamps nothing here (the two nodes are one)
		}
		n++
		if math.Abs(judged-solver) > 1e-9*math.Abs(solver) {
			t.Errorf("%s: %s %s: the judgement uses %.10g, the solver %.10g", path, p.Ref, what, judged, solver)
		}
	}
	if p.Kind == graph.Diode {
		if rd, ok := p.Param("rd"); ok && p.Params["off"] == 0 {
			b := lowBranch(p, "a", 1e3)
			s, ok := stamped[p.Ref+"."]
			same("rd", b.z, s, ok && rd > 0)
		}
		return n
	}
	if !p.IsActive() {
		return n
	}
	rName := map[graph.Kind]string{graph.Valve: "ra", graph.BJT: "ro", graph.FET: "rd"}[p.Kind]
	rout := lowBranch(p, p.PinWithRole(graph.RoleOutput), 1e3).z
	rpi := math.Inf(1)
	if p.Kind == graph.BJT {
		rpi = lowBranch(p, "b", 1e3).z
		s, ok := stamped[p.Ref+".rpi"]
		same("rπ", rpi, s, ok)
	}
	gm := 1/lowBranch(p, p.PinWithRole(graph.RoleCommon), 1e3).z - 1/rout - 1/rpi
	sr, okR := stamped[p.Ref+"."+rName]
	sg, okG := stamped[p.Ref+".gm"]
	same(rName, rout, sr, okR)
	same("gm", gm, sg, okG)
	same("µ", gm*rout, sg*sr, okR && okG)
	return n
}

// The impedance into a cathode that the bypass judgement counts is
// graph/device's one formula, (ra + RL)/(µ + 1), with RL the lower bound of
// the anode's load; values derived from that formula for µ 20, ra 10 kΩ
// (docs/references.md §5 gives ra/(µ+1) = 476.190 Ω), in parallel with
// the 1.5 kΩ cathode resistor.
func TestCathodeBranchCountsLoad(t *testing.T) {
	cases := []struct {
		name, anode, extra string
		want               float64
		text               string
	}{
		{"resistive anode load", "a1", `R3 = { r = "47k", pins = ["a1", "ht"] }`, 966.10,
			"V1 cathode ≈ (ra+RL)/(µ+1) 2.7143 kΩ with RL ≥ 47 kΩ on a1"}, // 57 kΩ/21 ∥ 1.5 kΩ
		{"anode at AC ground", "ht", "", 361.45, "V1 cathode ≈ ra/(µ+1) 476.19 Ω"}, // 476.19 ∥ 1.5 kΩ
		{"anode load beyond a port", "a1", `P1 = { port = "to the next stage", pins = ["a1"] }`, 361.45,
			"V1 cathode ≈ ra/(µ+1) 476.19 Ω"}, // the port bounds nothing: RL ≥ 0
		{"nothing else on the anode", "a1", "", 1500, "V1 cathode open (nothing else on a1)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := parse(t, `band = "20..20k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "`+tc.anode+`", g1 = "in", k = "k1" } }
R1 = { r = "1M", pins = ["in", "gnd"] }
R2 = { r = "1k5", pins = ["k1", "gnd"] }
`+tc.extra+"\n")
			z, text := newCtx(c, 0.1, LevelSignal).LowerZ("k1", 20)
			if math.Abs(z-tc.want) > 0.01 {
				t.Errorf("LowerZ(k1) = %.5g Ω, want %.5g Ω (%s)", z, tc.want, text)
			}
			if !strings.Contains(text, tc.text) {
				t.Errorf("why %q does not name %q", text, tc.text)
			}
		})
	}
}
