package align_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// A three-gang set with an RF stage, a wavechange switch between every
// gang section and its coils, slug-tuned IF cans and an IF rejector at the
// aerial (examples/club-receiver.toml) gets the whole procedure in the
// trade's order (common practice): the IF cans from the detector back,
// secondary then primary, at the IF; the IF trap for the least output at
// the IF; the oscillator trimmer at the high end; then the RF and aerial
// trimmers, the tank nearest the mixer first. L4 with C1 is 1.147 mH with
// 100 pF: 469.9 kHz by f = 1/(2π√(LC)) (docs/references.md §1), within
// 5 % of the 470 kHz IF. The low end is set by the slug cores of L1, T3
// and T1 at the bottom tracking point, each after its trimmer. The set is a
// three-point design: its worst tracking error is +6.87 kHz at the top of
// the dial (ngspice on rules/stages/testdata/club-track/mw_pair_walk.cir),
// inside half the RF tank's loaded bandwidth there, so the guide must not
// call it mistracking.
func TestClubReceiverFullProcedure(t *testing.T) {
	_, g := build(t, example("club-receiver"))
	var got []string
	for _, s := range g.Steps {
		got = append(got, s.Phase+" "+s.Part+s.Winding)
	}
	want := []string{"IF T7s", "IF T7p", "IF T6s", "IF T6p", "IF T5s", "IF T5p", "IF trap L4",
		"oscillator TC6", "oscillator L1", "aerial/RF TC4", "aerial/RF T3", "aerial/RF TC2", "aerial/RF T1"}
	if strings.Join(got, ", ") != strings.Join(want, ", ") {
		t.Errorf("steps\n got %v\nwant %v\n(nothing: %s; tracking: %s)", got, want, g.Nothing, g.TrackNote)
	}
	for _, s := range g.Steps {
		if s.Phase == "IF trap" && s.Freq != g.IF {
			t.Errorf("IF trap step at %g Hz, want the IF %g Hz", s.Freq, g.IF)
		}
	}
	warn := strings.Join(g.Warnings, "\n")
	if strings.Contains(warn, "the set mistracks") {
		t.Errorf("a set that tracks called mistracking:\n%s", warn)
	}
	if len(g.Warnings) != 0 {
		t.Errorf("the flagship as captured should align without warnings:\n%s", warn)
	}
}

// Without a core on the oscillator coil and with a fixed padder, nothing
// sets the low end (common practice: the padder or the coil's core does):
// the guide must say so and point at the padder's value instead of
// inventing a step. The club receiver with L1's core left out of the
// capture is that case.
func TestClubReceiverNoOscCoreChecksPadder(t *testing.T) {
	src, err := os.ReadFile(example("club-receiver"))
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, line := range strings.Split(string(src), "\n") {
		if strings.HasPrefix(line, "L1 = ") {
			line = strings.Replace(line, `adjust = "core", `, "", 1)
		}
		out = append(out, line)
	}
	path := filepath.Join(t.TempDir(), "club-nocore.toml")
	if err := os.WriteFile(path, []byte(strings.Join(out, "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
	_, g := build(t, path)
	warn := strings.Join(g.Warnings, "\n")
	if !strings.Contains(warn, "check C12's value") {
		t.Errorf("no warning saying to check C12's value:\n%s", warn)
	}
	for _, s := range g.Steps {
		if s.Part == "L1" {
			t.Errorf("a step turns L1, which has no core in this capture")
		}
	}
}

// The injection table's levels come from a linear model: rows that ask a
// generator for less than 1 µV (common practice: a service generator's
// least trustworthy level and about a valve set's noise at its first grid)
// must say so, the table must say the AGC is ignored and how to hold it,
// and a row whose level depends on a control must name its position (RV1,
// the volume control, as captured at mid-travel: the loader's default
// set = 0.5, docs/netlist.md). The club receiver's rows at V2's grid, V1's
// grid and the aerial would ask under 1 µV and give no level.
func TestClubReceiverInjectionCaveats(t *testing.T) {
	_, g := build(t, example("club-receiver"))
	var text strings.Builder
	if err := align.WriteText(&text, g); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "ignores the AGC: hold the AGC line") {
		t.Errorf("the table does not say the AGC is ignored:\n%s", text.String())
	}
	low, vol := 0, false
	for _, in := range g.Inject {
		if in.Why != "" {
			continue
		}
		below := in.Level < 1e-6
		if says := in.BelowFloor && strings.Contains(in.Caveat, "no level: the solved reference would ask less than 1 µV"); says != below {
			t.Errorf("%s at %g V: caveat %q (below 1 µV: %v)", in.Where, in.Level, in.Caveat, below)
		}
		if below {
			low++
		}
		if in.Band == "audio" && strings.Contains(in.Where, "detector") {
			// The netlist's set is a share of the resistance, no law: the
			// row says so, and that the level follows the control (a log
			// track gives about 10 % of its resistance at mid-rotation,
			// common practice, from memory).
			vol = strings.Contains(in.Caveat, "RV1 with its wiper at 50 % of the track's resistance") &&
				strings.Contains(in.Caveat, "log-law control") && strings.Contains(in.Caveat, "depends on the control's setting")
		}
	}
	if low < 3 {
		t.Errorf("%d rows below 1 µV, want the 3 the review found (V2 grid, V1 grid, aerial)", low)
	}
	if !vol {
		t.Errorf("the detector-load row does not state RV1's position")
	}
}

// Every band of a wavechange switch is aligned on its own after the IF
// (common practice), with the trimmers that band switches in: on the club
// receiver's LW (every wafer at 2) the oscillator trimmer TC5, the RF
// trimmer TC3 and the aerial trimmer TC1, not the MW trimmers on the gang
// sections themselves, at LW's own tracking points (below 300 kHz: LW as
// captured tunes 149.5–284.8 kHz).
func TestClubReceiverAlignsEveryBand(t *testing.T) {
	r, g := build(t, example("club-receiver"))
	g.AddBands(r.Circuit, r.Stages, r.BandRun)
	var got []string
	for _, s := range g.Steps {
		if s.Band == "" {
			continue
		}
		got = append(got, s.Phase+" "+s.Part)
		if s.Freq <= 0 || s.Freq > 300e3 {
			t.Errorf("band step %s at %g Hz, want a LW tracking point", s.Part, s.Freq)
		}
	}
	want := []string{"oscillator TC5", "oscillator L2", "aerial/RF TC3", "aerial/RF T4", "aerial/RF TC1", "aerial/RF T2"}
	if strings.Join(got, ", ") != strings.Join(want, ", ") {
		t.Errorf("band steps %v, want %v\nwarnings: %v", got, want, g.Warnings)
	}
}
