package stages

import (
	"fmt"
	"math"
	"strings"
	"testing"

	model "pare/graph/device"
)

// An amplifier stage's Zin and Zout in circuit against ngspice 39 .ac on
// hand-written decks of the reduced fixtures, at each stage's band centre
// √(20·20k) = 632.456 Hz: 1 A into the net, |V| read there. The driver's
// coupling capacitor is cut for Zin (the stage as its driver sees it).
// Devices as pare's model gives them (docs/devices.md): the triode's µ 100
// and ra 62.5 kΩ as given, gm = µ/ra = 1.6 mA/V; the BJT's gm = Ic/VT
// (docs/references.md §5), rπ = β/gm, ro = VA/Ic with the default Early
// voltage of 100 V (graph/device defaults).
func TestStageImpedancesAgainstNgspice(t *testing.T) {
	gm := 1e-3 / model.VT
	bjt := fmt.Sprintf("Rpi b 0 %.9g\nG1 c 0 b 0 %.9g\nRo c 0 100k\n", 100/gm, gm)
	triode := "G1 a 0 g 0 1.6m\nRra a 0 62.5k\n"
	cases := []struct {
		fixture, topology, fig, net, deck string
	}{
		// the grid draws nothing: the grid leak alone
		{"triode-stage.toml", "amp-common", "z_in", "g", "R1 g 0 1meg\nR2 a 0 100k\n" + triode},
		// anode load ∥ ra, the grid held by C1 to the input source
		{"triode-stage.toml", "amp-common", "z_out", "a", "Vin in 0 DC 0 AC 0\nC1 in g 22n\nR1 g 0 1meg\nR2 a 0 100k\n" + triode},
		// 18 kΩ ∥ rπ (2.585 kΩ)
		{"incircuit-rpi.toml", "amp-common", "z_in", "b", "R1 b 0 18k\nR2 c 0 4.7k\n" + bjt},
		// 4.7 kΩ ∥ ro
		{"incircuit-rpi.toml", "amp-common", "z_out", "c", "Vin in 0 DC 0 AC 0\nC1 in b 1u\nR1 b 0 18k\nR2 c 0 4.7k\n" + bjt},
	}
	for _, c := range cases {
		t.Run(c.fixture+"/"+c.fig, func(t *testing.T) {
			_, st := reduceFixture(t, c.fixture)
			s := stageOf(st, c.topology)
			if s == nil {
				t.Fatalf("no %s", c.topology)
			}
			got, ok := s.Figures.Get(c.fig)
			if !ok || got.Check == nil {
				t.Fatalf("%s %+v: want the solver's with its formula beside it", c.fig, got)
			}
			deck := "I1 0 out DC 0 AC 1\n" + strings.NewReplacer(" "+c.net+" ", " out ").Replace(c.deck)
			_, v := ngspiceSweep(t, deck, "lin 2 632.456 632.457")
			if math.Abs(got.Value-v[0]) > 1e-4*v[0] {
				t.Errorf("%s: pare %.6g Ω, ngspice %.6g Ω", c.fig, got.Value, v[0])
			}
			t.Logf("%s: pare %.6g Ω (formula %.6g Ω), ngspice %.6g Ω", c.fig, got.Value, got.Check.Value, v[0])
		})
	}
}

// The frequency changer's RF tank (S1) loaded in circuit: its Q at mid
// travel from the −3 dB points of |Z| across T1's secondary, against the
// same read off ngspice 39 .ac on the hand-written deck of
// TestTrackingInCircuitAgainstNgspice with the gang at 188.5 pF.
func TestLoadedQAgainstNgspice(t *testing.T) {
	full, reduced, log := reduceExample(t, "frequency-changer.toml")
	s := stageOf(find(t, reduced, Options{Full: full, ACGround: log.ACGround}), "tuned-winding")
	if s == nil {
		t.Fatal("no RF tank")
	}
	q, ok := s.Figures.Get("q_loaded")
	if !ok || q.Check == nil || q.Check.Value != 80 { // T1's q in the netlist
		t.Fatalf("q_loaded %+v: want the solver's beside the winding's q 80", q)
	}
	deck := strings.ReplaceAll(frequencyChangerDeck, "{CG}", "188.5p")
	deck = strings.NewReplacer(" rf_tank ", " out ").Replace(deck + "\n")
	f, v := ngspiceSweep(t, deck, "lin 8001 600k 900k")
	fp, _ := peak(f, v)
	ng := fp / band3dB(f, v)
	if math.Abs(q.Value-ng) > 0.01*ng { // 37.5 Hz steps on a band of about 14 kHz
		t.Errorf("loaded Q: pare %.2f, ngspice %.2f", q.Value, ng)
	}
	t.Logf("loaded Q: pare %.3f, ngspice %.3f (winding q %g)", q.Value, ng, q.Check.Value)
}
