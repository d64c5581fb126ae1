package main

import (
	"path/filepath"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/render"
	"pare/render/check"
	"pare/rules"
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
		res := sheetsOf(t, pipeline.Options{Path: f, Level: rules.LevelSignal})
		for _, st := range []render.Style{render.IEC, render.IEEE} {
			g, err := render.Config{Style: st}.Geometry(res.Sheet(render.Reduced))
			if err != nil {
				t.Fatalf("%s %s: %v", f, st, err)
			}
			r := check.Measure(g)
			for _, p := range r.FrameIntruders {
				t.Errorf("%s %s: %s", filepath.Base(f), st, p)
			}
			for _, p := range r.FrameStrays {
				t.Logf("%s %s: %s", filepath.Base(f), st, p)
			}
		}
	}
}
