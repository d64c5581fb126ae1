package align

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/device"
	"pare/rules/stages"
)

// Reference outputs (common practice, no source): 50 mW into a loudspeaker
// is the customary standard output, with the carrier modulated 30 % at the
// generators' customary 400 Hz; 1 V at a section's output is a level a
// meter reads easily, kept for a set with an amplifier but no loudspeaker
// captured, or no detector.
const (
	refSpeakerW = 0.05
	refVolts    = 1.0
	audioHz     = 400.0
	modDepth    = 0.3
)

// detLevels are the RMS carrier levels at an AM detector in use (from
// memory, no source): the least it detects in proportion (below it a
// diode's curve makes it a square-law detector, giving less audio), the
// level it sees on an ordinary station, and the most it handles before the IF stage feeding it or the diode's own
// loading distorts. A transistor set's signal diode works on a few hundred
// millivolts to a couple of volts; a valve set's diode on volts.
// efficiency is what the rows say of the detector's efficiency.
type detLevels struct {
	least, normal, most float64
	set                 string // "a transistor set's", for the row's words
	efficiency          string
}

var (
	transistorDet = detLevels{least: 0.2, normal: 0.5, most: 2, set: "a transistor set's",
		efficiency: "detector efficiency taken as 1, pare's detector model: a signal diode gives about 0.8–0.9, so the bench needs a little more carrier"}
	valveDet = detLevels{least: 1, normal: 3, most: 15, set: "a valve set's",
		efficiency: "detector efficiency taken as 1, pare's detector model: a valve diode gives about 0.8–0.9, so the bench needs a little more carrier"}
)

// detectorLevels are the carrier levels for this set's detector: a valve
// set's where its devices are valves, else a transistor set's.
func detectorLevels(c *graph.Circuit) detLevels {
	if setFamily(c) == "valve" {
		return valveDet
	}
	return transistorDet
}

// reference is what a row of a band is solved to give.
func reference(c *graph.Circuit, sts []stages.Stage, pts []point, rows []Injection, i int, det *detSides) (net string, level float64, what string) {
	switch pts[i].band {
	case "audio":
		if spk := loudspeaker(c); spk != nil {
			return hotNet(c, spk), math.Sqrt(refSpeakerW * spk.Value.Max), fmt.Sprintf("50 mW into the loudspeaker %s (the standard output, common practice)", spk.Ref)
		}
		if net, level, what := detectorAudioRef(c, pts, det); net != "" {
			return net, level, what
		}
	case "IF":
		if net, level, what := carrierRef(c, pts, rows, det); net != "" {
			return net, level, what
		}
	case "RF":
		for j := i + 1; j < len(pts); j++ {
			if pts[j].mixer {
				word, dev := mixerWords(c, pts[j].net)
				if conversionGm(c, pts[j].net) {
					// a frequency-changer valve's gm is its conversion
					// conductance already (docs/devices.md): the
					// mixer row's gain at the IF is its conversion gain,
					// and a quarter of it again counted the loss twice
					// (review19 a02)
					return pts[j].net, rows[j].Level, fmt.Sprintf("the RF at the mixer's %s (%s) that gives the mixer row's IF: the %s's gm is its conversion conductance (docs/devices.md), so the row's gain at the IF stands for its conversion gain; an estimate, not solved", word, pts[j].net, dev)
				}
				return pts[j].net, rows[j].Level / convFraction, fmt.Sprintf("the RF at the mixer's %s (%s) that gives the mixer row's IF, through a conversion gain estimated at a quarter of its IF gain (conversion transconductance about a quarter to a third of the %s's gm, %s): an estimate, not solved", word, pts[j].net, dev, convSource)
			}
		}
	}
	if len(c.Outputs) == 0 {
		return "", 0, ""
	}
	out := c.Outputs[0]
	if out == pts[i].net {
		// a capture that stops at this point's own net (review19 b02's
		// outputs = mix_b gave "1 V at mix_b gives 1 V at mix_b, ×1"):
		// the IF is read where the stage's transformer passes it on
		if n := stagePassesOn(c, sts, out); n != "" {
			out = n
		}
	}
	return out, refVolts, fmt.Sprintf("1 V at the output (%s)", out)
}

