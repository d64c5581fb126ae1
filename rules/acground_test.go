package rules

import (
	"strings"
	"testing"
)

const railsFixture = `
band = "530k..1.6M"
inputs = ["g"]
outputs = ["a"]
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
hx = { role = "heater", label = "6.3 V~" }
bias = { role = "bias", volts = -2 }
chassis = { role = "ground" }
[parts]
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "chassis", h1 = "hx", h2 = "gnd" } }
R1 = { r = "47k", pins = ["a", "ht"] }
R2 = { r = "1M", pins = ["g", "bias"] }
`

func TestRailsAreACGround(t *testing.T) {
	cases := []struct {
		level    Level
		grounded []string // nets the log says were grounded (rail-ground), sorted
		joined   bool     // chassis joined into gnd
	}{
		{LevelTidy, nil, true},
		{LevelSignal, []string{"bias", "ht", "hx"}, true},
	}
	for _, tc := range cases {
		t.Run(tc.level.String(), func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, railsFixture), Options{Level: tc.level})
			var got []string
			for _, s := range stepsOf(log, "rail-ground") {
				got = append(got, s.Grounded...)
				if !strings.Contains(s.Why, "assumes") {
					t.Errorf("the why must state its assumption: %s", s.Why)
				}
			}
			if strings.Join(got, ",") != strings.Join(tc.grounded, ",") {
				t.Errorf("grounded %v, want %v\n%s", got, tc.grounded, logText(log))
			}
			if (r.Net("chassis") == nil) != tc.joined {
				t.Errorf("chassis joined = %v, want %v", r.Net("chassis") == nil, tc.joined)
			}
			if tc.level >= LevelSignal {
				for _, n := range []string{"bias", "ht", "hx", "chassis", "gnd"} {
					if !contains(log.ACGround, n) {
						t.Errorf("Log.ACGround %v lacks %s", log.ACGround, n)
					}
				}
				if r.Part("R1").Pins[1].Net != "gnd" {
					t.Errorf("the anode load should now go to gnd: %v", r.Part("R1").Pins)
				}
			}
		})
	}
}

// A declared output keeps its signal even if someone gave it a rail's role.
func TestRailThatIsAnEnd(t *testing.T) {
	src := strings.Replace(railsFixture, `outputs = ["a"]`, `outputs = ["a", "ht"]`, 1)
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if r.Net("ht") == nil {
		t.Fatalf("ht is a declared output and must not be grounded:\n%s", logText(log))
	}
}
