package pipeline

import (
	"errors"
	"path/filepath"
	"strings"
	"testing"
)

// --switch S1=2 turns every wafer of the wavechange switch S1 (S1a…S1g,
// the trade's way of lettering the sections of one spindle) and nothing
// else; the switch named in full turns alone. Bad settings are refused
// with the reason, never applied in part.
func TestSwitchSettings(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "club-receiver.toml")
	cases := []struct {
		set  []SwitchSetting
		want map[string]float64 // ref → position after the load
		err  string
	}{
		{nil, map[string]float64{"S1a": 1, "S1g": 1, "S2": 2, "S3": 1}, ""},
		{[]SwitchSetting{{"S1", 2}}, map[string]float64{"S1a": 2, "S1b": 2, "S1c": 2, "S1d": 2, "S1e": 2, "S1f": 2, "S1g": 2, "S2": 2, "S3": 1}, ""},
		{[]SwitchSetting{{"S1c", 2}}, map[string]float64{"S1b": 1, "S1c": 2, "S1d": 1}, ""},
		{[]SwitchSetting{{"S3", 2}, {"S1", 2}}, map[string]float64{"S1a": 2, "S3": 2}, ""},
		{[]SwitchSetting{{"S9", 2}}, nil, "no switch S9 in the netlist (its switches: S1a, S1b"},
		{[]SwitchSetting{{"S1", 3}}, nil, "S1a has 2 position(s)"},
		{[]SwitchSetting{{"R1", 1}}, nil, "no switch R1"},
	}
	for _, c := range cases {
		r, err := Run(Options{Path: path, Until: PhaseLoad, Switches: c.set})
		if c.err != "" {
			var pe *Error
			if err == nil || !strings.Contains(err.Error(), c.err) || !errors.As(err, &pe) || pe.Phase != PhaseLoad {
				t.Errorf("%v: error %v, want a load error with %q", c.set, err, c.err)
			}
			continue
		}
		if err != nil {
			t.Fatalf("%v: %v", c.set, err)
		}
		for ref, pos := range c.want {
			if got := r.Circuit.Part(ref).Set; got != pos {
				t.Errorf("%v: %s at %v, want %v", c.set, ref, got, pos)
			}
		}
	}
}

func TestParseSwitchSetting(t *testing.T) {
	for _, c := range []struct {
		in   string
		want SwitchSetting
		ok   bool
	}{
		{"S1=2", SwitchSetting{"S1", 2}, true},
		{" S1 = 2 ", SwitchSetting{"S1", 2}, true},
		{"S1", SwitchSetting{}, false},
		{"=2", SwitchSetting{}, false},
		{"S1=0", SwitchSetting{}, false},
		{"S1=two", SwitchSetting{}, false},
		{"S1=1.5", SwitchSetting{}, false},
	} {
		got, err := ParseSwitchSetting(c.in)
		if (err == nil) != c.ok || got != c.want {
			t.Errorf("%q: %v, %v", c.in, got, err)
		}
	}
}

// With the wavechange switch on LW the proof compares the front end where
// the LW coils work: the example's header gives LW as 150 kHz to 290 kHz
// (handbook f = 1/(2π√(LC)): 2.3 mH with 134 pF fully open gives 287 kHz),
// not the MW band the netlist declares. On the netlist's own position no
// band moves.
func TestSwitchedBandIsProvenWhereItTunes(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "club-receiver.toml")
	r, err := Run(Options{Path: path, Until: PhaseLoad})
	if err != nil || len(r.Retuned) != 0 {
		t.Fatalf("netlist position: retuned %v (err %v), want none", r.Retuned, err)
	}
	r, err = Run(Options{Path: path, Until: PhaseVerify, Verify: true, StepCheck: NoStepCheck, Switches: []SwitchSetting{{"S1", 2}}})
	if err != nil || r.Report == nil {
		t.Fatalf("S1=2: %v", err)
	}
	found := false
	for _, p := range r.Report.Pairs {
		if p.Label() != "V(mix_tank)/V(aerial)" {
			continue
		}
		found = true
		if p.AtHz < 145e3 || p.AtHz > 295e3 || !strings.HasPrefix(p.Bands, "150 kHz") {
			t.Errorf("S1=2: front end compared over %s (worst at %.0f Hz), want LW's 150–290 kHz", p.Bands, p.AtHz)
		}
	}
	if !found {
		t.Errorf("S1=2: the front end's transfer was not compared: %v", r.Report.Pairs)
	}
	if !strings.Contains(strings.Join(r.Report.Notes, "\n"), "instead of the declared 540 kHz–1.6 MHz") {
		t.Errorf("S1=2: the proof does not say its band moved: %q", r.Report.Notes)
	}
}

// The main job's run of the other band (BandRun, what align's LW tracking
// rests on) loads the set with the wafers turned, so its reduction is
// proven over the LW tanks' range too: 150–290 kHz by the example's header,
// not the MW band the netlist declares.
func TestBandRunProvesItsOwnBand(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "club-receiver.toml")
	r := &Result{opts: Options{Path: path, Verify: true}}
	set := map[string]int{}
	for _, w := range "abcdefg" {
		set["S1"+string(w)] = 2
	}
	c, _, err := r.BandRun(set)
	if err != nil {
		t.Fatal(err)
	}
	if c.Band.Min < 145e3 || c.Band.Max > 295e3 {
		t.Errorf("LW band run declares %v, want LW's 150–290 kHz", c.Band)
	}
}
