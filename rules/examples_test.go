package rules

import (
	"fmt"
	"math/rand"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
	"testing"

	"pare/graph"
)

// fixtures are every example of the project and every netlist in testdata.
func fixtures(t *testing.T) []string {
	t.Helper()
	var out []string
	for _, pat := range []string{"../examples/*.toml", "testdata/*.toml"} {
		m, _ := filepath.Glob(pat)
		out = append(out, m...)
	}
	sort.Strings(out)
	if len(out) == 0 {
		t.Fatal("no fixtures found")
	}
	return out
}

func loadFile(t *testing.T, path string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return c
}

var levels = []Level{LevelTidy, LevelSignal, LevelIdeal}

func TestPrintExampleLogs(t *testing.T) {
	if !testing.Verbose() {
		t.Skip("prints the logs for reading with -v")
	}
	for _, path := range fixtures(t) {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, log := reduceChecked(t, c, Options{Level: lvl})
			t.Logf("== %s at %s: parts %d → %d, nets %d → %d\n%s", path, lvl, log.Before.Parts, log.After.Parts, log.Before.Nets, log.After.Nets, logText(log))
			_ = r
		}
	}
}

// Reducing a reduced circuit takes no step: the rules reach a fixpoint.
func TestIdempotent(t *testing.T) {
	for _, path := range fixtures(t) {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, _ := reduceChecked(t, c, Options{Level: lvl})
			again, log := reduceChecked(t, r, Options{Level: lvl})
			if log.Applied() != 0 {
				t.Errorf("%s at %s: reducing again took %d steps:\n%s", path, lvl, log.Applied(), logText(log))
			}
			if written(t, again) != written(t, r) {
				t.Errorf("%s at %s: second reduction changed the circuit", path, lvl)
			}
			// The same holds through the file: the written netlist loads and is a fixpoint.
			back, err := graph.Parse("reduced.toml", []byte(written(t, r)))
			if err != nil {
				t.Fatalf("%s at %s: the reduced netlist does not load: %v\n%s", path, lvl, err, written(t, r))
			}
			_, log2 := reduceChecked(t, back, Options{Level: lvl})
			if log2.Applied() != 0 {
				t.Errorf("%s at %s: the written reduced netlist reduces further:\n%s", path, lvl, logText(log2))
			}
		}
	}
}

// Every original part is either kept (in some reduced part's origins, and
// then never named as removed) or named as removed by exactly one step; every
// merge's result stands for the parts it names.
func TestProvenanceComplete(t *testing.T) {
	for _, path := range fixtures(t) {
		for _, lvl := range levels {
			c := loadFile(t, path)
			r, log := reduceChecked(t, c, Options{Level: lvl})
			kept := map[string]bool{}
			for _, p := range r.Parts {
				for _, o := range p.Origins() {
					kept[o] = true
				}
			}
			removed := map[string]int{}
			for _, s := range log.Steps {
				for _, ref := range s.Removed {
					removed[ref]++
				}
			}
			for _, p := range c.Parts {
				switch {
				case kept[p.Ref] && removed[p.Ref] > 0:
					t.Errorf("%s at %s: %s is kept and also named removed", path, lvl, p.Ref)
				case !kept[p.Ref] && removed[p.Ref] != 1:
					t.Errorf("%s at %s: %s is gone but named removed %d times", path, lvl, p.Ref, removed[p.Ref])
				}
			}
		}
	}
}

// Shuffling the entries of every table (parts, nets, regions, pin tables) in
// the input gives the same reduced circuit, byte for byte, and the same log.
func TestOrderIndependent(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for _, path := range fixtures(t) {
		c := loadFile(t, path)
		c.Comments = nil
		canon := written(t, c)
		for trial := 0; trial < 4; trial++ {
			shuffled := shuffleTOML(canon, rng)
			d, err := graph.Parse(path, []byte(shuffled))
			if err != nil {
				t.Fatalf("%s: shuffled text does not load: %v\n%s", path, err, shuffled)
			}
			for _, lvl := range levels {
				r1, l1 := reduceChecked(t, c, Options{Level: lvl})
				r2, l2 := reduceChecked(t, d, Options{Level: lvl})
				r1.Comments, r2.Comments = nil, nil
				if a, b := writtenByName(t, r1), writtenByName(t, r2); a != b {
					t.Fatalf("%s at %s: shuffled input reduces differently:\n%s\n---\n%s", path, lvl, a, b)
				}
				if a, b := logWithoutPositions(l1), logWithoutPositions(l2); a != b {
					t.Fatalf("%s at %s: shuffled input logs differently:\n%s\n---\n%s", path, lvl, a, b)
				}
			}
		}
	}
}

var pinTable = regexp.MustCompile(`pins = \{ ([^}]*) \}`)

