package pipeline

import (
	"slices"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/figure"
	"pare/render"
	"pare/rules/stages"
)

// Stage frames on a sheet: each recognised stage's box, its title and
// figures line, and the supply filters drawn apart from the signal rows
// (sheet.go draws the views).

// stageFrames makes one frame per top-level stage (sub-stages would draw
// frames inside frames). On a sheet of the original circuit (full not nil) a
// frame holds the original parts its reduced parts stand for.
func stageFrames(found []stages.Stage, reduced, full *graph.Circuit) []render.Frame {
	sub := map[string]bool{}
	byName := map[string]stages.Stage{}
	for _, s := range found {
		byName[s.Name] = s
		for _, c := range s.Contains {
			sub[c] = true
		}
	}
	hosts := supplyHosts(found, full)
	loose := looseSupply(found, reduced, full, hosts)
	var frames []render.Frame
	var names []string
	for _, s := range found {
		if sub[s.Name] || filterSection(s, full) && hosts[s.Name] == "" || s.Topology == stages.OverallFeedbackTopology {
			continue
		}
		set := map[string]bool{}
		for _, ref := range s.Parts {
			rp := reduced.Part(ref)
			switch {
			case full == nil && rp != nil:
				// a stage found on the full circuit lists original parts: a
				// merged part that also stands for parts of other jobs is no
				// part of its frame (a signal stage was found on the merged
				// part itself)
				set[ref] = true
			case full != nil && rp != nil:
				for _, o := range rp.Origins() {
					if full.Part(o) != nil {
						set[o] = true
					}
				}
			case full != nil && full.Part(ref) != nil:
				set[ref] = true
			}
		}
		if len(set) == 0 {
			continue
		}
		places := framePlaces(s, byName, reduced, full, loose)
		for _, pl := range places {
			if slices.Contains(loose, pl.Ref) {
				set[pl.Ref] = true // a loose supply part the template placed
			}
		}
		parts := make([]string, 0, len(set))
		for ref := range set {
			parts = append(parts, ref)
		}
		sort.Strings(parts)
		frames = append(frames, render.Frame{Title: s.Name + " " + s.Title, Subtitle: frameFigures(s.Figures, 2), Parts: parts,
			Places: places, Supply: s.Supply, Apart: apart(s, full)})
		names = append(names, s.Name)
	}
	drawn := full
	if drawn == nil {
		drawn = reduced
	}
	joinChained(frames, names, byName, drawn)
	if full == nil {
		apartChain(frames, reduced)
	}
	return joinSupply(frames, names, hosts)
}

// filterSection tells a supply filter section (a series resistor or choke
// and its capacitors, found on the full circuit) from the stages a sheet
// frames: its parts sit where the rail meets each stage's feed, often far
// apart on the sheet, and a frame around them would sweep across the
// stages between; the stage list and the note name it with its figures.
// A section on the rectifier's output is the exception (supplyHosts). A
// shunt stabiliser's feed is such a section too: its stabiliser (a zener,
// a neon) stands on the line it holds as a decoupler's capacitor does.
func filterSection(s stages.Stage, full *graph.Circuit) bool {
	if !s.Supply || full == nil {
		return false
	}
	for _, ref := range s.Parts {
		p := full.Part(ref)
		if p == nil || !sectionPart(p, s.Topology) {
			return false
		}
	}
	return len(s.Parts) > 0
}

// sectionPart tells a part a supply filter section is made of: a
// resistor, choke or capacitor, or, in a shunt stabiliser's feed, the
// two-terminal stabiliser across its line.
func sectionPart(p *graph.Part, topology string) bool {
	switch p.Kind {
	case graph.Resistor, graph.Inductor, graph.Capacitor:
		return true
	case graph.Diode, graph.Generic:
		return topology == stages.ShuntStabiliserTopology && len(p.Pins) == 2
	}
	return false
}

// apart says whether a stage's frame on the reduced sheet (full nil) is a
// supply filter drawn apart from the signal stages (render.Frame.Apart):
// a supply stage the reduction kept some parts of, but a screen feed,
// which the trade draws at the valve it feeds (apartChain).
func apart(s stages.Stage, full *graph.Circuit) bool {
	return full == nil && s.Supply && s.Topology != stages.ScreenFeedTopology
}

// apartChain draws apart with the supply filters the screen feeds fed from
// one of their lines (a dropper from the smoothed HT): review16 a05's, left
// at its valve, stood in the output stage's row with the smoothed line run
// into it past the loudspeaker, where the filter it hangs on was apart. A
// screen feed that is only a bypass at its valve's screen (the dropper in
// the valve's frame, a battery set's) stays there.
func apartChain(frames []render.Frame, c *graph.Circuit) {
	nets := make([]map[string]bool, len(frames))
	for i, f := range frames {
		nets[i] = map[string]bool{}
		for _, ref := range f.Parts {
			if p := c.Part(ref); p != nil {
				for _, pn := range p.Pins {
					if pn.Net != graph.NotConnected && !c.RoleOf(pn.Net).IsACGround() {
						nets[i][pn.Net] = true
					}
				}
			}
		}
	}
	for more := true; more; {
		more = false
		for i := range frames {
			if !frames[i].Supply || frames[i].Apart {
				continue
			}
			for j := range frames {
				if frames[j].Apart && shares(nets[i], nets[j]) {
					frames[i].Apart, more = true, true
					break
				}
			}
		}
	}
}

// frameFigures is a frame's second line: the first n items of the stage's
// figure line, in the one order (the ones a repairer checks first), at a
// sheet's precision ("osc f 1–2.06 MHz").
func frameFigures(figs figure.List, n int) string {
	items := figure.Items(figs, figure.Sheet)
	return strings.Join(items[:min(n, len(items))], ", ")
}
