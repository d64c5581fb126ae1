package stages

import (
	"cmp"
	"sort"
	"strings"

	"pare/graph/figure"
)

// figName is what pare knows about a figure by its name: the words a person
// reads before it, the item it makes with others (a group), and whether it
// is a working value, one that goes into another figure (the C and L of a
// resonance): JSON has it, a table and a sheet leave it out.
type figName struct {
	name, label, group string
	working            bool
	inDB               bool // the row of the figure's value in decibels (gain_db)
}

// suggestedDesign is the item a three-point padding design makes: a design
// pare proposes, not the fitted set, so its parts and its exact points go
// in one item that says so, and a repairer does not "correct" a good padder.
const suggestedDesign = "suggested 3-point design"

// figureNames is every figure a calc writes, in the one order a stage's
// figures are read in: a table and a note list them so, a sheet's frame
// shows the first two. First what a repairer checks first on a stage (the
// oscillator and signal ranges, the resonance, the IF, the bandwidth, the
// gain; common practice), then the rest, then the working values.
var figureNames = []figName{
	{name: "osc_f", label: "osc f"},
	{name: "sig_f", label: "sig f"},
	// a self-oscillating mixer's oscillator tank without its loop, beside
	// the loop's osc f (loopmixfig.go)
	{name: "osc_f_tank", label: "osc tank alone"},
	{name: "f", label: "f"},
	// an oscillator's tank resonance without its loop, beside the loop's f
	{name: "f_tank", label: "tank alone"},
	// an FM detector's S-curve (discriminator.go): its zero, where both
	// diodes are driven alike, and its two peaks; the centre first, what the detector is aligned to
	{name: "f_centre", label: "centre"},
	{name: "s_peak_sep", label: "S-curve peaks apart"},
	{name: "s_peak_lo", label: "S-curve low peak"},
	{name: "s_peak_hi", label: "S-curve high peak"},
	{name: "f1", label: "f1"},
	{name: "f2", label: "f2"},
	{name: "if", label: "IF"},
	{name: "ift_f", label: "IF transformer f"},
	{name: "bw", label: "bandwidth"},
	{name: "q_loaded", label: "loaded Q"},
	// a coupled pair's pass band as the solver gives it (pairpass.go)
	{name: "pass_centre", label: "pass band centre"},
	{name: "hump_lo", label: "lower hump"},
	{name: "hump_hi", label: "upper hump"},
	// a mixer's anode peak where it is not the pass band's centre (iftnote.go)
	{name: "ift_anode_f", label: "anode peak"},
	{name: "image_f", label: "image f"},
	{name: "track_err_max", label: "track err max"},
	{name: "track_err_at", label: "track err at"},
	{name: "track_fit", label: "fitted set tracks exactly at"},
	{name: "track_bw", label: "signal tank bandwidth at worst"},
	{name: "pad_c", label: "padder", group: suggestedDesign},
	{name: "pad_l", label: "coil", group: suggestedDesign},
	{name: "pad_trim", label: "trimmer", group: suggestedDesign},
	{name: "track_f", label: "exact at", group: suggestedDesign},
	{name: "gain", label: "gain"},
	// beside a gain to a tuned secondary: the gain at the device's own
	// output electrode, named for the electrode a repairer probes
	{name: "gain_anode", label: "anode gain"},
	{name: "gain_collector", label: "collector gain"},
	{name: "gain_drain", label: "drain gain"},
	// a phase splitter's other output
	{name: "gain_cathode", label: "cathode gain"},
	{name: "gain_emitter", label: "emitter gain"},
	{name: "gain_source", label: "source gain"},
	{name: "load_ratio", label: "load ratio", working: true},
	// a driver's gain to the other half of a push-pull pair
	{name: "gain_other_half", label: "gain to the other half"},
	// a push-pull pair's drive, the lower half's control against the
	// upper's, with the set driven from its input (pushpull.go)
	{name: "drive_ratio", label: "drive ratio, lower half to upper"},
	{name: "load_f", label: "load tuned f"},
	// The tuned load's Q: the prefix's word before "loaded Q" would read
	// "load loaded Q".
	{name: "load_q_loaded", label: "load tuned Q (loaded)"},
	{name: "f_c", label: "f c"},
	{name: "f_c_unloaded", label: "f c (unloaded)"},
	{name: "tau", label: "tau"},
	// a de-emphasis network's level below its corner, its load's cost
	{name: "pass_level", label: "level below the corner", inDB: true},
	{name: "r_dyn", label: "dynamic R"},
	{name: "tap_share", label: "tap share"},
	{name: "z_in", label: "Zin"},
	// shunt feedback seen at the control electrode (shuntfbz.go)
	{name: "z_in_fb", label: "Zin with feedback"},
	{name: "z_in_open", label: "Zin, feedback opened", working: true},
	{name: "r_feedback", label: "feedback resistor", working: true},
	{name: "z_out", label: "Zout"},
	{name: "r_load", label: "r load"},
	{name: "r_load_ac", label: "r load AC"},
	{name: "ac_dc_ratio", label: "AC/DC load"},
	// a detector diode forward-biased at rest (detbias.go)
	{name: "rd_rest", label: "diode rd on the IF"},
	{name: "r_boot", label: "bootstrapped load"},
	{name: "r_load_plain", label: "the same without the bootstrap"},
	{name: "r_unbypassed", label: "unbypassed common R"},
	{name: "c_neutralising", label: "C"},
	{name: "c_cancelled", label: "cancels an internal C of"},
	{name: "c_added", label: "adds to the internal C"},
	{name: "rev_transfer", label: "reverse transfer"},
	{name: "rev_transfer_open", label: "the same without it"},
	{name: "gain_bypass_open", label: "gain with the bypass open"},
	{name: "nfb", label: "overall feedback", inDB: true},
	// a detector's return held by its bypass: the check behind the name
	{name: "return_if", label: "IF at the return", working: true, inDB: true},
	{name: "gain_closed_loop", label: "closed-loop gain"},
	{name: "gain_open_loop", label: "open-loop gain"},
	{name: "nfb_fraction", label: "feedback fraction β"},
	// a feedback loop's margins off its return ratio (loopmargin.go)
	{name: "phase_margin", label: "phase margin"},
	{name: "phase_margin_at", label: "phase margin at"},
	{name: "gain_margin", label: "gain margin", inDB: true},
	{name: "gain_margin_at", label: "gain margin at"},
	{name: "r_out", label: "r out"},
	{name: "r_in", label: "r in"},
	{name: "r", label: "r"},
	{name: "c_eff", label: "c eff"},
	{name: "feedback", label: "feedback"},
	{name: "gain_min", label: "gain needed to oscillate ≥"}, // the loop's threshold, not the stage's gain
	{name: "regen_loop", label: "reaction loop gain", inDB: true},
	{name: "r_reflected", label: "reflected load"},
	{name: "f_top_cut", label: "top-cut f"},
	{name: "top_cut", label: "cut at band top", inDB: true},
	{name: "bass", label: "bass at band bottom", inDB: true},
	{name: "treble", label: "treble at band top", inDB: true},
	{name: "loss_mid", label: "loss at mid-band, controls at mid", inDB: true},
	{name: "f_rolloff", label: "rolls the gain off above"},
	{name: "cut_top", label: "cut at band top", inDB: true},
	{name: "z_load", label: "load |Z| across the band"},
	{name: "f_zobel", label: "Zobel takes over above"},
	{name: "f_notch", label: "notch f"},
	{name: "notch_depth", label: "notch depth", inDB: true},
	{name: "p_out_class_a", label: "max output (class A)"},
	{name: "p_anode", label: "anode dissipation"},
	{name: "p_max", label: "pmax"},
	{name: "q_mult", label: "Q multiplied by"},
	{name: "k", label: "k"},
	{name: "kc", label: "kc"},
	{name: "q1_loaded", label: "loaded Q1"},
	{name: "q2_loaded", label: "loaded Q2"},
	{name: "z_ratio", label: "z ratio"},
	{name: "turns_ratio", label: "turns ratio"},
	{name: "c_reservoir", label: "c reservoir"},
	{name: "c_input", label: "c input"},
	{name: "c_smoothing", label: "c smoothing"},
	{name: "c_decoupling", label: "c decoupling"},
	{name: "c_screen_bypass", label: "c screen bypass"},
	{name: "screen_v", label: "screen V (DC)"},
	// a detector or AGC diode held off by its return's standing volts
	{name: "delay", label: "delay (DC)"},
	// the voltage a Vbe multiplier holds between an output pair's bases
	{name: "bias_v", label: "bias V (DC)"},
	{name: "screen_drop", label: "drop across the screen feed (DC)"},
	// a shunt stabiliser's feed (stabfeed.go)
	{name: "v_stab", label: "stabilised V (DC)"},
	{name: "i_feed", label: "feed current (DC)"},
	{name: "i_line", label: "drawn by the line's loads (DC)"},
	{name: "i_stab", label: "stabiliser current (DC)"},
	{name: "f_ripple", label: "ripple f"},
	{name: "atten_ripple", label: "attenuation at ripple f", inDB: true},
	{name: "ripple_in", label: "ripple p-p at the reservoir"},
	{name: "hum_out", label: "hum p-p left at the output (fundamental)"},
	// a choke section's resonance and Q as the solver shows them
	// (chokesection.go), after its corner and ripple figures
	{name: "f_res", label: "section resonance"},
	{name: "q_section", label: "section Q"},
	{name: "f_feed", label: "fed stage's lowest f"},
	{name: "atten_feed", label: "attenuation at fed stage's lowest f", inDB: true},
	{name: "z_screen", label: "screen |Z| to chassis"},
	{name: "z_screen_k", label: "screen |Z| to its cathode"},
	{name: "c_in", label: "input C with Miller"},
	{name: "gain_miller", label: "Miller gain |A|"},
	{name: "z_screen_unbypassed", label: "screen |Z| without its bypass"},
	{name: "z_screen_k_unbypassed", label: "screen |Z| to its cathode without its bypass"},
	// a gang-tuned amplifier's gain solved at each end of the travel
	{name: "gain_band_low", label: "gain at the band's low end"},
	{name: "gain_band_high", label: "gain at the band's high end"},
	{name: "l", working: true},
	{name: "c", working: true},
	{name: "l1", working: true},
	{name: "l2", working: true},
	{name: "m", working: true},
	{name: "q1", working: true},
	{name: "q2", working: true},
	{name: "k_ratio", working: true},
	{name: "gain", inDB: true, working: true}, // says what gain says
}

