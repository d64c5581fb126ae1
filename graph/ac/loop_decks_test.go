package ac

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The self-oscillating converters' kicked-transient decks are committed
// beside their fixtures (testdata/osc/mixer-*.cir): `ngspice -b` on one
// writes out.dat, the returned control voltage after a kick, as drawn and
// at the gang setting TestLoopGainAgainstNgspiceTransient checks (its
// envelope grows where pare's margin is above 0 dB and decays where below;
// its zero crossings give the frequency). This test keeps each committed
// deck byte-equal to the one the transient test writes; PARE_WRITE_DECKS=1
// rewrites them.
func TestConverterDecksCommitted(t *testing.T) {
	files, err := filepath.Glob("../../testdata/osc/mixer-*.toml")
	if err != nil || len(files) < 4 {
		t.Fatalf("converter fixtures: %v, %d files", err, len(files))
	}
	for _, file := range files {
		t.Run(filepath.Base(file), func(t *testing.T) {
			c := load(t, file)
			ref := ""
			for _, p := range c.Parts {
				if p.IsActive() {
					ref = p.Ref
				}
			}
			gang := 1.0
			if far(t, c, ref, gang) {
				gang = 0
			}
			o := Options{VarFrac: gang, VarSet: true}
			loop, err := FindLoop(c, ref, LoopOptions{Options: o})
			if err != nil || loop.F == 0 {
				t.Fatalf("%s: no loop: %v", ref, err)
			}
			ls, err := newLoopSystem(c, ref, o)
			if err != nil {
				t.Fatal(err)
			}
			pole, err := ls.pole(loop.F, 1)
			if err != nil {
				t.Fatal(err)
			}
			fp := imag(pole) / (2 * math.Pi)
			deck := tranDeck(t, c, o, tranRun{ref: ref, k: 1, f: fp, cycles: cyclesFor(real(pole), fp)}, looseTol)
			path := strings.TrimSuffix(file, ".toml") + ".cir"
			if os.Getenv("PARE_WRITE_DECKS") == "1" {
				if err := os.WriteFile(path, deck, 0o644); err != nil {
					t.Fatal(err)
				}
			}
			got, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("committed deck: %v (PARE_WRITE_DECKS=1 writes it)", err)
			}
			if !bytes.Equal(got, deck) {
				t.Errorf("%s differs from the deck the transient test runs (PARE_WRITE_DECKS=1 rewrites it)", path)
			}
		})
	}
}
