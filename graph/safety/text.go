package safety

import (
	"fmt"
	"strings"

	"pare/graph"
)

// The caution texts, in our own words (common practice;
// docs/references.md §9). Every one defers to local codes and licensed
// practice, and every one that goes with reduced or modelled output says
// the output is small-signal only.

// Caution is the safety text for one circuit, in the forms pare prints it.
type Caution struct {
	Assessment
	// Heading and Lines are the repair note's caution block: a bold first
	// line, then one item per line. The last line is about the reduced
	// diagram itself.
	Heading string
	Lines   []string
	// sheet is the one line a sheet carries; sentence the safety sentence
	// under a text report.
	sheet, sentence string
}

// For is the caution for a circuit: Assess, then the texts of its class.
// Pass the original circuit, not a reduced one (see the package comment).
func For(c *graph.Circuit) Caution { return Assess(c).Caution() }

// Caution gives the texts for the assessed class.
func (a Assessment) Caution() Caution {
	t := texts[Unknown]
	if a.Class >= 0 && int(a.Class) < len(texts) {
		t = texts[a.Class]
	}
	if a.Class == MainsHT && a.Valves == 0 {
		t = a.solidState()
	}
	lines := make([]string, 0, len(t.lines)+2)
	for _, l := range t.lines {
		lines = append(lines, strings.ReplaceAll(l, "{volts}", volts(a.MaxVolts)))
	}
	if len(a.HotHeaters) > 0 {
		lines = append(lines, fmt.Sprintf(hotHeaterLine, strings.Join(a.HotHeaters, "; ")))
	}
	lines = append(lines, codesLine, smallSignalLine)
	return Caution{
		Assessment: a, Heading: t.heading, Lines: lines,
		sheet:    strings.ReplaceAll(t.sheet, "{volts}", volts(a.MaxVolts)),
		sentence: t.sentence,
	}
}

// solidState is the MainsHT caution of a set without valves (a mains
// transistor set, or a transistor stage on a rail above 50 V): the mains
// side where the netlist shows one, the rails for what they are. The
// valve set's text ("mains and valve HT", "HT typically 200–400 V") said
// of a 16 V transistor set run from a mains transformer is wrong, and a
// caution that is wrong about the set teaches its reader to skip it.
func (a Assessment) solidState() classText {
	t := classText{sentence: mainsSentence}
	high := a.MaxVolts > LowVolts
	switch {
	case a.Mains && high:
		t.heading = "Caution: mains-powered equipment with a rail above 50 V: both can kill."
		t.sheet = "Caution: the mains side and the {volts} V rail can kill; capacitors stay charged after switch-off. Follow local codes and licensed practice."
	case a.Mains:
		t.heading = "Caution: mains-powered equipment can kill: its mains side is at mains potential whenever it is plugged in."
		t.sheet = "Caution: mains-powered: the mains input, fuse, switch and transformer primary can kill. Unplug before touching them; follow local codes and licensed practice."
	case high:
		t.heading = "Caution: a rail above 50 V can give a dangerous shock."
		t.sheet = "Caution: the {volts} V rail can give a dangerous shock; capacitors stay charged after switch-off. Follow local codes and licensed practice."
		t.sentence = highRailSentence
	default:
		// A rectifier with nothing shown feeding it: the mains until
		// checked, as for a netlist that shows nothing.
		t.heading = "Caution: the netlist shows a rectifier but not what feeds it; treat its input as the mains, which can kill, until you have checked."
		t.sheet = "Caution: a rectifier is shown but not its feed; treat it as mains-powered until checked. Follow local codes and licensed practice."
	}
	if a.Mains {
		t.lines = append(t.lines, mainsSideLine)
	}
	if high {
		t.lines = append(t.lines, highRailLine, reservoirLine)
	} else {
		t.lines = append(t.lines, lowSideLine)
	}
	if a.Mains {
		t.lines = append(t.lines, slowLine)
	}
	return t
}

