package dc

import (
	"math"
	"strings"
	"testing"
)

// TestLawParametersListed: every parameter the DC laws use is listed under
// "law parameters" with where it came from, and the netlist can set it.
func TestLawParametersListed(t *testing.T) {
	cases := []struct {
		file, ref string
		params    []string
		from      string // prefix of From for every param
	}{
		{"testdata/law-params.toml", "V1", []string{"share", "mu2", "vknee", "kg"}, "given"},
		{"testdata/law-params.toml", "D1", []string{"n", "is"}, "given"},
		{"testdata/pentode-rc.toml", "V1", []string{"share", "mu2", "vknee", "kg"}, "default"},
		{"testdata/pentode-rc.toml", "V2", []string{"kg"}, "default"},
		{"testdata/pentode-rc.toml", "D1", []string{"n"}, "default"},
		{"testdata/rectifier-valve.toml", "V1", []string{"perveance"}, "default: perveance of one anode of a rectifier valve"},
	}
	for _, tc := range cases {
		pt, err := Solve(load(t, tc.file))
		if err != nil {
			t.Fatal(err)
		}
		for _, name := range tc.params {
			found := false
			for _, o := range pt.Origins {
				if o.Ref == tc.ref && o.Param == name {
					found = true
					if !strings.HasPrefix(o.From, tc.from) {
						t.Errorf("%s %s %s: from %q, want %q…", tc.file, tc.ref, name, o.From, tc.from)
					}
				}
			}
			if !found {
				t.Errorf("%s %s: %s not listed", tc.file, tc.ref, name)
			}
		}
	}
	// The diode's given law: V = n·VT·ln(I/Is + 1) at the current R5 passes,
	// derived by hand: (250 − V)/10 kΩ ≈ 24.9 mA, n 1.8, Is 5 nA gives 0.718 V
	// (Shockley; ngspice 39 .op on the same deck agrees, TestAgainstNgspiceOP).
	pt, err := Solve(load(t, "testdata/law-params.toml"))
	if err != nil {
		t.Fatal(err)
	}
	v, _ := pt.Volts("dx")
	i := (250 - v) / 10e3
	if want := 1.8 * VT * math.Log(i/5e-9+1); math.Abs(v-want) > 1e-6 || math.Abs(v-0.718) > 0.001 {
		t.Errorf("dx %.6f V, Shockley with n 1.8 gives %.6f V", v, want)
	}
}
