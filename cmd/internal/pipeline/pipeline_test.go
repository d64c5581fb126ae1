package pipeline

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/graph/safety"
	"pare/render"
	"pare/rules"
)

// edgeCoupling is a triode stage whose coupling capacitor just passes the
// ten-times rule at 20 Hz, so the ideal level shorts it; the phase that
// leaves out is atan(Xc/(R2 + ra∥RL)) = 5.28° at 20 Hz, over the 5°
// tolerance (derived: Xc = 1/(2π·20 Hz·180 nF) = 44.21 kΩ, ra∥RL = 10k∥47k
// = 8.2456 kΩ; the same circuit as cmd/pare's verify test).
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

func writeTemp(t testing.TB, name, src string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// TestUntil: each phase runs only when asked for, and only after the ones
// before it.
func TestUntil(t *testing.T) {
	path := writeTemp(t, "edge.toml", edgeCoupling)
	for _, tc := range []struct {
		until                             Phase
		reduced, verified, stages, sheets bool
	}{
		{PhaseLoad, false, false, false, false},
		{PhaseCheck, false, false, false, false},
		{PhaseReduce, true, false, false, false},
		{PhaseVerify, true, true, false, false},
		{PhaseStages, true, true, true, false},
		{0, true, true, true, true}, // the zero value runs everything
	} {
		res, err := Run(Options{Path: path, Until: tc.until, Level: rules.LevelSignal, Verify: true,
			Views: []render.View{render.Reduced}})
		if err != nil {
			t.Fatalf("until %s: %v", tc.until, err)
		}
		if res.Circuit == nil || res.Title != "Coupling capacitor at the edge of the ten-times rule" {
			t.Errorf("until %s: no circuit or title %q", tc.until, res.Title)
		}
		got := [4]bool{res.Reduced != nil, res.Verified && res.Report != nil, res.Stages != nil, len(res.Sheets) == 1}
		if want := [4]bool{tc.reduced, tc.verified, tc.stages, tc.sheets}; got != want {
			t.Errorf("until %s: reduced, verified, stages, sheets = %v, want %v", tc.until, got, want)
		}
	}
}

// TestErrorsCarryTheirPhase: a missing file fails in PhaseLoad, a pattern
// directory that does not exist in PhaseStages, and the message is the
// underlying one, unchanged.
func TestErrorsCarryTheirPhase(t *testing.T) {
	good := writeTemp(t, "edge.toml", edgeCoupling)
	for _, tc := range []struct {
		name string
		o    Options
		want Phase
	}{
		{"missing file", Options{Path: filepath.Join(t.TempDir(), "none.toml")}, PhaseLoad},
		{"bad netlist", Options{Path: writeTemp(t, "bad.toml", "[parts]\nR1 = { r = \"4k7\", pins = [\"a\"] }\n")}, PhaseLoad},
		{"missing patterns", Options{Path: good, PatternDir: filepath.Join(t.TempDir(), "none")}, PhaseStages},
	} {
		res, err := Run(tc.o)
		var pe *Error
		if !errors.As(err, &pe) || pe.Phase != tc.want {
			t.Errorf("%s: error %v, want one of phase %s", tc.name, err, tc.want)
			continue
		}
		if pe.Error() != pe.Err.Error() {
			t.Errorf("%s: message %q rewords %q", tc.name, pe.Error(), pe.Err.Error())
		}
		if res == nil {
			t.Errorf("%s: no partial result", tc.name)
		}
	}
	var list graph.ErrorList
	_, err := Run(Options{Path: writeTemp(t, "bad.toml", "[parts]\nR1 = { r = \"4k7\", pins = [\"a\"] }\n")})
	if !errors.As(err, &list) || len(list) == 0 {
		t.Errorf("a bad netlist's positioned errors are not reachable through the phase error: %v", err)
	}
}

// TestStepsAgainstOriginal: under AgainstOriginal every tentative step is
// compared with the original and numbered as in the log; at the ideal level
// the coupling short breaks the 5° tolerance (5.28°, see edgeCoupling) and
// is refused, so the final comparison passes.
func TestStepsAgainstOriginal(t *testing.T) {
	path := writeTemp(t, "edge.toml", edgeCoupling)
	res, err := Run(Options{Path: path, Until: PhaseVerify, Level: rules.LevelIdeal, StepCheck: AgainstOriginal, Verify: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Steps) != len(res.Log.Steps) || len(res.Steps) == 0 {
		t.Fatalf("%d checks for %d logged steps", len(res.Steps), len(res.Log.Steps))
	}
	refused := 0
	for i, ck := range res.Steps {
		s := res.Log.Steps[i]
		if ck.N != s.N || ck.Rule != s.Rule || ck.OK != (s.Refused == "") {
			t.Errorf("check %d = %+v does not match step %+v", i, ck, s)
		}
		if !ck.OK {
			refused++
			// derived: atan(44.21 kΩ / (470 kΩ + 8.2456 kΩ)) = 5.28°
			if ck.Worst == nil || math.Abs(ck.Worst.MaxDeg-5.28) > 0.01 || ck.Worst.AtHz != 20 {
				t.Errorf("refused step's worst pair %+v, want 5.28° at 20 Hz", ck.Worst)
			}
		}
	}
	if refused != 1 {
		t.Errorf("%d steps refused, want the coupling short alone", refused)
	}
	if !res.Report.OK || res.StepErr != nil || res.CompareErr != nil {
		t.Errorf("final comparison %+v, step error %v, compare error %v", res.Report, res.StepErr, res.CompareErr)
	}
}

// TestCautionFromTheOriginal: the caution is chosen from the circuit as
// loaded, and every sheet carries it, the reduced one with its
// small-signal sentence.
func TestCautionFromTheOriginal(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "transistor-front-end.toml")
	res, err := Run(Options{Path: path, Level: rules.LevelSignal,
		Views: []render.View{render.Reduced, render.Full, render.Faded}})
	if err != nil {
		t.Fatal(err)
	}
	// A 9 V rail and two BJTs: a battery set (IEC 60449 band I).
	if res.Caution.Class != safety.Battery || res.Caution.Class != safety.Assess(res.Circuit).Class {
		t.Fatalf("class %s, want battery", res.Caution.Class)
	}
	for _, s := range res.Sheets {
		if want := res.Caution.Sheet(s.View == render.Reduced); s.Sheet.Caution != want {
			t.Errorf("%s sheet caution %q, want %q", s.View, s.Sheet.Caution, want)
		}
	}
	// the reduced sheet's circuit is the reduced one, or its copy with the
	// decoupled lines' own voltages on their tags (railvolts.go)
	rs := res.SheetFor(render.Reduced).Sheet.Circuit
	if res.SheetFor(render.Full) == nil || res.SheetFor(render.Faded).Sheet.Circuit != res.Circuit ||
		rs != res.Reduced && (len(rs.Parts) != len(res.Reduced.Parts) || len(rs.Nets) != len(res.Reduced.Nets)) {
		t.Error("sheets do not show the circuits of their views")
	}
}

// TestReducedNetlist: the reduced netlist is marked as a reduction at its
// top and loads back.
func TestReducedNetlist(t *testing.T) {
	res, err := Run(Options{Path: writeTemp(t, "edge.toml", edgeCoupling), Until: PhaseReduce, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	b, err := res.ReducedNetlist()
	if err != nil {
		t.Fatal(err)
	}
	const marker = "# Reduced by pare (level signal): small-signal equivalent only, not a wiring diagram.\n"
	if len(b) < len(marker) || string(b[:len(marker)]) != marker {
		t.Errorf("reduced netlist does not start with the marker:\n%s", b)
	}
	if _, err := graph.Parse("again.toml", b); err != nil {
		t.Errorf("reduced netlist does not load back: %v", err)
	}
}

// A running valve oscillator's grid sits at a negative grid-leak bias the
// DC solve (oscillator stopped) gives as 0 V, so its sheets carry no grid
// figure (issue 10, the reviewer's VFO: "DC a 126 g1 0"); its buffer, not
// oscillating, keeps its grid figure.
func TestOscillatorGridHasNoDCFigure(t *testing.T) {
	res, err := stagesRun(filepath.Join("..", "..", "..", "testdata", "good", "review-vfo.toml"))
	if err != nil {
		t.Fatal(err)
	}
	v := res.electrodeVolts()
	if _, ok := v["V1a"]["g1"]; ok || v["V1a"]["a"] == "" {
		t.Errorf("V1a figures %v: want the anode's and no grid's", v["V1a"])
	}
	if _, ok := v["V1b"]["g1"]; !ok {
		t.Errorf("V1b figures %v: the buffer keeps its grid's", v["V1b"])
	}
}

// TestPinFiguresSayWhatTheyAre: the full and faded sheets carry the pin
// figures' legend once (ideal meter, oscillators stopped: docs/dc.md), the
// reduced sheet (no figures) does not; the supply points get figures at
// their decouplers (the review's valve amplifier: the reservoir C1 at the
// estimate, C2 after the choke, C5 on the decoupled line).
func TestPinFiguresSayWhatTheyAre(t *testing.T) {
	path := filepath.Join("..", "..", "..", "graph", "dc", "testdata", "review-valve-amp.toml")
	res, err := Run(Options{Path: path, Level: rules.LevelSignal,
		Views: []render.View{render.Reduced, render.Full, render.Faded}})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range res.Sheets {
		n := 0
		for _, l := range s.Sheet.Furniture {
			if l == PinLegend {
				n++
			}
		}
		if want := map[bool]int{true: 0, false: 1}[s.View == render.Reduced]; n != want {
			t.Errorf("%s sheet: legend %d times, want %d", s.View, n, want)
		}
	}
	pv := res.SheetFor(render.Full).Sheet.PinVolts
	// ngspice 39 .op of pare's deck with the rail at pare's estimate
	// (graph/dc/testdata/review-valve-amp-op.cir): 287.9 V, 274.3 V, 233.7 V.
	for ref, want := range map[string]string{"C1": "288", "C2": "274", "C5": "234"} {
		got := ""
		for _, v := range pv[ref] {
			got = v
		}
		if got != want {
			t.Errorf("%s: figure %q, want %q (ngspice .op 287.9 V, 274.3 V, 233.7 V)", ref, got, want)
		}
	}
}
