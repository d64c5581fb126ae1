package align_test

import (
	"bytes"
	"math"
	"math/cmplx"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync"
	"testing"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/graph/ac"
	"pare/graph/value"
	"pare/internal/reftool"
	"pare/rules"
	"pare/rules/stages"
)

var superhets = []string{"frequency-changer", "if-detector-audio", "transistor-front-end"}

// fmRatio is an invented FM IF stage and ratio detector (testdata).
var fmRatio = filepath.Join("testdata", "fm-ratio.toml")

// cases are every circuit the guide is checked on.
func cases() []string {
	var out []string
	for _, n := range superhets {
		out = append(out, example(n))
	}
	return append(out, fmRatio)
}

func build(t *testing.T, path string) (*pipeline.Result, *align.Guide) {
	t.Helper()
	// The main job's path: every step proven against the one before it.
	return buildWith(t, path, pipeline.AgainstPrevious)
}

// buildWith runs the pipeline with the given step check: a refused step
// leaves a different reduced circuit and stage order, and the guide must
// read the same wiring either way. The pipeline runs once per file and
// step check in the test binary (most tests read the same few sets, the
// club receiver's run alone some seconds of CPU); the guide is built anew
// each call, since a test may add to it (AddBands).
func buildWith(t *testing.T, path string, check pipeline.StepCheck) (*pipeline.Result, *align.Guide) {
	t.Helper()
	r, err := runs.get(runKey{path, check})
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return r, align.Build(r.Title, r.Circuit, r.Stages, r.Caution)
}

type runKey struct {
	path  string
	check pipeline.StepCheck
}

// runs are the pipeline's results the tests share; they only read them.
var runs runMemo

type runMemo struct {
	sync.Mutex
	m map[runKey]*runEntry
}

type runEntry struct {
	once sync.Once
	r    *pipeline.Result
	err  error
}

// get is k's result, run on first use; callers of one key wait for the
// first, callers of others go ahead.
func (c *runMemo) get(k runKey) (*pipeline.Result, error) {
	c.Lock()
	if c.m == nil {
		c.m = map[runKey]*runEntry{}
	}
	e, ok := c.m[k]
	if !ok {
		e = &runEntry{}
		c.m[k] = e
	}
	c.Unlock()
	e.once.Do(func() {
		e.r, e.err = pipeline.Run(pipeline.Options{Path: k.path, Until: pipeline.PhaseStages, Level: rules.LevelSignal, StepCheck: k.check})
	})
	return e.r, e.err
}

func example(name string) string { return filepath.Join("..", "..", "..", "examples", name+".toml") }

// TestFrequenciesArePareFigures (docs/references.md §19): every frequency the procedure quotes is
// one of the stage figures it names, bit for bit (pare's own tracking and
// IF figures; LO = RF + IF, docs/references.md §2), and every part it
// names is in the circuit.
func TestFrequenciesArePareFigures(t *testing.T) {
	for _, name := range cases() {
		t.Run(filepath.Base(name), func(t *testing.T) {
			r, g := build(t, name)
			if len(g.Steps) == 0 {
				t.Fatalf("no steps: %s", g.Nothing)
			}
			mix := mixerOf(r.Stages)
			wantIF := r.Circuit.Freqs["if"]
			var points []float64
			if mix != nil {
				f, _ := mix.Figures.Get("if")
				wantIF = f.Value
				fit, _ := mix.Figures.Get("track_fit")
				sug, _ := mix.Figures.Get("track_f")
				points = append(slices.Clone(fit.Points), sug.Points...)
				osc, _ := mix.Figures.Get("osc_f")
				sig, _ := mix.Figures.Get("sig_f")
				if len(g.Ends) != 2 || g.Ends[0].Sig != sig.Range.Min || g.Ends[1].Osc != osc.Range.Max {
					t.Errorf("dial ends %+v, want the ranges %v and %v", g.Ends, sig.Range, osc.Range)
				}
			}
			if g.IF != wantIF {
				t.Errorf("IF %g, want the figure's %g", g.IF, wantIF)
			}
			for _, s := range g.Steps {
				if r.Circuit.Part(s.Part) == nil {
					t.Errorf("step %d names %s, which is not in the circuit", s.N, s.Part)
				}
				switch {
				case s.Phase == "IF" && s.Freq != wantIF:
					t.Errorf("step %d at %g, want the IF %g", s.N, s.Freq, wantIF)
				case s.Phase != "IF" && (!slices.Contains(points, s.Dial) || s.Osc != s.Dial+wantIF):
					t.Errorf("step %d dial %g osc %g: not a tracking point of %v plus the IF", s.N, s.Dial, s.Osc, points)
				}
			}
		})
	}
}

