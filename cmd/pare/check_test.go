package main

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// root is the repository root seen from cmd/pare.
const root = "../.."

// cliRun runs pare in-process and returns the exit code and both streams.
func cliRun(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String(), errb.String()
}

func cliGlob(t *testing.T, pattern string) []string {
	t.Helper()
	files, err := filepath.Glob(filepath.Join(root, pattern))
	if err != nil || len(files) == 0 {
		t.Fatalf("no files for %s (%v)", pattern, err)
	}
	return files
}

// TestCheckExamples: the three examples load and have no warnings (exit 0,
// one summary line each, nothing on stderr).
func TestCheckExamples(t *testing.T) {
	files := cliGlob(t, "examples/*.toml")
	code, out, errs := cliRun(t, append([]string{"check", "--strict"}, files...)...)
	if code != exitOK || errs != "" {
		t.Fatalf("pare check --strict examples: exit %d\nstdout:\n%s\nstderr:\n%s", code, out, errs)
	}
	for _, f := range files {
		if !strings.Contains(out, f+": ") || !strings.Contains(out, ", 0 warnings") {
			t.Errorf("no clean summary line for %s in:\n%s", f, out)
		}
	}
	if n := strings.Count(out, "\n"); n != len(files) {
		t.Errorf("%d output lines for %d files:\n%s", n, len(files), out)
	}
}

var posLine = regexp.MustCompile(`^\S+\.toml:\d+:\d+: \S`)

// TestCheckBadFiles: every bad file exits 2 and stderr carries exactly the
// positioned messages of its golden .err (the graph package's golden suite),
// with the path as it was given on the command line.
func TestCheckBadFiles(t *testing.T) {
	for _, path := range cliGlob(t, "testdata/bad/*.toml") {
		name := strings.TrimSuffix(filepath.Base(path), ".toml")
		t.Run(name, func(t *testing.T) {
			code, out, errs := cliRun(t, "check", path)
			if code != exitBad {
				t.Fatalf("exit %d, want %d\nstdout:\n%s\nstderr:\n%s", code, exitBad, out, errs)
			}
			golden, err := os.ReadFile(strings.TrimSuffix(path, ".toml") + ".err")
			if err != nil {
				t.Fatal(err)
			}
			// The golden files name the path relative to the repository root.
			want := strings.ReplaceAll(string(golden), "testdata/bad/", filepath.ToSlash(filepath.Join(root, "testdata", "bad"))+"/")
			lines := strings.Split(strings.TrimSuffix(errs, "\n"), "\n")
			if len(lines) < 2 {
				t.Fatalf("stderr too short:\n%s", errs)
			}
			for _, l := range lines[:len(lines)-1] {
				if !posLine.MatchString(l) {
					t.Errorf("not a file:line:col message: %q", l)
				}
			}
			if got := strings.Join(lines[:len(lines)-1], "\n") + "\n"; got != want {
				t.Errorf("stderr messages differ from the golden file\n--- got\n%s--- want\n%s", got, want)
			}
			if last := lines[len(lines)-1]; !strings.HasSuffix(last, "error(s)") {
				t.Errorf("last line %q should count the errors", last)
			}
		})
	}
}

// TestCheckStrict: a warning fixture exits 0 normally and 1 with --strict,
// and its warnings are printed as file:line:col: warning: ...
func TestCheckStrict(t *testing.T) {
	path := filepath.Join(root, "testdata", "warn", "one-connection.toml")
	code, out, _ := cliRun(t, "check", path)
	if code != exitOK {
		t.Errorf("check without --strict: exit %d, want 0", code)
	}
	if !regexp.MustCompile(`(?m)^\S+one-connection\.toml:11:26: warning: net pg1 has only one connection`).MatchString(out) {
		t.Errorf("warning line missing:\n%s", out)
	}
	if code, _, _ := cliRun(t, "check", "--strict", path); code != exitFound {
		t.Errorf("check --strict: exit %d, want %d", code, exitFound)
	}
	// Flags may follow the file names.
	if code, _, _ := cliRun(t, "check", path, "--strict"); code != exitFound {
		t.Errorf("check FILE --strict: exit %d, want %d", code, exitFound)
	}
	code, out, _ = cliRun(t, "check", "--quiet", path)
	if code != exitOK || strings.Contains(out, "warning:") || !strings.Contains(out, "1 warnings") {
		t.Errorf("check --quiet: exit %d, output:\n%s", code, out)
	}
}