// stagePassesOn is, for the stage whose active device has a pin on net,
// the net its transformer passes the signal on by (passedOn), or "".
func stagePassesOn(c *graph.Circuit, sts []stages.Stage, net string) string {
	for _, st := range sts {
		t := transformerIn(c, st)
		if t == nil {
			continue
		}
		for _, ref := range st.Parts {
			if p := c.Part(ref); p != nil && p.IsActive() && slices.ContainsFunc(p.Pins, func(pn graph.Pin) bool { return pn.Net == net }) {
				return passedOn(c, t)
			}
		}
	}
	return ""
}

// loudspeaker is the set's first loudspeaker with an impedance, or nil.
func loudspeaker(c *graph.Circuit) *graph.Part {
	for _, p := range c.Parts {
		if p.Kind == graph.Loudspeaker && p.Value.Max > 0 {
			return p
		}
	}
	return nil
}

// detectorAudioRef is the audio rows' reference where the set's output is
// passive after its detector (a volume control's wiper, the detector load
// itself: no device to inject at past the detector): the audio a detector
// gives from its usual carrier, carried to the output by the AC solver.
// Aiming at 1 V there would ask the detector for volts of audio, a carrier
// no such set makes. "" where the output has an amplifier after the
// detector, or there is none.
func detectorAudioRef(c *graph.Circuit, pts []point, det *detSides) (string, float64, string) {
	if !passiveAfter(c, pts, det) {
		return "", 0, ""
	}
	out := c.Outputs[0]
	h, err := Response(c, det.load, out, audioHz, 0.5)
	if err != nil || h == 0 || math.IsNaN(h) || math.IsInf(h, 0) {
		return "", 0, ""
	}
	lv := detectorLevels(c)
	audio := modDepth * detEfficiency * lv.normal
	return out, audio * h, fmt.Sprintf("%s at the output (%s): the audio a detector gives from %s of carrier modulated 30 %% (%s usual carrier at the detector, from memory), %s on %s, through what follows it to the output (AC solver)",
		volts(audio*h), out, volts(lv.normal), lv.set, volts(audio), det.load)
}

// passiveAfter says whether the set's output follows an AM detector with
// no device to inject at between them (the detector point is the last).
func passiveAfter(c *graph.Circuit, pts []point, det *detSides) bool {
	k := detectorPoint(pts)
	return k >= 0 && k == len(pts)-1 && det != nil && det.stage != nil && len(c.Outputs) > 0 &&
		!strings.Contains(det.stage.Topology, "discriminator") && !strings.Contains(det.stage.Topology, "ratio")
}

// detectorPoint is the index of the detector-load point, −1 when none.
func detectorPoint(pts []point) int {
	for j := range pts {
		if pts[j].detector {
			return j
		}
	}
	return -1
}

// detEfficiency is the peak detector's efficiency (audio peak over the
// envelope's swing) the IF rows assume: 1, as pare's detector model does
// (graph/device.DetectorRd, derived from the power balance at efficiency
// 1); a valve diode into a load of some hundred kilohms gives 0.8–0.9
// (from memory), so the bench needs a little more carrier than the rows.
const detEfficiency = 1.0

// convFraction is the mixer's conversion transconductance over its gm,
// the estimate an RF row's reference rests on: the small-signal model has
// no conversion gain, only the mixer's gain at the IF as an amplifier, so
// the RF that gives the mixer row's IF is that row's level over this.
const (
	convFraction = 0.25
	convSource   = "a handbook rule from memory"
)

// mixerWords names the control electrode on net and the kind of the device
// it drives, for the RF rows' reference: a transistor mixer's base and
// gm are not a valve's grid and gm. Without a device there, the valve's
// words, as before.
func mixerWords(c *graph.Circuit, net string) (control, device string) {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if graph.RoleOfPin(p.Kind, cn.Pin) != graph.RoleControl {
			continue
		}
		switch p.Kind {
		case graph.BJT:
			return "base", "transistor"
		case graph.FET:
			return "gate", "FET"
		case graph.Valve:
			return "grid", "valve"
		}
	}
	return "grid", "valve"
}

