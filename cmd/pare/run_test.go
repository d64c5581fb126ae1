package main

import (
	"bytes"
	"errors"
	"flag"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"testing"

	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/graph/ac"
	"pare/graph/safety"
	"pare/internal/testmain"
)

// examples lists the bundled example netlists; the main job must handle
// every one of them.
func examples(t *testing.T) []string {
	t.Helper()
	files, err := filepath.Glob("../../examples/*.toml")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) == 0 {
		t.Fatal("no examples found under examples/")
	}
	return files
}

// runJob runs pare in-process and returns the exit code and both streams.
func runJob(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String(), errb.String()
}

var resultFiles = []string{fileReducedNetlist, fileReducedSheet, fileFadedSheet, fileNote, fileNoteHTML}

// packFiles are the files a main job's pack must hold: resultFiles, with a
// view the job cut onto pages (a whole set's, under --page auto) as its
// numbered pages instead of its one sheet, which must then hold at least one.
func packFiles(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	for _, f := range resultFiles {
		if _, err := os.Stat(filepath.Join(dir, f)); err == nil || (f != fileReducedSheet && f != fileFadedSheet) {
			out = append(out, f)
			continue
		}
		pages, _ := filepath.Glob(filepath.Join(dir, strings.TrimSuffix(f, ".svg")+"-*.svg"))
		if len(pages) == 0 {
			out = append(out, f) // neither: the caller's check names the missing sheet
		}
		for _, p := range pages {
			out = append(out, filepath.Base(p))
		}
	}
	return out
}

// jobRun is one run of the main job on an example, kept for every test that
// only reads its results: the job verifies every step by AC analysis, and
// running it once per example keeps the package's tests quick.
type jobRun struct {
	dir            string
	code           int
	stdout, stderr string
}

// jobCache holds the runs; jobRoot is the folder they are written into,
// removed by TestMain.
var (
	jobCache memo[string, *jobRun]
	jobRoot  struct {
		once sync.Once
		dir  string
		err  error
	}
)

// cachedJob runs the main job on ex once per test binary. Tests running in
// parallel wait only for the example they ask for.
func cachedJob(t *testing.T, ex string) *jobRun {
	t.Helper()
	jobRoot.once.Do(func() { jobRoot.dir, jobRoot.err = os.MkdirTemp("", "pare-run-test-") })
	if jobRoot.err != nil {
		t.Fatal(jobRoot.err)
	}
	r, _ := jobCache.get(ex, func() (*jobRun, error) {
		r := &jobRun{dir: filepath.Join(jobRoot.dir, strings.TrimSuffix(filepath.Base(ex), ".toml")+".pare")}
		r.code, r.stdout, r.stderr = runJob(t, ex, "-o", r.dir)
		return r, nil
	})
	return r
}

// moreParallelSlots lets two more parallel tests run than there are cores,
// unless -parallel is given: the kill test, the browser and the print
// tests spend most of their time waiting on child processes and syncs, and
// with one slot per core they would hold a core's share of the run idle.
// warmJobs runs the main job on every file not yet run, as many at a time
// as there are cores, for the tests that read the packs one after another.
func warmJobs(t *testing.T, files []string) {
	eachAtOnce(len(files), func(i int) { cachedJob(t, files[i]) })
}

func moreParallelSlots() {
	flag.Parse()
	set := false
	flag.Visit(func(f *flag.Flag) { set = set || f.Name == "test.parallel" })
	if !set {
		flag.Set("test.parallel", strconv.Itoa(runtime.GOMAXPROCS(0)+2))
	}
}

func TestMain(m *testing.M) {
	if args, ok := killChildArgs(); ok { // the kill test's child: one main job
		tuneCollector()
		os.Exit(run(args, os.Stdout, os.Stderr))
	}
	testmain.Collector()
	moreParallelSlots()
	code := m.Run()
	if jobRoot.dir != "" {
		os.RemoveAll(jobRoot.dir)
	}
	os.Exit(code)
}

