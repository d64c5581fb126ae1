package align

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
)

// genFloor is the least level a row may ask of a generator (common
// practice, no source): about 1 µV is where a service generator's
// attenuator stops being trustworthy and where a valve receiver's own noise
// at its first grid lies; a row asking less is the linear model's
// arithmetic, not a level anyone can set or hear above the hiss.
const genFloor = 1e-6

// potStep is how far each control's wiper is moved to see whether a row
// depends on it, and potSens the change in the row's response that counts
// as depending (1 %).
const (
	potStep = 0.25
	potSens = 0.01
)

// caveats says what a solved row assumes that a bench does not give for
// free: the controls whose setting its level depends on (at their set
// positions), and for a level below genFloor why no level is given and
// how to use the row's gain instead, holding the AGC line agc ("" when
// the set has none).
func caveats(c *graph.Circuit, in Injection, agc string) string {
	var out []string
	controls, presets, unsure := potsOnRow(c, in)
	if len(controls) > 0 {
		out = append(out, "assumes "+strings.Join(controls, " and ")+" (set as captured; the netlist gives a wiper's share of the resistance, not a law, so on a log-law control that is well past mid-rotation): the level depends on the control's setting, so read this row for the ratio, with the control where the table assumes")
	}
	if len(presets) > 0 {
		out = append(out, "assumes "+strings.Join(presets, " and ")+" as captured (a preset, set on the bench and left: an adjustment, not a control): set it by its own adjustment first, since the level here moves with it")
	}
	if len(unsure) > 0 {
		out = append(out, "assumes "+strings.Join(unsure, " and ")+" as captured (wired as a variable resistor, its wiper strapped to an end; the netlist does not say whether it is a control or a preset, type = \"preset\" would): a preset is set by its own adjustment first, a control read for the ratio, since the level here moves with it")
	}
	if in.BelowFloor {
		out = append(out, floorMethod(in, agc))
	}
	return strings.Join(out, "; ")
}

// floorMethod is what a row below genFloor says in place of a level: why
// there is none, and the bench method that uses its gain instead.
func floorMethod(in Injection, agc string) string {
	hold := ""
	if agc != "" {
		hold = fmt.Sprintf("; hold the AGC line (%s) at its no-signal voltage throughout, or the AGC hides the gain", agc)
	}
	return fmt.Sprintf("no level: the solved reference would ask less than %s, under the least a generator sets reliably and the set's own noise (common practice); on the bench set the generator, at this row's frequency, for a steady reading with it on %s, then move it here and turn it down until the reading is the same: it should come down by about this gain (if it comes down far less, the stage between is at fault)%s",
		volts(genFloor), in.GainTo, hold)
}

// potsOnRow lists, as "RV1 with its wiper at 50 % of the track's
// resistance" (a pot's set, docs/netlist.md: no taper is captured, so
// pare cannot say where a log-law knob stands), each control whose
// wiper changes the row's response by more than potSens when moved by
// potStep (the AC solver on the whole circuit, the rest as captured).
// A pot captured as a preset (a bias or current adjustment) is listed
// apart: calling its setting a knob's rotation would mislead. One not said
// to be either whose wiper is strapped to an end (a variable resistor: a
// tone control or a bias preset alike) is listed as unsure.
func potsOnRow(c *graph.Circuit, in Injection) (controls, presets, unsure []string) {
	base, err := Response(c, in.Net, in.RefNet, in.Freq, in.Gang)
	if err != nil || base == 0 {
		return nil, nil, nil
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Pot {
			continue
		}
		moved := c.Clone()
		q := moved.Part(p.Ref)
		q.Set = p.Set + potStep
		if q.Set > 1 {
			q.Set = p.Set - potStep
		}
		h, err := Response(moved, in.Net, in.RefNet, in.Freq, in.Gang)
		if err != nil || math.Abs(h-base) <= potSens*base {
			continue
		}
		switch {
		case p.Type == graph.PotPreset:
			presets = append(presets, fmt.Sprintf("%s at %.0f %% of its track", p.Ref, p.Set*100))
		case p.Type == "" && wiperStrapped(p):
			unsure = append(unsure, fmt.Sprintf("%s at %.0f %% of its track", p.Ref, p.Set*100))
		default:
			controls = append(controls, fmt.Sprintf("%s with its wiper at %.0f %% of the track's resistance", p.Ref, p.Set*100))
		}
	}
	return controls, presets, unsure
}

// wiperStrapped reports whether a pot's wiper shares a net with one of its
// ends: a variable resistor, not a divider.
func wiperStrapped(p *graph.Part) bool {
	w, a, b := p.Pin("w"), p.Pin("1"), p.Pin("2")
	return w != nil && a != nil && b != nil && (w.Net == a.Net || w.Net == b.Net)
}
