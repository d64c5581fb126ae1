package rules

import (
	"strings"
	"testing"
)

// A pentode with its screen decoupled, suppressor on the cathode, shield to
// chassis and heater on the heater rail keeps a, g1, k only.
const pentodeFixture = `
band = "455k..485k"
inputs = ["g"]
outputs = ["a"]
[nets]
ht = { role = "supply", volts = 250 }
hx = { role = "heater" }
[parts]
V1 = { valve = "pentode", pins = { a = "a", g1 = "g", g2 = "scr", g3 = "k", k = "k", h1 = "hx", h2 = "gnd", s = "gnd" }, gm = "2.2mA/V" }
R1 = { r = "1M", pins = ["g", "gnd"] }
R2 = { r = "33k", pins = ["ht", "scr"], note = "screen feed" }
C2 = { c = "100n", pins = ["scr", "gnd"] }
R3 = { r = "150", pins = ["k", "gnd"] }
C3 = { c = "100n", pins = ["k", "gnd"] }
R4 = { r = "10k", pins = ["a", "ht"] }
`

func TestStaticElectrodes(t *testing.T) {
	r, log := reduceChecked(t, parse(t, pentodeFixture), Options{Level: LevelSignal})
	v := r.Part("V1")
	var live []string
	for _, pin := range v.Pins {
		if pin.Net != "nc" {
			live = append(live, pin.Name+"="+pin.Net)
		}
	}
	// common practice: screen at AC ground, suppressor on the cathode, heaters and shield carry no signal.
	if got := strings.Join(live, " "); got != "a=a g1=g k=gnd" {
		t.Errorf("V1 keeps %q, want a, g1, k (k at AC ground through C3)\n%s", got, logText(log))
	}
	var dropped []string
	for _, s := range stepsOf(log, "static-electrode") {
		dropped = append(dropped, s.Pins...)
		if !strings.Contains(s.Why, "keeps") {
			t.Errorf("the why must say what the device keeps: %s", s.Why)
		}
	}
	for _, want := range []string{"V1.g2", "V1.g3", "V1.h1", "V1.h2", "V1.s"} {
		if !contains(dropped, want) {
			t.Errorf("%s not dropped; dropped %v", want, dropped)
		}
	}
	// required electrodes go to "nc" so the written netlist still loads; optional ones go entirely
	if v.Pin("h1") != nil || v.Pin("s") != nil {
		t.Errorf("heater and shield pins should be removed from V1: %v", v.Pins)
	}
	if p := v.Pin("g2"); p == nil || p.Net != "nc" {
		t.Errorf("g2 should be written as not connected: %v", v.Pins)
	}
	for _, ref := range []string{"R2", "C2", "R3", "C3"} {
		if r.Part(ref) != nil {
			t.Errorf("%s should have gone (screen feed, screen bypass, cathode resistor and bypass)", ref)
		}
	}
}

// At tidy level nothing about the valve changes.
func TestStaticElectrodesNotAtTidy(t *testing.T) {
	r, log := reduceChecked(t, parse(t, pentodeFixture), Options{Level: LevelTidy})
	if len(r.Part("V1").Pins) != 8 || len(stepsOf(log, "static-electrode")) != 0 {
		t.Fatalf("tidy must leave the valve alone:\n%s", logText(log))
	}
}

// A valve marked keep stays as drawn, electrodes and all.
func TestStaticElectrodesKeep(t *testing.T) {
	src := strings.Replace(pentodeFixture, `gm = "2.2mA/V" }`, `gm = "2.2mA/V", keep = true }`, 1)
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	if len(r.Part("V1").Pins) != 8 || len(stepsOf(log, "static-electrode")) != 0 {
		t.Fatalf("a kept valve lost electrodes:\n%s", logText(log))
	}
}
