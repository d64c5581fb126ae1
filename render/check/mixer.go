package check

import (
	"fmt"
	"slices"
	"strings"

	"pare/render/geom"
)

// mixerOrder reports a frequency changer drawn out of the trade's order
// (common practice, ../shared/DRAWING-NOTES.md): in a frame titled as a
// mixer or converter, the signal comes in on the left, the mixing device
// stands in the middle, the IF transformer follows it on the right and the
// oscillator coil hangs below it. The frame's device is its one valve or
// transistor; its IF transformer is a transformer whose windings no gang
// section tunes (fixed capacitors or trimmers across an IF winding); its
// oscillator coil is a coil or transformer with a gang section on one of
// its nets. A frame with no single device, or without the part looked for,
// says nothing about it.
func (r *Report) mixerOrder(g *geom.Sheet) {
	tuned := gangTuned(g)
	byRef := map[string]*geom.Symbol{}
	for i := range g.Symbols {
		byRef[g.Symbols[i].Ref] = &g.Symbols[i]
	}
	for _, f := range g.Frames {
		if len(f.Title.Lines) == 0 || !mixerTitle(f.Title.Lines[0]) {
			continue
		}
		var dev *geom.Symbol
		var ifts, oscs []*geom.Symbol
		devices := 0
		for _, ref := range f.Parts {
			s := byRef[ref]
			if s == nil {
				continue
			}
			switch {
			case s.Kind == "valve" || s.Kind == "bjt" || s.Kind == "fet":
				dev = s
				devices++
			case s.Kind == "transformer" && !slices.ContainsFunc(s.Pins, func(p geom.Pin) bool { return tuned[p.Net] }):
				ifts = append(ifts, s)
			case (s.Kind == "transformer" || s.Kind == "inductor") && slices.ContainsFunc(s.Pins, func(p geom.Pin) bool { return tuned[p.Net] }):
				oscs = append(oscs, s)
			}
		}
		if devices != 1 {
			continue
		}
		mid := centre(dev.Box)
		for _, t := range ifts {
			if centre(t.Box).X <= dev.Box.X1 {
				r.MixerOrder = append(r.MixerOrder, fmt.Sprintf("IF transformer %s not drawn right of the mixer %s", t.Ref, dev.Ref))
			}
		}
		for _, t := range oscs {
			if centre(t.Box).Y <= mid.Y {
				r.MixerOrder = append(r.MixerOrder, fmt.Sprintf("oscillator coil %s not drawn below the mixer %s", t.Ref, dev.Ref))
			}
		}
	}
	slices.Sort(r.MixerOrder)
}

// mixerTitle tells a frequency changer's frame by its title's words.
func mixerTitle(title string) bool {
	t := strings.ToLower(title)
	return strings.Contains(t, "mixer") || strings.Contains(t, "frequency changer") || strings.Contains(t, "converter")
}

func centre(r geom.Rect) geom.Pt { return geom.Pt{X: (r.X0 + r.X1) / 2, Y: (r.Y0 + r.Y1) / 2} }

// gangTuned are the nets a gang section tunes that are not AC ground (a
// local ground or rail symbol stands on them), and the coil's end of a
// padder in series with a gang section: the nets of an oscillator or
// signal-frequency tank.
func gangTuned(g *geom.Sheet) map[string]bool {
	acg := acGround(g)
	tuned := map[string]bool{}
	padded := map[string]bool{}
	for _, s := range g.Symbols {
		if s.Kind == "capacitor" && s.Type == "variable" {
			for _, p := range s.Pins {
				tuned[p.Net] = !acg[p.Net]
			}
		}
	}
	for _, s := range g.Symbols {
		if s.Kind == "capacitor" && s.Type != "variable" && len(s.Pins) == 2 {
			a, b := s.Pins[0].Net, s.Pins[1].Net
			if tuned[a] && !acg[b] && !tuned[b] || tuned[b] && !acg[a] && !tuned[a] {
				padded[a], padded[b] = true, true
			}
		}
	}
	for n := range padded {
		tuned[n] = true
	}
	return tuned
}

// acGround are the nets a local ground or rail symbol stands on.
func acGround(g *geom.Sheet) map[string]bool {
	acg := map[string]bool{}
	for _, l := range g.Locals {
		if l.Kind == geom.LocalGround || l.Kind == geom.LocalRail {
			acg[l.Net] = true
		}
	}
	return acg
}