// Basis says what the choice was made from, for the note: "Chosen from the
// netlist: valves V1, V2; rail above 50 V: ht 250 V."
func (c Caution) Basis() string {
	if len(c.Evidence) == 0 {
		return "Chosen because the netlist shows no valves, no mains parts and no rail voltage: pare cannot tell what powers the set."
	}
	return "Chosen from the netlist: " + strings.Join(c.Evidence, "; ") + "."
}

// Sheet is the caution line of a sheet; a sheet of the reduced circuit
// also says it is small-signal only.
func (c Caution) Sheet(reduced bool) string {
	if reduced {
		return c.sheet + " " + smallSignalSheet
	}
	return c.sheet
}

// Output is a kind of text report a caution goes under.
type Output int

// Outputs: what the report is, said before the safety sentence.
const (
	ReduceLog    Output = iota // pare reduce: the reduced circuit and its log
	Comparison                 // pare verify: the AC comparison
	StageFigures               // pare stages: stage figures
	SweepModel                 // pare sweep: a response of the model
)

var outputPrefix = [...]string{
	ReduceLog:    "Small-signal equivalent only: not a wiring diagram, no DC voltages.",
	Comparison:   "Small-signal comparison only: no DC conditions.",
	StageFigures: "Figures are small-signal values from the reduced circuit, not DC voltages.",
	SweepModel:   "Small-signal model only, at the DC operating point: no overload.",
}

// Report is the caution printed under a text report (and in its JSON).
func (c Caution) Report(o Output) string {
	if int(o) < 0 || int(o) >= len(outputPrefix) {
		panic(fmt.Sprintf("safety: no output %d", int(o))) // programming error, never user input
	}
	return outputPrefix[o] + " " + c.sentence
}

const (
	codesLine       = "Follow your local electrical codes and licensed practice; this note does not replace them."
	smallSignalLine = "The reduced diagram is small-signal only: it leaves out DC conditions, heaters and supplies. Do not take voltages or safety decisions from it."
	// smallSignalSheet goes on every sheet of a reduced circuit.
	smallSignalSheet = "Small-signal only: bias, supply and heater paths are not shown."
)

// liveLine opens the caution of a DC voltage chart and of a readings
// report: unlike everything else pare prints, these invite work on a set
// that is switched on (common practice: one hand, clip the negative lead
// first with the set off). A battery set's chart says the same without the
// mains and HT wording (batteryLiveLine): its danger is a shorted battery.
const (
	liveLine        = "These voltages are measured with the set switched on. Clip the meter's negative lead to chassis with the set off, then probe with one hand."
	batteryLiveLine = "These voltages are measured with the set on (battery connected). Clip the meter's negative lead to the battery negative before you connect the battery, and keep the probes from bridging the battery's leads."
	supplyLiveLine  = "These voltages are measured with the supply on. Clip the meter's negative lead to the supply's negative (the circuit's common) with the supply off, and keep the probes from bridging the supply's leads."
)

// Readings is the caution above a DC voltage chart or a readings report:
// the class's line on measuring a working set (a battery set's without
// the mains and HT wording), then its own lines and the line on codes (the
// line about the reduced diagram does not apply to a chart of the whole
// set).
func (c Caution) Readings() []string {
	switch c.Class {
	case Battery, BatteryValve:
		return c.live(batteryLiveLine)
	case OutsideSupply:
		return c.live(supplyLiveLine)
	}
	return c.live(liveLine)
}

// live is the class's lines less the small-signal one, after first.
func (c Caution) live(first string) []string {
	out := []string{first}
	for _, l := range c.Lines {
		if l != smallSignalLine {
			out = append(out, l)
		}
	}
	return out
}

// Alignment is the caution above an alignment procedure and a
// signal-injection table: the live-set line for trimming, then the class's
// own lines and the line on codes (the line about the reduced diagram does
// not apply: the guide is for the whole set).
func (c Caution) Alignment() []string { return c.live(alignLine) }

// alignLine opens the caution of an alignment guide: cores and trimmers
// are turned with the set switched on (common practice: an insulated
// trimming tool, one hand, the generator's earth clipped on with the set
// off).
const alignLine = "Alignment and signal tracing are done with the set switched on. Clip the generator's earth lead on with the set off, turn cores and trimmers with an insulated trimming tool, and keep one hand away from the chassis."