func TestMainJobOnExamples(t *testing.T) {
	for _, ex := range examples(t) {
		name := strings.TrimSuffix(filepath.Base(ex), ".toml")
		t.Run(name, func(t *testing.T) {
			orig, err := os.ReadFile(ex)
			if err != nil {
				t.Fatal(err)
			}
			r := cachedJob(t, ex)
			dir, code, stdout, stderr := r.dir, r.code, r.stdout, r.stderr
			// The examples are meant to reduce and verify cleanly.
			if code != exitOK {
				t.Fatalf("exit %d, want 0\nstdout:\n%s\nstderr:\n%s", code, stdout, stderr)
			}
			for _, f := range packFiles(t, dir) {
				st, err := os.Stat(filepath.Join(dir, f))
				if err != nil || st.Size() == 0 {
					t.Errorf("%s missing or empty: %v", f, err)
				}
			}
			again, _ := os.ReadFile(ex)
			if !bytes.Equal(orig, again) {
				t.Error("the input netlist was modified")
			}

			full, err := graph.LoadFile(ex)
			if err != nil {
				t.Fatal(err)
			}
			reduced, err := graph.LoadFile(filepath.Join(dir, fileReducedNetlist))
			if err != nil {
				t.Fatalf("reduced.toml does not load back: %v", err)
			}
			// At level signal every example has bypass and decoupling
			// capacitors to take out (each example's comments name them), so the
			// reduced circuit must be smaller.
			if len(reduced.Parts) >= len(full.Parts) {
				t.Errorf("reduced has %d parts, original %d: nothing was reduced", len(reduced.Parts), len(full.Parts))
			}
			// The proof, redone independently of the job: the reduced
			// netlist read back from disk must still match the original.
			rep, err := ac.Compare(full, reduced, ac.CompareOptions{})
			if err != nil {
				t.Fatalf("comparing reduced.toml with the original: %v", err)
			}
			if !rep.OK {
				t.Errorf("reduced.toml does not match the original: %+v", rep.Pairs)
			}

			md := readString(t, filepath.Join(dir, fileNote))
			// The caution is the one graph/safety words for this set, with
			// what it was chosen from.
			caution := safety.For(full)
			for _, want := range append(caution.Lines, "> **"+caution.Heading+"**", caution.Basis()) {
				if !strings.Contains(md, want) {
					t.Errorf("notes.md lacks the caution line %q", want)
				}
			}
			for _, want := range []string{
				"small-signal only",
				"## Stages", "| stage | what | family | parts | figures | flags |",
				"## Reduction log", "## Verification", "**Verification passed**",
				"## Parts before → after",
				// The voltage chart carries the live-set caution (common practice).
				"## DC voltage chart", "taken with the set working", "| part | electrode | net | DC | meter reads |",
				"| original | " + strconv.Itoa(len(full.Parts)) + " | " + strconv.Itoa(len(full.Nets)) + " |",
				"| reduced | " + strconv.Itoa(len(reduced.Parts)) + " | " + strconv.Itoa(len(reduced.Nets)) + " |",
			} {
				if !strings.Contains(md, want) {
					t.Errorf("notes.md lacks %q", want)
				}
			}
			// Each of the netlist's signal paths is a verified pair, or, past
			// a detector, the note says plainly it was not compared at the IF
			// (the audio side is then compared from the detector).
			for _, in := range full.Inputs {
				for _, out := range full.Outputs {
					pair := "V(" + out + ")/V(" + in + ")"
					if !strings.Contains(md, "| `"+pair+"` | transfer |") && !strings.Contains(md, "- "+pair+" not compared over") {
						t.Errorf("verification table lacks the pair %s → %s and no note says why", in, out)
					}
				}
			}
			// One log line per step, each with the netlist position of a
			// part it touched (file:line).
			logLine := regexp.MustCompile("(?m)^[0-9]+\\. \\*\\*.* at `" + regexp.QuoteMeta(filepath.Base(ex)) + ":[0-9]+`")
			if n := len(logLine.FindAllString(md, -1)); n == 0 {
				t.Errorf("no log line with a %s:line position", filepath.Base(ex))
			}
			for _, f := range packFiles(t, dir) {
				if !strings.HasSuffix(f, ".svg") {
					continue
				}
				if !strings.Contains(md, "]("+f+")") {
					t.Errorf("notes.md does not embed %s", f)
				}
				svg := readString(t, filepath.Join(dir, f))
				if !strings.Contains(svg, `xmlns="http://www.w3.org/2000/svg"`) || !strings.Contains(svg, "</svg>") {
					t.Errorf("%s is not a complete SVG document", f)
				}
			}
			if !strings.Contains(stdout, "→") || !strings.Contains(stdout, "verification: ok") || !strings.Contains(stdout, "wrote ") {
				t.Errorf("summary incomplete:\n%s", stdout)
			}
		})
	}
}