// TestCheckMixed: a good file and a bad one: the bad one decides the exit
// code, and the good one is still checked and summarised.
func TestCheckMixed(t *testing.T) {
	good := filepath.Join(root, "examples", "frequency-changer.toml")
	bad := filepath.Join(root, "testdata", "bad", "malformed-value.toml")
	code, out, errs := cliRun(t, "check", bad, good)
	if code != exitBad || !strings.Contains(out, good+": ") || !strings.Contains(errs, bad+":6:12: ") {
		t.Errorf("exit %d\nstdout:\n%s\nstderr:\n%s", code, out, errs)
	}
}

func TestCheckUsage(t *testing.T) {
	if code, _, errs := cliRun(t, "check"); code != exitBad || !strings.Contains(errs, "no files") {
		t.Errorf("check with no files: exit %d, stderr %q", code, errs)
	}
	code, _, errs := cliRun(t, "check", filepath.Join(t.TempDir(), "missing.toml"))
	if code != exitBad || !strings.Contains(errs, "missing.toml") {
		t.Errorf("check of a missing file: exit %d, stderr %q", code, errs)
	}
	if code, _, errs := cliRun(t, "check", "--no-such-flag", "x.toml"); code != exitBad || !strings.Contains(errs, "usage: pare check") {
		t.Errorf("unknown flag: exit %d, stderr %q", code, errs)
	}
}

func TestVersion(t *testing.T) {
	code, out, _ := cliRun(t, "--version")
	if code != exitOK || !regexp.MustCompile(`^pare \d+\.\d+\.\d+\n$`).MatchString(out) {
		t.Errorf("--version: exit %d, %q", code, out)
	}
}

// TestUnknownCommand: exit 2, a suggestion when the name is a prefix of a
// command, and a pointer to the command list always.
func TestUnknownCommand(t *testing.T) {
	code, _, errs := cliRun(t, "chec", "x")
	if code != exitBad || !strings.Contains(errs, `unknown command "chec"`) || !strings.Contains(errs, `did you mean "check"?`) {
		t.Errorf("pare chec: exit %d, stderr %q", code, errs)
	}
	code, _, errs = cliRun(t, "frobnicate")
	if code != exitBad || !strings.Contains(errs, "pare help") {
		t.Errorf("pare frobnicate: exit %d, stderr %q", code, errs)
	}
	if code, _, errs := cliRun(t); code != exitBad || !strings.Contains(errs, "usage:") {
		t.Errorf("pare with no arguments: exit %d, stderr %q", code, errs)
	}
}

// TestCheckStrictOscillator: a circuit whose device oscillates by its loop
// is its own signal source, so the missing input is a note that --strict
// does not count (the review's Colpitts VFO, +27.92 dB at 5.858 MHz by
// ngspice .ac on testdata/good/review-osc/c1-vfo-loop.cir); an amplifier
// with no input (no-signal-ends) and an oscillator that does not start
// (R7 120 Ω, −2.05 dB by c3-phaseshift-loop.cir) still fail it.
func TestCheckStrictOscillator(t *testing.T) {
	for _, tc := range []struct {
		file string
		code int
		line string
	}{
		{"testdata/good/review-osc-c1-vfo.toml", exitOK, "note: no signal input declared, and none needed: Q1 oscillates by its loop (0° of loop phase at 5.858 MHz"},
		{"testdata/good/review-osc-c3-phaseshift-below.toml", exitFound, "warning: no signal input declared"},
		{"testdata/warn/no-signal-ends.toml", exitFound, "warning: no signal input declared"},
	} {
		code, out, _ := cliRun(t, "check", "--strict", filepath.Join(root, tc.file))
		if code != tc.code || !strings.Contains(out, tc.line) {
			t.Errorf("%s: exit %d (want %d), output:\n%s", tc.file, code, tc.code, out)
		}
	}
}

// TestCheckUndriven: a primary that nothing brings in warns at its first
// terminal (file:line:col) and check --strict exits 1; the same primary on a
// two-pin inlet part (review22 a04) or on two ports (a04-two-ports) is held
// as an undriven source and check is clean.
func TestCheckUndriven(t *testing.T) {
	cases := []struct {
		file string
		code int
		want string
	}{
		{"cmd/pare/testdata/check/floating-primary.toml", exitFound, "floating-primary.toml:12:26: warning: net(s) mains_l, mains_n have no path to ground"},
		{"testdata/review22/a04.toml", exitOK, ", 0 warnings"},
		{"testdata/review22/a04-two-ports.toml", exitOK, ", 0 warnings"},
	}
	for _, tc := range cases {
		code, out, _ := cliRun(t, "check", "--strict", filepath.Join(root, tc.file))
		if code != tc.code || !strings.Contains(out, tc.want) {
			t.Errorf("%s: exit %d, want %d with %q in:\n%s", tc.file, code, tc.code, tc.want, out)
		}
	}
}
