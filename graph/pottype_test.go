package graph

import (
	"bytes"
	"strings"
	"testing"
)

// A pot says whether it is a control or a preset (docs/netlist.md); the
// type survives a write and a load, and a slip gets the types listed at
// the key's position.
func TestPotType(t *testing.T) {
	src := "band = \"20..20k\"\n[parts]\nRV1 = { pot = \"100R\", set = 0.3, type = \"preset\", pins = [\"a\", \"b\", \"b\"] }\nRV2 = { pot = \"500k\", pins = [\"x\", \"y\", \"gnd\"] }\n"
	c, err := Parse("p.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	back, text := roundTrip(t, c)
	for ref, want := range map[string]string{"RV1": PotPreset, "RV2": ""} {
		if got := back.Part(ref).Type; got != want {
			t.Errorf("%s after a round trip: type %q, want %q\n%s", ref, got, want, text)
		}
	}
	_, err = Parse("p.toml", []byte("band = \"20..20k\"\n[parts]\nRV1 = { pot = \"100R\", type = \"prest\", pins = [\"a\", \"b\", \"b\"] }\n"))
	if want := `p.toml:3:30: unknown pot type "prest" (did you mean "preset"?); types: control, preset`; err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("bad pot type: error %v, want %q", err, want)
	}
}

// roundTrip writes c and loads it back, failing the test when the written
// netlist does not load; it returns the circuit and the text written.
func roundTrip(t *testing.T, c *Circuit) (*Circuit, string) {
	t.Helper()
	var b bytes.Buffer
	if err := Write(&b, c); err != nil {
		t.Fatal(err)
	}
	back, err := Parse("back.toml", b.Bytes())
	if err != nil {
		t.Fatalf("written netlist does not load: %v\n%s", err, b.String())
	}
	return back, b.String()
}
