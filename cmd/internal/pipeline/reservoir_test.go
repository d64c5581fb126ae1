package pipeline

import (
	"path/filepath"
	"strings"
	"testing"

	"pare/rules"
	"pare/rules/stages"
)

// An estimated reservoir is a supply for the small-signal work: review
// 12's five-valve superhet leaves its reservoir net ht1 undeclared, and
// its 32 µF (99 Ω at 50 Hz, more than a tenth of the output transformer's
// primary: not a bypass by its reactance) kept the mains transformer,
// fuse, mains capacitor and rectifier on the reduced sheet, and the output
// valve was read as a tone control. With ht1 a supply rail by graph/dc's
// estimate (rectifier.go) they go, the output stage is named, the
// verification passes and a note says how to declare it.
func TestEstimatedReservoirIsASupply(t *testing.T) {
	path := filepath.Join("..", "..", "..", "testdata", "review12", "c10.toml")
	res, err := Run(Options{Path: path, Until: PhaseStages, Level: rules.LevelSignal, Verify: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, ref := range []string{"T6", "V5", "F1", "C25"} {
		if res.Reduced.Part(ref) != nil {
			t.Errorf("%s, a mains supply part, is on the reduced circuit", ref)
		}
	}
	var out *stages.Stage
	for i := range res.Stages {
		if s := &res.Stages[i]; strings.Contains(strings.Join(s.Parts, " "), "V4") {
			out = s
		}
	}
	if out == nil || out.Topology != "output-transformer" {
		t.Errorf("the output valve V4's stage: %+v, want output-transformer", out)
	}
	if res.Report == nil || res.Report.Broken() || res.StepErr != nil {
		t.Errorf("verification %+v, step error %v", res.Report, res.StepErr)
	}
	if !strings.Contains(strings.Join(res.Report.Notes, "\n"), `ht1 = { role = "supply" }`) {
		t.Errorf("no note with the fix: %q", res.Report.Notes)
	}
	if n := res.Circuit.Net("ht1"); n == nil || n.Role.IsACGround() {
		t.Errorf("the original circuit's ht1 changed: %+v", n)
	}
}
