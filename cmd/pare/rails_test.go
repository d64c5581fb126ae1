package main

import (
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// railSheetFiles are every example and every test fixture that draws: the
// examples, the oscillators, the good and safety fixtures, the stage
// fixtures and the drawer's own.
func railSheetFiles(t *testing.T) []string {
	files := exampleFiles(t)
	for _, glob := range []string{"../../testdata/good/*.toml", "../../testdata/osc/*.toml",
		"../../testdata/safety/*.toml", "../../rules/stages/testdata/*.toml", "../../render/testdata/*.toml"} {
		more, err := filepath.Glob(glob)
		if err != nil || len(more) == 0 {
			t.Fatalf("no fixtures in %s: %v", glob, err)
		}
		files = append(files, more...)
	}
	return files
}

// isRail: supply, bias and heater nets are rails, never chassis (docs/netlist.md, "Nets").
func isRail(r graph.Role) bool { return r == graph.Supply || r == graph.Bias || r == graph.Heater }

// returnNet is the net a drawn local symbol's pin went to in the circuit as
// the netlist wrote it: on a reduced sheet the original part of the same ref
// and pin (an independent record: the reduction may have tied that net to
// AC ground), else the pin's net on the drawn circuit.
func returnNet(res *pipeline.Result, v render.View, l geom.Local) *graph.Net {
	if v == render.Reduced {
		if p := res.Circuit.Part(l.Owner); p != nil && p.Pin(l.Pin) != nil {
			return res.Circuit.Net(p.NetOf(l.Pin))
		}
		return res.Reduced.Net(l.Net)
	}
	return res.Circuit.Net(l.Net)
}

// TestNoEarthOnRails: no sheet (reduced, full or faded, either symbol style)
// of any example or fixture draws the earth/chassis symbol at a pin that
// returns to a supply, bias or heater rail. A technician reads the earth
// symbol as chassis; on a set whose caution says the chassis may be live, a
// rail drawn as chassis is wrong and unsafe (common practice: rails are
// drawn as labelled rail symbols). Every rail tag drawn for a rail with a
// declared voltage shows that voltage, and every sheet stays clean for the
// geometry checker.
func TestNoEarthOnRails(t *testing.T) {
	if testing.Short() {
		t.Skip("draws every fixture in every view")
	}
	earthOnRail, tags, loose := 0, 0, 0
	warmSheets(railSheetFiles(t), "")
	for _, f := range railSheetFiles(t) {
		res := cachedResult(t, f)
		for _, v := range drawViews {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				ls := cachedSheet(t, f, v, st)
				g := ls.g
				where := filepath.Base(f) + " " + v.String() + " " + st.String()
				for _, l := range g.Locals {
					n := returnNet(res, v, l)
					if n == nil || !isRail(n.Role) {
						continue
					}
					switch l.Kind {
					case geom.LocalGround:
						earthOnRail++
						t.Errorf("%s: %s.%s returns to rail %s but is drawn with the earth symbol", where, l.Owner, l.Pin, n.Name)
					case geom.LocalRail:
						tags++
						if want := railVolts(n); want != "" && !strings.Contains(l.Text, want) {
							t.Errorf("%s: the rail tag at %s.%s says %q, without the declared %s", where, l.Owner, l.Pin, l.Text, want)
						}
					}
				}
				// The reduced sheets (where pins move to rail tags) of
				// every fixture, and every sheet of the examples, must be
				// clean; the full and faded sheets of some fixtures carry
				// problems of the router's and the full layout's, logged.
				strict := v == render.Reduced || strings.Contains(f, "examples")
				for _, p := range ls.report.Problems() {
					if strict {
						t.Errorf("%s: %s", where, p)
					} else {
						t.Logf("%s: %s", where, p)
						loose++
					}
				}
			}
		}
	}
	t.Logf("earth symbols on rails: %d; rail tags: %d; problems on fixtures' full and faded sheets: %d", earthOnRail, tags, loose)
	if tags == 0 {
		t.Error("no rail tag drawn on any sheet: the walk found nothing to check")
	}
}

// railVolts is the declared voltage as a tag must show it, the magnitude
// with its unit ("250 V", "6 V"), or "" when the netlist declares none.
func railVolts(n *graph.Net) string {
	if n.Volts == 0 {
		return ""
	}
	v := n.Volts
	if v < 0 {
		v = -v
	}
	return strconv.FormatFloat(v, 'g', -1, 64) + " V"
}
