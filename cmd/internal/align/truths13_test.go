package align_test

import (
	"bytes"
	"math"
	"pare/cmd/internal/note"
	"pare/rules/stages"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// guideText is the alignment guide of a circuit as `pare align` prints it,
// with its stages' notes after it.
func guideText(t *testing.T, path string) string {
	t.Helper()
	r, g := build(t, path)
	var b bytes.Buffer
	if err := align.WriteText(&b, g); err != nil {
		t.Fatal(err)
	}
	for _, s := range r.Stages {
		b.WriteString(strings.Join(s.Notes, "\n") + "\n")
	}
	return b.String()
}

// TestDeviceWordsFollowTheKind: a transistor set's guide and stage notes
// speak of bases and transistors. The review's transistor superhet
// (testdata/review13/b05.toml) read "the RF at the mixer's grid", "the
// valve's gm" and "what the grid capacitor, the injection and the valve
// put across the coil" of its BJT mixer; the valve frequency changer keeps
// the valve's words.
func TestDeviceWordsFollowTheKind(t *testing.T) {
	valveWords := regexp.MustCompile(`mixer's grid|valve's gm|grid capacitor, the injection and the valve`)
	for _, tc := range []struct {
		path  string
		valve bool
	}{
		{review13("b05"), false},
		{example("frequency-changer"), true},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			text := guideText(t, tc.path)
			if got := valveWords.FindString(text); (got != "") != tc.valve {
				t.Errorf("valve wording %q, want valve wording %v", got, tc.valve)
			}
			if !tc.valve && !strings.Contains(text, "mixer's base") {
				t.Errorf("no \"mixer's base\" in the transistor set's guide:\n%s", text)
			}
		})
	}
}

// TestOscillatorOwnsItsLoop (docs/references.md §33): b01 is an RC
// phase-shift oscillator Q1 with an emitter-follower buffer Q2 fed through
// C5. Q2's return ratio crosses 0° near Q1's frequency with a large
// "margin" only because Q1's loop is closed: with Q1 made passive Q2
// closes no loop. The follower was flagged "Q2 oscillates … +26.4 dB …
// may squegg"; the loop is Q1's alone. Q1's loop is checked against the
// reviewer's ngspice return-ratio deck with its resistors written in plain
// SPICE and the operating point's figures of pare's DC law with the Early
// effect (testdata/review13/spice/b01_loop_values.cir: 0° at 586.271 Hz,
// |T| +2.091 dB; 586.777 Hz, +1.932 dB at the figures before it; the deck
// as sent read "5k6" as 5 kΩ and gave 604.4 Hz).
// The oscillator's frequency is in the note's stage table, and its
// symptoms speak of its output, not of RF rows and a dial.
func TestOscillatorOwnsItsLoop(t *testing.T) {
	r, g := build(t, review13("b01"))
	var q1 *stages.Loop
	for _, s := range r.Stages {
		for i, l := range s.Loop {
			if l.Device == "Q2" {
				t.Errorf("%s carries a loop of the follower Q2: %s", s.Name, stages.LoopLine(l))
			}
			if l.Device == "Q1" {
				q1 = &s.Loop[i]
			}
		}
		for _, f := range s.Flags {
			if strings.Contains(f, "Q2 oscillates") || strings.Contains(f, "squegg") && slices.Contains(s.Parts, "Q2") {
				t.Errorf("%s: %s", s.Name, f)
			}
		}
	}
	if q1 == nil {
		t.Fatal("no loop for Q1")
	}
	fMin, _, mMin, _, ok := q1.Range()
	if !ok || math.Abs(fMin/586.271-1) > 1e-3 || math.Abs(mMin-2.091) > 0.05 {
		t.Errorf("Q1's loop %s, want 586.271 Hz, +2.091 dB (ngspice)", stages.LoopLine(*q1))
	}
	for _, o := range r.DC.Oscillators() {
		if o.Ref == "Q2" {
			t.Errorf("the DC chart's oscillators list the follower Q2 (%.1f Hz)", o.F)
		}
	}
	n := note.FromResult(r, note.Meta{})
	for _, s := range n.Stages {
		if s.Name == "S1" && !strings.Contains(s.Figures, "586.3 Hz") {
			t.Errorf("S1's figures in the note %q lack the oscillator's frequency", s.Figures)
		}
	}
	for _, h := range g.Hints {
		if strings.Contains(h.Inject, "RF row") || strings.Contains(h.Inject, "dial") {
			t.Errorf("symptom %q of an audio oscillator speaks of RF rows or a dial: %q", h.Fault, h.Inject)
		}
	}
}

// TestCouplingIntoLoudspeaker: b04's C5 (470 µF) couples the output to
// LS1, 8 Ω to chassis; the note said "the resistance beyond is not in this
// circuit" because the resistive walk saw only resistors. The corner is
// that of 470 µF into 8 Ω: 42.33 Hz (derived from fc = 1/(2πRC),
// docs/references.md §4; the loudspeaker's rating its nominal impedance,
// common practice).
func TestCouplingIntoLoudspeaker(t *testing.T) {
	r, _ := build(t, review13("b04"))
	for _, s := range r.Stages {
		if !slices.Contains(s.Parts, "C5") {
			continue
		}
		for _, n := range s.Notes {
			if strings.Contains(n, "not in this circuit") {
				t.Errorf("%s: %s", s.Name, n)
			}
		}
		f, ok := s.Figures.Get("f_c")
		if !ok {
			t.Fatalf("%s has no corner: %v", s.Name, s.Figures)
		}
		if f.Check == nil || math.Abs(f.Check.Value/42.33-1) > 0.01 {
			t.Errorf("%s corner formula %v, want 42.33 Hz", s.Name, f.Check)
		}
		return
	}
	t.Fatal("no stage holds C5")
}
