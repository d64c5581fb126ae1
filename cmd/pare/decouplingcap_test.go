package main

import (
	"path/filepath"
	"strings"
	"testing"
)

// TestDecouplingFiltersSayDecoupling: a supply filter section pare names a
// decoupling filter (no rectifier feeds it) words its capacitor as a
// decoupling capacitor; review19 a04 printed "c smoothing (C4)" and on the
// next line "it does not smooth one". Over every review circuit.
func TestDecouplingFiltersSayDecoupling(t *testing.T) {
	files, err := filepath.Glob("../../testdata/review1[3-9]/*.toml")
	if err != nil || len(files) < 50 {
		t.Fatalf("fixtures: %d, %v", len(files), err)
	}
	n := 0
	for _, f := range files {
		for _, st := range cachedResult(t, f).Stages {
			if !strings.Contains(st.Title, "decoupling filter") {
				continue
			}
			n++
			if _, ok := st.Figures.Get("c_smoothing"); ok {
				t.Errorf("%s %s %q: a c smoothing figure on a decoupling filter", filepath.Base(f), st.Name, st.Title)
			}
		}
	}
	if n == 0 {
		t.Fatal("no decoupling filter in the review circuits")
	}
}
