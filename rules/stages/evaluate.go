package stages

// A match made a stage: its family, title, figures and flags, and the
// circuit-wide facts the patterns' guards read (FM reception, audio bands).

import (
	"math"
	"slices"
	"sort"
	"strings"

	"pare/graph"
)

// evaluate turns a match into a stage: family, title, figures, flags; nil
// when a guard rejects it or the pattern does not serve the family matched.
// With solve, the figures are the solver's in circuit, the formulas
// beside them; without, the formulas' alone.
func evaluate(w *world, m *match, solve bool) *Stage { return evaluateOn(w, m, solve, nil) }

// evaluateOn is evaluate with the figures solved on cut, a piece of a large
// set (piece.go); nil solves them as solverCircuit chooses.
func evaluateOn(w *world, m *match, solve bool, cut *graph.Circuit) *Stage {
	p := m.v.p
	st := &Stage{Topology: p.ID, group: p.Group, nets: map[string]string{}}
	for i, vp := range m.v.parts {
		if !vp.pp.Shared {
			st.Parts = append(st.Parts, w.parts[m.parts[i]].Ref)
			for _, o := range alongside(w, m, i) {
				st.Parts = append(st.Parts, o.Ref)
			}
		}
	}
	sort.Strings(st.Parts)
	st.Draw = drawPlaces(w, m)
	for vi, vn := range m.v.nets {
		if m.nets[vi] < 0 {
			continue // only absent optional parts touched it
		}
		for _, n := range vn.names {
			st.nets[n] = w.names[m.nets[vi]]
		}
	}
	var active *graph.Part
	for i, vp := range m.v.parts {
		part := w.parts[m.parts[i]]
		if active == nil && (isActiveDevice(vp.pp.Device) || part.Kind == graph.Valve) {
			active = part
		}
	}
	st.Family = familyOf(m, w)
	if len(p.Families) > 0 && !contains(p.Families, st.Family) {
		return nil
	}
	if !contextHolds(p, w, st) {
		return nil
	}
	title := p.Title
	if t, ok := p.Titles[st.Family]; ok {
		title = t
	}
	st.Title = expandTitle(title, st.Family)
	x := &figCtx{w: w, m: m, st: st, solve: solve, cut: cut}
	for _, f := range p.Figures {
		x.spec = f
		calcs[f.Calc].fn(x)
	}
	for _, g := range p.Guards {
		v, ok := st.Figures.Lookup(g.Figure)
		if !ok || math.IsNaN(v) || g.HasMin && v < g.Min || g.HasMax && v > g.Max {
			return nil
		}
	}
	if p.Group == "power" {
		st.Parts = append(st.Parts, x.surgeResistors()...)
		sort.Strings(st.Parts)
	}
	sortFigures(st)
	sort.Strings(st.Flags)
	return st
}

// fmMinHz is where FM reception shows in a circuit's frequencies: the
// usual FM IF is 10.7 MHz and the broadcast band 88–108 MHz, while AM sets
// stop near 30 MHz with a 450–470 kHz IF (from memory). A band or IF of
// 10 MHz or more says the set handles FM.
const fmMinHz = 10e6

// fmReceived tells whether a circuit receives FM: its band, a region's band
// or its declared IF reaches fmMinHz. A network that only makes sense after
// an FM detector (de-emphasis) is not looked for anywhere else; the
// detector itself need not be in the file (an audio board of an FM set).
func fmReceived(c *graph.Circuit) bool {
	return c.FullBand().Max >= fmMinHz || c.Freqs["if"] >= fmMinHz
}

// audioTopHz is the highest top of a band still taken as audio: 20 kHz for
// the ear, with room for a stereo multiplex signal (53 kHz, from memory).
const audioTopHz = 100e3

// inAudioBand tells whether every part lies in an audio band (its region's
// band, or the circuit's): de-emphasis works on the detector's audio
// output, not in the RF or IF stages of the same set.
func inAudioBand(c *graph.Circuit, refs []string) bool {
	for _, r := range refs {
		p := c.Part(r)
		if p == nil {
			return false
		}
		if b := c.BandOf(p); b.Max <= 0 || b.Max > audioTopHz {
			return false
		}
	}
	return len(refs) > 0
}

// familyOf is the kind of the first amplifying device in the match, a
// valve diode counting as valve; a stage of passive parts and semiconductor
// diodes only is "passive".
func familyOf(m *match, w *world) string {
	fam := ""
	for _, ci := range m.parts {
		p := w.parts[ci]
		switch p.Kind {
		case graph.Valve:
			return "valve"
		case graph.BJT:
			if fam == "" {
				fam = "bjt"
			}
		case graph.FET:
			if fam == "" {
				fam = "fet"
			}
		}
	}
	if fam == "" {
		return "passive"
	}
	return fam
}

var electrodeWords = map[string]map[string]string{
	"valve":   {"{control}": "grid", "{common}": "cathode", "{output}": "anode", "{family}": "valve"},
	"bjt":     {"{control}": "base", "{common}": "emitter", "{output}": "collector", "{family}": "BJT"},
	"fet":     {"{control}": "gate", "{common}": "source", "{output}": "drain", "{family}": "FET"},
	"passive": {"{control}": "control", "{common}": "common", "{output}": "output", "{family}": "passive"},
}

func expandTitle(t, family string) string {
	if family == "passive" {
		// "(passive)" tells a reader nothing; drop the parenthesis.
		t = strings.ReplaceAll(t, " ({family})", "")
	}
	words := electrodeWords[family]
	for _, k := range sortedKeys(words) {
		t = strings.ReplaceAll(t, k, words[k])
	}
	return t
}

// Unmatched lists the parts of the circuit that no stage claims, sorted,
// leaving out ports (they are the sheet's connections, not stages).
func Unmatched(c *graph.Circuit, stages []Stage) []string {
	claimed := map[string]bool{}
	for _, s := range stages {
		for _, r := range s.Parts {
			claimed[r] = true
		}
	}
	var out []string
	for _, p := range c.Parts {
		if !claimed[p.Ref] && p.Kind != graph.Port {
			out = append(out, p.Ref)
		}
	}
	return out
}

// sharesCoil reports whether two stages' figures are calculated on the
// same coil (the circuit part each pattern's `coil` or `xfmr` argument binds; both
// stages come from one search, so one numbering of parts).
func sharesCoil(a, b *found) bool {
	ca := figureCoils(a)
	for i := range figureCoils(b) {
		if ca[i] {
			return true
		}
	}
	return false
}

func figureCoils(f *found) map[int]bool {
	out := map[int]bool{}
	for _, spec := range f.m.v.p.Figures {
		names := append(slices.Clone(spec.Args["coil"]), spec.Args["xfmr"]...)
		for _, name := range names {
			for i, vp := range f.m.v.parts {
				if vp.pp.Name == name && f.m.parts[i] >= 0 {
					out[f.m.parts[i]] = true
				}
			}
		}
	}
	return out
}