// The frequency changer's tuned circuits, as the stage table of the note
// reports them, must agree with f = 1/(2π√(LC)) (docs/references.md §1)
// worked by hand from the netlist's values: the RF tank is T1's 260 µH
// secondary across gang section VC1a (12–365 pF) plus its 23.6 pF trimmer;
// the Hartley oscillator is L1 (126 µH) across VC1b (12–365 pF) plus its
// 36.3 pF trimmer, in series with the 390 pF padder. That the oscillator
// then runs 470 kHz above the band at both ends (LO = RF + IF, §2: 1000
// and 2070 kHz) is checked on the solver's range in circuit, which the
// example was designed on (its header).
func TestMainJobTuningRange(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	if _, err := os.Stat(ex); err != nil {
		t.Fatal(err)
	}
	r := cachedJob(t, ex)
	if r.code != exitOK {
		t.Fatalf("exit %d: %s", r.code, r.stderr)
	}
	md := readString(t, filepath.Join(r.dir, fileNote))
	series := func(a, b float64) float64 { return a * b / (a + b) }
	tests := []struct {
		topology   string  // the stage table row, by its pattern id prefix
		l          float64 // henries
		cMin, cMax float64 // farads across the coil at the gang's ends
	}{
		{"tuned-winding", 260e-6, 12e-12 + 23.6e-12, 365e-12 + 23.6e-12},
		{"hartley-", 126e-6, series(12e-12+36.3e-12, 390e-12), series(365e-12+36.3e-12, 390e-12)},
	}
	inCircuit := regexp.MustCompile(`\*\* f ([0-9.]+) (k|M)Hz–([0-9.]+) (k|M)Hz in circuit`)
	// The stage's f is the solver's in circuit; the formula's, checked
	// here, is in the note's cross-check line for the stage's f.
	figs := regexp.MustCompile(`\*\* f [^;]+; formula f = 1/\(2π√\(LC\)\) gives ([0-9.]+) (k|M)Hz–([0-9.]+) (k|M)Hz`)
	for _, tt := range tests {
		row, name := "", ""
		for _, l := range strings.Split(md, "\n") {
			if strings.Contains(l, "(`"+tt.topology) {
				name = strings.TrimSpace(strings.Split(l, "|")[1])
				break
			}
		}
		for _, l := range strings.Split(md, "\n") {
			if name != "" && strings.HasPrefix(l, "- **"+name+"** f ") {
				row = l
				break
			}
		}
		if row == "" {
			t.Errorf("no stage %s… with a cross-checked f in the note", tt.topology)
			continue
		}
		m := figs.FindStringSubmatch(row)
		if m == nil {
			t.Errorf("stage %s has no tuning range (f min–max) figure: %s", tt.topology, row)
			continue
		}
		if c := inCircuit.FindStringSubmatch(row); tt.topology == "hartley-" && c != nil {
			if lo, hi := parseHz(t, c[1], c[2]), parseHz(t, c[3], c[4]); lo > 1000e3 || hi < 2070e3 {
				t.Errorf("the oscillator runs %g–%g Hz in circuit, not over 1000–2070 kHz: the example misses its band", lo, hi)
			}
		} else if tt.topology == "hartley-" {
			t.Errorf("no in-circuit range for the oscillator: %s", row)
		}
		fmin, fmax := parseHz(t, m[1], m[2]), parseHz(t, m[3], m[4])
		wantMin, wantMax := lc(tt.l, tt.cMax), lc(tt.l, tt.cMin)
		// 0.5 %: a note prints four digits (figure.Text); the stage figures leave out
		// nothing the hand formula includes.
		if !near(fmin, wantMin, 0.005) || !near(fmax, wantMax, 0.005) {
			t.Errorf("%s: tuning %g–%g Hz, want %g–%g Hz", tt.topology, fmin, fmax, wantMin, wantMax)
		}
	}
}

