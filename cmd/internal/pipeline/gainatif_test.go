package pipeline

import (
	"math"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"pare/rules"
)

// TestGainAtIFBesideThePeak: review20 b05's 2nd IF stage (Q3 into T5, the
// detector's diode conducting at rest across T5's secondary) gives its gain
// at its load's own peak, and where that peak lies off the IF the note
// gives the gain at the IF as well. ngspice-39 on the blind reviewer's
// deck, testdata/review20/spice/b/c05.cir (its `ac lin` sweep, the ratio
// vm(q3_c)/vm(q3_b) read from the same run), gives a peak of 211.3 at
// 458.09 kHz and 196.52 at 455 kHz: the reviewer compared pare's peak
// figure (−211 at 458.2 kHz) with the deck's value at 455 kHz (196.5), and
// the two models agree at both frequencies. The peak sits 0.7 % above the
// can's own 454.9 kHz because the diode's low rd (212 Ω, the deck's gd
// 4.71 mS) across the 60 µH secondary takes inductance off the primary
// (reflected j·ω·M²·ωLs/(R² + (ωLs)²)).
//
// review20 b02's RF stage is the same reading: pare's ×279 is the stage's
// peak with the gang set so the RF tank peaks at the signal; the
// reviewer's 252 ("Q3's gm removed") and 233 (Q3 live) were read at
// 1.508 MHz with the gang fixed at 14 pF, where their RF tank peaks at
// 1.5029 MHz (271.3 there, Q3 as its rπ and ro) and 1.5019 MHz (255.2).
// pare's own exported deck at that gang gives 277.5 and 252.8 at the same
// peaks, within 2.3 % (the transistors' rπ and ro from pare's bias). Not
// a modelling difference: no change to the solve (docs/references.md §45).
func TestGainAtIFBesideThePeak(t *testing.T) {
	res, err := Run(Options{Path: filepath.Join("..", "..", "..", "testdata", "review20", "b05.toml"), Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	re := regexp.MustCompile(`the gain (-?[0-9.]+) is its peak at ([0-9.]+) kHz in circuit, [0-9.]+ % above the 455 kHz IF: .*; at the IF itself the gain is (-?[0-9.]+) as captured`)
	found := 0
	for _, s := range res.Stages {
		if !strings.HasPrefix(s.Title, "2nd IF amplifier") {
			continue
		}
		for _, n := range s.Notes {
			m := re.FindStringSubmatch(n)
			if m == nil {
				continue
			}
			found++
			for i, want := range []float64{-211.3, 458.09, -196.52} { // ngspice-39, c05.cir, above
				got, _ := strconv.ParseFloat(m[i+1], 64)
				if math.Abs(got-want) > 0.01*math.Abs(want) {
					t.Errorf("%s: figure %d reads %g, ngspice %g", s.Title, i+1, got, want)
				}
			}
			if !strings.Contains(n, "own parts tune it to 454.9 kHz, and what the tuned winding feeds moves the peak") {
				t.Errorf("note does not say the can's own tuning is at the IF: %q", n)
			}
		}
	}
	if found != 1 {
		t.Errorf("want one note on the 2nd IF stage giving its gain at the IF, found %d", found)
	}
	for _, s := range res.Stages {
		if strings.HasPrefix(s.Title, "1st IF amplifier") {
			for _, n := range s.Notes {
				if strings.Contains(n, "at the IF itself") {
					t.Errorf("1st IF stage peaks at the IF (454.9 kHz), yet: %q", n)
				}
			}
		}
	}
}
