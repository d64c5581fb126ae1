package stages

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"pare/graph/ac"
)

// frequencyChangerDeck is the example frequency changer's reduced circuit
// written by hand for ngspice, the valve made quiet as the tank figures
// solve it (its ra of 1 MΩ from cathode to anode, no transconductance), the
// aerial input held at 0 V (T1's primary to ground). Winding losses are the
// series ω0·L/Q the solver takes at the middle of each part's band
// (graph/ac): T1 at √(530k·1.6M) = 920.87 kHz (Q 80: 2.893 Ω and
// 18.80 Ω), L1 at √(1M·2.07M) = 1.43875 MHz (Q 90: 12.656 Ω, put on the
// upper section), T2 at √(455k·485k) = 469.76 kHz (30.78 Ω, 33.85 Ω).
// The tapped L1 is its two sections fully coupled, 0.12² and 0.88² of
// 126 µH. OUT marks the net the 1 A source drives and the sweep reads;
// CG is the gang section's capacitance.
const frequencyChangerDeck = `I1 0 out DC 0 AC 1
Lp aerial pa 40u
Rp pa 0 2.893
Ls rf_tank sa 260u
Rs sa 0 18.80
K1 Lp Ls 0.3
CG1 rf_tank 0 {CG}
CT1 rf_tank 0 23.6p
C1 rf_tank osc_g 4.7p
R1 osc_g 0 47k
C2 osc_tank osc_g 100p
La k1 0 1.8144u
Lb osc_tank lb 97.5744u
Rb lb k1 12.656
K2 La Lb 0.999999
C3 osc_tank osc_pad 390p
CG2 osc_pad 0 {CG}
CT2 osc_pad 0 36.3p
Rra k1 mix_a 1meg
Lt1 mix_a t1 1.147m
Rt1 t1 0 30.78
C4 mix_a 0 100p
Lt2 if_out t2 1.147m
Rt2 t2 0 33.85
K3 Lt1 Lt2 0.01
C5 if_out 0 100p
Vaerial aerial 0 DC 0 AC 0`

// ngspiceTank is the peak of |Z| at net (renamed "out" in the deck) with
// the gang at th, swept ±1 % around near in 4001 steps (5·10⁻⁶ each).
func ngspiceTank(t *testing.T, net string, th, near float64) float64 {
	t.Helper()
	cg := 12e-12 + th*(365e-12-12e-12) // the gang, linear in rotation as pare takes it
	deck := strings.ReplaceAll(frequencyChangerDeck, "{CG}", fmt.Sprintf("%.6gp", cg*1e12))
	deck = strings.NewReplacer(" "+net+" ", " out ", " "+net+"\n", " out\n").Replace(deck + "\n")
	f, v := ngspiceSweep(t, deck, fmt.Sprintf("lin 4001 %g %g", near*0.99, near*1.01))
	fp, _ := peak(f, v)
	if fp == f[0] || fp == f[len(f)-1] {
		t.Fatalf("%s at gang %.2f: ngspice peak at the edge of %g..%g Hz", net, th, f[0], f[len(f)-1])
	}
	return fp
}

// ngspiceOscLoop is where the example's oscillator runs at gang setting
// th: the deck with V1's 2.2 mA/V (the example's gm, grid osc_g, cathode
// k1, anode mix_a) driven from an independent 1 V and the 1 A source off,
// the 0° crossing of V(osc_g) − V(k1) nearest near.
func ngspiceOscLoop(t *testing.T, th, near float64) float64 {
	t.Helper()
	cg := 12e-12 + th*(365e-12-12e-12)
	deck := strings.ReplaceAll(frequencyChangerDeck, "{CG}", fmt.Sprintf("%.6gp", cg*1e12))
	deck = strings.Replace(deck, "I1 0 out DC 0 AC 1", "I1 0 osc_tank DC 0 AC 0", 1)
	deck += "\nGl mix_a k1 gt 0 2.2m\nVt gt 0 DC 0 AC 1\n"
	return ngspiceLoopAt(t, deck, fmt.Sprintf("lin 4001 %g %g", near*0.99, near*1.01), "osc_g", "k1", near)
}

// The example frequency changer's tracking in circuit against ngspice 39
// .ac on the hand-written deck above: at five gang settings each tank's
// peak is where pare's solver finds it (within 10⁻⁴, two sweep steps and
// the tapped coil's loss placement), the worst tracking error pare reports
// (at the bottom of the dial, full capacitance) is ngspice's there, and
// each crossing pare reports lies between settings where ngspice's error
// changes sign. The oscillator's frequency in the error is where V1's loop
// phase is 0° (ngspiceOscLoop), as the walk takes it: 215 Hz above its
// tank's peak at full capacitance.
func TestTrackingInCircuitAgainstNgspice(t *testing.T) {
	full, reduced, log := reduceExample(t, "frequency-changer.toml")
	mix := stageOf(find(t, reduced, Options{Full: full, ACGround: log.ACGround}), "self-oscillating-mixer")
	if mix == nil {
		t.Fatal("no self-oscillating mixer")
	}
	q := quiet(reduced)
	ths := []float64{0, 0.1, 0.4, 0.9, 1}
	var fsig, errs []float64
	for _, th := range ths {
		var got [2]float64
		for i, net := range []string{"rf_tank", "osc_tank"} {
			f, ok := tankAt(ac.NewResponses(q), tankNets{hot: net}, th, 1.2e6)
			if !ok {
				t.Fatalf("%s at gang %.2f: no peak from pare's solver", net, th)
			}
			ng := ngspiceTank(t, net, th, f)
			if math.Abs(f-ng) > 1e-4*ng {
				t.Errorf("%s at gang %.2f: pare %.1f Hz, ngspice %.1f Hz", net, th, f, ng)
			}
			got[i] = ng
			if net == "osc_tank" { // the walk reads the oscillator where its loop runs
				got[i] = ngspiceOscLoop(t, th, ng)
			}
		}
		fsig, errs = append(fsig, got[0]), append(errs, got[1]-got[0]-470e3)
	}
	worst, _ := mix.Figures.Get("track_err_max")
	if math.Abs(worst.Value-errs[len(errs)-1]) > 300 || math.Abs(worst.At.Value-fsig[len(fsig)-1]) > 300 {
		t.Errorf("track err max %.0f Hz at %.0f Hz; ngspice at full capacitance %.0f Hz at %.0f Hz",
			worst.Value, worst.At.Value, errs[len(errs)-1], fsig[len(fsig)-1])
	}
	fits, _ := mix.Figures.Get("track_fit")
	if len(fits.Points) != 3 {
		t.Fatalf("track_fit %v: want three crossings", fits.Points)
	}
	for i := 0; i < 3; i++ {
		lo, hi := fsig[i+1], fsig[i] // the dial runs down as the gang closes
		if errs[i]*errs[i+1] >= 0 {
			t.Errorf("ngspice error %.0f Hz at %.0f Hz and %.0f Hz at %.0f Hz: no sign change", errs[i], hi, errs[i+1], lo)
		}
		if p := fits.Points[2-i]; p < lo || p > hi {
			t.Errorf("crossing %.0f Hz not between %.0f and %.0f Hz where ngspice's error changes sign", p, lo, hi)
		}
	}
	t.Logf("ngspice: fsig %v Hz, error %v Hz", fsig, errs)
}
