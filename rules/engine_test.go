package rules

import (
	"errors"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/value"
)

func TestParseLevel(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Level
		ok   bool
	}{{"tidy", LevelTidy, true}, {"signal", LevelSignal, true}, {"IDEAL", LevelIdeal, true}, {"full", 0, false}, {"", 0, false}} {
		got, err := ParseLevel(tc.in)
		if (err == nil) != tc.ok || (tc.ok && got != tc.want) {
			t.Errorf("ParseLevel(%q) = %v, %v", tc.in, got, err)
		}
		if tc.ok && got.String() != strings.ToLower(tc.in) {
			t.Errorf("%v.String() = %q", got, got.String())
		}
	}
}

// Two rules that undo each other must end in a "rewrite cycle" error, not a hang.
func TestRewriteCycle(t *testing.T) {
	flip := func(name string, from, to float64) Rule {
		return Rule{Name: name, Purpose: "test", Level: LevelTidy, Kinds: []graph.Kind{graph.Resistor},
			Match: func(x *Ctx, a Anchor) *Plan {
				if a.Part.Value.Max != from {
					return nil
				}
				return &Plan{Parts: []*graph.Part{a.Part}, Why: "flip"}
			},
			Apply: func(x *Ctx, m *Plan) Step {
				m.Parts[0].Value = value.Range{Min: to, Max: to}
				return Step{}
			}}
	}
	c := parse(t, "band = \"1k..2k\"\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"b\"] }\n")
	_, _, err := Reduce(c, Options{Rules: []Rule{flip("up", 1000, 2000), flip("down", 2000, 1000)}, MaxSteps: 1 << 20})
	if !errors.Is(err, errCycle) {
		t.Fatalf("want a rewrite cycle error, got %v", err)
	}
	// With the default bound the step limit or the cycle check stops it, never a hang.
	if _, _, err := Reduce(c, Options{Rules: []Rule{flip("up", 1000, 2000), flip("down", 2000, 1000)}}); err == nil {
		t.Fatal("a cycling table must fail")
	}
}

func TestBadTables(t *testing.T) {
	ok := Table()[0]
	cases := map[string][]Rule{
		"no name":   {{Match: ok.Match, Apply: ok.Apply}},
		"twice":     {ok, ok},
		"no apply":  {{Name: "x", Match: ok.Match}},
		"reserved":  {{Name: "focus", Match: ok.Match, Apply: ok.Apply}},
		"bad level": {{Name: "x", Level: 7, Match: ok.Match, Apply: ok.Apply}},
	}
	c := parse(t, "band = \"1k..2k\"\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"b\"] }\n")
	for name, rules := range cases {
		if _, _, err := Reduce(c, Options{Rules: rules}); err == nil {
			t.Errorf("%s: table accepted", name)
		}
	}
}

func TestBadRatio(t *testing.T) {
	c := parse(t, "band = \"1k..2k\"\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"b\"] }\n")
	for _, r := range []float64{-1, 1, 5} {
		if _, _, err := Reduce(c, Options{BypassRatio: r}); err == nil {
			t.Errorf("ratio %g accepted", r)
		}
	}
}

// Check refuses a step: it is logged with the reason, not applied, and not
// tried again.
func TestCheckRefuses(t *testing.T) {
	c := parse(t, gridNet("100..20k", "1k", "25u", `["x", "gnd"]`, ""))
	calls := 0
	r, log, err := Reduce(c, Options{Level: LevelSignal, Check: func(before, after *graph.Circuit, st *Step) error {
		if before == nil || after == nil {
			t.Fatal("Check was not given both circuits")
		}
		if st.Rule == "bypass" {
			calls++
			return errors.New("transfer in→out changes by 3 dB")
		}
		return nil
	}})
	if err != nil {
		t.Fatal(err)
	}
	refused := 0
	for _, s := range log.Steps {
		if s.Refused != "" {
			refused++
			if !strings.Contains(s.String(), "[refused: transfer in→out changes by 3 dB]") {
				t.Errorf("refused step line: %s", s.String())
			}
		}
	}
	if refused != 1 || calls != 1 {
		t.Errorf("want one refused bypass, checked once; got %d refused, %d calls\n%s", refused, calls, logText(log))
	}
	if r.Part("C1") == nil || r.Net("x") == nil {
		t.Errorf("a refused step must not be applied")
	}
	// Nor may the log name its net as AC ground (the note prints this list
	// under "At AC ground"): failed before, issue 10 item 9.
	for _, n := range log.ACGround {
		if n == "x" {
			t.Errorf("net x listed at AC ground though the bypass that grounds it was refused: %v", log.ACGround)
		}
	}
	if log.Applied() != len(log.Steps)-1 {
		t.Errorf("Applied() = %d of %d", log.Applied(), len(log.Steps))
	}
}

