package stages

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/internal/reftool"
)

// A blind reviewer's push-pull pentodes (testdata/review17/a04.toml): each
// anode on half the output transformer, loaded by the reflected load and
// the overall feedback. The stopper's Miller gain is the valve's
// grid-to-anode gain in circuit at the middle of its band (30 Hz..20 kHz:
// 774.6 Hz); the reviewer's ngspice deck (testdata/review17/spice/a/
// c04-closed.cir) gives 40.7 for V3 at 1 kHz and 38.0 at 774.6 Hz. The old
// figure, read at 20 kHz where the transformer's leakage inductance lifts
// the anode load, was 307 and flagged a cut at 98 kHz that the circuit does
// not make. The coupling capacitor C3 into the cathodyne's bootstrapped
// grid leak works into more than its resistors: the words must say the
// resistance is raised, not that V2 draws current.
func TestMillerGainReview17(t *testing.T) {
	full, reduced, log := reduceExample(t, "../testdata/review17/a04.toml")
	st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
	deck := filepath.Join("..", "..", "testdata", "review17", "spice", "a", "c04-closed.cir")
	f := math.Sqrt(30 * 20e3)
	cases := []struct {
		stopper, anode, grid string
	}{
		{"R10", "v3_a", "v3_g"},
		{"R11", "v4_a", "v4_g"},
	}
	for _, c := range cases {
		s := stageWith(st, c.stopper)
		if s == nil || s.Topology != "grid-stopper" {
			t.Fatalf("%s in %v, want a grid stopper", c.stopper, s)
		}
		want := deckRatio(t, deck, c.anode, c.grid, f)
		if got := fig(s.Figures, "gain_miller"); math.Abs(got/want-1) > 0.02 {
			t.Errorf("%s: Miller gain %g, ngspice %g at %g Hz", c.stopper, got, want, f)
		}
		if len(s.Flags) != 0 {
			t.Errorf("%s: flags %q, want none (corner far above 20 kHz)", c.stopper, s.Flags)
		}
	}
	s := stageWith(st, "C3")
	fc, ok := s.Figures.Get("f_c")
	if s == nil || !ok || fc.Check == nil {
		t.Fatalf("C3's corner with no formula beside it: %v", s)
	}
	if !strings.Contains(fc.Why, "raises the resistance") || strings.Contains(fc.Why, "draws current") {
		t.Errorf("C3's corner explained as %q, want the resistance raised", fc.Why)
	}
}

// deckRatio is |V(num)/V(den)| at f of an ngspice deck file, its own
// control block replaced by one that writes that ratio.
func deckRatio(t *testing.T, path, num, den string, f float64) float64 {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	body, _, _ := strings.Cut(string(src), ".control")
	fs := strconv.FormatFloat(f, 'g', 12, 64)
	deck := body + ".control\nset wr_singlescale\nset wr_vecnames\noption numdgt=12\nac lin 1 " + fs + " " + fs +
		"\nlet r = mag(v(" + num + ")/v(" + den + "))\nwrdata out.dat r\nquit\n.endc\n.end\n"
	sc := ngspiceData(t, reftool.Find(t, reftool.Ngspice), t.TempDir(), deck)
	if !sc.Scan() {
		t.Fatal("ngspice data has no row")
	}
	cols := strings.Fields(sc.Text())
	v, err := strconv.ParseFloat(cols[len(cols)-1], 64)
	if err != nil {
		t.Fatal(err)
	}
	return v
}
