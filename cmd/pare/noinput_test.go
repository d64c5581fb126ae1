package main

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// One triode stage captured with no input or output declared (invented):
// µ 20, ra 10 kΩ, anode load 47 kΩ.
const noInputTriode = `band = "20..20k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "a1", g1 = "g", k = "gnd" }, mu = 20, ra = "10k" }
R2 = { r = "47k", pins = ["ht", "a1"] }
`

// Without a declared input, sweep drives the first active part's control
// and observes the far end of the chain, and says so; spice drives the same
// net and says so in the deck.
func TestSweepAndSpiceWithoutDeclaredInput(t *testing.T) {
	path := writeTemp(t, "noin.toml", noInputTriode)
	code, out, errs := cliRun(t, "sweep", path, "--csv", "--points", "2", "--band", "1k..2k")
	if code != exitOK {
		t.Fatalf("sweep: exit %d, stderr %q", code, errs)
	}
	// Gain −µRL/(ra+RL) = −20·47k/57k = −16.491, 24.345 dB (docs/references.md §5).
	rows := strings.Split(strings.TrimSpace(out), "\n")
	if len(rows) < 2 {
		t.Fatalf("sweep csv:\n%s", out)
	}
	db, err := strconv.ParseFloat(strings.Split(rows[1], ",")[1], 64)
	if err != nil || math.Abs(db-24.345) > 0.01 {
		t.Errorf("gain %v dB (%v), want 24.345 dB:\n%s", db, err, out)
	}
	code, out, errs = cliRun(t, "sweep", path, "--points", "2", "--band", "1k..2k")
	if code != exitOK || !strings.Contains(out, "V(a1)/V(g)") || !strings.Contains(out, "no input declared: driving g, the control of V1") {
		t.Errorf("sweep table: exit %d, stderr %q, out:\n%s", code, errs, out)
	}
	deck := filepath.Join(t.TempDir(), "x.cir")
	code, _, errs = cliRun(t, "spice", path, "-o", deck)
	b, _ := os.ReadFile(deck)
	if code != exitOK || !strings.Contains(string(b), "* Driven at g (V1's control") {
		t.Errorf("spice: exit %d, stderr %q, deck:\n%s", code, errs, b)
	}
}
