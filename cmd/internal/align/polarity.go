package align

import (
	"pare/graph"
	"pare/rules/stages"
)

// The words for the detector's DC and the AGC line follow the circuit: a
// diode whose cathode carries the load gives positive DC with a carrier in,
// one loaded at its anode side negative (common practice: a valve set's
// detector and AGC go negative, many NPN portables' positive).

// detectorSign is the sign of the detector load's DC with a carrier in
// (detSides: +1 positive, −1 negative), 0 when there is no detector.
func detectorSign(c *graph.Circuit, sts []stages.Stage) int {
	return detectorSides(c, sts).signOf()
}

// signOf is the detector's sign, the DC solver's where it showed one.
func (d *detSides) signOf() int {
	switch {
	case d == nil:
		return 0
	case d.dc != nil && d.dc.Sign != 0:
		return d.dc.Sign
	}
	return d.sign
}

// agcSign is the sign of the AGC line's declared DC (0: not declared).
func agcSign(c *graph.Circuit, net string) int {
	n := c.Net(net)
	switch {
	case n == nil || n.Volts == 0:
		return 0
	case n.Volts > 0:
		return 1
	}
	return -1
}

// agcReading is what the AGC line does as the IF peaks: its most negative
// or most positive reading when the detector and the line agree on the
// sign, else its largest change from the no-signal reading.
func agcReading(c *graph.Circuit, sts []stages.Stage, agc string) string {
	d, a := detectorSign(c, sts), agcSign(c, agc)
	if d == 0 && a == 0 && setFamily(c) == "valve" {
		a = -1 // a valve set's AGC goes negative (common practice)
	}
	switch {
	case d < 0 && a <= 0, d == 0 && a < 0:
		return "its most negative reading"
	case d > 0 && a >= 0, d == 0 && a > 0:
		return "its most positive reading"
	}
	return "its largest change from the no-signal reading"
}

// signWord is "negative" or "positive" for a detector sign, for the
// symptom rows ("no negative DC on the detector load").
func signWord(s int) string {
	if s > 0 {
		return "positive"
	}
	return "negative"
}

// setFamily is the family of the set's active devices ("valve", "bjt",
// "fet"), or "mixed" when they differ or there are none.
func setFamily(c *graph.Circuit) string {
	fam := ""
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		f := map[graph.Kind]string{graph.Valve: "valve", graph.BJT: "bjt", graph.FET: "fet"}[p.Kind]
		if fam != "" && f != fam {
			return "mixed"
		}
		fam = f
	}
	if fam == "" {
		return "mixed"
	}
	return fam
}

// readingVariants are the readings of a fault in the words of the set's
// devices ("valve", "bjt", "fet") or of its detector's sign ("negative",
// "positive"), by fault; a set of mixed devices keeps the table's own
// wording, which names both (common practice, no source).
var readingVariants = map[string]map[string]string{
	"dead oscillator": {
		"valve": "no negative voltage on the oscillator grid; the cathode current rises to its no-signal value",
		"bjt":   "the oscillator's base bias not pulled back by the oscillation; the emitter current sits at its no-signal value",
		"fet":   "no negative voltage on the oscillator gate; the source current rises to its no-signal value",
	},
	"mixer not converting": {
		"valve": "anode voltage normal but screen or cathode readings off the chart",
		"bjt":   "collector voltage normal but the emitter reading off the chart",
		"fet":   "drain voltage normal but the source reading off the chart",
	},
	"leaky coupling capacitor": {
		"valve": "the next grid sits positive; that stage's anode voltage drops",
		"bjt":   "the next base is pulled off its bias; that stage's collector voltage drops",
		"fet":   "the next gate sits off its bias; that stage's drain voltage drops",
	},
	openDetector: {
		"negative": "no negative DC on the detector load and the AGC line with a carrier in",
		"positive": "no positive DC on the detector load and the AGC line with a carrier in",
	},
}

// readingsFor is a row's readings in the words of this set.
func readingsFor(row hintRow, family string, det int) string {
	v := readingVariants[row.fault]
	if t, ok := v[family]; ok {
		return t
	}
	if t, ok := v[signWord(det)]; ok && det != 0 {
		return t
	}
	return row.readings
}
