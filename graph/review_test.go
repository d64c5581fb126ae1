package graph

import (
	"strings"
	"testing"
)

// Defects found by a review with its own circuits: each is refused at load
// with the position of the mistake itself.

// TestValveTripleAgreement: a valve giving gm, ra and µ must have
// gm·ra = µ within 2 % (docs/devices.md, from µ = gm·ra, the triode
// relation in any valve handbook); outside that it is refused at the µ
// value, before verification.
func TestValveTripleAgreement(t *testing.T) {
	const valve = `V1 = { valve = "triode", pins = { a = "a", g1 = "in", k = "gnd" }, gm = "1.6m", ra = "10k", mu = %s }`
	cases := []struct {
		name, mu string
		ok       bool
	}{
		{"exact (1.6 mA/V × 10 kΩ = 16)", "16", true},
		{"1.9 % high, inside 2 %", "16.3", true},
		{"1.9 % low, inside 2 %", "15.7", true},
		{"2.5 % high, outside", "16.4", false},
		{"factor of six (the reviewer's file)", "100", false},
	}
	for _, c := range cases {
		src := head + strings.Replace(valve, "%s", c.mu, 1) + "\nR1 = { r = \"100k\", pins = [\"a\", \"gnd\"] }\n"
		if c.ok {
			if _, err := Parse("t.toml", []byte(src)); err != nil {
				t.Errorf("%s: refused: %v", c.name, err)
			}
			continue
		}
		// Line 3 is the valve; column 98 is the µ value (counted from the text).
		wantError(t, c.name, src, "3:98", "must agree within 2 %", "mu = "+c.mu)
	}
}

// TestKeyTwicePositions: a key given twice within one part is named, at its
// second place; a part written twice still names the part.
func TestKeyTwicePositions(t *testing.T) {
	cases := []struct{ name, src, at, word string }{
		{"key twice in an inline part", head + "T1 = { l = \"1m\", k = 0.1, q = 9, k = 0.2, pins = [\"a\", \"gnd\"] }\n", "3:34", "part T1: key k is written twice"},
		{"key twice in a part table", "band = \"1k..2k\"\n[parts.L1]\nl = \"1m\"\npins = [\"a\", \"gnd\"]\nl = \"2m\"\n", "5:1", "part L1: key l is written twice"},
		{"key inside a string is not the key", head + "L1 = { note = \"l = 1\", l = \"1m\", l = \"2m\", pins = [\"a\", \"gnd\"] }\n", "3:34", "part L1: key l is written twice"},
		{"part written twice", head + "R1 = { r = \"1k\", pins = [\"a\", \"gnd\"] }\nR1 = { r = \"2k\", pins = [\"a\", \"gnd\"] }\n", "4:1", "part R1 is written twice"},
	}
	for _, c := range cases {
		wantError(t, c.name, c.src, c.at, c.word)
	}
}

// TestInvalidUTF8Column: the column is that of the bad byte (counted in
// characters, as every column is), not of the string or comment holding it.
func TestInvalidUTF8Column(t *testing.T) {
	cases := []struct{ name, src, at string }{
		{"in a string", "title = \"Bench \xff amp\"\nband = \"1k..2k\"\n", "1:16"},
		{"after a µ in a string", "title = \"µF \xfe\"\nband = \"1k..2k\"\n", "1:13"},
		{"in a comment", "band = \"1k..2k\" # note \xff\n", "1:24"},
	}
	for _, c := range cases {
		wantError(t, c.name, c.src, c.at, "invalid UTF-8")
	}
}

// TestTerminalLimitPosition: the message for a net with too many terminals
// stands at the first entry past the limit in the file, whatever the order
// of the reference designators (C1000 sorts before C551 as text). The
// netlist is the reviewer's star, made here rather than kept (240 KB).
func TestTerminalLimitPosition(t *testing.T) {
	var b strings.Builder
	b.WriteString("band = \"1k..10k\"\ninputs = [\"a\"]\noutputs = [\"b\"]\n[parts]\n")
	b.WriteString("R1 = { r = \"1k\", pins = [\"a\",\"b\"] }\n") // line 5: b's first terminal
	for i := 2; i <= MaxTerminalsPerNet+1; i++ {
		b.WriteString("C" + itoa(i) + " = { c = \"1n\", pins = [\"b\",\"gnd\"] }\n")
	}
	// By construction part Ci stands on line i+4 and is b's i-th terminal,
	// so the 5001st is C5001 on line 5005, its "b" (the quote) at column 29.
	wantError(t, "star", b.String(), "5005:29", "net b has more than 5000 terminals")
}

// TestACGroundTerminalLimit: a net at AC ground may hold a terminal per
// part (a whole set's chassis: 10,000 parts put some 5,100 terminals on
// it, internal/synth's bank), past MaxTerminalsPerNet, and is refused at
// the first terminal past MaxTerminalsPerACGroundNet, with its position.
// Capacitors with both ends on the chassis put two terminals a line on it.
func TestACGroundTerminalLimit(t *testing.T) {
	const head = "band = \"1k..10k\"\ninputs = [\"a\"]\noutputs = [\"b\"]\n[parts]\nR1 = { r = \"1k\", pins = [\"a\",\"b\"] }\n"
	build := func(lines int) string {
		var b strings.Builder
		b.WriteString(head)
		for i := 2; i < lines+2; i++ {
			b.WriteString("C" + itoa(i) + " = { c = \"1n\", pins = [\"gnd\",\"gnd\"] }\n")
		}
		return b.String()
	}
	// Past the signal nets' limit, within the chassis's: it loads.
	if _, err := Parse("chassis.toml", []byte(build(MaxTerminalsPerNet))); err != nil {
		t.Fatalf("%d terminals on the chassis: %v", 2*MaxTerminalsPerNet, err)
	}
	// The chassis's 20,001st terminal is the first pin of the 10,001st
	// capacitor, C10002 on line 10006 (R1 on line 5), "gnd" at column 30.
	wantError(t, "chassis", build(MaxTerminalsPerACGroundNet/2+1), "10006:30", "net gnd has more than 20000 terminals")
}
