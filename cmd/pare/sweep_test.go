package main

import (
	"encoding/csv"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// The RC corner of a coupling network: 10 nF into 470 kΩ, −3.0103 dB and
// +45° at 33.8628 Hz (docs/references.md §4, derived from fc = 1/(2πRC)).
const highPassNet = `band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "470k", pins = ["out", "gnd"] }
`

func TestSweepCSV(t *testing.T) {
	path := writeTemp(t, "hp.toml", highPassNet)
	code, out, errs := cliRun(t, "sweep", path, "--band", "33.8628..338.628", "--points", "2", "--csv")
	if code != exitOK || errs != "" {
		t.Fatalf("exit %d\n%s\n%s", code, out, errs)
	}
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(rows) != 3 || strings.Join(rows[0], ",") != "freq_hz,mag_db,phase_deg" {
		t.Fatalf("csv %q (%v)", out, err)
	}
	f, _ := strconv.ParseFloat(rows[1][0], 64)
	m, _ := strconv.ParseFloat(rows[1][1], 64)
	p, _ := strconv.ParseFloat(rows[1][2], 64)
	if math.Abs(f-33.8628) > 1e-6 || math.Abs(m+3.0103) > 1e-3 || math.Abs(p-45) > 1e-3 {
		t.Errorf("corner row %v, want 33.8628 Hz, −3.0103 dB, 45°", rows[1])
	}
	// A decade above the corner: −0.0432 dB, 5.71° (derived: x = 10).
	m, _ = strconv.ParseFloat(rows[2][1], 64)
	p, _ = strconv.ParseFloat(rows[2][2], 64)
	if math.Abs(m-10*math.Log10(100.0/101)) > 1e-4 || math.Abs(p-math.Atan(0.1)*180/math.Pi) > 1e-3 {
		t.Errorf("decade row %v", rows[2])
	}
}

func TestSweepTableAndReduced(t *testing.T) {
	path := filepath.Join(root, "graph/ac/testdata/triode-stage.toml")
	code, out, _ := cliRun(t, "sweep", path, "--points", "5")
	if code != exitOK || !strings.Contains(out, "V(out)/V(in), original circuit") || strings.Count(out, "Hz  ") < 5 || !strings.Contains(out, "Small-signal") {
		t.Fatalf("exit %d\n%s", code, out)
	}
	code, red, _ := cliRun(t, "sweep", path, "--points", "5", "--reduced")
	if code != exitOK || !strings.Contains(red, "reduced circuit (level signal)") {
		t.Fatalf("--reduced: exit %d\n%s", code, red)
	}
	code, z, _ := cliRun(t, "sweep", path, "--points", "3", "--impedance", "--from", "g2")
	if code != exitOK || !strings.Contains(z, "Z(g2)") {
		t.Fatalf("--impedance: exit %d\n%s", code, z)
	}
}

func TestSweepBadInput(t *testing.T) {
	path := writeTemp(t, "hp.toml", highPassNet)
	cases := []struct {
		args []string
		want string
	}{
		{[]string{"sweep", path, "--to", "nowhere"}, `no net "nowhere"`},
		{[]string{"sweep", path, "--from", "gnd"}, "AC ground"},
		{[]string{"sweep", path, "--points", "1"}, "--points"},
		{[]string{"sweep", path, "--band", "2k..1k"}, "--band"},
		{[]string{"sweep", path, "--at", "top"}, "--at"},
	}
	for _, tc := range cases {
		code, out, errs := cliRun(t, tc.args...)
		if code != exitBad || !strings.Contains(errs, tc.want) || out != "" {
			t.Errorf("%v: exit %d, stdout %q, stderr %q; want exit 2 and %q", tc.args, code, out, errs, tc.want)
		}
	}
}

// A stated termination loads the output: 470 kΩ ∥ 470 kΩ halves the
// resistance, and the corner moves to 1/(2π·235 kΩ·10 nF) = 67.7256 Hz
// (derived), where the response is −3.0103 dB.
func TestSweepTermination(t *testing.T) {
	path := writeTemp(t, "hp.toml", highPassNet)
	code, out, errs := cliRun(t, "sweep", path, "--band", "67.7256..677.256", "--points", "2", "--csv", "--term", "out=470k")
	if code != exitOK {
		t.Fatalf("exit %d\n%s", code, errs)
	}
	rows, _ := csv.NewReader(strings.NewReader(out)).ReadAll()
	m, _ := strconv.ParseFloat(rows[1][1], 64)
	if math.Abs(m+3.0103) > 1e-3 {
		t.Errorf("terminated corner %v, want −3.0103 dB", rows[1])
	}
	for _, bad := range []string{"out", "out=-5", "nowhere=600"} {
		code, _, errs := cliRun(t, "sweep", path, "--term", bad)
		if code != exitBad || errs == "" {
			t.Errorf("--term %s: exit %d, stderr %q", bad, code, errs)
		}
	}
}