// TestOrder: the IF cans are aligned from the detector back (T2 before T1
// on the IF strip, secondary before primary), the oscillator before the
// aerial, the trimmer at the high point before the core at the low one
// (common practice).
func TestOrder(t *testing.T) {
	_, g := build(t, example("if-detector-audio"))
	var got []string
	for _, s := range g.Steps {
		got = append(got, s.What)
	}
	want := []string{"core of T2's secondary (s)", "core of T2's primary (p)", "core of T1's secondary (s)", "core of T1's primary (p)"}
	if !slices.Equal(got, want) {
		t.Errorf("IF order %q, want %q", got, want)
	}
	_, g = build(t, example("frequency-changer"))
	var phases []string
	for _, s := range g.Steps {
		phases = append(phases, s.Phase+" "+s.Part)
	}
	want = []string{"IF T2", "IF T2", "oscillator TC2", "oscillator L1", "aerial/RF TC1"}
	if !slices.Equal(phases, want) {
		t.Errorf("steps %q, want %q", phases, want)
	}
}

// TestFMRatioDetector: an FM strip is aligned at its 10.7 MHz IF (the
// netlist's [freqs] if; 10.7 MHz is the FM broadcast IF, common practice):
// the detector's primary and the IF can peaked for the largest DC, the
// detector's secondary last, for zero at its audio output (common practice).
func TestFMRatioDetector(t *testing.T) {
	_, g := build(t, fmRatio)
	if !g.FM || g.IF != 10.7e6 {
		t.Fatalf("FM %v, IF %g: want FM at 10.7 MHz", g.FM, g.IF)
	}
	var got []string
	for _, s := range g.Steps {
		got = append(got, s.What)
	}
	want := []string{"core of T2's primary (p)", "core of T1", "core of T2's secondary (s)"}
	if !slices.Equal(got, want) {
		t.Errorf("steps %q, want %q", got, want)
	}
	if last := g.Steps[len(g.Steps)-1]; !strings.Contains(last.Watch, "zero") || !strings.Contains(last.Watch, "(ct)") {
		t.Errorf("last step watches %q, want zero DC at the centre tap ct", last.Watch)
	}
}

// TestNothingToAlign: an audio stage has no trimmer and no core: the
// guide says so, with the reason, and names no part.
func TestNothingToAlign(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "audio.toml")
	src := `title = "audio stage"
band = "20..20k"
inputs = ["g"]
outputs = ["out"]
[nets]
gnd = { role = "ground" }
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "k" }, gm = "1.6mA/V", mu = 100, ra = "62k5" }
R1 = { r = "1M", pins = ["g", "gnd"] }
R2 = { r = "1k5", pins = ["k", "gnd"] }
R3 = { r = "100k", pins = ["ht", "a"] }
C1 = { c = "22n", pins = ["a", "out"] }
R4 = { r = "470k", pins = ["out", "gnd"] }
`
	if err := os.WriteFile(path, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	_, g := build(t, path)
	if len(g.Steps) != 0 || !strings.HasPrefix(g.Nothing, "nothing to align: no trimmer capacitor and no adjustable core") {
		t.Errorf("steps %v, nothing %q", g.Steps, g.Nothing)
	}
	var b bytes.Buffer
	if err := align.WriteText(&b, g); err != nil || !strings.Contains(b.String(), "Nothing to align") {
		t.Errorf("text %q, %v", b.String(), err)
	}
}

// TestInjectionGivesReference: each row's level, fed back into the AC
// solver on the whole circuit (through ac.Transfer, the sweep's entry point,
// not the response the table was solved with), gives the stated reference
// within 0.5 dB (the tolerance).
func TestInjectionGivesReference(t *testing.T) {
	for _, name := range cases() {
		r, g := build(t, name)
		if len(g.Inject) < 2 {
			t.Fatalf("%s: %d rows (%s)", name, len(g.Inject), g.InjectErr)
		}
		for _, in := range g.Inject {
			h, err := ac.Transfer(in.Circuit(r.Circuit), in.Net, in.RefNet, []float64{in.Freq}, in.Options())
			if err != nil {
				t.Fatal(err)
			}
			out := in.Level * cmplx.Abs(h[0])
			if d := 20 * math.Log10(out/in.RefLevel); math.Abs(d) > 0.5 {
				t.Errorf("%s %s: %g V gives %g V at %s, want %g V (%.3f dB off)", name, in.Net, in.Level, out, in.RefNet, in.RefLevel, d)
			}
			t.Logf("%s: %s %s %g Hz: %.4g V → %.4g V at %s; gain %.4g to %s", name, in.Band, in.Net, in.Freq, in.Level, out, in.RefNet, in.Gain, in.GainTo)
		}
	}
}

