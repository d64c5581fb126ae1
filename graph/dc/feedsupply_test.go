package dc

import "testing"

// A valve diode takes the rectifier valve's law where its wiring says it
// charges a supply, however it is fed: the AC/DC set's half-wave rectifier
// straight off the mains (no winding, so no rectifier estimate) is one; a
// double-diode-triode's detector and AGC diodes on the triode's bypassed
// cathode are not (near miss: a large capacitor on the cathode net, but an
// amplifier's cathode is there), nor a diode detector into a small load.
// The defaults' sources: Defaults ("rectifier valve" and "valve diode").
func TestValveDiodeClassByWiring(t *testing.T) {
	cases := []struct {
		file, ref string
		want      string
	}{
		{"testdata/acdc-feed.toml", "V1", "rectifier valve"},
		{"../../testdata/review22/a05.toml", "V5", "rectifier valve"},
		{"testdata/rectifier-valve.toml", "", "rectifier valve"}, // the winding-fed one, found by its estimate
		{"../../testdata/review13/a03.toml", "V2a", valveDiodeClass},
		{"../../testdata/review12/c05.toml", "V2a", valveDiodeClass},
	}
	for _, tc := range cases {
		c := load(t, tc.file)
		r, err := Solve(c)
		if err != nil {
			t.Fatalf("%s: %v", tc.file, err)
		}
		found := false
		for _, o := range r.Origins {
			if o.Param != "perveance" || tc.ref != "" && o.Ref != tc.ref {
				continue
			}
			found = true
			if want := "default: " + sourceOf(tc.want, "perveance"); o.From != want {
				t.Errorf("%s %s: perveance from %q, want %q", tc.file, o.Ref, o.From, want)
			}
		}
		if !found {
			t.Errorf("%s: no perveance origin for %q", tc.file, tc.ref)
		}
	}
}
