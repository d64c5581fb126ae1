// Pairs across a detector: past a diode detector the signal is audio, so
// the proof compares the IF side and the audio side each in its own band.

package ac

import (
	"fmt"

	"pare/graph"
	"pare/graph/value"
)

// DefaultAudioBand is the band a detector's audio is compared over when the
// netlist declares none below the IF: 20 Hz–20 kHz, the usual span of
// hearing and of audio equipment (common practice, no source).
var DefaultAudioBand = value.Range{Min: 20, Max: 20e3}

// audioTop is the highest frequency a band may reach and still count as
// audio for a detector's output (a declared band up to 30 kHz; common
// practice: nothing a broadcast detector passes lies above it).
const audioTop = 30e3

// detector is one envelope detector of the original circuit: the net its IF
// arrives on and the net its audio leaves by.
type detector struct {
	ref, ifNet, audioNet string
}

// detectors finds the signal diodes the solver models as peak detectors
// (a DC load of their own; not rectifiers, zeners or varicaps): for each,
// the diode's terminal net that is not AC ground is its IF side, and the
// net holding the reservoir capacitor to AC ground (that net itself, or
// one a winding joins to it for DC, as with a load in the winding's cold
// end) its audio side.
func detectors(c *graph.Circuit) []detector {
	var out []detector
	for _, p := range c.Parts {
		anodes, cathode := diodeSections(p)
		if len(anodes) == 0 || p.Type == "varicap" || p.Type == "rectifier" || p.Type == "zener" {
			continue
		}
		if _, own := p.Param("rd"); own {
			continue
		}
		var sides []string // cathode side first: the usual detector's load
		for _, n := range []string{p.NetOf(cathode), p.NetOf(anodes[0])} {
			if usable(n) && !c.RoleOf(n).IsACGround() {
				sides = append(sides, n)
			}
		}
		for i, side := range sides {
			audio := reservoirNet(c, side)
			if audio == "" {
				continue
			}
			in := side // a load in the winding's cold end: the diode's own net
			if len(sides) == 2 {
				in = sides[1-i]
			}
			if in != audio {
				out = append(out, detector{ref: p.Ref, ifNet: in, audioNet: audio})
			}
			break
		}
	}
	return out
}

// reservoirNet is net, or a net a winding joins to it, that has a
// capacitor to AC ground: where a detector holds its peaks. "" if none.
func reservoirNet(c *graph.Circuit, net string) string {
	cands := []string{net}
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		for _, w := range p.Windings {
			a, b := p.NetOf(w.From), p.NetOf(w.To)
			if a == net && usable(b) && !c.RoleOf(b).IsACGround() {
				cands = append(cands, b)
			} else if b == net && usable(a) && !c.RoleOf(a).IsACGround() {
				cands = append(cands, a)
			}
		}
	}
	for _, n := range cands {
		for _, cn := range c.ConnsOf(n) {
			if cn.Part.Kind != graph.Capacitor {
				continue
			}
			other := cn.Part.NetOf("1")
			if other == n {
				other = cn.Part.NetOf("2")
			}
			if c.RoleOf(other).IsACGround() {
				return n
			}
		}
	}
	return ""
}

// audioBands are the bands at or below audioTop among the nets' bands, or
// DefaultAudioBand when there are none.
func (ql *quantityList) audioBands(nets ...string) []value.Range {
	var out []value.Range
	for _, n := range nets {
		for _, b := range ql.bandsAt(n) {
			if b.Max <= audioTop {
				out = addBand(out, b)
			}
		}
	}
	if len(out) == 0 {
		out = []value.Range{DefaultAudioBand}
	}
	return out
}

