package stages

import (
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"pare/internal/reftool"
)

// The grid stopper's loss at the band's top is the solver's (the output
// electrode with the stopper against with it shorted, the device's typical
// input capacitances put in), flagged past 1 dB (common practice). Checked
// against ngspice on decks of the same circuits with those capacitances
// (rules/stages/testdata/stopper/, each naming its source): review17 a04's V3 stopper
// lifts its anode 0.20 dB at 20 kHz (no flag, where the formula once
// flagged a cut), review16 a03's audio stopper takes 1.30 dB at 15 kHz
// (flagged; its Miller corner, 39.2 kHz, gives 0.59 dB).
func TestStopperLossAgainstNgspice(t *testing.T) {
	cases := []struct {
		file, stopper, deck, out, rs string
		top                          float64
		flagged                      bool
	}{
		{"../testdata/review17/a04.toml", "R10", "review17-a04.cir", "v3_a", "10k", 20e3, false},
		{"../testdata/review16/a03.toml", "R9", "review16-a03.cir", "au_a", "47k", 15e3, true},
	}
	bin := reftool.Find(t, reftool.Ngspice)
	for _, tc := range cases {
		full, reduced, log := reduceExample(t, tc.file)
		st := find(t, reduced, Options{Full: full, ACGround: log.ACGround})
		s := stageWith(st, tc.stopper)
		if s == nil || s.Topology != "grid-stopper" {
			t.Fatalf("%s: %s in %v, want a grid stopper", tc.file, tc.stopper, s)
		}
		src, err := os.ReadFile(filepath.Join("testdata", "stopper", tc.deck))
		if err != nil {
			t.Fatal(err)
		}
		mag := func(rs string) float64 {
			body := strings.Replace(string(src), ".param rs="+tc.rs, ".param rs="+rs, 1)
			body, _, _ = strings.Cut(body, "\n.end\n")
			fs := strconv.FormatFloat(tc.top, 'g', 12, 64)
			deck := body + "\n.control\nset wr_singlescale\nset wr_vecnames\noption numdgt=12\nac lin 1 " + fs + " " + fs +
				"\nlet r = mag(v(" + tc.out + "))\nwrdata out.dat r\nquit\n.endc\n.end\n"
			sc := ngspiceData(t, bin, t.TempDir(), deck)
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
		want := 20 * math.Log10(mag("1m")/mag(tc.rs))
		got, ok := s.Figures.Get("cut_top")
		if !ok || math.Abs(got.Value-want) > 0.05 {
			t.Errorf("%s: %s's loss at %g Hz %+v (found %v), ngspice %.3f dB", tc.file, tc.stopper, tc.top, got.Value, ok, want)
		}
		flagged := slices.ContainsFunc(s.Flags, func(f string) bool { return strings.Contains(f, "cuts the signal") })
		if flagged != tc.flagged {
			t.Errorf("%s: flagged %v (%q), want %v for %.2f dB against the 1 dB threshold", tc.file, flagged, s.Flags, tc.flagged, want)
		}
	}
}
