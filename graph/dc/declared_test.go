package dc

import (
	"strings"
	"testing"

	"pare/graph"
)

// TestChartDeclaredCurrentsAndRails: the chart says when a solved anode or
// collector current stands more than 30 % from the ia or ic the netlist
// declares (production spread, common practice), or when the part is cut
// off as captured; and a supply net without volts gets a note only when no
// rail feeds it through a resistor, choke or winding. The triode's current
// follows the three-halves law pare fits at (gm, ia) (docs/dc.md): with
// its cathode resistor 1 kΩ the bias settles near the fit point, with 10 Ω
// the grid sits nearly at the cathode and the current is well above it.
func TestChartDeclaredCurrentsAndRails(t *testing.T) {
	const head = "title = \"t\"\nband = \"20..20k\"\n[nets]\ngnd = { role = \"ground\" }\nht = { role = \"supply\", volts = 250 }\n"
	for _, tc := range []struct {
		name, nets, parts string
		want, not         []string
	}{
		{"near its point", "", `V1 = { valve = "triode", gm = "2mA/V", ia = "2mA", mu = 50, pins = { a = "a", g1 = "g", k = "k" } }
R1 = { r = "47k", pins = ["ht", "a"] }
R2 = { r = "1M", pins = ["g", "gnd"] }
R3 = { r = "1k5", pins = ["k", "gnd"] }`, nil, []string{"current solves"}},
		{"far above its point", "", `V1 = { valve = "triode", gm = "2mA/V", ia = "0.5mA", mu = 50, pins = { a = "a", g1 = "g", k = "k" } }
R1 = { r = "22k", pins = ["ht", "a"] }
R2 = { r = "1M", pins = ["g", "gnd"] }
R3 = { r = "10R", pins = ["k", "gnd"] }`, []string{"V1 anode current solves to", "from the 500 µA the netlist gives as ia"}, nil},
		{"cut off", "", `Q1 = { bjt = "npn", ic = "1mA", pins = { b = "gnd", c = "c", e = "gnd" } }
R1 = { r = "4k7", pins = ["ht", "c"] }`, []string{"Q1 collector current solves to nothing (the part is cut off as captured)"}, nil},
		{"rail fed through a choke", "ht2 = { role = \"supply\" }\n", `L1 = { l = "10", rdc = "250R", pins = ["ht", "ht2"] }
C1 = { c = "32u", pins = ["ht2", "gnd"] }
R1 = { r = "10k", pins = ["ht2", "gnd"] }`, nil, []string{"rail ht2"}},
		// A declared 9 V rail fed from ht through a dropper and held by a
		// zener: ht gives (250 − 9)/10k = 24.1 mA, the load takes 9 mA, so
		// the rail sinks 15.1 mA, which in the set D1 carries (Ohm's law).
		{"rail a zener holds", "vz = { role = \"supply\", volts = 9 }\n", `R1 = { r = "10k", pins = ["ht", "vz"] }
D1 = { diode = "zener", pins = ["gnd", "vz"] }
R2 = { r = "1k", pins = ["vz", "gnd"] }`, []string{"rail vz is held at its declared voltage and takes in 15.1 mA", "shunt regulator D1"}, nil},
		// The same rail drawing more than the dropper gives: no warning.
		{"rail a zener holds, loaded", "vz = { role = \"supply\", volts = 9 }\n", `R1 = { r = "10k", pins = ["ht", "vz"] }
D1 = { diode = "zener", pins = ["gnd", "vz"] }
R2 = { r = "100", pins = ["vz", "gnd"] }`, nil, []string{"takes in"}},
		{"rail nothing feeds", "ht2 = { role = \"supply\" }\n", `C1 = { c = "32u", pins = ["ht2", "gnd"] }
R1 = { r = "10k", pins = ["ht2", "gnd"] }`, []string{"rail ht2 declares no volts and no rail feeds it"}, nil},
	} {
		c, err := graph.Parse(tc.name+".toml", []byte(head+tc.nets+"[parts]\n"+tc.parts))
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		pt, err := Solve(c)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		ch, err := pt.Chart(Meter{})
		if err != nil {
			t.Fatal(err)
		}
		all := strings.Join(ch.Warnings, "\n")
		for _, w := range tc.want {
			if !strings.Contains(all, w) {
				t.Errorf("%s: no warning %q in\n%s", tc.name, w, all)
			}
		}
		for _, w := range tc.not {
			if strings.Contains(all, w) {
				t.Errorf("%s: unwanted warning %q in\n%s", tc.name, w, all)
			}
		}
	}
}