// The stage table of each note must carry the figures a handbook gives for
// the example's values.
func TestMainJobStageFigures(t *testing.T) {
	tests := []struct {
		example, topology, label string
		want, tol                float64
		source                   string
	}{
		{"if-detector-audio", "amp-common-bypassed", "gain", -61.5385, 0.002,
			"docs/references.md §5: −µRL/(ra+RL) with µ 100, ra 62.5 kΩ, RL 100 kΩ (R9)"},
		{"if-detector-audio", "rc-coupling", "f c", 33.8628, 0.002,
			"docs/references.md §4: fc = 1/(2πRC), C10 10 nF into R7 470 kΩ"},
		{"if-detector-audio", "rc-coupling", "tau", 4.7e-3, 0.002,
			"docs/references.md §4: τ = RC = 10 nF × 470 kΩ"},
		{"if-detector-audio", "amp-common-bypassed", "bypass tau", 0.077628, 0.002,
			"derived from τ = RC with R = R8 1.5 kΩ ∥ (ra + RL)/(µ + 1) = 62.5 k + 100 k over 101 (the impedance into a cathode: textbook, from memory) = 776.3 Ω, C13 100 µF"},
		// The double-tuned kc in the table is the loaded Qs' (solver);
		// its formula cross-check 1/√(110·100) is checked in rules/stages
		// (TestDoubleTunedOnLoadedQ).
	}
	for _, tt := range tests {
		t.Run(tt.example+"/"+tt.topology+"/"+tt.label, func(t *testing.T) {
			ex := "../../examples/" + tt.example + ".toml"
			if _, err := os.Stat(ex); err != nil {
				t.Fatal(err)
			}
			r := cachedJob(t, ex)
			if r.code != exitOK {
				t.Fatalf("exit %d: %s", r.code, r.stderr)
			}
			figs, ok := stageFigures(readString(t, filepath.Join(r.dir, fileNote)), tt.topology)
			if !ok {
				t.Fatalf("no stage %s in the note's table", tt.topology)
			}
			got, ok := figs[tt.label]
			if !ok {
				t.Fatalf("stage %s has no figure %q: %v", tt.topology, tt.label, figs)
			}
			if math.Abs(got-tt.want) > tt.tol*math.Abs(tt.want) {
				t.Errorf("%s %s = %g, want %g (%s)", tt.topology, tt.label, got, tt.want, tt.source)
			}
		})
	}
}

