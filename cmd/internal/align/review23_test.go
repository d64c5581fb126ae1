package align_test

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// review23 is a fixture of the twelfth blind review (testdata/review23 at
// the repository's root; the reviewer called b02 and b05 c02 and c05).
func review23(name string) string {
	return filepath.Join("..", "..", "..", "testdata", "review23", name+".toml")
}

// A separate oscillator found by its loop, its tank returned to a
// decoupled supply line (review23 b02: VC1c and TC3 from osc_pad to
// vcc_osc, the padder C12 in series with T3's tuned winding, vcc_osc fed
// through R12 and held by C14; b05 the same on vcc_rf), and an RF tank
// whose gang section and trimmer return to such a line (b02: VC1b and TC2
// across T2's primary, to vcc_rf). The reviewer read "the low end cannot
// be set: no padder and no adjustable core is captured", "The core of T3:
// no step" and "no RF trimmer is captured on VC1b" where all of them are
// captured: each must have its step, with no such warning.
func TestSeparateOscillatorOnADecoupledLine(t *testing.T) {
	for _, tc := range []struct {
		name            string
		oscTrim, oscLow string // the oscillator's high and low end
		rf              []string
	}{
		{"b02", "TC3", "T3", []string{"TC2", "T2", "TC1", "T1"}},
		{"b05", "TC2", "T2", []string{"TC1", "T1"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, g := build(t, review23(tc.name))
			var osc, rf []string
			for _, s := range g.Steps {
				switch s.Phase {
				case "oscillator":
					osc = append(osc, s.Part)
				case "aerial/RF":
					rf = append(rf, s.Part)
				}
			}
			if strings.Join(osc, " ") != tc.oscTrim+" "+tc.oscLow {
				t.Errorf("oscillator steps turn %v, want %s at the top and the core of %s at the bottom", osc, tc.oscTrim, tc.oscLow)
			}
			if strings.Join(rf, " ") != strings.Join(tc.rf, " ") {
				t.Errorf("aerial/RF steps turn %v, want %v (RF tank first, aerial last)", rf, tc.rf)
			}
			for _, w := range append(g.Warnings, g.LeftOut...) {
				if strings.Contains(w, "cannot be set") || strings.Contains(w, "trimmer is captured") || strings.Contains(w, "no step") ||
					strings.Contains(w, "alignment cannot reach") {
					t.Errorf("false warning: %s", w)
				}
			}
		})
	}
}

// The guide's dial ends for a separate oscillator on a decoupled line are
// its loop's: the return ratio of its controlled source solved by ngspice-39
// (docs/references.md §46, §53). Review23 b02's Q3 on
// testdata/review23/c02loop.cir: 0° of loop phase at 976.885 kHz with the
// gang fully meshed and at 2.01393 MHz fully open. Review23 b05's Q2 on
// testdata/review23/c05loop.cir with the aerial tank's input free, as the
// set runs with its ferrite rod: 973.237 kHz and 2.00836 MHz (with
// ant_tank held at 0 V, as an idle generator would, 2.03324 MHz: the top
// end pare read before it left a tuned input free). 0.2 % and 0.3 %
// (b05's meshed end reads 0.25 % high): pare's rπ and ro come from its own
// DC solve, the decks' from ngspice's.
func TestSeparateOscillatorDialEndsAgainstNgspice(t *testing.T) {
	for _, tc := range []struct {
		name string
		ends []float64 // meshed, open
		tol  float64
	}{
		{"b02", []float64{976.885e3, 2.01393e6}, 0.002},
		{"b05", []float64{973.237e3, 2.00836e6}, 0.003},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, g := build(t, review23(tc.name))
			if len(g.Ends) != 2 {
				t.Fatalf("dial ends %+v, want the meshed and the open end", g.Ends)
			}
			for i, want := range tc.ends {
				if got := g.Ends[i].Osc; math.Abs(got-want) > tc.tol*want {
					t.Errorf("%s: oscillator at %.0f Hz, ngspice's return ratio %.0f Hz", g.Ends[i].Where, got, want)
				}
			}
		})
	}
}

