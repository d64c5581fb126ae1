package rules

import (
	"testing"

	"pare/graph/ac"
)

// Every reduction below the ideal view keeps the signal behaviour: the AC
// comparison (transfer from each input to each output and the driving-point
// impedances, swept over every band, gangs at min, mid and max) stays within
// its default tolerance of 0.5 dB and 5° (common practice for a redrawn
// circuit). The ideal view approximates on purpose and is not held to it.
func TestReductionsVerify(t *testing.T) {
	for _, path := range fixtures(t) {
		for _, lvl := range []Level{LevelTidy, LevelSignal} {
			c := loadFile(t, path)
			r, _ := reduceChecked(t, c, Options{Level: lvl})
			rep, err := ac.Compare(c, r, ac.CompareOptions{})
			if err != nil {
				t.Fatalf("%s at %s: %v", path, lvl, err)
			}
			if !rep.OK {
				w, _ := rep.Worst()
				t.Errorf("%s at %s: reduction changes the signal: %s", path, lvl, w)
			}
		}
	}
}

// The device figures the rules assume agree with the ones the AC models use:
// the same central transconductances and bias, and output-resistance bounds
// that bracket the models' values.
func TestDeviceDefaultsAgreeWithModels(t *testing.T) {
	model := map[string]float64{}
	for _, d := range ac.Defaults {
		model[d.Class+"."+d.Param] = d.Value
	}
	d := deviceDefaults
	same := []struct {
		key  string
		ours float64
	}{
		{"triode.gm", d.triodeGm}, {"tetrode, pentode.gm", d.pentodeGm}, {"hexode, heptode, octode.gm", d.multigridGm},
		{"bjt.beta", d.bjtBeta}, {"bjt.ic", d.bjtIc}, {"fet.gm", d.fetGm},
	}
	for _, s := range same {
		if m, ok := model[s.key]; !ok || m != s.ours {
			t.Errorf("%s: rules assume %g, the AC models %g (present: %v)", s.key, s.ours, m, ok)
		}
	}
	bracket := []struct {
		key    string
		lo, hi float64
	}{
		{"triode.ra", d.triodeRaLow, d.triodeRaHi}, {"tetrode, pentode.ra", d.multiRaLow, d.multiRaHi}, {"fet.rd", d.fetRdLow, d.fetRdHi},
	}
	for _, b := range bracket {
		if m, ok := model[b.key]; !ok || m < b.lo || m > b.hi {
			t.Errorf("%s: the AC models' %g is outside the rules' bounds %g..%g", b.key, m, b.lo, b.hi)
		}
	}
}
