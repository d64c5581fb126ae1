package stages

import (
	"math"
	"pare/graph/figure"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/rules"
)

// reduceExample loads an example and reduces it at the default level, as
// `pare stages` does.
func reduceExample(t *testing.T, name string) (*graph.Circuit, *graph.Circuit, *rules.Log) {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "examples", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatalf("reduce %s: %v", name, err)
	}
	return c, r, log
}

// The valve frequency changer is a self-oscillating mixer containing a
// Hartley oscillator with the cathode tap. Its oscillator range follows
// from L1 126 µH and the gang 12–365 pF with 36.3 pF trimmer in series with
// the 390 pF padder: C = (Cg+Ct)·Cp/(Cg+Ct+Cp) (series and parallel
// capacitors, docs/references.md §4), f = 1/(2π√(LC)) (§1); the signal range is
// oscillator − 470 kHz and the image signal + 940 kHz (§2).
func TestFrequencyChangerExample(t *testing.T) {
	full, reduced, log := reduceExample(t, "frequency-changer.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	mix := stageOf(st, "self-oscillating-mixer")
	if mix == nil {
		t.Fatalf("no self-oscillating mixer: %s", topologies(st))
	}
	var hartley *Stage
	for _, name := range mix.Contains {
		for i := range st {
			if st[i].Name == name && st[i].Topology == "hartley-common-tap" {
				hartley = &st[i]
			}
		}
	}
	if hartley == nil {
		t.Fatalf("the mixer %v contains no Hartley oscillator: %s", mix.Contains, topologies(st))
	}
	series := func(cg float64) float64 { c := cg + 36.3e-12; return c * 390e-12 / (c + 390e-12) }
	fmin := 1 / (2 * math.Pi * math.Sqrt(126e-6*series(365e-12)))
	fmax := 1 / (2 * math.Pi * math.Sqrt(126e-6*series(12e-12)))
	for _, c := range []struct {
		key  string
		want float64
	}{
		{"osc_f_min_hz", fmin}, {"osc_f_max_hz", fmax},
		{"sig_f_min_hz", fmin - 470e3}, {"sig_f_max_hz", fmax - 470e3},
		{"image_f_min_hz", fmin + 470e3}, {"image_f_max_hz", fmax + 470e3},
		{"if_hz", 470e3},
	} {
		got, ok := formulaOf(mix.Figures, c.key)
		if !ok || math.Abs(got-c.want) > 1e-6*c.want {
			t.Errorf("%s = %g (present %v), want %g", c.key, got, ok, c.want)
		}
	}
	// In circuit the set covers the band, 530 kHz–1.6 MHz, with the RF tank
	// (S1) and the oscillator less the IF (§2) both reaching past its ends.
	rf := stageOf(st, "tuned-winding")
	if rf == nil {
		t.Fatal("no RF tank")
	}
	for _, c := range []struct {
		l    figure.List
		name string
	}{{rf.Figures, "f"}, {mix.Figures, "sig_f"}} {
		f, ok := c.l.Get(c.name)
		if !ok || f.Range == nil || f.Origin.Source != figure.Solver || f.Range.Min > 530e3 || f.Range.Max < 1.6e6 {
			t.Errorf("%s %+v: want the solver's range over 530 kHz–1.6 MHz", c.name, f)
		}
	}
	// In circuit the dial sweep stays within a few kHz (the file's header;
	// the tanks are checked against ngspice in
	// TestTrackingInCircuitAgainstNgspice).
	if e := math.Abs(fig(mix.Figures, "track_err_max_hz")); e == 0 || e > 9.4e3 {
		t.Errorf("tracking error %g Hz: want a few kHz in circuit, inside 2 %% of the IF", e)
	}
	if u := Unmatched(reduced, st); len(u) > 0 {
		t.Errorf("parts in no stage: %v", u)
	}
}

// The IF strip: the triode preamplifier's gain is the textbook
// −µRL/(ra+RL) = −61.5385 for µ 100, ra 62.5 kΩ, RL 100 kΩ
// (docs/references.md §5), and the AC solver agrees.
func TestIFStripExample(t *testing.T) {
	full, reduced, log := reduceExample(t, "if-detector-audio.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	for _, want := range []string{"amp-tuned", "double-tuned"} {
		if stageOf(st, want) == nil {
			t.Errorf("no %s: %s", want, topologies(st))
		}
	}
	var det *Stage
	for i := range st {
		if st[i].Topology == "diode-detector" || st[i].Topology == "diode-detector-cold-end" {
			det = &st[i]
		}
	}
	if det == nil {
		t.Errorf("no detector: %s", topologies(st))
	}
	var amp *Stage
	for i := range st {
		if g, ok := st[i].Figures.Lookup("gain"); ok && g < -1 {
			amp = &st[i]
		}
	}
	if amp == nil {
		t.Fatalf("no amplifier with a gain: %s", topologies(st))
	}
	if g, _ := formulaOf(amp.Figures, "gain"); math.Abs(g+61.5385) > 1e-4*61.5385 {
		t.Errorf("preamplifier gain by its formula %g, want −61.5385", g)
	}
	// In circuit the stage works into the same 100 kΩ (its output is a
	// port), so the solver and the formula agree within 2 %.
	if g := fig(amp.Figures, "gain"); math.Abs(g+61.5385) > figure.CheckAgreement*61.5385 {
		t.Errorf("preamplifier gain in circuit %g, want −61.5385 within 2 %%", g)
	}
	if u := Unmatched(reduced, st); len(u) > 0 {
		t.Errorf("parts in no stage: %v", u)
	}
}

// The transistor front end: the BJT mixer (its emitter fed by a link
// winding on the oscillator coil) and the IF amplifier are named, every
// part labelled.
func TestTransistorExample(t *testing.T) {
	full, reduced, log := reduceExample(t, "transistor-front-end.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	var mixer *Stage
	for i := range st {
		if st[i].Topology == "self-oscillating-mixer-common-link" {
			mixer = &st[i]
		}
	}
	if mixer == nil || mixer.Family != "bjt" {
		t.Fatalf("no BJT self-oscillating mixer: %s", topologies(st))
	}
	if fig(mixer.Figures, "if_hz") != 455e3 {
		t.Errorf("IF %g, want the declared 455 kHz", fig(mixer.Figures, "if_hz"))
	}
	if u := Unmatched(reduced, st); len(u) > 0 {
		t.Errorf("parts in no stage: %v", u)
	}
}

// Every netlist in the repository, reduced at every level, goes through Find
// without a panic or an error, and twice gives the same stages.
func TestEveryNetlistEveryLevel(t *testing.T) {
	var files []string
	for _, g := range []string{"../../examples/*.toml", "../testdata/*.toml", "testdata/*.toml"} {
		m, _ := filepath.Glob(g)
		files = append(files, m...)
	}
	if len(files) == 0 {
		t.Fatal("no netlists found")
	}
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Error(err) // every netlist under these globs is valid input
			continue
		}
		for _, lvl := range []rules.Level{rules.LevelTidy, rules.LevelSignal, rules.LevelIdeal} {
			r, log, err := rules.Reduce(c, rules.Options{Level: lvl})
			if err != nil {
				t.Errorf("%s at %s: %v", f, lvl, err)
				continue
			}
			a, err := Find(r, Options{Full: c, ACGround: log.ACGround})
			if err != nil {
				t.Errorf("%s at %s: %v", f, lvl, err)
				continue
			}
			b, _ := Find(r, Options{Full: c, ACGround: log.ACGround})
			if topologies(a) != topologies(b) {
				t.Errorf("%s at %s: two runs differ:\n%s\n%s", f, lvl, topologies(a), topologies(b))
			}
		}
	}
}
