package stages

import (
	"testing"

	"pare/graph"
	"pare/rules"
)

// The blind review of sheets (review 12): its circuits are
// testdata/review12/*.toml, the reviewer's ngspice decks in
// testdata/review12/spice/.

// review12 loads a review circuit and finds its stages on the reduction, as
// the main job does.
func review12(t *testing.T, file string, o ...Options) []Stage {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/review12/" + file)
	if err != nil {
		t.Fatal(err)
	}
	if len(o) == 0 {
		return findReduced(t, c)
	}
	return find(t, c, o[0])
}

// review12Candidates are the matches of one built-in pattern on a review
// circuit's reduction that survive its guards, before any other stage
// (an oscillator found by its loop) takes their parts.
func review12Candidates(t *testing.T, file, id string) []*found {
	t.Helper()
	c, err := graph.LoadFile("../../testdata/review12/" + file)
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	lib, err := Builtin()
	if err != nil {
		t.Fatal(err)
	}
	acg := map[string]bool{}
	for _, n := range log.ACGround {
		acg[n] = true
	}
	budget := DefaultLimit
	got, err := recognise(r, &Library{Patterns: []*Pattern{lib.Pattern(id)}}, false, acg,
		newWorldJoined(c, false, acg, switchJoins(c)), nil, &budget)
	if err != nil {
		t.Fatal(err)
	}
	return got
}

// An AGC filter is named only where a detector feeds it and its line runs
// on to a grid or base return (rcagc.go, agcConfirmed). The record-player
// preamp's part-bypass R11 + C9 in TR2's emitter lead (220 Ω × 47 µF =
// 10.3 ms, above the filter's 10 ms floor) and the phase-shift oscillator's
// long RCs (R1 4.7 kΩ or R2 100 kΩ into the 100 µF decoupler) have neither;
// the oscillator's are looked for among the pattern's own matches, before
// the loop stage takes every part round the device, on the capture with
// the preset's wiper unconnected that once showed one and on the final one.
func TestReview12NoAGCFilterWithoutDetector(t *testing.T) {
	st := review12(t, "c09.toml")
	if s := stageOf(st, "agc-filter"); s != nil {
		t.Errorf("c09 named an AGC filter %v with no detector feeding it: %s", s.Parts, topologies(st))
	}
	for _, file := range []string{"c02.toml", "c02-wiper-nc.toml"} {
		for _, f := range review12Candidates(t, file, "agc-filter") {
			t.Errorf("%s: an AGC filter %v matched in an oscillator with no detector", file, f.Parts)
		}
	}
}