// Near misses: the same set with truly nothing to turn still warns. With
// the padder gone (the gang and trimmer straight across the winding) and
// no core on the oscillator coil, the low end cannot be set; with the
// padder kept but a fixed coil, the fixed padder is named; with the RF
// trimmer gone, the RF tank has no high-end step.
func TestSeparateOscillatorNearMisses(t *testing.T) {
	src, err := os.ReadFile(review23("b02"))
	if err != nil {
		t.Fatal(err)
	}
	noCore := func(s string) string {
		return strings.Replace(s, `pins = { p1 = "vcc_osc", pt = "q3_c", p2 = "osc_tank", f1 = "q3_b", f2 = "q3_bias", l1 = "osc_inj", l2 = "gnd" }, adjust = "core",`,
			`pins = { p1 = "vcc_osc", pt = "q3_c", p2 = "osc_tank", f1 = "q3_b", f2 = "q3_bias", l1 = "osc_inj", l2 = "gnd" },`, 1)
	}
	for _, tc := range []struct {
		name, warn string
		edit       func(string) string
	}{
		{"no padder, fixed coil", "the low end cannot be set: no padder and no adjustable core is captured on T3", func(s string) string {
			s = noCore(s)
			s = strings.Replace(s, `C12 = { c = "275p", pins = ["osc_tank", "osc_pad"], tol = "2%", note = "padder: low end" }`+"\n", "", 1)
			s = strings.Replace(s, `"TC3", "C12", `, `"TC3", `, 1)
			return strings.ReplaceAll(s, `"osc_pad"`, `"osc_tank"`)
		}},
		{"fixed padder, fixed coil", "the low end cannot be set: the padder C12 is fixed and no adjustable core is captured on T3", noCore},
		{"no RF trimmer", "no RF trimmer is captured on VC1b", func(s string) string {
			return strings.Replace(s, `TC2 = { c = "3p..30p", set = "15p", pins = ["rf_tank", "vcc_rf"], note = "RF trimmer" }`+"\n", "", 1)
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			edited := tc.edit(string(src))
			if edited == string(src) {
				t.Fatal("the edit changed nothing")
			}
			path := filepath.Join(t.TempDir(), "b02.toml")
			if err := os.WriteFile(path, []byte(edited), 0o644); err != nil {
				t.Fatal(err)
			}
			_, g := build(t, path)
			if !hasWarning(g, tc.warn) {
				t.Errorf("no warning %q in %q", tc.warn, g.Warnings)
			}
		})
	}
}

func hasWarning(g *align.Guide, w string) bool {
	for _, s := range g.Warnings {
		if strings.Contains(s, w) {
			return true
		}
	}
	return false
}

// The reach search solves the oscillator tank quiet: review17's AC/DC
// set's pentagrid oscillator tank (T2 105 µH, padder C3 450 pF in series
// with VC1b 12–365 pF, TC2 5–30 pF across the coil) was solved with its
// loop closed and read "no pair of settings of TC2 and the core covers
// both ends", where TC2 at 30 pF and the core at +8.6 % of T2's inductance
// give, by f = 1/(2π√(LC)) (handbook), 979.7 kHz with the gang full
// (365·450/815 + 30 pF) and 2.308 MHz with it at its least (12·450/462 +
// 30 pF): over the band's 980 kHz to 2.06 MHz. 1 %: the solve keeps the
// strays and the windings' losses.
func TestSelfOscillatingTankReachSolvedQuiet(t *testing.T) {
	_, g := build(t, filepath.Join("..", "..", "..", "testdata", "good", "review17-acdc.toml"))
	re := regexp.MustCompile(`with TC2 at ([0-9.]+) pF and the core of T2 at \+([0-9.]+) % of its inductance the tank tunes ([0-9.]+) kHz to ([0-9.]+) MHz in circuit \(solved with both\)`)
	for _, w := range g.Warnings {
		m := re.FindStringSubmatch(w)
		if m == nil {
			continue
		}
		trim, core := num(t, m[1])*1e-12, 1+num(t, m[2])/100
		l := 105e-6 * core
		for i, cg := range []float64{365e-12, 12e-12} {
			c := cg*450e-12/(cg+450e-12) + trim
			want := 1 / (2 * math.Pi * math.Sqrt(l*c))
			got := num(t, m[3+i]) * []float64{1e3, 1e6}[i]
			if math.Abs(got-want) > 0.01*want {
				t.Errorf("gang %g F: %g Hz in the warning, handbook %g Hz", cg, got, want)
			}
		}
		return
	}
	t.Errorf("no solved trimmer and core setting in %q", g.Warnings)
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}
