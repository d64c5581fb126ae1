package main

import (
	"fmt"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// A complementary output pair drawn as the trade draws it (common practice
// in transistor service sheets): the NPN above the PNP in one column, the
// emitters meeting at the mid-point between them, the bias chain (diodes,
// resistor or preset) standing between the two bases, left of them, and
// the loudspeaker after the stages, inside no other stage's frame. Before
// the pair had a template and feedback was told from the forward path,
// review14's b04 drew the pair side by side with the chain lying
// horizontal, and its loudspeaker inside the output coupling capacitor's
// frame, left of the pair. The fixtures cover the class: two diodes and a
// preset with emitter resistors and a bootstrapped driver load (b04), two
// diodes and a resistor (comp-chain), two diodes alone with the emitters
// joined straight and a plain driver load (comp-direct), and the pair at
// the end of a whole set (b05). Both the reduced and the faded view.
func TestComplementaryDrawnStacked(t *testing.T) {
	files := []string{
		"../../testdata/review14/b04.toml",
		"../../testdata/review14/b05.toml",
		"../../testdata/pairs/comp-chain.toml",
		"../../testdata/pairs/comp-direct.toml",
	}
	for _, f := range files {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			g := cachedSheet(t, f, v, render.IEC).g
			name := fmt.Sprintf("%s %s", f[strings.LastIndex(f, "/")+1:], v)
			for _, p := range stackedPair(g) {
				t.Errorf("%s: %s", name, p)
			}
			for _, p := range framedSpeakers(g) {
				t.Errorf("%s: %s", name, p)
			}
		}
	}
}

// stackedPair lists what is wrong with the complementary pair's drawing.
func stackedPair(g *geom.Sheet) []string {
	fr := titled(g, "Complementary")
	if fr == nil {
		return []string{"no complementary pair frame"}
	}
	sym := symbols(g)
	var npn, pnp *geom.Symbol
	var chain []geom.Symbol
	for _, ref := range fr.Parts {
		s := sym[ref]
		switch {
		case s.Kind == "bjt" && s.Type == "npn":
			npn = &s
		case s.Kind == "bjt" && s.Type == "pnp":
			pnp = &s
		case s.Kind == "diode" || s.Kind == "pot":
			chain = append(chain, s)
		}
	}
	if npn == nil || pnp == nil {
		return []string{"the frame holds no NPN and PNP pair"}
	}
	var out []string
	// upper device wholly above the lower, in one column (half a grid
	// step of slack)
	if npn.Box.Y1 > pnp.Box.Y0 || abs(npn.Box.X0-pnp.Box.X0) > 0.5 {
		out = append(out, fmt.Sprintf("%s (NPN) at %v not straight above %s (PNP) at %v", npn.Ref, npn.Box, pnp.Ref, pnp.Box))
	}
	top, bottom := controlPin(*npn), controlPin(*pnp)
	if len(chain) == 0 {
		out = append(out, "no bias diode or preset in the pair's frame")
	}
	for _, s := range chain {
		cy, cx := (s.Box.Y0+s.Box.Y1)/2, (s.Box.X0+s.Box.X1)/2
		if cy <= top.At.Y || cy >= bottom.At.Y || cx >= top.At.X {
			out = append(out, fmt.Sprintf("bias part %s at (%.1f, %.1f) not between the bases (%.1f, %.1f) and (%.1f, %.1f), left of them",
				s.Ref, cx, cy, top.At.X, top.At.Y, bottom.At.X, bottom.At.Y))
		}
	}
	return out
}

// framedSpeakers lists the loudspeakers drawn inside the frame of a stage
// that does not hold them.
func framedSpeakers(g *geom.Sheet) []string {
	var out []string
	for _, s := range g.Symbols {
		if s.Kind != "loudspeaker" {
			continue
		}
		cx, cy := (s.Box.X0+s.Box.X1)/2, (s.Box.Y0+s.Box.Y1)/2
		for _, f := range g.Frames {
			in := cx > f.Box.X0 && cx < f.Box.X1 && cy > f.Box.Y0 && cy < f.Box.Y1
			if in && !contains(f.Parts, s.Ref) {
				out = append(out, fmt.Sprintf("loudspeaker %s inside the frame %q", s.Ref, strings.Join(f.Title.Lines, " ")))
			}
		}
	}
	return out
}