// figureRows indexes figureNames by name, the decibel rows apart: built
// once, since every candidate match writes its figures through it.
var figureRows = func() map[figRow]int {
	m := make(map[figRow]int, len(figureNames))
	for i, n := range figureNames {
		m[figRow{n.name, n.inDB}] = i
	}
	return m
}()

type figRow struct {
	name string
	inDB bool
}

// figureIndex finds a figure in figureNames, -1 when it is not there (a
// name a pattern's value calc gives).
func figureIndex(name string, u figure.Unit) int {
	if i, ok := figureRows[figRow{name, u == figure.Decibel}]; ok {
		return i
	}
	return -1
}

// prefixed puts a pattern's prefix before a figure's name: "osc", "f" →
// "osc_f".
func prefixed(prefix, name string) string {
	if prefix == "" {
		return name
	}
	return prefix + "_" + name
}

// nameOf is what the table says of a figure written under a prefix: the
// whole name's row when it has one ("ift" + "f" is the IF transformer's
// f), else the bare name's with the prefix's word before its label ("grid
// f c"), else the name spelt plainly.
func nameOf(prefix, name string, u figure.Unit) figName {
	full := prefixed(prefix, name)
	if i := figureIndex(full, u); i >= 0 {
		n := figureNames[i]
		n.label = labelOr(n, full)
		return n
	}
	if i := figureIndex(name, u); i >= 0 && prefix != "" {
		n := figureNames[i]
		n.label = strings.ReplaceAll(prefix, "_", " ") + " " + labelOr(n, name)
		return n
	}
	return figName{name: full, label: strings.ReplaceAll(full, "_", " ")}
}