// TestGainsAgainstNgspice: each stage gain of the table, and each row's
// response to its reference, match ngspice's .ac on the deck pare writes for
// the same circuit, driven at the row's point, within 0.1 dB (ngspice,
// docs/references.md §15 for the recipe).
func TestGainsAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	for _, name := range cases() {
		r, g := build(t, name)
		for _, in := range g.Inject {
			v := spiceAt(t, bin, in.Circuit(r.Circuit), in)
			gain, ref := cmplx.Abs(v[0]), cmplx.Abs(v[1])
			if d := 20 * math.Log10(gain/in.Gain); math.Abs(d) > 0.1 {
				t.Errorf("%s %s→%s: gain %g, ngspice %g (%.3f dB)", name, in.Net, in.GainTo, in.Gain, gain, d)
			}
			if d := 20 * math.Log10(in.Level*ref/in.RefLevel); math.Abs(d) > 0.1 {
				t.Errorf("%s %s: ngspice gives %g V at %s, want %g V (%.3f dB)", name, in.Net, in.Level*ref, in.RefNet, in.RefLevel, d)
			}
			t.Logf("%s %s→%s at %g Hz: pare %.6g, ngspice %.6g", name, in.Net, in.GainTo, in.Freq, in.Gain, gain)
		}
	}
}

// spiceAt runs the deck for one row at its frequency and returns V(GainTo)
// and V(RefNet) for 1 V at the row's point.
func spiceAt(t *testing.T, bin string, c *graph.Circuit, in align.Injection) []complex128 {
	t.Helper()
	dir := t.TempDir()
	var deck bytes.Buffer
	o := ac.SpiceOptions{Options: in.Options(), Input: in.Net, Outputs: []string{in.GainTo, in.RefNet},
		Band: value.Range{Min: in.Freq, Max: in.Freq}, DataFile: "out.dat"}
	if err := ac.WriteSpice(&deck, c, o); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "-b", "deck.cir")
	cmd.Dir = dir
	out, err := cmd.CombinedOutput()
	if err != nil || strings.Contains(string(out), "Error") {
		t.Fatalf("ngspice: %v\n%s", err, out)
	}
	data, err := os.ReadFile(filepath.Join(dir, "out.dat"))
	if err != nil {
		t.Fatalf("ngspice wrote no data: %v\n%s", err, out)
	}
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	f := strings.Fields(lines[len(lines)-1])
	if len(f) != 5 {
		t.Fatalf("wrdata row %q", lines[len(lines)-1])
	}
	num := func(s string) float64 {
		x, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatal(err)
		}
		return x
	}
	return []complex128{cmplx.Rect(num(f[1]), num(f[2])), cmplx.Rect(num(f[3]), num(f[4]))}
}

// mixerOf is the stage with the IF figure, as the procedure reads it.
func mixerOf(sts []stages.Stage) *stages.Stage {
	for i := range sts {
		if _, ok := sts[i].Figures.Get("if"); ok {
			return &sts[i]
		}
	}
	return nil
}

// TestHints: the symptom table (common practice) is chosen by the kind of
// stage: a detuned IF only for stages tuned to the IF (not the aerial
// circuit S1 of the frequency changer), an open bypass for the bypassed
// triode, each fault once with every stage it applies to.
func TestHints(t *testing.T) {
	for _, tc := range []struct {
		name      string
		want, not map[string]string // fault → stages
	}{
		{"if-detector-audio",
			map[string]string{"detuned IF transformer (cores moved, a tuning capacitor gone low)": "S1, S2", "open cathode or emitter bypass": "S8", "leaky coupling capacitor": "S7, S9"},
			nil},
		{"frequency-changer",
			map[string]string{"dead oscillator": "S2", "detuned IF transformer (cores moved, a tuning capacitor gone low)": "S2.2"},
			map[string]string{"open cathode or emitter bypass": ""}},
	} {
		_, g := build(t, example(tc.name))
		got := map[string]string{}
		for _, h := range g.Hints {
			if _, dup := got[h.Fault]; dup {
				t.Errorf("%s: %q twice", tc.name, h.Fault)
			}
			got[h.Fault] = strings.Join(h.Stages, ", ")
		}
		for f, st := range tc.want {
			if got[f] != st {
				t.Errorf("%s: %q on %q, want %q", tc.name, f, got[f], st)
			}
		}
		for f := range tc.not {
			if _, ok := got[f]; ok {
				t.Errorf("%s: %q does not apply", tc.name, f)
			}
		}
	}
}

