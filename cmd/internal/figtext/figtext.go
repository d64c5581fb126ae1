// Package figtext words stage figures the way every output of pare prints
// them: one line per stage for the stage list and the repair note (Line),
// the short second line of a sheet's stage frame (Frame), and a key spelt
// plainly where the stages package has no trade word for it (Label). The
// sheet, the note and `pare stages` share it so the same figure reads the
// same everywhere.
package figtext

import (
	"fmt"
	"regexp"
	"sort"
	"strings"

	"pare/rules/stages"
)

// hiddenFigures are the working values a table leaves to --json: the
// capacitance and inductance that go into a resonance, the Qs behind kc.
var hiddenFigures = map[string]bool{
	"c_f": true, "c_min_f": true, "c_max_f": true, "l_h": true, "l1_h": true, "l2_h": true, "m_h": true,
	"q1": true, "q2": true, "k_ratio": true, "gain_db": true,
}

// Line prints a stage's figures on one line, a min/max pair as one
// range ("osc f 1 MHz–2.07 MHz"), the tracking error with where it occurs
// as one item, the three exact-tracking points as one item.
func Line(figs map[string]float64) string {
	var out []string
	done := map[string]bool{}
	for _, k := range stages.KeyFigures(figs) {
		if done[k] || hiddenFigures[lastFigure(k)] {
			continue
		}
		if item, ok := joinedFigure(figs, k, done); ok {
			out = append(out, item)
			continue
		}
		if strings.Contains(k, "_max_") {
			if _, ok := figs[strings.Replace(k, "_max_", "_min_", 1)]; ok {
				continue // printed with its minimum
			}
		}
		if strings.Contains(k, "_min_") {
			hi := strings.Replace(k, "_min_", "_max_", 1)
			if v, ok := figs[hi]; ok {
				done[hi] = true
				label := figureWords(strings.Replace(k, "_min_", "_", 1))
				out = append(out, label+" "+stages.FigureText(k, figs[k])+"–"+stages.FigureText(hi, v))
				continue
			}
		}
		out = append(out, figureWords(k)+" "+stages.FigureText(k, figs[k]))
	}
	return strings.Join(out, ", ")
}

// joinedFigure prints figures that only make sense together as one item:
// the worst tracking error and the dial frequency where it occurs ("track
// err max -7.708 kHz at 1.6 MHz"), and the three frequencies where a
// three-point padding tracks exactly. It marks the keys it used in done.
func joinedFigure(figs map[string]float64, k string, done map[string]bool) (string, bool) {
	base, ok := strings.CutSuffix(k, "track_err_max_hz")
	if !ok {
		base, ok = strings.CutSuffix(k, "track_err_at_hz")
	}
	if ok {
		maxK, atK := base+"track_err_max_hz", base+"track_err_at_hz"
		v, hasMax := figs[maxK]
		at, hasAt := figs[atK]
		done[maxK], done[atK] = true, true
		switch {
		case hasMax && hasAt:
			return "track err max " + stages.FigureText(maxK, v) + " at " + stages.FigureText(atK, at), true
		case hasMax:
			return "track err max " + stages.FigureText(maxK, v), true
		}
		return "", true // where the error peaks, without the error, says nothing
	}
	// The three-point padding is a design pare proposes, not the fitted
	// set: its parts and its exact points go in one item that says so, so a
	// repairer does not take them for the set's values and "correct" a good
	// padder.
	for _, member := range suggestedKeys {
		base, ok := strings.CutSuffix(k, member)
		if !ok {
			continue
		}
		var parts, at []string
		for _, p := range []struct{ key, word string }{{"pad_c_f", "padder"}, {"pad_l_h", "coil"}, {"pad_trim_f", "trimmer"}} {
			if v, has := figs[base+p.key]; has {
				parts = append(parts, p.word+" "+stages.FigureText(base+p.key, v))
			}
			done[base+p.key] = true
		}
		for _, n := range []string{"1", "2", "3"} {
			key := base + "track_f" + n + "_hz"
			if v, has := figs[key]; has {
				at = append(at, stages.FigureText(key, v))
			}
			done[key] = true
		}
		if len(at) > 0 {
			parts = append(parts, "exact at "+andList(at))
		}
		item := "suggested 3-point design: " + strings.Join(parts, ", ")
		if fit := fittedItem(figs, base, done); fit != "" {
			item = fit + ", " + item // what the set does before what pare proposes
		}
		return item, true
	}
	if m := fittedKey.FindStringSubmatch(k); m != nil {
		return fittedItem(figs, m[1], done), true
	}
	return "", false
}

// fittedItem is "fitted set tracks exactly at …" for the figures with the
// given prefix, "" when there are none; it marks the keys it used in done.
func fittedItem(figs map[string]float64, base string, done map[string]bool) string {
	var at []string
	for n := 1; ; n++ {
		key := fmt.Sprintf("%strack_fit%d_hz", base, n)
		v, has := figs[key]
		if !has {
			break
		}
		if !done[key] {
			at = append(at, stages.FigureText(key, v))
		}
		done[key] = true
	}
	if len(at) == 0 {
		return ""
	}
	return "fitted set tracks exactly at " + andList(at)
}

