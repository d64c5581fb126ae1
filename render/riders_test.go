package render

import (
	"os"
	"path/filepath"
	"slices"
	"sort"
	"testing"
)

// ridersNet is a mixer's stretch with the base bias divider and decoupler
// of the winding feeding its base riding on it (R1, R2, C1), tied to the
// stage only by the front end's decoupled supply line (vfe) that the
// stage's load (R6) and the line's own decoupler (R27, C27) share, and a
// base stopper (R9) on the base itself. Invented values.
const ridersNet = `title = "riders"
band = "20..20k"
inputs = ["qb"]
outputs = ["qc"]

[nets]
gnd = { role = "ground" }
vcc = { role = "supply", volts = 9 }

[parts]
Q1 = { bjt = "npn", pins = { b = "qb", c = "qc", e = "gnd" } }
R6 = { r = "4k7", pins = ["qc", "vfe"] }
R1 = { r = "47k", pins = ["vfe", "qbias"] }
R2 = { r = "10k", pins = ["qbias", "gnd"] }
C1 = { c = "22n", pins = ["qbias", "gnd"] }
R9 = { r = "100R", pins = ["qb", "qs"] }
R27 = { r = "470R", pins = ["vcc", "vfe"] }
C27 = { c = "47u", pins = ["vfe", "gnd"] }
`

// TestLooseRiders: a rider is cut off its stretch (riderPieces) when the
// nets tying it to the stretch's own parts all run on to another stretch
// anyway; a net only the stretch holds, directly or through another rider,
// keeps it. The cases are this package's own reading of where a connector
// pair is drawn (from memory of the trade's off-sheet arrows: a supply line
// carried to another sheet by a pair, never a stage's base lead).
func TestLooseRiders(t *testing.T) {
	path := filepath.Join(t.TempDir(), "riders.toml")
	if err := os.WriteFile(path, []byte(ridersNet), 0o644); err != nil {
		t.Fatal(err)
	}
	c := load(t, path)
	mixer := block{refs: []string{"Q1", "R6", "R1", "R2", "C1"}, riders: []string{"R1", "R2", "C1"}}
	stopped := block{refs: []string{"Q1", "R6", "R9", "R1", "R2", "C1"}, riders: []string{"R9", "R1", "R2", "C1"}}
	supply := block{refs: []string{"R27", "C27"}}
	cases := []struct {
		name string
		bs   []block
		a    int
		want []string
	}{
		{"supply line held by another stretch", []block{supply, mixer}, 1, []string{"C1", "R1", "R2"}},
		{"supply line held by this stretch alone", []block{mixer}, 0, nil},
		{"stopper on the base stays", []block{supply, stopped}, 1, []string{"C1", "R1", "R2"}},
	}
	for _, tc := range cases {
		free := looseRiders(c, tc.bs[tc.a], heldElsewhere(c, tc.bs, tc.a))
		var got []string
		for r := range free {
			got = append(got, r)
		}
		sort.Strings(got)
		if !slices.Equal(got, tc.want) {
			t.Errorf("%s: loose riders %v, want %v", tc.name, got, tc.want)
		}
	}
}
