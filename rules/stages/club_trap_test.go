package stages

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"testing"

	"pare/graph"
)

// The club receiver's IF trap and long-wave aerial tank, with each coil's q
// referred to the tank it tunes (graph.Circuit.ReferQ): L4 with C1 at
// 469.94 kHz, the LW coils at their own range near 208 kHz, not the MW
// band's centre. Check values: ngspice on testdata/club-trap/aerial.cir (the
// aerial side by hand): MW, the least |Z| at the aerial 471.47 kHz and the
// trap's depth (|Z| without L4 over with it) 8.137 dB; LW (every wafer at 2,
// the aerial held by its source), the aerial tank's f0/(f2 − f1) of |Z| at
// the V1 grid 52.62, gang at mid travel. Referred to the MW centre the trap
// read 4.6 dB and the LW tank Q 11.9.
func TestClubReceiverTrapAndLongWaveQ(t *testing.T) {
	mw := clubStages(t, false)
	trap := stageOf(mw, "series-trap")
	if trap == nil {
		t.Fatalf("no trap: %s", topologies(mw))
	}
	checkFig(t, trap, "f_notch", 471.47e3, 0.001*471.47e3) // ngspice aerial.cir, 0.1 %
	checkFig(t, trap, "notch_depth", 8.137, 0.1)           // ngspice aerial.cir, 0.1 dB
	lw := clubStages(t, true)
	var tank *Stage
	for i := range lw {
		if lw[i].Topology == "tuned-winding" && slices.Contains(lw[i].Parts, "T2") {
			tank = &lw[i]
		}
	}
	if tank == nil {
		t.Fatalf("no LW aerial tank: %s", topologies(lw))
	}
	checkFig(t, tank, "q_loaded", 52.62, 0.01*52.62) // ngspice aerial.cir, 1 %
}

// clubStages finds the club receiver's stages, with the wavechange wafers
// turned to LW (position 2) when lw is set.
func clubStages(t *testing.T, lw bool) []Stage {
	t.Helper()
	path := filepath.Join("..", "..", "examples", "club-receiver.toml")
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if lw {
		data = regexp.MustCompile(`(?m)^(S1[a-g] = \{ switch = 2,)`).ReplaceAll(data, []byte("$1 set = 2,"))
	}
	c, err := graph.Parse(path, data)
	if err != nil {
		t.Fatal(err)
	}
	return findReduced(t, c)
}

func checkFig(t *testing.T, s *Stage, name string, want, tol float64) {
	t.Helper()
	f, ok := s.Figures.Get(name)
	if !ok || math.Abs(f.Value-want) > tol {
		t.Errorf("%s %s = %g (present %v), want %g ± %g (ngspice testdata/club-trap/aerial.cir)", s.Name, name, f.Value, ok, want, tol)
	}
}