// TestSpeakerReference: where the circuit has a loudspeaker the audio rows
// give 50 mW into it (the customary standard output, common practice):
// V = √(P·R) across its rated impedance (derived from P = V²/R).
func TestSpeakerReference(t *testing.T) {
	r, g := build(t, filepath.Join("..", "..", "..", "rules", "stages", "testdata", "output-single-ended.toml"))
	var spk *graph.Part
	for _, p := range r.Circuit.Parts {
		if p.Kind == graph.Loudspeaker {
			spk = p
		}
	}
	if spk == nil || len(g.Inject) == 0 {
		t.Fatalf("no loudspeaker or no rows (%s)", g.InjectErr)
	}
	in := g.Inject[0]
	if want := math.Sqrt(0.05 * spk.Value.Max); in.RefLevel != want || !strings.Contains(in.RefWhat, "50 mW") {
		t.Errorf("reference %g V (%s), want %g V", in.RefLevel, in.RefWhat, want)
	}
	h, err := ac.Transfer(r.Circuit, in.Net, in.RefNet, []float64{in.Freq}, in.Options())
	if err != nil {
		t.Fatal(err)
	}
	if p := math.Pow(in.Level*cmplx.Abs(h[0]), 2) / spk.Value.Max; math.Abs(10*math.Log10(p/0.05)) > 0.5 {
		t.Errorf("%g V at %s gives %g W in %s, want 50 mW", in.Level, in.Net, p, spk.Ref)
	}
}

// TestHintsLoopCapacitor: a capacitor in an oscillator's loop (the review
// VFO's DC block C2 and feedback arm C3, which open stop it; a Colpitts
// oscillator's feedback is its capacitive divider, handbook, from memory)
// gets an oscillator's fault (the Colpitts stage's dead oscillator, or the
// oscillator-loop fault when no pattern names the oscillator), never the
// coupling capacitor's "the next base is pulled off its bias"; the
// buffer's coupling capacitors keep that one.
func TestHintsLoopCapacitor(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "good", "review-osc-c1-vfo.toml"))
	for _, p := range []string{"C2", "C3"} {
		oscillator := false
		for _, h := range g.Hints {
			if !slices.Contains(h.Parts, p) {
				continue
			}
			if strings.Contains(h.Fault, "coupling") || strings.Contains(h.Readings, "off its bias") {
				t.Errorf("%s in %q (%s): a coupling capacitor's fault", p, h.Fault, h.Readings)
			}
			oscillator = oscillator || strings.Contains(h.Fault, "oscillator")
		}
		if !oscillator {
			t.Errorf("%s is in no oscillator fault", p)
		}
	}
}

// TestTrackingLoopOscillatorBesideMixer: a triode-heptode's triode
// oscillator, found with its loop across the gang (the review's circuit,
// loop 1.021–3.255 MHz by ngspice .ac on
// testdata/good/review-osc/c2b-triode-loop.cir), is the oscillator the
// tracking looks at even though the heptode is a mixer stage: the note no
// longer says there is no oscillator stage on the gang, and the aerial
// tank (its secondary returned through the AGC bypass, a tuned winding
// with a bypassed cold end) is found, so the aerial trimmer is peaked.
func TestTrackingLoopOscillatorBesideMixer(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "good", "review-osc-c2b-triode-heptode.toml"))
	if strings.Contains(g.TrackNote, "no oscillator stage") || strings.Contains(g.TrackNote, "no signal tank") {
		t.Errorf("track note %q", g.TrackNote)
	}
	if !slices.ContainsFunc(g.Steps, func(s align.Step) bool { return s.What == "aerial trimmer TC1" }) {
		t.Errorf("no step peaks the aerial trimmer TC1: %v", g.Steps)
	}
}

// TestHintsLevelControl: a pot across an RF generator's output (review18
// a01, a VFO's output-level control) is no receiver's volume control, so
// its worn-track hint names a level control without the detector wording;
// a pot a detector feeds (review18 a03) keeps it.
func TestHintsLevelControl(t *testing.T) {
	for _, tc := range []struct {
		file, fault, inject, notInject string
	}{
		{"a01.toml", "worn level-control track", "top of the control gives", "detector"},
		{"a03.toml", "worn volume track", "top of the control (the detector load) gives", "in a receiver"},
	} {
		_, g := build(t, filepath.Join("..", "..", "..", "testdata", "review18", tc.file))
		found := false
		for _, h := range g.Hints {
			if !strings.Contains(h.Fault, "track") {
				continue
			}
			found = h.Fault == tc.fault
			if !found || !strings.Contains(h.Inject, tc.inject) || strings.Contains(h.Inject, tc.notInject) {
				t.Errorf("%s: %q: %q", tc.file, h.Fault, h.Inject)
			}
		}
		if !found {
			t.Errorf("%s: no %q hint", tc.file, tc.fault)
		}
	}
}
