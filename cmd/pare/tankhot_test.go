package main

import (
	"fmt"
	"strings"
	"testing"

	"pare/render"
)

// A tuning capacitor from a winding's hot end to chassis, the winding's
// other end decoupled to a rail, stands by that end (render/layout
// tankplace.go): centred on the long collector winding, review19 b02's
// VC1b had its hot lead run up its side, over its top and under its earth,
// a wire box round the part (render/check's WireBoxes, the part measured
// with its earth symbol). Reduced and faded views, the whole sheet and
// its A3 pages.
func TestTankCapByHotEnd(t *testing.T) {
	for _, tc := range []struct{ file, cap string }{
		{"../../testdata/review19/b02.toml", "VC1b"},
	} {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			name := fmt.Sprintf("%s %s", tc.file[strings.LastIndex(tc.file, "/")+1:], v)
			for _, f := range cachedSheet(t, tc.file, v, render.IEC).report.WireBoxes {
				if strings.Contains(f, "part "+tc.cap+" ") {
					t.Errorf("%s: %s", name, f)
				}
			}
			pages, err := cachedPages(tc.file, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pages {
				for _, f := range measured(pg).WireBoxes {
					if strings.Contains(f, "part "+tc.cap+" ") {
						t.Errorf("%s page %d: %s", name, i+1, f)
					}
				}
			}
		}
	}
}
