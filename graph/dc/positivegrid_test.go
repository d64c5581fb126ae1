package dc

import (
	"strings"
	"testing"
)

// TestPositiveGridWarned: a valve whose grid solves more than half a volt
// positive of its cathode draws grid current the law does not model, and
// the chart says so (review18 a04: a direct-coupled cathodyne, V1b's grid
// 1.24 V positive, as the blind reviewer worked it out from the capture;
// a grid is run negative of its cathode, common practice). A set whose
// grids all stand negative gets no such warning.
func TestPositiveGridWarned(t *testing.T) {
	cases := []struct {
		file, ref string // ref "" for no warning
	}{
		{"../../testdata/review18/a04.toml", "V1b"},
		{"../../examples/club-receiver.toml", ""},
	}
	for _, tc := range cases {
		pt, err := Solve(load(t, tc.file))
		if err != nil {
			t.Fatal(err)
		}
		ch, err := pt.Chart(Meter{})
		if err != nil {
			t.Fatal(err)
		}
		var got []string
		for _, w := range ch.Warnings {
			if strings.Contains(w, "positive of its cathode") {
				got = append(got, w)
			}
		}
		switch {
		case tc.ref == "" && len(got) > 0:
			t.Errorf("%s: %v", tc.file, got)
		case tc.ref != "" && (len(got) != 1 || !strings.HasPrefix(got[0], tc.ref+" grid solves")):
			t.Errorf("%s: want one warning on %s, got %v", tc.file, tc.ref, got)
		}
	}
}
