package main

import (
	"bytes"
	"encoding/json"
	"path/filepath"
	"strings"
	"testing"

	"pare/internal/golden"
)

// TestDCChartGolden keeps the voltage charts of the examples in golden files
// (the numbers themselves are checked against ngspice in graph/dc).
func TestDCChartGolden(t *testing.T) {
	files, _ := filepath.Glob("../../examples/*.toml")
	for _, f := range files {
		var out, errb bytes.Buffer
		if code := run([]string{"dc", "--meter", "20k/V", f}, &out, &errb); code != exitOK {
			t.Fatalf("%s: exit %d: %s", f, code, errb.String())
		}
		name := filepath.Join("testdata", "dc", strings.TrimSuffix(filepath.Base(f), ".toml")+".chart")
		golden.Check(t, name, out.Bytes(), *updateSheets, "go test ./cmd/pare -run TestDCChartGolden -update")
	}
}

func TestDCWarningsAndErrors(t *testing.T) {
	cases := []struct {
		args []string
		code int
		want string // in stdout or stderr
	}{
		// Caution first: readings are taken on a live set (graph/safety, common practice).
		{[]string{"dc", "../../graph/dc/testdata/triode-self-bias.toml"}, exitOK, "switched on"},
		// 20 kΩ/V on 250 V is 5 MΩ (common practice, docs/references.md §10).
		{[]string{"dc", "--meter", "20k/V@250", "../../graph/dc/testdata/triode-self-bias.toml"}, exitOK, "20 kΩ/V meter on its 250 V range"},
		{[]string{"dc", "--meter", "fast", "x.toml"}, exitBad, "--meter"},
		{[]string{"dc"}, exitBad, "exactly one"},
		{[]string{"dc", "missing.toml"}, exitBad, "missing.toml"},
		{[]string{"dc", "testdata/dc/reversed-electrolytic.toml"}, exitOK, "reversed"},
		{[]string{"dc", "testdata/dc/reversed-electrolytic.toml"}, exitOK, "R1 dissipates"},
		{[]string{"dc", "testdata/dc/reversed-electrolytic.toml"}, exitOK, "over its 1 W rating"},
		{[]string{"dc", "testdata/dc/reversed-electrolytic.toml"}, exitOK, "against its 5 V rating"},
		// A captured rectifier: the rail is marked an estimate with its method (docs/dc.md).
		{[]string{"dc", "../../graph/dc/testdata/rectifier-bridge.toml"}, exitOK, "estimate: full-wave bridge rectifier on T1"},
		{[]string{"dc", "../../graph/dc/testdata/rectifier-bridge.toml"}, exitOK, "method: capacitor-input filter: the reservoir's periodic steady state"},
		{[]string{"dc", "../../graph/dc/testdata/rectifier-bridge.toml"}, exitOK, "cross-check: the conduction-angle formula gives 22.89 V"},
		{[]string{"dc", "../../graph/dc/testdata/rectifier-bridge.toml"}, exitOK, "AC: the rectifier's winding"},
		// The JFET Hartley's source sits on the coil's tap at DC ground: a
		// running VFO shows at the gate behind its leak (the reviewer's
		// ngspice transient: gate −9.5 V, source 1.4 mV), not at the source.
		{[]string{"dc", "../../graph/dc/testdata/review-vfo-bfo.toml"}, exitOK, "through the gate leak, and the gate reads more negative; the drain goes up"},
		{[]string{"dc", "../../graph/dc/testdata/review-vfo-bfo.toml"}, exitOK, "(Q3): the chart gives the base at 5.557 V"}, // with the Early effect (VA 100 V) in the DC law; 5.539 V before,
		// Positive earth: the chassis is the positive side, the meter's
		// positive lead goes to it (common practice).
		{[]string{"dc", "testdata/dc/positive-earth.toml"}, exitOK, "instead clip the meter's positive (red) lead to chassis"},
		{[]string{"dc", "testdata/dc/positive-earth.toml"}, exitOK, "-9 V   draws 1.02 mA"}, // with the Early effect in the DC law; 1.01 mA before,
		// Supply test points and the rectifier's anode currents (reviewer's
		// ngspice .op: 268 V after the choke, 229 V decoupled).
		{[]string{"dc", "../../graph/dc/testdata/review-valve-amp.toml"}, exitOK, "ht              274.3 V   after L1 from res, decoupled by C2"},
		{[]string{"dc", "../../graph/dc/testdata/review-valve-amp.toml"}, exitOK, "htd             233.7 V   after R4 from ht, decoupled by C5"},
		{[]string{"dc", "../../graph/dc/testdata/review-valve-amp.toml"}, exitOK, "V1     anode 1, mean (est.) 22.6 mA"},
		// MOSFETs have the square law now, not a refusal.
		{[]string{"dc", "../../graph/dc/testdata/mosfet.toml"}, exitOK, "drain current"},
	}
	for _, tc := range cases {
		var out, errb bytes.Buffer
		code := run(tc.args, &out, &errb)
		if code != tc.code || !strings.Contains(out.String()+errb.String(), tc.want) {
			t.Errorf("%v: exit %d (want %d), output lacks %q:\n%s%s", tc.args, code, tc.code, tc.want, out.String(), errb.String())
		}
	}
}