// stageFigures reads the figures cell of the first stage-table row whose
// topology is topology: "gain -61.5, f c 33.86 Hz" → {"gain": -61.5,
// "f c": 33.86}. Ranges ("f 1 MHz–2 MHz") are left out.
func stageFigures(md, topology string) (map[string]float64, bool) {
	item := regexp.MustCompile(`^(.+?) (-?[0-9.]+(?:e[-+]?[0-9]+)?)(?: ?([pnµumkMG]?)(?:Hz|s|Ω|F|H|V|A)?)?(?: at [0-9.]+ ?[kMG]?Hz)?$`)
	scale := map[string]float64{"": 1, "p": 1e-12, "n": 1e-9, "µ": 1e-6, "u": 1e-6, "m": 1e-3, "k": 1e3, "M": 1e6, "G": 1e9}
	for _, line := range strings.Split(md, "\n") {
		if !strings.Contains(line, "(`"+topology+"`)") {
			continue
		}
		cells := strings.Split(line, " | ")
		if len(cells) < 6 {
			return nil, false
		}
		out := map[string]float64{}
		for _, f := range strings.Split(cells[4], ", ") {
			m := item.FindStringSubmatch(f)
			if m == nil {
				continue
			}
			v, err := strconv.ParseFloat(m[2], 64)
			if err != nil {
				continue
			}
			out[m[1]] = v * scale[m[3]]
		}
		return out, true
	}
	return nil, false
}

// lc is the resonant frequency 1/(2π√(LC)).
func lc(l, c float64) float64 { return 1 / (2 * math.Pi * math.Sqrt(l*c)) }

func near(got, want, frac float64) bool { return got >= want*(1-frac) && got <= want*(1+frac) }

func parseHz(t *testing.T, n, prefix string) float64 {
	t.Helper()
	var v float64
	if _, err := fmt.Sscan(n, &v); err != nil {
		t.Fatalf("bad number %q", n)
	}
	switch prefix {
	case "k":
		v *= 1e3
	case "M":
		v *= 1e6
	}
	return v
}

func TestMainJobDeterministic(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	for _, ex := range examples(t) {
		t.Run(filepath.Base(ex), func(t *testing.T) {
			first := cachedJob(t, ex)
			if first.code == exitBad {
				t.Fatalf("first run: %s", first.stderr)
			}
			a, b := first.dir, filepath.Join(t.TempDir(), "b")
			if code, _, stderr := runJob(t, ex, "-o", b); code == exitBad {
				t.Fatalf("second run: %s", stderr)
			}
			if fa, fb := packFiles(t, a), packFiles(t, b); strings.Join(fa, " ") != strings.Join(fb, " ") {
				t.Errorf("two runs write %v and %v", fa, fb)
			}
			for _, f := range packFiles(t, a) {
				if !bytes.Equal(readBytes(t, filepath.Join(a, f)), readBytes(t, filepath.Join(b, f))) {
					t.Errorf("%s differs between two runs", f)
				}
			}
		})
	}
}

// Bad input: exit 2, every message positioned file:line:col, and no output
// directory at all.
func TestMainJobBadInput(t *testing.T) {
	bad, _ := filepath.Glob("../../testdata/bad/*.toml")
	own, _ := filepath.Glob("testdata/*.toml")
	bad = append(bad, own...)
	if len(bad) == 0 {
		t.Fatal("no bad-input fixtures")
	}
	for _, f := range bad {
		t.Run(filepath.Base(f), func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "out")
			code, stdout, stderr := runJob(t, f, "-o", dir)
			if code != exitBad {
				t.Fatalf("exit %d, want 2\nstdout: %s\nstderr: %s", code, stdout, stderr)
			}
			pos := regexp.MustCompile("(?m)^" + regexp.QuoteMeta(f) + ":[0-9]+:[0-9]+: ")
			if !pos.MatchString(stderr) {
				t.Errorf("stderr has no %s:line:col message:\n%s", f, stderr)
			}
			if _, err := os.Stat(dir); !errors.Is(err, os.ErrNotExist) {
				t.Errorf("output directory was created (%v)", err)
			}
		})
	}
}

