package main

import (
	"encoding/csv"
	"strconv"
	"strings"
	"testing"

	"pare/internal/synth"
)

// TestSweepSaysBeyondResolution: on the 10,000-section RC ladder of
// bench/gen, `pare sweep` printed −6159.074 dB with a phase of rounding at
// every point above about 170 Hz (the smallest numbers a double holds). A
// point the solve does not resolve now reads as a bound in the table and
// in CSV (empty magnitude and phase, below_db), and a resolved one keeps
// its figure: −4863.930 dB at 100 Hz, as ngspice-39 (Debian) prints on
// pare's deck (−4863.93004 dB) and the ladder's closed form gives
// (docs/references.md §36).
func TestSweepSaysBeyondResolution(t *testing.T) {
	src, err := synth.Ladder(10000)
	if err != nil {
		t.Fatal(err)
	}
	path := writeTemp(t, "ladder.toml", string(src))
	cases := []struct {
		name string
		args []string
		want []string // lines, each somewhere in the output
		not  []string
	}{
		{"table", []string{"--band", "100..1k", "--points", "3"},
			[]string{"100 Hz   -4863.930", "316 Hz     < -", "unresolved", "2 of 3 points are beyond the solver's resolution"},
			[]string{"-6159.074"}},
		{"impedance", []string{"--band", "100..1k", "--points", "3", "--impedance"},
			[]string{"Z(n0)"}, []string{"unresolved", "beyond"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			code, out, errs := cliRun(t, append([]string{"sweep", path}, tc.args...)...)
			if code != exitOK {
				t.Fatalf("exit %d\n%s\n%s", code, out, errs)
			}
			for _, w := range tc.want {
				if !strings.Contains(out, w) {
					t.Errorf("no %q in\n%s", w, out)
				}
			}
			for _, w := range tc.not {
				if strings.Contains(out, w) {
					t.Errorf("%q in\n%s", w, out)
				}
			}
		})
	}
	code, out, _ := cliRun(t, "sweep", path, "--band", "100..1k", "--points", "3", "--csv")
	rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if code != exitOK || err != nil || len(rows) != 4 || strings.Join(rows[0], ",") != "freq_hz,mag_db,phase_deg,below_db" {
		t.Fatalf("exit %d csv %q (%v)", code, out, err)
	}
	if rows[1][1] != "-4863.93004" || rows[1][3] != "" {
		t.Errorf("100 Hz row %v, want -4863.93004 dB and no bound", rows[1])
	}
	closed := map[string]float64{"316.227766": -8658.999, "1000": -15430.107}
	for _, r := range rows[2:] {
		b, err := strconv.ParseFloat(r[3], 64)
		// The closed form (§36): −8659.0 dB at 316 Hz, −15430.1 dB at
		// 1 kHz; the bound lies between it and the smallest normal double.
		if r[1] != "" || r[2] != "" || err != nil || b > -6153 || b < closed[r[0]] {
			t.Errorf("row %v: want empty magnitude and phase and a bound below -6153 dB", r)
		}
	}
}