func labelOr(n figName, name string) string {
	if n.label != "" {
		return n.label
	}
	return strings.ReplaceAll(name, "_", " ")
}

// figRank is a figure's place in the one order: the table's own rows
// first in table order, then figures under a pattern's prefix (grouped by
// prefix, in table order within), then names the table does not know, by
// name.
type figRank struct {
	tier   int
	prefix string
	index  int
}

func rankOf(prefix, name string, u figure.Unit) figRank {
	if i := figureIndex(prefixed(prefix, name), u); i >= 0 {
		return figRank{tier: 0, index: i}
	}
	if i := figureIndex(name, u); i >= 0 {
		return figRank{tier: 1, prefix: prefix, index: i}
	}
	return figRank{tier: 2, prefix: prefix}
}

// sortFigures puts a stage's figures in the one order; figRanks runs
// beside Figures (figCtx.put keeps them so) and is sorted with it.
func sortFigures(st *Stage) {
	sort.Stable(byRank{st})
}

// byRank sorts a stage's figures and their ranks together, in place.
type byRank struct{ st *Stage }

func (b byRank) Len() int { return len(b.st.Figures) }

func (b byRank) Swap(i, j int) {
	f, r := b.st.Figures, b.st.figRanks
	f[i], f[j] = f[j], f[i]
	r[i], r[j] = r[j], r[i]
}

func (b byRank) Less(i, j int) bool {
	ra, rb := b.st.figRanks[i], b.st.figRanks[j]
	return cmp.Or(cmp.Compare(ra.tier, rb.tier), strings.Compare(ra.prefix, rb.prefix),
		cmp.Compare(ra.index, rb.index), strings.Compare(b.st.Figures[i].Name, b.st.Figures[j].Name)) < 0
}