// Lines shared by the classes that may carry mains or HT.
const (
	htLine        = "The HT in a valve set is typically 200–400 V DC, more in transmitters: treat it as lethal. Work one-handed, never when wet or standing on a conductive floor."
	reservoirLine = "Reservoir and filter capacitors stay charged long after switch-off. Discharge them through a resistor and confirm with a meter before you touch anything."
	acdcLine      = "AC/DC (live-chassis) sets can put mains on the chassis. Power them through an isolation transformer, and never clip an earthed scope ground to an unisolated chassis."
	slowLine      = "Bring an old set up slowly (variac or a series lamp), and replace suspect mains-side capacitors and perished wiring first."
)

// hotHeaterLine warns of a heater winding at HT (a directly heated
// rectifier's filament is its cathode): a few volts across it, the full HT
// to chassis (common practice).
const hotHeaterLine = "A heater winding here sits at the full HT (%s): a directly heated rectifier's filament is its cathode. Its tags, leads and the valve's heater pins are live at HT though the winding gives only a few volts: never treat it as a low-voltage heater supply or clip a meter to it as one."

// mainsSentence is the MainsHT report sentence for a set without valves.
const mainsSentence = "Mains-powered sets carry lethal voltages on the mains side and on any rail above 50 V; capacitors stay charged after switch-off. Use an isolation transformer and follow local codes and licensed practice."

// The lines of a set without valves (common practice; docs/references.md
// §9): the mains side of a transformer set is at mains potential while it
// is plugged in, switched on or not (a single-pole switch may break only
// the neutral); a rail above the extra-low-voltage band can shock; a low
// rail cannot, but its reservoir shorted burns.
const (
	highRailSentence = "A rail above 50 V can give a dangerous shock, and capacitors stay charged after switch-off. Follow local codes and licensed practice."
	mainsSideLine    = "The mains input, its fuse and switch and the mains transformer's primary are at mains potential whenever the set is plugged in, switched on or not: unplug it before you touch them, and keep the mains side covered while you work on the rest."
	highRailLine     = "A rail of {volts} V is above the 50 V extra-low-voltage band and can give a dangerous shock: work one-handed, never when wet or standing on a conductive floor."
	lowSideLine      = "The rails are low voltage, but a reservoir capacitor or a rectifier shorted by a probe or a solder bridge can deliver a large current and burn."
)

// classText is what one class says; {volts} stands for the highest
// declared rail.
type classText struct {
	heading  string
	lines    []string // before the codes and small-signal lines
	sheet    string
	sentence string
}