func TestMainJobUsage(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	notDir := filepath.Join(t.TempDir(), "file")
	if err := os.WriteFile(notDir, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name string
		args []string
		want string
	}{
		{"no file", []string{"run"}, "give exactly one netlist file"},
		{"bad level", []string{ex, "--level", "max"}, "--level"},
		{"bad symbols", []string{ex, "--symbols", "din"}, "--symbols"},
		{"negative tolerance", []string{ex, "--tol-db", "-1"}, "--tol-db"},
		{"missing file", []string{"run", "nowhere.toml"}, "nowhere.toml"},
		{"output is a file", []string{ex, "-o", notDir}, "exists and is not a folder"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "out")
			args := tt.args
			if tt.name != "output is a file" {
				args = append(args, "-o", dir)
			}
			code, _, stderr := runJob(t, args...)
			if code != exitBad {
				t.Fatalf("exit %d, want 2 (%s)", code, stderr)
			}
			if !strings.Contains(stderr, tt.want) {
				t.Errorf("stderr %q lacks %q", stderr, tt.want)
			}
			if _, err := os.Stat(dir); !errors.Is(err, os.ErrNotExist) {
				t.Error("output directory was created")
			}
		})
	}
}

// The input is never overwritten, even when -o points at its own folder and
// it is called reduced.toml.
func TestMainJobKeepsInput(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	data, err := os.ReadFile(ex)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	in := filepath.Join(dir, fileReducedNetlist)
	if err := os.WriteFile(in, data, 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr := runJob(t, in, "-o", dir)
	if code != exitBad || !strings.Contains(stderr, "is the input: writing there would overwrite it") {
		t.Errorf("exit %d, stderr %q: want 2 and a refusal", code, stderr)
	}
	if !bytes.Equal(readBytes(t, in), data) {
		t.Error("input changed")
	}
}

func TestMainJobDefaultDirAndNoVerify(t *testing.T) {
	ex := "../../examples/frequency-changer.toml"
	data, err := os.ReadFile(ex)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	in := filepath.Join(dir, "set.toml")
	if err := os.WriteFile(in, data, 0o644); err != nil {
		t.Fatal(err)
	}
	code, stdout, stderr := runJob(t, in, "--no-verify")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	md := readString(t, filepath.Join(dir, "set.pare", fileNote))
	if !strings.Contains(md, "**Verification was not run** (--no-verify)") {
		t.Error("note does not say the verification was skipped")
	}
	if !strings.Contains(stdout, "verification: not run") {
		t.Errorf("summary does not say the verification was skipped:\n%s", stdout)
	}
}

// A circuit the AC comparison cannot solve: its grid net touches nothing but
// the grid, so nodal analysis has an all-zero row for it (a floating node
// makes the admittance matrix singular; textbook nodal analysis, from
// memory). The job must still write everything, say so, and exit 1.
func TestMainJobVerificationFails(t *testing.T) {
	in := filepath.Join("testdata", "unverifiable", "floating-grid.toml")
	dir := filepath.Join(t.TempDir(), "out")
	code, stdout, stderr := runJob(t, in, "-o", dir)
	if code != exitFound {
		t.Fatalf("exit %d, want 1\nstdout: %s\nstderr: %s", code, stdout, stderr)
	}
	for _, f := range resultFiles {
		if _, err := os.Stat(filepath.Join(dir, f)); err != nil {
			t.Errorf("%s not written: %v", f, err)
		}
	}
	md := readString(t, filepath.Join(dir, fileNote))
	if !strings.Contains(md, "**Verification FAILED**") || !strings.Contains(md, "gx") {
		t.Errorf("note does not say the verification failed, or not why:\n%s", md)
	}
	if !strings.Contains(stdout, "verification: FAILED") {
		t.Errorf("summary does not say the verification failed:\n%s", stdout)
	}
}

// A write that fails part-way leaves no new directory behind, and an
// existing one exactly as it was (red-team item 3: a folder was left half
// old, half new).
func TestWriteResultsAllOrNothing(t *testing.T) {
	fresh := filepath.Join(t.TempDir(), "new")
	_, err := writeResults(fresh, "", []outFile{{"a.txt", []byte("a")}, {"sub/b.txt", []byte("b")}})
	if err == nil {
		t.Fatal("want an error for a file name with a folder in it")
	}
	if _, err := os.Stat(fresh); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("the new directory was left behind (%v)", err)
	}
	old := filepath.Join(t.TempDir(), "old")
	if _, err := writeResults(old, "", []outFile{{"x", []byte("1")}, {"y", []byte("2")}}); err != nil {
		t.Fatal(err)
	}
	if _, err := writeResults(old, "", []outFile{{"x", []byte("3")}, {"y/z", []byte("4")}}); err == nil {
		t.Fatal("want an error")
	}
	if got := readString(t, filepath.Join(old, "x")); got != "1" {
		t.Errorf("existing folder changed: x = %q", got)
	}
	names, err := writeResults(old, "", []outFile{{"x", []byte("5")}, {"y", []byte("6")}})
	if err != nil || strings.Join(names, " ") != "x y" || readString(t, filepath.Join(old, "y")) != "6" {
		t.Errorf("got %v, %v", names, err)
	}
}

