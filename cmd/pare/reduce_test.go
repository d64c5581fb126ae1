package main

import (
	"crypto/sha256"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// The examples reduce at every level with exit 0, a numbered log, the
// counts, and the caution; the output is the same on every run.
func TestReduceExamples(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	for _, f := range cliGlob(t, "examples/*.toml") {
		for _, lvl := range []string{"tidy", "signal", "ideal"} {
			code, out, errs := cliRun(t, "reduce", "--level", lvl, f)
			if code != exitOK || errs != "" {
				t.Fatalf("reduce %s --level %s: exit %d\n%s\n%s", f, lvl, code, out, errs)
			}
			if !strings.Contains(out, "reduction at level "+lvl) || !strings.Contains(out, "parts ") || !strings.Contains(out, "Small-signal equivalent only") {
				t.Errorf("%s: log lacks header, summary or caution:\n%s", f, out)
			}
			_, again, _ := cliRun(t, "reduce", "--level", lvl, f)
			if again != out {
				t.Errorf("%s at %s: two runs differ", f, lvl)
			}
		}
	}
}

// The counts the log reports for the frequency changer (26 parts, 15 nets
// in the file; 14 parts, 10 nets on the signal path with the padder apart,
// see rules' example test).
func TestReduceSummary(t *testing.T) {
	code, out, _ := cliRun(t, "reduce", filepath.Join(root, "examples/frequency-changer.toml"))
	if code != exitOK || !strings.Contains(out, "parts 26 → 14, nets 15 → 10") {
		t.Fatalf("exit %d, summary not as expected:\n%s", code, out)
	}
	if !strings.Contains(out, "gang tune: VC1a, VC1b") {
		t.Errorf("gang annotation missing:\n%s", out)
	}
	if !strings.Contains(out, "frequency-changer.toml:53") { // C6, the anode bypass, is on line 53
		t.Errorf("steps should name parts with file:line:\n%s", out)
	}
}

// -o writes a netlist that loads, never touches the input, and --json gives
// steps, counts and the same netlist text.
func TestReduceOutputAndJSON(t *testing.T) {
	src := filepath.Join(root, "examples/if-detector-audio.toml")
	before := fileHash(t, src)
	out := filepath.Join(t.TempDir(), "reduced.toml")
	code, _, errs := cliRun(t, "reduce", src, "-o", out)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if fileHash(t, src) != before {
		t.Fatal("the input file was modified")
	}
	c, err := graph.LoadFile(out)
	if err != nil {
		t.Fatalf("the written netlist does not load: %v", err)
	}
	data, _ := os.ReadFile(out)
	if !strings.Contains(string(data), "Reduced by pare (level signal): small-signal equivalent only") {
		t.Errorf("the written netlist should say it is a reduction:\n%s", data)
	}
	// Reducing the written netlist again changes nothing.
	code, again, _ := cliRun(t, "reduce", out)
	if code != exitOK || !strings.Contains(again, " 0 step(s)") {
		t.Errorf("reducing the reduced netlist took steps:\n%s", again)
	}

	code, js, errs := cliRun(t, "reduce", "--json", src)
	if code != exitOK {
		t.Fatalf("--json: exit %d: %s", code, errs)
	}
	var doc struct {
		Steps []struct {
			Rule    string   `json:"rule"`
			Removed []string `json:"removed"`
			Merged  []string `json:"merged"`
			Why     string   `json:"why"`
			Refs    []string `json:"refs"`
			At      []string `json:"at"`
		} `json:"steps"`
		Before  struct{ Parts, Nets int } `json:"before"`
		After   struct{ Parts, Nets int } `json:"after"`
		Circuit string                    `json:"circuit"`
	}
	if err := json.Unmarshal([]byte(js), &doc); err != nil {
		t.Fatalf("--json output is not JSON: %v\n%s", err, js)
	}
	if len(doc.Steps) == 0 || doc.Steps[0].Rule == "" || doc.Steps[0].Why == "" {
		t.Errorf("steps lack rule or why: %+v", doc.Steps)
	}
	for _, s := range doc.Steps {
		if len(s.At) != len(s.Refs) || (len(s.At) > 0 && !strings.Contains(s.At[0], "if-detector-audio.toml:")) {
			t.Errorf("step %s: at %v does not match refs %v", s.Rule, s.At, s.Refs)
		}
	}
	if doc.Before.Parts != 37 || doc.After.Parts != len(c.Parts) {
		t.Errorf("counts %+v → %+v, want 37 → %d", doc.Before, doc.After, len(c.Parts))
	}
	if doc.Circuit != string(data) {
		t.Errorf("the JSON circuit differs from the -o file")
	}
}

func fileHash(t *testing.T, path string) [32]byte {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return sha256.Sum256(data)
}

// Bad input and usage: exit 2, a clear message, and no output file.
func TestReduceBadInput(t *testing.T) {
	dir := t.TempDir()
	broken := filepath.Join(dir, "broken.toml")
	os.WriteFile(broken, []byte("band = \"20..20k\"\n[parts]\nR1 = { r = \"1k\", pins = [\"a\" }\n"), 0o644)
	noband := filepath.Join(dir, "noband.toml")
	os.WriteFile(noband, []byte("inputs = [\"in\"]\noutputs = [\"out\"]\n[regions]\naudio = { band = \"20..20k\", parts = [\"R1\"] }\n[parts]\nR1 = { r = \"1k\", pins = [\"in\", \"out\"] }\nR2 = { r = \"1k\", pins = [\"out\", \"x\"] }\nC2 = { c = \"10u\", pins = [\"x\", \"gnd\"] }\n"), 0o644)
	fc := filepath.Join(root, "examples/frequency-changer.toml")
	out := filepath.Join(dir, "out.toml")
	cases := []struct {
		name string
		args []string
		want string
	}{
		{"no file", []string{"reduce"}, "give exactly one netlist file"},
		{"missing file", []string{"reduce", filepath.Join(dir, "nope.toml"), "-o", out}, "no such file"},
		{"syntax error", []string{"reduce", broken, "-o", out}, "broken.toml:3:"},
		{"bad level", []string{"reduce", "--level", "full", fc, "-o", out}, "unknown reduction level"},
		{"bad ratio", []string{"reduce", "--ratio", "2", fc, "-o", out}, "--ratio 2"},
		{"focus names nothing", []string{"reduce", "--focus", "V9", fc, "-o", out}, `focus "V9": no part or net of that name`},
		{"empty focus", []string{"reduce", "--focus", ",", fc, "-o", out}, "--focus names nothing"},
		{"no band", []string{"reduce", noband, "-o", out}, "noband.toml:8:1: C2: no band of interest"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			code, _, errs := cliRun(t, tc.args...)
			if code != exitBad || !strings.Contains(errs, tc.want) {
				t.Errorf("exit %d, stderr %q; want exit 2 and %q", code, errs, tc.want)
			}
			if _, err := os.Stat(out); err == nil {
				t.Errorf("an output file was written despite the error")
			}
		})
	}
}

