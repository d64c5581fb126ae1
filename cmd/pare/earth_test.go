package main

import (
	"math"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// TestEarthOnGround: only ground nets get the earth symbol
// (docs/netlist.md). On the full and faded views every earth symbol
// stands on a net of the ground role; on the reduced view, where the
// reduction tied bypassed lines to AC ground, every earth symbol's
// terminal sat, in the original circuit, on a net whose DC voltage is
// under half the circuit's highest (an anode load returned to a supply
// line at 275 V drawn to chassis was the class; a bypassed cathode or
// emitter a volt or two up is at chassis for the signal, and drawn so).
func TestEarthOnGround(t *testing.T) {
	review, err := filepath.Glob("../../testdata/review12/*.toml")
	if err != nil || len(review) == 0 {
		t.Fatalf("no review circuits: %v", err)
	}
	files := append(readSheets(t), review...)
	warmSheets(files, "")
	for _, f := range files {
		res := cachedResult(t, f)
		top := 0.0
		if res.DC != nil {
			for _, n := range res.Circuit.Nets {
				if v, ok := res.DC.Volts(n.Name); ok {
					top = math.Max(top, math.Abs(v))
				}
			}
		}
		for _, v := range drawViews {
			g := cachedSheet(t, f, v, render.IEC).g
			for _, l := range g.Locals {
				if l.Kind != geom.LocalGround {
					continue
				}
				if v != render.Reduced {
					if res.Circuit.RoleOf(l.Net) != graph.Ground {
						t.Errorf("%s %s: earth symbol at %s.%s on net %s, not a ground net", filepath.Base(f), v, l.Owner, l.Pin, l.Net)
					}
					continue
				}
				p := res.Circuit.Part(l.Owner)
				if p == nil || res.DC == nil {
					continue // an equivalent the reduction made: on no original net
				}
				was := p.NetOf(l.Pin)
				if dcv, ok := res.DC.Volts(was); ok && math.Abs(dcv) > top/2 && math.Abs(dcv) > 1 {
					t.Errorf("%s reduced: earth symbol at %s.%s, whose net %s sits at %.4g V DC (the circuit's highest %.4g V)", filepath.Base(f), l.Owner, l.Pin, was, dcv, top)
				}
			}
		}
	}
}
