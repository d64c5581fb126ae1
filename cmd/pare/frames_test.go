package main

import (
	"path/filepath"
	"testing"

	"pare/render"
)

// TestFramesHoldTheirOwnParts: no stage frame on the reduced sheet of an
// example or a stage fixture (the oscillators of testdata/osc and the
// fixtures of rules/stages/testdata) encloses a part of another stage. A
// frame tells the reader "these parts are this stage"; a transistor drawn
// inside an "RC coupling" frame tells a wrong story.
func TestFramesHoldTheirOwnParts(t *testing.T) {
	files := exampleFiles(t)
	for _, glob := range []string{"../../testdata/osc/*.toml", "../../rules/stages/testdata/*.toml"} {
		more, err := filepath.Glob(glob)
		if err != nil || len(more) == 0 {
			t.Fatalf("no fixtures in %s: %v", glob, err)
		}
		files = append(files, more...)
	}
	for _, f := range files {
		for _, st := range []render.Style{render.IEC, render.IEEE} {
			r := cachedSheet(t, f, render.Reduced, st).report
			for _, p := range r.FrameIntruders {
				t.Errorf("%s %s: %s", filepath.Base(f), st, p)
			}
			for _, p := range r.FrameStrays {
				t.Logf("%s %s: %s", filepath.Base(f), st, p)
			}
		}
	}
}