func TestDefaultOutDir(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"examples/frequency-changer.toml", "examples/frequency-changer.pare"},
		{"set", "set.pare"},
		{"a.b.toml", "a.b.pare"},
	} {
		if got := defaultOutDir(c.in); got != c.want {
			t.Errorf("defaultOutDir(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// The summary names the pair nearest its tolerance, measured against each
// tolerance separately: 4° of 5° is worse than 0.3 dB of 0.5 dB.
func TestVerifySummaryWorst(t *testing.T) {
	v := note.Verify{OK: true, TolDB: 0.5, TolDeg: 5, Pairs: []note.Pair{
		{From: "a", To: "b", What: "transfer", MaxDB: 0.3, MaxDeg: 1, AtHz: 1e3},
		{From: "a", What: "impedance", MaxDB: 0.1, MaxDeg: 4, AtHz: 2e6},
	}}
	got := verifySummary(v)
	if want := "verification: ok, worst 0.1 dB / 4° (Z(a) at 2 MHz); tolerance 0.5 dB / 5°"; got != want {
		t.Errorf("got  %q\nwant %q", got, want)
	}
	v.OK = false
	if got := verifySummary(v); !strings.HasPrefix(got, "verification: FAILED") {
		t.Errorf("failed verification summarised as %q", got)
	}
	// A pair the reduced circuit could not be solved for is always the worst.
	v.Pairs = append(v.Pairs, note.Pair{From: "b", To: "c", What: "transfer", Error: "singular matrix"})
	if got, want := verifySummary(v), "verification: FAILED, V(c)/V(b) could not be solved: singular matrix; tolerance 0.5 dB / 5°"; got != want {
		t.Errorf("got  %q\nwant %q", got, want)
	}
}

func readBytes(t *testing.T, p string) []byte {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func readString(t *testing.T, p string) string { return string(readBytes(t, p)) }

// BenchmarkMainJob times the whole job in memory (reduce with a per-step AC
// check, compare, recognise, draw two sheets, write the note) per example,
// with the job's defaults (the flagship's sheets cut onto pages), the
// whole set club-receiver among them.
func BenchmarkMainJob(b *testing.B) {
	files, _ := filepath.Glob("../../examples/*.toml")
	if len(files) == 0 {
		b.Skip("no examples")
	}
	cfg, err := configure(&runOpts{level: "signal", symbols: "iec", page: autoPage})
	if err != nil {
		b.Fatal(err)
	}
	for _, ex := range files {
		b.Run(strings.TrimSuffix(filepath.Base(ex), ".toml"), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				pr, err := pipeline.Run(jobOptions(ex, cfg))
				if err != nil {
					b.Fatal(err)
				}
				if _, err := mainJobOn(pr, cfg); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
