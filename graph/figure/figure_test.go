package figure

import (
	"encoding/json"
	"math"
	"strings"
	"testing"

	"pare/graph/value"
)

func TestFormat(t *testing.T) {
	for _, c := range []struct {
		v    float64
		u    Unit
		m    Medium
		want string
	}{
		{1.47e6, Hertz, Text, "1.47 MHz"},      // SI prefix, common practice
		{0.723, Hertz, Text, "0.723 Hz"},       // not "723 mHz", read as MHz on a sheet (common practice)
		{0.723, Hertz, Sheet, "0.723 Hz"},      // the same on a sheet
		{1455e3, Hertz, Text, "1.455 MHz"},     // four digits keep kHz steps (units table)
		{1455e3, Hertz, Sheet, "1.46 MHz"},     // three on a sheet, as a marking carries
		{459.6e3, Hertz, Text, "459.6 kHz"},    // an IF can 1 % high of 455 kHz shows as such
		{-7708, Hertz, Text, "-7.708 kHz"},     // a signed tracking error keeps its sign
		{0.1, Second, Text, "0.1 s"},           // plain seconds from 0.1 s (secondsPlain)
		{0.099, Second, Text, "99 ms"},         // just under: SI prefix
		{4.7e-3, Second, Text, "4.7 ms"},       // SI prefix
		{2.209, Second, Sheet, "2.21 s"},       // three digits either way
		{-16.4912, Ratio, Text, "-16.5"},       // three significant digits
		{-597.2, Ratio, Sheet, "-597"},         // the integer part kept whole
		{1234.5, Ratio, Text, "1234"},          // four integer digits kept
		{0.0102062, Ratio, Text, "0.0102"},     // three significant digits
		{1e-5, Ratio, Text, "1e-05"},           // below a thousandth: %g
		{35.78, Decibel, Text, "35.8 dB"},      // tenths of a decibel, common practice
		{40.26, Degree, Sheet, "40°"},          // a phase margin in whole degrees, common practice
		{364.241e-12, Farad, Text, "364.2 pF"}, // docs/references.md §2 three-point padder, four digits
		{364.241e-12, Farad, Sheet, "364 pF"},  // the same on a sheet
		{4.7e-3, Farad, Text, "4700 µF"},       // capacitances skip milli (graph/value, common practice)
		{135.265e-6, Henry, Text, "135.3 µH"},  // docs/references.md §2 three-point L2
		{776.2, Ohm, Text, "776 Ω"},            // three digits for resistance
		{1234.5, Unit(99), Text, "1234"},       // an unknown unit falls back to a plain number
	} {
		if got := Format(c.v, c.u, c.m); got != c.want {
			t.Errorf("Format(%g, %v, %v) = %q, want %q", c.v, c.u, c.m, got, c.want)
		}
	}
}

// The mixer's figures as the stage finder writes them (labels and order
// from rules/stages), built by hand so the line can be checked alone. The
// numbers are the frequency-changer example's.
func mixerFigures() List {
	at := Figure{Name: "track_err_at", Label: "track err at", Unit: Hertz, Value: 1.6e6}
	return List{
		{Name: "osc_f", Label: "osc f", Unit: Hertz, Range: &value.Range{Min: 1.004e6, Max: 2.063e6}},
		{Name: "if", Label: "IF", Unit: Hertz, Value: 470e3},
		{Name: "track_err_max", Label: "track err max", Unit: Hertz, Value: -7708, At: &at},
		{Name: "track_fit", Label: "fitted set tracks exactly at", Unit: Hertz, Points: []float64{620.9e3, 905.6e3}},
		{Name: "pad_c", Label: "padder", Group: "suggested 3-point design", Unit: Farad, Value: 366.6e-12},
		{Name: "pad_l", Label: "coil", Group: "suggested 3-point design", Unit: Henry, Value: 130.8e-6},
		{Name: "track_f", Label: "exact at", Group: "suggested 3-point design", Unit: Hertz, Points: []float64{591.7e3, 1.053e6, 1.509e6}},
		{Name: "osc_c", Working: true, Unit: Farad, Range: &value.Range{Min: 43e-12, Max: 396e-12}},
		{Name: "gain", Label: "gain", Unit: Decibel, Value: 35.78, Working: true},
	}
}