// TestDCReadings runs the ranking on the bench fixture whose readings were
// taken (in simulation) with its coupling capacitor leaking, on a
// readings file full of mistakes, and on the blind review's readings (a
// healthy set with its oscillators running, an open bias diode: ngspice on
// the reviewer's decks through a 20 kΩ/V meter); the outputs are golden
// files.
func TestDCReadings(t *testing.T) {
	const pentode = "../../graph/dc/testdata/pentode-rc.toml"
	cases := []struct {
		circuit, readings, golden string
		code                      int
	}{
		{pentode, "testdata/dc/pentode-rc.readings", "testdata/dc/pentode-rc.ranking", exitOK},
		{pentode, "testdata/dc/bad.readings", "testdata/dc/bad.readings.err", exitBad},
		{"../../graph/dc/testdata/review-vfo-bfo.toml", "testdata/dc/review-vfo-bfo-healthy.readings", "testdata/dc/review-vfo-bfo-healthy.ranking", exitOK},
		{"../../graph/dc/testdata/review-vfo-bfo.toml", "testdata/dc/review-vfo-bfo-f5.readings", "testdata/dc/review-vfo-bfo-f5.ranking", exitOK},
		{"../../graph/dc/testdata/review-tr-portable.toml", "testdata/dc/review-tr-portable-f4.readings", "testdata/dc/review-tr-portable-f4.ranking", exitOK},
	}
	for _, tc := range cases {
		var out, errb bytes.Buffer
		code := run([]string{"dc", tc.circuit, "--readings", tc.readings}, &out, &errb)
		if code != tc.code {
			t.Fatalf("%s: exit %d, want %d: %s", tc.readings, code, tc.code, errb.String())
		}
		golden.Check(t, tc.golden, append(out.Bytes(), errb.Bytes()...), *updateSheets, "go test ./cmd/pare -run TestDCReadings -update")
	}
	var out bytes.Buffer
	run([]string{"dc", "../../graph/dc/testdata/pentode-rc.toml", "--readings", cases[0].readings}, &out, &out)
	// The leaky coupling capacitor pulls the next grid positive (common
	// practice): it must come first, and the grid is the reading to take next.
	if !strings.Contains(out.String(), "1. C2 leaky") || !strings.Contains(out.String(), "next reading: g2") {
		t.Errorf("ranking should put C2 leaky first and ask for g2:\n%s", out.String())
	}
}

// TestDCJSON: the chart and the ranking print as JSON in SI base units with
// the caution beside them.
func TestDCJSON(t *testing.T) {
	for _, args := range [][]string{
		{"dc", "--json", "../../graph/dc/testdata/triode-self-bias.toml"},
		{"dc", "--json", "../../graph/dc/testdata/pentode-rc.toml", "--readings", "testdata/dc/pentode-rc.readings"},
	} {
		var out, errb bytes.Buffer
		if code := run(args, &out, &errb); code != exitOK {
			t.Fatalf("%v: exit %d: %s", args, code, errb.String())
		}
		var v map[string]any
		if err := json.Unmarshal(out.Bytes(), &v); err != nil {
			t.Fatalf("%v: not JSON: %v", args, err)
		}
		if _, ok := v["caution"]; !ok {
			t.Errorf("%v: no caution in the JSON", args)
		}
	}
}