var texts = [...]classText{
	MainsHT: {
		heading: "Caution: mains-powered and valve equipment can kill.",
		// No live-chassis line: the netlist shows no mains input without
		// a transformer and no heater chain (that is LiveChassis), and the
		// README promises that caution only where the circuit shows it.
		lines:    []string{htLine, reservoirLine, slowLine},
		sheet:    "Caution: mains and valve HT can kill; capacitors stay charged after switch-off. Follow local codes and licensed practice.",
		sentence: "Valve sets carry lethal HT; capacitors stay charged after switch-off. Follow local codes and licensed practice.",
	},
	LiveChassis: {
		heading: "Caution: this is an AC/DC set: its chassis can be live at mains potential, and its HT can kill.",
		lines: []string{
			"An AC/DC set has no mains transformer: depending on which way round it is plugged in, the chassis, the control spindles and any screw in reach can be at mains potential. Power it only through an isolation transformer, and never clip an earthed scope ground to its chassis.",
			"Its HT is rectified straight from the mains: treat it as lethal. Work one-handed, never when wet or standing on a conductive floor.",
			"The heater chain sits across the mains as well, and its dropper resistor or line cord runs hot.",
			reservoirLine, slowLine,
		},
		sheet:    "Caution: AC/DC set: the chassis can be live at mains potential and the HT can kill. Work only through an isolation transformer and follow local codes and licensed practice.",
		sentence: "This AC/DC set can have its chassis at mains potential and carries lethal HT; capacitors stay charged after switch-off. Work only through an isolation transformer and follow local codes and licensed practice.",
	},
	Battery: {
		heading: "Caution: a battery set is low voltage, but not free of hazards.",
		lines: []string{
			"This set runs from {volts} V, low voltage on its own. A mains adaptor, charger or bench supply feeding it can be faulty: check it before connecting, and prefer a bench supply with a current limit.",
			"A battery or a large electrolytic shorted by a probe or a solder bridge can deliver a large current and burn: take the battery out before you solder.",
			"Leaking cells are corrosive: clean the contacts and keep the electrolyte off your skin.",
		},
		sheet:    "Caution: battery set ({volts} V): low voltage, but check any mains adaptor or bench supply before connecting and never short the battery. Follow local codes and licensed practice.",
		sentence: "A battery set is low voltage, but a mains adaptor or bench supply can be faulty and a shorted battery can burn: check the supply before connecting and follow local codes and licensed practice.",
	},
	BatteryValve: {
		heading: "Caution: a battery valve set: its HT battery can shock and burn, and HT reaching the filament line blows every valve.",
		// Common practice for battery valve sets (docs/references.md §9):
		// the HT battery is the hazard to the worker, the 1.4 V filaments
		// the hazard to the set.
		lines: []string{
			"The HT battery ({volts} V here) can give a shock and, shorted by a probe or a solder bridge, burns: treat its leads as live HT and work one-handed.",
			"Disconnect the HT battery before you work on the set or solder. To power up, connect the LT (filament) battery first and the HT last; disconnect the HT first.",
			"HT reaching the filament line (a plug in the wrong socket, a slipped probe, a shorted capacitor) blows every valve's filament at once: check the battery plugs and leads with a meter before you connect them.",
			"A mains HT/LT supply used in place of the batteries is mains equipment: check it and its output voltages before connecting.",
		},
		sheet:    "Caution: battery valve set ({volts} V HT): the HT can shock, and HT on the filament line blows every valve. Disconnect the HT battery before working; follow local codes and licensed practice.",
		sentence: "A battery valve set's HT battery can shock and burn, and HT reaching the filament line blows every valve: disconnect the HT battery before working and follow local codes and licensed practice.",
	},
	OutsideSupply: {
		heading: "Caution: a low-voltage circuit fed from an outside supply: low voltage here, but the supply may be mains equipment.",
		lines: []string{
			"This circuit runs from {volts} V brought in from outside the netlist, low voltage on its own. The netlist does not say what feeds it: a battery, or a bench supply, an adaptor or the set's own supply board, any of which may be mains-powered: check it and its output before connecting, and prefer a bench supply with a current limit.",
			"A battery, a reservoir or a large electrolytic shorted by a probe or a solder bridge can deliver a large current and burn: disconnect the supply before you solder.",
		},
		sheet:    "Caution: low-voltage circuit ({volts} V) fed from an outside supply that may be mains equipment: check the supply before connecting, disconnect it before soldering. Follow local codes and licensed practice.",
		sentence: "This circuit is low voltage, but the supply feeding it may be mains equipment and a shorted reservoir can burn: check the supply before connecting and follow local codes and licensed practice.",
	},
	Unknown: {
		heading: "Caution: the netlist does not show what powers this set; treat it as mains-powered equipment, which can kill.",
		lines: []string{
			"Find out what powers the set before you work on it. Until then assume mains and HT: " + strings.ToLower(htLine[:1]) + htLine[1:],
			reservoirLine, acdcLine, slowLine,
		},
		sheet:    "Caution: what powers this set is not shown; treat it as mains and valve HT until checked. Use an isolation transformer and follow local codes and licensed practice.",
		sentence: "The netlist does not show what powers the set: until checked, treat it as mains and valve HT, with lethal voltages, a possibly live chassis and capacitors charged after switch-off. Use an isolation transformer and follow local codes and licensed practice.",
	},
}
