package stages

import (
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"pare/graph"
	"pare/internal/synth"
)

// TestPiecesAreWide: a supply filter section that keeps a diode, and an AGC
// line's lag, solved on the piece closed at AC ground with the DC loads the
// wide circuit gives its diodes, give every figure the wide circuit (the
// section's walk past the rails) and the whole circuit (the lag) give, to
// the bit (printed with %v, the shortest form that reads back to the same
// float): the examples, the IF strip with its AGC line bled to chassis and
// a bank of 346 parts whose channels share their rails. The check is the solver
// against itself on a larger circuit, so it holds whatever the figures are;
// it fails if the piece leaves out a part or a DC load the figure depends
// on.
func TestPiecesAreWide(t *testing.T) {
	if testing.Short() {
		t.Skip("long")
	}
	var sets []*graph.Circuit
	for _, name := range []string{"club-receiver.toml", "if-detector-audio.toml", "frequency-changer.toml", "transistor-front-end.toml"} {
		c, err := graph.LoadFile(filepath.Join("..", "..", "examples", name))
		if err != nil {
			t.Fatal(err)
		}
		sets = append(sets, c)
	}
	// the IF strip with its AGC line bled to chassis (a delay resistor,
	// invented 2M): the detector's DC load then runs on through R6 past
	// the line, which the piece of the IF decoupler stops at, so a piece
	// that took its diode's load from its own DC paths would differ
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "if-detector-audio.toml"))
	if err != nil {
		t.Fatal(err)
	}
	bled, err := graph.Parse("bled.toml", append(src, "R11 = { r = \"2M\", pins = [\"agc\", \"gnd\"] }\n"...))
	if err != nil {
		t.Fatal(err)
	}
	sets = append(sets, bled)
	bank, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	sets = append(sets, bank)
	lags, filters := 0, 0
	for _, c := range sets {
		piece := findReduced(t, c)
		solveWide = true
		wide := findReduced(t, c)
		solveWide = false
		if len(piece) != len(wide) {
			t.Fatalf("%s: %d stages on the pieces, %d wide", c.Title, len(piece), len(wide))
		}
		for i := range piece {
			if !reflect.DeepEqual(piece[i], wide[i]) {
				t.Errorf("%s: stage %s differs:\npiece %s\nwide  %s", c.Title, piece[i].Name, figs(piece[i]), figs(wide[i]))
			}
			for _, f := range piece[i].Figures {
				lags += strings.Count(f.Origin.String(), "fc the −3 dB point of V(")
				filters += strings.Count(f.Origin.String(), "−3 dB of V(")
			}
		}
	}
	// the cases exist: lags and filter sections solved (a test that
	// solved neither could not fail)
	if lags == 0 || filters == 0 {
		t.Errorf("solved %d AGC lags and %d filter corners: the test reaches neither piece", lags, filters)
	}
	t.Logf("%d AGC lags and %d filter corners compared", lags, filters)
}

// figs is a stage's figures with their values, for a failure's message.
func figs(s Stage) string {
	var b strings.Builder
	for _, f := range s.Figures {
		fmt.Fprintf(&b, "%s=%v (%s); ", f.Name, f.Value, f.Origin)
	}
	return b.String()
}
