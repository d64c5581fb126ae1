package main

import (
	"encoding/csv"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// sweepDB is the magnitude in dB of the one row a --points 2 --csv sweep
// over LO..LO·1.0001 prints first.
func sweepDB(t *testing.T, args ...string) (float64, string) {
	t.Helper()
	code, out, errs := cliRun(t, append([]string{"sweep"}, args...)...)
	if code != exitOK {
		t.Fatalf("sweep %v: exit %d\n%s\n%s", args, code, out, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) < 2 {
		t.Fatalf("sweep %v: csv %q (%v)", args, out, err)
	}
	m, err := strconv.ParseFloat(rows[1][1], 64)
	if err != nil {
		t.Fatalf("sweep %v: row %v", args, rows[1])
	}
	return m, errs
}

// Every command that shows a small-signal figure takes the transistors at
// the circuit's DC operating point. Plain `pare sweep` on the original
// circuit used to stop after loading, so each transistor without an `ic`
// ran at the device model's default 1 mA: the review circuit's driver and
// complementary pair gave 10.25 dB where the reduced circuit gave 18.56 dB
// and ngspice 18.94 dB (testdata/review13/spice/b04.cir, a nonlinear deck
// at pare's law parameters: |V(spk)/V(aud_in)| 8.848 at 400 Hz). The deck's
// devices carry an Early voltage (VAF=100) that pare's DC law leaves out,
// which puts about 5 % more current in the output pair; 0.5 dB covers it.
func TestSweepOriginalAtOperatingPoint(t *testing.T) {
	path := filepath.Join(root, "testdata/review13/b04.toml")
	band := []string{path, "--band", "400..400.04", "--points", "2", "--csv"}
	orig, errs := sweepDB(t, band...)
	if errs != "" {
		t.Errorf("original: stderr %q, want nothing (every transistor has its operating point)", errs)
	}
	red, _ := sweepDB(t, append(band, "--reduced")...)
	const ngspice = 18.937 // 20·log10(8.848), testdata/review13/spice/b04.cir
	if math.Abs(orig-ngspice) > 0.5 {
		t.Errorf("original circuit %.3f dB, ngspice %.3f dB", orig, ngspice)
	}
	// The reduction is proven equal to the original on the same model:
	// the two sweeps agree to the verification's tolerance.
	if math.Abs(orig-red) > 0.1 {
		t.Errorf("original %.3f dB, reduced %.3f dB: not the same bias", orig, red)
	}
}

// A transistor the operating point gives no current to (here no supply at
// all) keeps the model's default bias, and the sweep says so on standard
// error rather than printing its figures as the circuit's.
func TestSweepSaysDefaultBias(t *testing.T) {
	path := writeTemp(t, "nosupply.toml", `band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "1u", pins = ["in", "b"] }
R1 = { r = "100k", pins = ["b", "gnd"] }
Q1 = { bjt = "npn", pins = { b = "b", c = "out", e = "gnd" } }
R2 = { r = "4k7", pins = ["out", "gnd"] }
`)
	for _, extra := range [][]string{nil, {"--reduced"}} {
		_, errs := sweepDB(t, append([]string{path, "--band", "1k..1.0001k", "--points", "2", "--csv"}, extra...)...)
		if !strings.Contains(errs, "Q1 at the device model's default bias") {
			t.Errorf("sweep %v: stderr %q, want Q1 named as at the default bias", extra, errs)
		}
	}
}