// A cathodyne drawn as the trade draws it (common practice): the valve
// with its anode load above it, up to HT, its cathode load below it, down
// to chassis, and both outputs leaving to the right, the coupling parts on
// the anode and the cathode right of the valve. Review14's a04 drew it as
// looped wiring after the output stage it feeds. The class: grid-leak bias
// from the junction of the bias resistor and the cathode load (a04,
// cathodyne-leak) and a grid coupled straight from the amplifier's anode
// with the cathode load alone (cathodyne-dc); reduced and faded views.
func TestCathodyneDrawn(t *testing.T) {
	checkReducedAndFaded(t, cathodyneDrawn,
		"../../testdata/review14/a04.toml",
		"../../testdata/pairs/cathodyne-leak.toml",
		"../../testdata/pairs/cathodyne-dc.toml")
}

// checkReducedAndFaded reports, for each file's reduced and faded sheets
// (IEC), what wrong lists.
func checkReducedAndFaded(t *testing.T, wrong func(*geom.Sheet) []string, files ...string) {
	t.Helper()
	for _, f := range files {
		for _, v := range []render.View{render.Reduced, render.Faded} {
			g := cachedSheet(t, f, v, render.IEC).g
			name := fmt.Sprintf("%s %s", f[strings.LastIndex(f, "/")+1:], v)
			for _, p := range wrong(g) {
				t.Errorf("%s: %s", name, p)
			}
		}
	}
}

func cathodyneDrawn(g *geom.Sheet) []string {
	fr := titled(g, "Cathodyne")
	if fr == nil {
		return []string{"no cathodyne frame"}
	}
	sym := symbols(g)
	var valve *geom.Symbol
	for _, ref := range fr.Parts {
		if s := sym[ref]; s.Kind == "valve" {
			valve = &s
		}
	}
	if valve == nil {
		return []string{"no valve in the cathodyne's frame"}
	}
	var out []string
	a, k := pinNamed(*valve, "a"), pinNamed(*valve, "k")
	loads := map[string]int{}
	for _, s := range g.Symbols {
		for _, p := range s.Pins {
			if s.Ref == valve.Ref || p.Net != a.Net && p.Net != k.Net {
				continue
			}
			cx, cy := (s.Box.X0+s.Box.X1)/2, (s.Box.Y0+s.Box.Y1)/2
			switch {
			case contains(fr.Parts, s.Ref) && s.Kind == "resistor" && p.Net == a.Net:
				loads["anode"]++
				if cy >= a.At.Y {
					out = append(out, fmt.Sprintf("anode load %s at y %.1f not above the anode pin (y %.1f)", s.Ref, cy, a.At.Y))
				}
			case contains(fr.Parts, s.Ref) && s.Kind == "resistor":
				loads["cathode"]++
				if cy <= k.At.Y {
					out = append(out, fmt.Sprintf("cathode load %s at y %.1f not below the cathode pin (y %.1f)", s.Ref, cy, k.At.Y))
				}
			case s.Kind == "capacitor" && !contains(fr.Parts, s.Ref):
				if cx <= valve.Box.X1 {
					out = append(out, fmt.Sprintf("output coupling %s at x %.1f not right of the valve (x %.1f)", s.Ref, cx, valve.Box.X1))
				}
			}
		}
	}
	if loads["anode"] == 0 || loads["cathode"] == 0 {
		out = append(out, fmt.Sprintf("loads in the frame: %v", loads))
	}
	return out
}

func titled(g *geom.Sheet, word string) *geom.Frame {
	for i, f := range g.Frames {
		if strings.Contains(strings.Join(f.Title.Lines, " "), word) {
			return &g.Frames[i]
		}
	}
	return nil
}

func symbols(g *geom.Sheet) map[string]geom.Symbol {
	out := map[string]geom.Symbol{}
	for _, s := range g.Symbols {
		out[s.Ref] = s
	}
	return out
}

func pinNamed(s geom.Symbol, name string) geom.Pin {
	for _, p := range s.Pins {
		if p.Name == name {
			return p
		}
	}
	return geom.Pin{}
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
