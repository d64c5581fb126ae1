package stages

import (
	"math"
	"strings"
	"testing"
)

// The AGC filter of a whole set, on a declared AGC line (role bias), is a
// stage of its own (blind review 17, item 6a: R16/C31 were folded into the
// detector, C31 dropped with the grounded line). Its time constant is the
// solver's on the whole line: ngspice .ac on testdata/agc/club-agc-line.cir,
// −3 dB at 0.34800 Hz, τ = 1/(2π·fc) = 0.45734 s; τ = RC = 0.1 s (handbook)
// beside it. The grid feeds on the same line (R1 to C3's net, R8 to C18's)
// are not taken for it: no detector feeds them.
func TestAGCLineFilter(t *testing.T) {
	full, reduced, log := reduceExample(t, "club-receiver.toml")
	var agc []Stage
	for _, s := range find(t, reduced, Options{Full: full, ACGround: log.ACGround}) {
		if s.Title == "AGC filter" {
			agc = append(agc, s)
		}
	}
	if len(agc) != 1 {
		t.Fatalf("%d AGC filters, want 1: %+v", len(agc), agc)
	}
	s := agc[0]
	if strings.Join(s.Parts, " ") != "C31 R16" || s.Supply {
		t.Errorf("AGC filter parts %v (supply %v), want C31 R16 and no supply stage", s.Parts, s.Supply)
	}
	tau, ok := s.Figures.Get("tau")
	if !ok || math.Abs(tau.Value/0.45734-1) > 0.005 || tau.Check == nil || math.Abs(tau.Check.Value-0.1) > 1e-9 {
		t.Errorf("tau %v (check %v), want the solver's 0.4573 s beside RC = 0.1 s", tau.Value, tau.Check)
	}
}