// Reduce never modifies its input.
func TestInputUntouched(t *testing.T) {
	c := parse(t, pentodeFixture)
	before := written(t, c)
	if _, _, err := Reduce(c, Options{Level: LevelIdeal}); err != nil {
		t.Fatal(err)
	}
	if after := written(t, c); after != before {
		t.Fatalf("Reduce changed its input:\n%s\n---\n%s", before, after)
	}
}

// A part a numeric rule must judge but that has no band (regions only, the
// part in none of them) is reported with its position, not guessed.
func TestNoBandIsAnError(t *testing.T) {
	src := `
inputs = ["in"]
outputs = ["out"]
[regions]
audio = { band = "20..20k", parts = ["R1"] }
[parts]
R1 = { r = "1k", pins = ["in", "out"] }
R2 = { r = "1k", pins = ["out", "x"] }
C2 = { c = "10u", pins = ["x", "gnd"] }
`
	_, _, err := Reduce(parse(t, src), Options{Level: LevelSignal})
	var list graph.ErrorList
	if !errors.As(err, &list) || !strings.Contains(err.Error(), "test.toml:") || !strings.Contains(err.Error(), "no band of interest") {
		t.Fatalf("want a positioned no-band error, got %v", err)
	}
}

// Every step line carries the rule, the refs with file:line, and the why.
func TestStepString(t *testing.T) {
	s := Step{N: 3, Rule: "bypass", Refs: []string{"C12", "R7"}, Where: []graph.Pos{{File: "set.toml", Line: 40, Col: 1}, {File: "set.toml", Line: 38}},
		Why: "C12 (100 µF, k–gnd): |Xc| … → k is at AC ground"}
	want := "  3  bypass           C12 (set.toml:40), R7 (set.toml:38): C12 (100 µF, k–gnd): |Xc| … → k is at AC ground"
	if got := s.String(); got != want {
		t.Errorf("got  %q\nwant %q", got, want)
	}
}

// Hit counts come in table order, one per rule of the level.
func TestHits(t *testing.T) {
	_, log := reduceChecked(t, parse(t, pentodeFixture), Options{Level: LevelSignal})
	n := 0
	for _, h := range log.Hits {
		n += h.N
	}
	if n != log.Applied() {
		t.Errorf("hits add up to %d, steps %d", n, log.Applied())
	}
	if log.Hits[0].Rule != "ground-merge" || len(log.Hits) != 12 {
		t.Errorf("hits not in table order for the signal level: %+v", log.Hits)
	}
}

// A refused step puts the circuit back; the rules must then work on the
// restored parts, never on the ones the refused step had in hand (a stale
// part once produced "C4 in series with C4").
func TestRefusalRestoresCleanly(t *testing.T) {
	for _, path := range []string{"../examples/transistor-front-end.toml", "../examples/frequency-changer.toml", "testdata/band-switch.toml"} {
		c, err := graph.LoadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		r, log, err := Reduce(c, Options{Level: LevelSignal, CheckStep: func(j *graph.Journal, st *Step) error {
			if err := invariants(j.Circuit()); err != nil {
				t.Fatalf("%s: invariant broken after %s: %v", path, st.Rule, err)
			}
			if st.Rule == "series" || st.Rule == "parallel" {
				return errors.New("refused for the test")
			}
			return nil
		}})
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range log.Steps {
			seen := map[string]bool{}
			for _, ref := range s.Refs {
				if seen[ref] {
					t.Errorf("%s: step names %s twice: %s", path, ref, s)
				}
				seen[ref] = true
			}
			if (s.Rule == "series" || s.Rule == "parallel") && s.Refused == "" {
				t.Errorf("%s: a merge was applied although refused: %s", path, s)
			}
		}
		if err := invariants(r); err != nil {
			t.Errorf("%s: %v", path, err)
		}
	}
}