// One line for a table and a note: a range as one item, the tracking error
// with where it peaks, the points as prose, a group's members as one item,
// working values left out.
func TestLine(t *testing.T) {
	want := "osc f 1.004 MHz–2.063 MHz, IF 470 kHz, track err max -7.708 kHz at 1.6 MHz, " +
		"fitted set tracks exactly at 620.9 kHz and 905.6 kHz, " +
		"suggested 3-point design: padder 366.6 pF, coil 130.8 µH, exact at 591.7 kHz, 1.053 MHz and 1.509 MHz"
	if got := Line(mixerFigures(), Text); got != want {
		t.Errorf("Line =\n%q, want\n%q", got, want)
	}
	// A sheet: three digits, a range sharing its unit as the sheet's tuning
	// lines write it (graph/value.FormatRange).
	if got := Items(mixerFigures(), Sheet)[:2]; strings.Join(got, ", ") != "osc f 1–2.06 MHz, IF 470 kHz" {
		t.Errorf("sheet items %q", got)
	}
	if got := Line(nil, Text); got != "" {
		t.Errorf("no figures: %q", got)
	}
}

// JSON keeps the keys of the first JSON output: unit at the end, _min/_max
// for a range, a number per point, the "at" figure beside its figure;
// sorted, full precision.
func TestJSON(t *testing.T) {
	b, err := json.Marshal(mixerFigures())
	if err != nil {
		t.Fatal(err)
	}
	want := `{"gain_db":35.78,"if_hz":470000,"osc_c_max_f":3.96e-10,"osc_c_min_f":4.3e-11,"osc_f_max_hz":2063000,"osc_f_min_hz":1004000,` +
		`"pad_c_f":3.666e-10,"pad_l_h":0.0001308,"track_err_at_hz":1600000,"track_err_max_hz":-7708,` +
		`"track_f1_hz":591700,"track_f2_hz":1053000,"track_f3_hz":1509000,"track_fit1_hz":620900,"track_fit2_hz":905600}`
	if string(b) != want {
		t.Errorf("JSON\n%s\nwant\n%s", b, want)
	}
	// what encoding/json writes for the same map: the first output's shape
	m := map[string]float64{}
	for _, f := range mixerFigures() {
		for _, e := range f.Entries() {
			m[e.Key] = e.Value
		}
	}
	if ref, _ := json.Marshal(m); string(ref) != string(b) {
		t.Errorf("JSON differs from encoding/json's map:\n%s\n%s", b, ref)
	}
	if b, _ := json.Marshal(List(nil)); string(b) != "{}" {
		t.Errorf("no figures: %s", b)
	}
}

func TestListPutAndLookup(t *testing.T) {
	var l List
	l.Put(Figure{Name: "f", Unit: Hertz, Value: 1e6})
	l.Put(Figure{Name: "gain", Unit: Ratio, Value: -16.5})
	l.Put(Figure{Name: "gain", Unit: Decibel, Value: 24.3}) // another figure: the gain in decibels
	l.Put(Figure{Name: "f", Unit: Hertz, Value: 2e6})       // replaces in place
	l.Put(Figure{Name: "bad", Unit: Hertz, Value: math.NaN()})
	l.Put(Figure{Name: "bad2", Unit: Hertz, Range: &value.Range{Min: 1, Max: math.Inf(1)}})
	if len(l) != 3 || l[0].Value != 2e6 {
		t.Fatalf("list %+v", l)
	}
	for _, c := range []struct {
		key  string
		want float64
		ok   bool
	}{{"f_hz", 2e6, true}, {"gain", -16.5, true}, {"gain_db", 24.3, true}, {"bad_hz", 0, false}, {"f", 0, false}} {
		if v, ok := l.Lookup(c.key); v != c.want || ok != c.ok {
			t.Errorf("Lookup(%q) = %g, %v", c.key, v, ok)
		}
	}
	if f, ok := l.Get("gain"); !ok || f.Unit != Ratio {
		t.Errorf("Get(gain) = %+v, %v", f, ok)
	}
}

func TestOrigin(t *testing.T) {
	for _, c := range []struct {
		o    Origin
		want string
	}{
		{ByFormula("f = 1/(2π√(LC))"), "formula f = 1/(2π√(LC))"},
		{BySolver("V(o)/V(g)", "54.77 kHz"), "solver V(o)/V(g) at 54.77 kHz"},
		{FromNetlist("[freqs] if"), "netlist [freqs] if"},
	} {
		if got := c.o.String(); got != c.want {
			t.Errorf("%+v: %q, want %q", c.o, got, c.want)
		}
	}
}

// Every unit has a name, and all but a ratio a symbol; the key parts are
// distinct, so no two units give one JSON key.
func TestUnitTable(t *testing.T) {
	keys := map[string]Unit{}
	for _, u := range Units() {
		if u.String() == "unknown unit" || (u != Ratio && u.Symbol() == "") {
			t.Errorf("unit %d: name %q symbol %q", u, u.String(), u.Symbol())
		}
		if other, dup := keys[units[u].key]; dup {
			t.Errorf("%v and %v share the key part %q", u, other, units[u].key)
		}
		keys[units[u].key] = u
	}
}