// --focus keeps the stage around V3 of the IF/audio example with ports.
func TestReduceFocus(t *testing.T) {
	code, out, errs := cliRun(t, "reduce", "--focus", "V3", filepath.Join(root, "examples/if-detector-audio.toml"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "  1  focus") || !strings.Contains(out, "become ports") {
		t.Errorf("the cut should be step 1 and name its ports:\n%s", out)
	}
}

// --check verifies each step by AC analysis; refused steps are shown. With
// a loose bypass ratio (0.5) the portable's IF emitter capacitor C7 (47 nF,
// 7.6 Ω at 445 kHz) counts as a bypass of only 24.9 Ω (1/gm ∥ R6); the check
// finds the IF gain moves by more than 0.5 dB and refuses the step, and the
// reduction goes on without it.
func TestReduceCheck(t *testing.T) {
	code, out, errs := cliRun(t, "reduce", "--check", "--level", "ideal", "--ratio", "0.5", filepath.Join(root, "examples/transistor-front-end.toml"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if !strings.Contains(out, "bypass ") || !strings.Contains(out, "C7 (") || !strings.Contains(out, "[refused: ") || !strings.Contains(out, "1 refused\n") {
		t.Errorf("the loose bypass of C7 changes the IF gain and should be refused:\n%s", out)
	}
}

// A focused netlist declares where the signal enters and leaves, so it can
// be verified and swept on its own: focusing on the audio preamplifier V3
// cuts at V1's anode, whose port becomes the input; the output stays.
func TestReduceFocusWritesEnds(t *testing.T) {
	out := filepath.Join(t.TempDir(), "f.toml")
	code, _, errs := cliRun(t, "reduce", "--focus", "V3", "-o", out, filepath.Join(root, "examples/if-detector-audio.toml"))
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errs)
	}
	c, err := graph.LoadFile(out)
	if err != nil {
		t.Fatalf("the focused netlist does not load: %v", err)
	}
	if strings.Join(c.Inputs, ",") != "if_a" || strings.Join(c.Outputs, ",") != "audio_out" {
		t.Errorf("inputs %v, outputs %v; want [if_a] (from V1 anode) and [audio_out]", c.Inputs, c.Outputs)
	}
	code, vout, verrs := cliRun(t, "verify", out)
	if code != exitOK || !strings.Contains(vout, "V(audio_out)/V(if_a)") || !strings.Contains(vout, "ok: all") {
		t.Errorf("verify of the focused netlist: exit %d\n%s\n%s", code, vout, verrs)
	}
	code, sout, serrs := cliRun(t, "sweep", out)
	if code != exitOK || !strings.Contains(sout, "V(audio_out)/V(if_a)") {
		t.Errorf("sweep of the focused netlist: exit %d\n%s\n%s", code, sout, serrs)
	}
}
