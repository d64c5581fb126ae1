package main

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
	"pare/render"
)

// TestRowsFollowSignal: signal flows from row to row as along a row (common
// practice, ../shared/DRAWING-NOTES.md: left to right, the input at the
// start): on every example, gallery fixture and third-review circuit cut
// onto A3, reduced and faded, no amplifying part stands on a row before
// every part its signal comes from. The sources of a control electrode are
// found here on the circuit: the nearest active parts met on an output or
// common electrode (a cathodyne's cathode drives too) or input ports a walk through passive parts reaches,
// over nets not at AC ground; a feedback lead or an AGC line reaches it
// the longer way round; two parts each the other's nearest source (an
// oscillator's or a multivibrator's ring) read either way. Review 14's a04 drew its push-pull output stage a
// row before the phase splitter driving it, the overall feedback lead
// having brought the output transformer near the input.
func TestRowsFollowSignal(t *testing.T) {
	files := readSheets(t)
	reviewed, err := filepath.Glob("../../testdata/review14/*.toml")
	if err != nil || len(reviewed) == 0 {
		t.Fatalf("no review circuits in testdata/review14: %v", err)
	}
	files = append(files, reviewed...)
	a3, _ := render.ParsePaper("A3")
	for _, f := range files {
		res := cachedResult(t, f)
		for _, v := range galleryViews {
			s := res.Sheet(v)
			rows, err := render.Config{Page: a3}.Rows(s)
			if err != nil {
				t.Fatal(err)
			}
			rowOf := map[string]int{}
			for i, r := range rows {
				for _, ref := range r {
					rowOf[ref] = i
				}
			}
			for _, d := range s.Circuit.Parts {
				r, ok := rowOf[d.Ref]
				if !ok || !d.IsActive() {
					continue
				}
				srcs := nearestSources(s.Circuit, d)
				if slices.ContainsFunc(srcs, func(p string) bool { return slices.Contains(nearestSources(s.Circuit, s.Circuit.Part(p)), d.Ref) }) {
					continue // a ring (two devices each the other's nearest source) reads either way
				}
				if len(srcs) > 0 && !slices.ContainsFunc(srcs, func(p string) bool { k, on := rowOf[p]; return !on || k <= r }) {
					t.Errorf("%s %s on A3: %s on row %d takes its signal from %v, all on later rows", filepath.Base(f), v, d.Ref, r+1, srcs)
				}
			}
		}
	}
}

// nearestSources are the active parts (met on an output or common
// electrode) and input ports nearest d's control electrode through
// passive parts, over nets not at AC ground nor on d's other electrodes.
func nearestSources(c *graph.Circuit, d *graph.Part) []string {
	start := d.NetOf(d.PinWithRole(graph.RoleControl))
	if start == "" || start == graph.NotConnected || c.RoleOf(start).IsACGround() {
		return nil
	}
	met, seen := map[string]bool{d.Ref: true}, map[string]bool{start: true}
	for _, pn := range d.Pins {
		seen[pn.Net] = true // its own loop is no source
	}
	front := []string{start}
	for len(front) > 0 {
		var next, srcs []string
		for _, n := range front {
			for _, cn := range c.ConnsOf(n) {
				p := cn.Part
				if met[p.Ref] {
					continue
				}
				met[p.Ref] = true
				if p.IsActive() || p.Kind == graph.Port {
					if r := graph.RoleOfPin(p.Kind, cn.Pin); p.IsActive() && (r == graph.RoleOutput || r == graph.RoleCommon) || p.Kind == graph.Port && slices.Contains(c.Inputs, n) {
						srcs = append(srcs, p.Ref)
					}
					continue
				}
				for _, pn := range p.Pins {
					if m := pn.Net; m != "" && m != graph.NotConnected && !seen[m] && !c.RoleOf(m).IsACGround() {
						seen[m] = true
						next = append(next, m)
					}
				}
			}
		}
		if len(srcs) > 0 {
			return srcs
		}
		front = next
	}
	return nil
}