// suggestedKeys are the figures of a suggested three-point padding design
// (rules/stages tracking); any of them starts the joined item.
var suggestedKeys = []string{"track_f1_hz", "track_f2_hz", "track_f3_hz", "pad_c_f", "pad_l_h", "pad_trim_f"}

// fittedKey matches the points where the fitted set tracks exactly.
var fittedKey = regexp.MustCompile(`^(.*)track_fit\d+_hz$`)

// andList joins items as prose: "a", "a and b", "a, b and c".
func andList(items []string) string {
	if len(items) < 2 {
		return strings.Join(items, "")
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}

// figureWords is the label Line prints before a figure's value: the
// trade's words where stages has them (stages.FigureName), else the key
// spelt plainly (Label).
func figureWords(key string) string {
	if w, ok := stages.FigureName(key); ok {
		return w
	}
	return Label(key)
}

// lastFigure strips a calc prefix ("osc_c_min_f" → "c_min_f") so the hidden
// working values are hidden whatever stage they belong to.
func lastFigure(k string) string {
	for _, base := range []string{"c_min_f", "c_max_f", "c_f", "l1_h", "l2_h", "l_h", "m_h"} {
		if k == base || strings.HasSuffix(k, "_"+base) && !strings.HasPrefix(k, "pad_") {
			return base
		}
	}
	return k
}

// Frame prints up to n figures for a frame's second line: the ones a
// repairer checks first (oscillator and signal range, resonance, IF,
// bandwidth, gain, then time constants), with a min/max pair shown as one
// range ("osc f 1.004–2.063 MHz").
func Frame(figs map[string]float64, n int) string {
	type entry struct {
		rank int
		name string
		key  string
		text string
	}
	var list []entry
	keys := make([]string, 0, len(figs))
	for k := range figs {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		base, unit := splitFigure(k)
		if strings.HasSuffix(base, "_max") {
			if _, paired := figs[strings.TrimSuffix(base, "_max")+"_min"+unit]; paired {
				continue // shown with its _min
			}
		}
		text := stages.FigureText(k, figs[k])
		name := base
		if lo, ok := strings.CutSuffix(base, "_min"); ok {
			// Only a min with its max is a range; a lone min (the gain
			// needed to oscillate) keeps its own name.
			if hi, paired := figs[lo+"_max"+unit]; paired {
				name = lo
				text = stages.FigureText(k, figs[k]) + "–" + stages.FigureText(k, hi)
			}
		}
		list = append(list, entry{figureRank(name), name, name + unit, text})
	}
	sort.SliceStable(list, func(i, j int) bool { return list[i].rank < list[j].rank })
	seen := map[string]bool{}
	kept := list[:0]
	for _, e := range list {
		if !seen[e.name] { // gain and gain_db say the same thing once
			seen[e.name] = true
			kept = append(kept, e)
		}
	}
	list = kept
	if len(list) > n {
		list = list[:n]
	}
	out := make([]string, len(list))
	for i, e := range list {
		label := strings.ReplaceAll(e.name, "_", " ")
		if w, ok := stages.FigureName(e.key); ok {
			label = w // the same words as pare stages prints
		}
		out[i] = label + " " + e.text
	}
	return strings.Join(out, ", ")
}

// frameFigureOrder lists figure names (without unit suffix) in the order a
// repairer looks for them on a stage (common practice).
var frameFigureOrder = []string{"osc_f", "sig_f", "f", "f1", "if", "ift_f", "bw", "gain", "gain_unloaded", "load_f", "tau", "f_c", "c"}

func figureRank(name string) int {
	for i, n := range frameFigureOrder {
		if n == name {
			return i
		}
	}
	return len(frameFigureOrder)
}

// splitFigure parts a figure key into its name and its unit suffix.
func splitFigure(k string) (string, string) {
	for _, unit := range []string{"_hz", "_s", "_ohm", "_f", "_h", "_v", "_db"} {
		if strings.HasSuffix(k, unit) {
			return strings.TrimSuffix(k, unit), unit
		}
	}
	return k, ""
}

// Label turns a figure key into the words a note prints before it:
// "f_min_hz" -> "f min", "q_loaded" -> "q loaded". The unit is dropped
// because FigureText prints it with the number.
func Label(key string) string {
	for _, suffix := range []string{"_hz", "_ohm", "_s", "_f", "_h", "_v", "_a", "_db", "_deg"} {
		if strings.HasSuffix(key, suffix) && len(key) > len(suffix) {
			key = strings.TrimSuffix(key, suffix)
			break
		}
	}
	return strings.ReplaceAll(key, "_", " ")
}
