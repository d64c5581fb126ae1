package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/safety"
)

// edgeCoupling is a triode stage whose coupling capacitor just passes the
// ten-times rule at 20 Hz, so the ideal level shorts it; the phase it leaves
// out there is atan(Xc/(R2 + ra∥RL)) = 5.28°, over the 5° tolerance
// (derived: Xc = 1/(2π·20 Hz·180 nF) = 44.21 kΩ, ra∥RL = 10k∥47k = 8.2456 kΩ).
const edgeCoupling = `title = "Coupling capacitor at the edge of the ten-times rule"
band = "20..20k"
inputs = ["in"]
outputs = ["out"]

[nets]
ht = { role = "supply", volts = 250 }

[parts]
V1 = { valve = "triode", mu = 20, ra = "10k", pins = { a = "a", g1 = "in", k = "gnd" } }
R1 = { r = "47k", pins = ["a", "ht"] }
C1 = { c = "180n", pins = ["a", "out"] }
R2 = { r = "470k", pins = ["out", "gnd"] }
`

func writeTemp(t *testing.T, name, src string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func edgeNumbers() (dB, deg float64) {
	xc := 1 / (2 * math.Pi * 20 * 180e-9)
	rs := 10e3 * 47e3 / (10e3 + 47e3)
	r := xc / (470e3 + rs)
	return 10 * math.Log10(1+r*r), math.Atan(r) * 180 / math.Pi
}

func TestVerifyPasses(t *testing.T) {
	for _, f := range []string{"graph/ac/testdata/triode-stage.toml", "graph/ac/testdata/bjt-stage.toml", "examples/if-detector-audio.toml"} {
		path := filepath.Join(root, f)
		if _, err := os.Stat(path); err != nil {
			continue
		}
		code, out, errs := cliRun(t, "verify", path)
		if code != exitOK || errs != "" || !strings.Contains(out, "ok: all") {
			t.Errorf("verify %s: exit %d\n%s\n%s", f, code, out, errs)
		}
		// The caution closes the report, worded for the set (a valve set's
		// HT, the BJT stage's low-voltage supply) by graph/safety.
		c, err := graph.LoadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if want := safety.For(c).Report(safety.Comparison) + "\n"; !strings.HasSuffix(out, want) {
			t.Errorf("verify %s: the report does not end with its caution %q", f, want)
		}
	}
}

func TestVerifyIdealEdge(t *testing.T) {
	path := writeTemp(t, "edge.toml", edgeCoupling)
	wantDB, wantDeg := edgeNumbers()
	// The unproven reduction: the per-step proof (the default, the main
	// job's) refuses the edge step, so only --check=false shows its error.
	code, out, _ := cliRun(t, "verify", "--level", "ideal", "--check=false", "--json", path)
	if code != exitFound {
		t.Fatalf("exit %d, want 1 for a reduction out of tolerance:\n%s", code, out)
	}
	var rep struct {
		Pairs []struct {
			From, To, What string
			MaxDB          float64 `json:"max_db"`
			MaxDeg         float64 `json:"max_deg"`
			AtHz           float64 `json:"at_hz"`
		} `json:"pairs"`
		TolDB  float64 `json:"tolerance_db"`
		TolDeg float64 `json:"tolerance_deg"`
		OK     *bool   `json:"ok"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil {
		t.Fatalf("--json output does not parse: %v\n%s", err, out)
	}
	if rep.OK == nil || *rep.OK || rep.TolDB != 0.5 || rep.TolDeg != 5 || len(rep.Pairs) != 1 {
		t.Fatalf("report %+v", rep)
	}
	p := rep.Pairs[0]
	if p.From != "in" || p.To != "out" || p.What != "transfer" || p.AtHz != 20 ||
		math.Abs(p.MaxDB-wantDB) > 1e-6 || math.Abs(p.MaxDeg-wantDeg) > 1e-6 {
		t.Errorf("pair %+v, want in→out %.4f dB %.3f° at 20 Hz", p, wantDB, wantDeg)
	}
	// A wider phase tolerance lets it pass.
	if code, out, _ := cliRun(t, "verify", "--level", "ideal", "--check=false", "--tol-deg", "6", path); code != exitOK {
		t.Errorf("--tol-deg 6: exit %d\n%s", code, out)
	}
	// By default verify judges the main job's reduction: the step is
	// refused, named, and what is left passes, as the main job says.
	code, out, _ = cliRun(t, "verify", "--level", "ideal", path)
	if code != exitOK || !strings.Contains(out, "refused: step") || !strings.Contains(out, "coupling-short (C1)") {
		t.Errorf("default verify: exit %d, want 0 with the refused step named:\n%s", code, out)
	}
}

func TestVerifySteps(t *testing.T) {
	path := writeTemp(t, "edge.toml", edgeCoupling)
	code, out, _ := cliRun(t, "verify", "--level", "ideal", "--steps", path)
	if code != exitFound {
		t.Fatalf("exit %d, want 1:\n%s", code, out)
	}
	m := regexp.MustCompile(`first step to break the tolerance: step (\d+), coupling-short \(C1\): V\(out\)/V\(in\) changes by ([0-9.]+) dB, ([0-9.]+)° at 20 Hz`).FindStringSubmatch(out)
	if m == nil {
		t.Fatalf("no blame on the coupling-short step of C1:\n%s", out)
	}
	_, wantDeg := edgeNumbers()
	if deg, _ := strconv.ParseFloat(m[3], 64); math.Abs(deg-wantDeg) > 0.01 {
		t.Errorf("blamed deviation %s°, want %.2f°", m[3], wantDeg)
	}
	// The step was refused, so what is left verifies.
	if !strings.Contains(out, "V(out)/V(in)     0.000 dB") {
		t.Errorf("the refused step still shows in the final comparison:\n%s", out)
	}
}

func TestVerifyBadInput(t *testing.T) {
	bad := writeTemp(t, "bad.toml", "band = \"1k..2k\"\n[parts]\nR1 = { r = \"4k7\", pins = [\"a\"] }\n")
	good := writeTemp(t, "edge.toml", edgeCoupling)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"verify", bad}, "bad.toml:3:"},
		{[]string{"verify", filepath.Join(t.TempDir(), "missing.toml")}, "no such file"},
		{[]string{"verify", "--level", "tight", good}, "unknown reduction level"},
		{[]string{"verify", "--tol-db", "0", good}, "must be positive"},
		{[]string{"verify", "--at", "1.5", good}, "fraction of the travel"},
		{[]string{"verify"}, "exactly one"},
	}
	for _, tc := range cases {
		code, out, errs := cliRun(t, tc.args...)
		if code != exitBad || !strings.Contains(errs, tc.want) || out != "" {
			t.Errorf("%v: exit %d, stdout %q, stderr %q; want exit 2 and %q", tc.args, code, out, errs, tc.want)
		}
	}
}

// The same input gives byte-identical output.
func TestVerifyDeterministic(t *testing.T) {
	path := filepath.Join(root, "graph/ac/testdata/hartley-xtal.toml")
	_, a, _ := cliRun(t, "verify", "--json", "--steps", path)
	_, b, _ := cliRun(t, "verify", "--json", "--steps", path)
	if a != b || a == "" {
		t.Errorf("two runs differ:\n%s\n---\n%s", a, b)
	}
}

// The examples verify at every level, the ideal view included: the ideal
// view may short coupling capacitors and open chokes only where the AC
// comparison (0.5 dB, 5°, common practice for a redrawn circuit) agrees.
// A gang section merged with its padder into one linear range moved the
// frequency changer's aerial-to-IF transfer by about 20 dB at mid-travel.
func TestVerifyExamplesAtEveryLevel(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	files, _ := filepath.Glob(filepath.Join(root, "examples", "*.toml"))
	if len(files) == 0 {
		t.Fatal("no examples found")
	}
	for _, f := range files {
		for _, lvl := range []string{"tidy", "signal", "ideal"} {
			code, out, errs := cliRun(t, "verify", "--level", lvl, f)
			if code != exitOK || !strings.Contains(out, "ok: all") {
				t.Errorf("verify --level %s %s: exit %d\n%s\n%s", lvl, filepath.Base(f), code, out, errs)
			}
		}
	}
}

// A valid netlist whose AC model cannot be solved (a grid net touching
// nothing but the grid floats: textbook nodal analysis, from memory) is a
// finding, not bad input: exit 1 and "cannot be solved", as the main job
// reports it; in --json too. A primary reached only through its mains ports
// is held at 0 V as an undriven source and verifies.
func TestVerifyUnsolvableAndPortFed(t *testing.T) {
	floating := filepath.Join(root, "cmd/pare/testdata/unverifiable/floating-grid.toml")
	for _, args := range [][]string{{"verify", floating}, {"verify", "--steps", floating}} {
		code, out, errs := cliRun(t, args...)
		if code != exitFound || !strings.Contains(out, "FAILED: the circuit cannot be solved: ") || !strings.Contains(out, "gx") {
			t.Errorf("%v: exit %d, want 1 and 'cannot be solved' naming gx\n%s\n%s", args, code, out, errs)
		}
	}
	code, out, _ := cliRun(t, "verify", "--json", floating)
	var rep struct {
		OK    *bool  `json:"ok"`
		Error string `json:"error"`
	}
	if err := json.Unmarshal([]byte(out), &rep); err != nil || code != exitFound || rep.OK == nil || *rep.OK || !strings.HasPrefix(rep.Error, "cannot be solved: ") {
		t.Errorf("--json: exit %d, %+v (%v)\n%s", code, rep, err, out)
	}
	bridge := filepath.Join(root, "graph/ac/testdata/mains-bridge.toml")
	code, out, errs := cliRun(t, "verify", bridge)
	if code != exitOK || !strings.Contains(out, "ok: all") || !strings.Contains(out, "Held at 0 V: net(s) mains_l, mains_n") {
		t.Errorf("verify of the port-fed bridge: exit %d\n%s\n%s", code, out, errs)
	}
	// A termination naming no net is bad usage: exit 2.
	if code, _, errs := cliRun(t, "verify", "--term", "nosuch=5", bridge); code != exitBad || !strings.Contains(errs, "nosuch") {
		t.Errorf("--term on a missing net: exit %d, %s", code, errs)
	}
}

// --steps prints one line per checked step with its worst deviation from
// the original: on the edge fixture, the rail step keeps everything (0 dB),
// and the coupling-short of C1 is refused at the phase edgeNumbers derives
// (5.28° at 20 Hz); --json carries the same table.
func TestVerifyStepTable(t *testing.T) {
	path := writeTemp(t, "edge.toml", edgeCoupling)
	_, out, _ := cliRun(t, "verify", "--level", "ideal", "--steps", path)
	if !strings.Contains(out, "(2 step(s) checked)") {
		t.Errorf("the table should count the checked steps:\n%s", out)
	}
	if !regexp.MustCompile(`(?m)^\s+1  rail-ground\s+ht\s+V\(out\)/V\(in\)\s+0\.000 dB\s+0\.00°  at 20 Hz  kept$`).MatchString(out) {
		t.Errorf("no kept line for step 1:\n%s", out)
	}
	m := regexp.MustCompile(`(?m)^\s+2  coupling-short\s+C1\s+V\(out\)/V\(in\)\s+([0-9.]+) dB\s+([0-9.]+)°  at 20 Hz  REFUSED$`).FindStringSubmatch(out)
	if m == nil {
		t.Fatalf("no refused line for step 2:\n%s", out)
	}
	_, wantDeg := edgeNumbers()
	if deg, _ := strconv.ParseFloat(m[2], 64); math.Abs(deg-wantDeg) > 0.01 {
		t.Errorf("step 2 deviation %s°, want %.2f°", m[2], wantDeg)
	}
	_, js, _ := cliRun(t, "verify", "--level", "ideal", "--steps", "--json", path)
	var rep struct {
		Steps []struct {
			N     int
			Rule  string
			OK    bool
			Worst *struct {
				MaxDeg float64 `json:"max_deg"`
			}
		}
	}
	if err := json.Unmarshal([]byte(js), &rep); err != nil {
		t.Fatal(err)
	}
	if len(rep.Steps) != 2 || rep.Steps[1].N != 2 || rep.Steps[1].OK || rep.Steps[1].Worst == nil || math.Abs(rep.Steps[1].Worst.MaxDeg-wantDeg) > 1e-6 {
		t.Errorf("--json steps %+v", rep.Steps)
	}
}