// carrierRef is the IF rows' reference: the carrier at the detector's feed
// (the winding end the diode takes its carrier from, whichever way round
// it is) that, modulated modDepth, gives the detector-load row's audio (an
// envelope of RMS carrier Vc modulated m gives m·Vc RMS of audio through a
// detector of efficiency 1). Where that is more carrier than the detector
// handles in use (detLevels), the rows are solved for the most it handles
// and say what that gives. "" when there is no solved detector row.
func carrierRef(c *graph.Circuit, pts []point, rows []Injection, det *detSides) (string, float64, string) {
	j := detectorPoint(pts)
	if det == nil || det.feed == "" || j < 0 || rows[j].Why != "" || rows[j].Level <= 0 {
		return "", 0, ""
	}
	level := rows[j].Level / (modDepth * detEfficiency)
	lv := detectorLevels(c)
	effNote := lv.efficiency
	if level > lv.most {
		ratio := lv.most / level
		return det.feed, lv.most, fmt.Sprintf("%s of carrier at the detector (%s), modulated 30 %% at 400 Hz, the most %s detector handles in use (from memory): its audio, %s on %s (%s), gives %s; %s would take %s of carrier, more than the detector handles",
			volts(lv.most), det.feed, lv.set, volts(rows[j].Level*ratio), rows[j].Net, effNote, scaledRef(c, rows[j], ratio), rows[j].RefWhat, volts(level))
	}
	if passiveAfter(c, pts, det) {
		return det.feed, level, fmt.Sprintf("%s of carrier at the detector (%s), modulated 30 %% at 400 Hz, %s usual carrier at the detector (from memory): its audio, %s on %s (%s), gives %s at the output (%s)",
			volts(level), det.feed, lv.set, volts(rows[j].Level), rows[j].Net, effNote, volts(rows[j].RefLevel), rows[j].RefNet)
	}
	if level < lv.least {
		// So little carrier gives the reference only with the controls
		// as captured; a diode detects it in a square law, far below the
		// model's efficiency. The rows take the least it detects in
		// proportion, with the volume turned down to the reference.
		return det.feed, lv.least, fmt.Sprintf("%s of carrier at the detector (%s), modulated 30 %% at 400 Hz, the least %s detector works on in proportion (from memory): its audio, %s on %s (%s), gives %s with the volume turned down; as captured that would take only %s of carrier, where a diode detects far less than the model's efficiency",
			volts(lv.least), det.feed, lv.set, volts(lv.least*modDepth*detEfficiency), rows[j].Net, effNote, rows[j].RefWhat, volts(level))
	}
	return det.feed, level, fmt.Sprintf("%s of carrier at the detector (%s), modulated 30 %% at 400 Hz: its audio, %s on %s (%s), gives %s",
		volts(level), det.feed, volts(rows[j].Level), rows[j].Net, effNote, rows[j].RefWhat)
}

// scaledRef is what a row's reference becomes with its level scaled by
// ratio: a loudspeaker's power goes as the square.
func scaledRef(c *graph.Circuit, row Injection, ratio float64) string {
	if spk := loudspeaker(c); spk != nil && row.RefNet == hotNet(c, spk) {
		return fmt.Sprintf("%s into the loudspeaker %s", watts(refSpeakerW*ratio*ratio), spk.Ref)
	}
	return fmt.Sprintf("%s at %s", volts(row.RefLevel*ratio), row.RefNet)
}

// watts writes a power to three significant figures.
func watts(w float64) string {
	if w >= 1 {
		return fmt.Sprintf("%.3g W", w)
	}
	return fmt.Sprintf("%.3g mW", w*1e3)
}

// conversionGm says whether the device whose control electrode is on net
// is a frequency-changer valve (hexode, heptode, octode), whose gm the
// device model takes as its conversion conductance.
func conversionGm(c *graph.Circuit, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind == graph.Valve && graph.RoleOfPin(p.Kind, cn.Pin) == graph.RoleControl && device.ValveClass(p.Type) == "hexode, heptode, octode" {
			return true
		}
	}
	return false
}