// detectorTransfers: for each detector, its audio net to every declared
// output over the audio bands, and each declared input to its IF net over
// the input's bands. The input-to-output transfer over the input's bands
// is then what the detector leaks of the IF, not signal (the solver's
// detector is a resistor): it is left out, and a note says so.
func (ql *quantityList) detectorTransfers() (replaced map[string]bool) {
	replaced = map[string]bool{}
	dets := detectors(ql.orig)
	joined := joinedNets(ql.orig)
	for _, d := range dets {
		rAudio, okA := ql.mapped(d.audioNet, noAlt)
		for j, out := range ql.orig.Outputs {
			if out == d.audioNet || !okA || !joined(out, d.audioNet) {
				continue
			}
			if rout, ok := ql.mapped(out, ql.outputAlt(j)); ok {
				bands := ql.audioBands(d.audioNet, out)
				ql.add(quantity{what: "transfer", from: d.audioNet, to: out, rFrom: rAudio, rTo: rout, bands: bands})
				ql.rep.Notes = append(ql.rep.Notes, fmt.Sprintf("V(%s)/V(%s): past detector %s the signal is audio: compared over %s",
					out, d.audioNet, d.ref, bandsText(bands)))
			}
		}
		rIF, okI := ql.mapped(d.ifNet, noAlt)
		for i, in := range ql.orig.Inputs {
			if in == d.ifNet || !okI || !joined(in, d.ifNet) {
				continue
			}
			// The input's signal reaches the detector only where the two
			// share a band: past a frequency changer the input's band is
			// not the detector's, and the small-signal transfer there is
			// leakage too: the stages up to the frequency changer are
			// compared instead (changer.go), the regions' own pairs prove
			// the IF.
			var instead string
			if overlaps(ql.bandsAt(in), ql.bandsAt(d.ifNet)) {
				if rin, ok := ql.mapped(in, ql.inputAlt(i)); ok {
					ql.add(quantity{what: "transfer", from: in, to: d.ifNet, rFrom: rin, rTo: rIF, bands: ql.bandsAt(in)})
					instead = fmt.Sprintf("V(%s)/V(%s) is compared there instead", d.ifNet, in)
				}
			} else {
				instead = ql.frontEnd(in, i, d.ifNet)
			}
			for _, out := range ql.orig.Outputs {
				if joined(out, d.audioNet) && ql.pastDetector(in, out) {
					replaced[in+"\x00"+out] = true
					ql.rep.Notes = append(ql.rep.Notes, fmt.Sprintf("V(%s)/V(%s) not compared over %s: past detector %s the signal there is only the IF the detector leaks (a resistor in the model), not signal; %s",
						out, in, bandsText(ql.bandsAt(in)), d.ref, instead))
				}
			}
		}
	}
	return replaced
}

// joinedNets says whether two nets of c are joined through parts without
// passing an AC-ground net or "nc": the only nets a signal between them can
// take. A detector's pairs are those of the inputs and outputs joined to
// it: on a set of many channels, which share only AC ground, a detector
// has nothing to say about another channel's input or output (their
// transfer is zero by structure, which the comparison notes once), and
// listing every detector against every input and output made the notes
// grow with the cube of the channels.
func joinedNets(c *graph.Circuit) func(a, b string) bool {
	uf := &graph.NamedSets{}
	for _, p := range c.Parts {
		first := ""
		for _, pin := range p.Pins {
			if !usable(pin.Net) || c.RoleOf(pin.Net).IsACGround() {
				continue
			}
			if first == "" {
				first = pin.Net
				continue
			}
			uf.Union(first, pin.Net)
		}
	}
	return func(a, b string) bool { return uf.Find(a) == uf.Find(b) }
}

// pastDetector: the output works only at audio and the input only above
// it (an audio output of an IF input): the transfer over the input's bands
// is residue.
func (ql *quantityList) pastDetector(in, out string) bool {
	if in == out {
		return false
	}
	for _, b := range ql.bandsAt(out) {
		if b.Max > audioTop {
			return false
		}
	}
	for _, b := range ql.bandsAt(in) {
		if b.Min <= audioTop {
			return false
		}
	}
	return true
}

// overlaps says whether any band of a meets any band of b.
func overlaps(a, b []value.Range) bool {
	for _, x := range a {
		for _, y := range b {
			if x.Min <= y.Max && y.Min <= x.Max {
				return true
			}
		}
	}
	return false
}

// bandsText lists bands for a note: "20 Hz–20 kHz, 445 kHz–465 kHz".
func bandsText(bs []value.Range) string {
	s := ""
	for i, b := range bs {
		if i > 0 {
			s += ", "
		}
		s += FormatHz(b.Min) + "–" + FormatHz(b.Max)
	}
	return s
}