// shuffleTOML reorders the one-line entries of each table and the keys of
// each inline pin table.
func shuffleTOML(text string, rng *rand.Rand) string {
	lines := strings.Split(text, "\n")
	var out, block []string
	flush := func() {
		rng.Shuffle(len(block), func(i, j int) { block[i], block[j] = block[j], block[i] })
		out = append(out, block...)
		block = nil
	}
	inTable := false
	for _, l := range lines {
		switch {
		case strings.HasPrefix(l, "["):
			flush()
			out = append(out, l)
			inTable = true
		case inTable && strings.Contains(l, " = "):
			l = pinTable.ReplaceAllStringFunc(l, func(m string) string {
				inner := pinTable.FindStringSubmatch(m)[1]
				kv := strings.Split(inner, ", ")
				rng.Shuffle(len(kv), func(i, j int) { kv[i], kv[j] = kv[j], kv[i] })
				return "pins = { " + strings.Join(kv, ", ") + " }"
			})
			block = append(block, l)
		default:
			flush()
			out = append(out, l)
		}
	}
	flush()
	return strings.Join(out, "\n")
}

func logWithoutPositions(l *Log) string {
	var b strings.Builder
	for _, s := range append(append([]Step(nil), l.Steps...), l.Declined...) {
		fmt.Fprintf(&b, "%d %s %v %v %s %v %v %v %v %v %s %v\n", s.N, s.Rule, s.Removed, s.Merged, s.Result, s.Joined, s.Grounded, s.Pins, s.Added, s.Dropped, s.Why, s.Refs)
	}
	return b.String()
}

// The frequency changer reduces to the bare oscillator-mixer: the tapped
// oscillator coil, the oscillator gang section with its trimmer merged in
// (its padder stays apart at every level), the grid capacitor and grid leak, the valve on its signal
// electrodes, the RF injection (aerial coil, tuned by its section and
// trimmer, through the injection capacitor), and the IF transformer with its
// tuning capacitors. Everything else (decoupling, screen feed, rails, heater
// wiring, supply ports) is gone.
func TestFrequencyChangerReducesToOscillatorMixer(t *testing.T) {
	const path = "../examples/frequency-changer.toml"
	if _, err := os.Stat(path); err != nil {
		t.Fatal(err)
	}
	for _, lvl := range []Level{LevelSignal, LevelIdeal} {
		oscillatorMixer(t, path, lvl)
	}
}

func oscillatorMixer(t *testing.T, path string, lvl Level) {
	r, log := reduceChecked(t, loadFile(t, path), Options{Level: lvl})
	var got []string
	for _, p := range r.Parts {
		got = append(got, string(p.Kind)+":"+strings.Join(p.Origins(), "+"))
	}
	osc := []string{"capacitor:C3", "capacitor:TC2+VC1b"} // padder apart at every level: a series merge would be exact at the ends of the travel only
	want := []string{
		"capacitor:C1",       // RF injection onto the oscillator grid
		"capacitor:C2",       // oscillator grid capacitor
		"capacitor:C4",       // IF primary tuning
		"capacitor:C5",       // IF secondary tuning
		"inductor:L1",        // tapped oscillator coil
		"port:P1",            // the aerial input
		"port:P3",            // to the IF amplifier
		"resistor:R1",        // grid leak
		"transformer:T1",     // aerial coil (RF injection)
		"transformer:T2",     // IF transformer
		"valve:V1",           // the mixer on its signal electrodes
		"capacitor:TC1+VC1a", // aerial section with its trimmer
	}
	want = append(want, osc...)
	sort.Strings(got)
	sort.Strings(want)
	if strings.Join(got, " ") != strings.Join(want, " ") {
		t.Fatalf("surviving parts:\n got %v\nwant %v\n%s", got, want, logText(log))
	}
	v := r.Part("V1")
	var live []string
	for _, pin := range v.Pins {
		if pin.Net != "nc" {
			live = append(live, pin.Name)
		}
	}
	if strings.Join(live, ",") != "a,g1,k" {
		t.Errorf("V1 keeps %v, want a, g1, k", live)
	}
	// The oscillator section: gang 12–365 pF + trimmer 36.3 pF =
	// 48.3–401.3 pF (derived: sum); the 390 pF padder stays its own part in
	// series.
	sec := r.Part("VC1b")
	lo, hi := 48.3e-12, 401.3e-12
	if !near(sec.Value.Min, lo, 1e-6) || !near(sec.Value.Max, hi, 1e-6) || sec.Gang != "tune" {
		t.Errorf("%s: oscillator section %v gang %q, want %g–%g F on gang tune", lvl, sec.Value, sec.Gang, lo, hi)
	}
}
