package stages

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// clubVariant is the club receiver with its MW oscillator coil L1, padder
// C12 and trimmer TC6 changed, reduced and its stages found.
func clubVariant(t *testing.T, l1, cp, tc6 string) *Stage {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "club-receiver.toml"))
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	for _, r := range [][2]string{{`L1 = { l = "`, l1}, {`C12 = { c = "`, cp}, {`TC6 = { c = "10p..70p", set = "`, tc6}} {
		i := strings.Index(text, r[0])
		if i < 0 {
			t.Fatalf("%q not in the example", r[0])
		}
		j := i + len(r[0]) + strings.Index(text[i+len(r[0]):], `"`)
		text = text[:i+len(r[0])] + r[1] + text[j:]
	}
	path := filepath.Join(t.TempDir(), "club.toml")
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	mix := stageOf(findReduced(t, c), "self-oscillating-mixer")
	if mix == nil {
		t.Fatal("no self-oscillating mixer")
	}
	return mix
}

// clubPairPeak is ngspice's largest |Z| across net (mix_tank or osc_tank)
// on testdata/club-track/mw_pair.cir with the gang at least capacitance.
func clubPairPeak(t *testing.T, net, l1, cp, tc6 string) float64 {
	t.Helper()
	deck, err := os.ReadFile(filepath.Join("testdata", "club-track", "mw_pair.cir"))
	if err != nil {
		t.Fatal(err)
	}
	d := strings.Replace(string(deck), "l1=109.3u", "l1="+l1, 1)
	d = strings.Replace(d, "cp=487p", "cp="+cp, 1)
	d = strings.Replace(d, "tc6=43.75p", "tc6="+tc6, 1)
	if net == "osc_tank" {
		d = strings.Replace(d, "isig=1 iosc=0", "isig=0 iosc=1", 1)
		d = strings.Replace(d, "Eout out 0 mix_tank", "Eout out 0 osc_tank", 1)
	}
	f, v := ngspiceSweep(t, d, "lin 20001 700k 2.6Meg")
	fp, _ := peak(f, v)
	return fp
}

// The tracking walk must keep each ganged tank on its own resonance. The
// signal tank and the oscillator are coupled (C9, V2's grid), so each
// tank's |Z| also peaks at its partner's resonance; with L1 115 µH, C12
// 380 pF and TC6 50 pF the oscillator's resonance stood inside the window searched for the
// signal tank at the top of the dial, both tanks were read on it, and the
// walk reported −481.5 kHz at a signal frequency of 1.73 MHz, above the
// top of the signal tank's travel. Check values: ngspice .ac on
// testdata/club-track/mw_pair.cir at least capacitance (the signal tank's
// top, each tank's largest |Z|): the worst error's signal frequency cannot
// lie above that top, and the worst error over the dial is at least the
// error there.
func TestTrackingWalkKeepsEachTankOnItsOwnResonance(t *testing.T) {
	for _, tc := range []struct{ l1, cp, tc6 string }{
		{"109.3u", "487p", "43.75p"}, // as captured
		{"127u", "380p", "35p"},      // an earlier capture, 33 kHz out near 1 MHz
		{"115u", "380p", "50p"},      // the walk locked both tanks on the oscillator's resonance
		{"100u", "380p", "50p"},
	} {
		t.Run(tc.l1+"/"+tc.cp+"/"+tc.tc6, func(t *testing.T) {
			mix := clubVariant(t, tc.l1, tc.cp, tc.tc6)
			e, ok := mix.Figures.Get("track_err_max")
			if !ok || e.At == nil {
				t.Fatalf("no tracking figure: %v", mix.Figures)
			}
			fs := clubPairPeak(t, "mix_tank", tc.l1, tc.cp, tc.tc6)
			fo := clubPairPeak(t, "osc_tank", tc.l1, tc.cp, tc.tc6)
			top := fo - fs - 470e3
			msg := fmt.Sprintf("pare worst %.0f Hz at %.0f Hz; ngspice at least capacitance: signal %.0f Hz, oscillator %.0f Hz, error %.0f Hz", e.Value, e.At.Value, fs, fo, top)
			if e.At.Value > fs*1.002 {
				t.Errorf("worst error read above the signal tank's top: %s", msg)
			}
			if math.Abs(e.Value) < math.Abs(top)-0.002*fs {
				t.Errorf("worst error smaller than the error at the top of the dial: %s", msg)
			}
			t.Log(msg)
		})
	}
}
