package stages

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// Oscillator loops. A pattern names an oscillator's topology; whether it
// starts, where it runs and how hard it is driven are in its loop gain,
// which the AC solver gives in circuit, with every load (ac.FindLoop: the
// return ratio of the device's controlled source). Each oscillator and
// mixer stage carries its loop at several settings of the gang, and flags
// a repairer acts on.

// LoopSetting is an oscillator's loop at one gang setting.
type LoopSetting struct {
	Gang     float64 `json:"gang"`      // 0: gang at minimum (top of the dial), 1: at maximum
	F        float64 `json:"f_hz"`      // where the loop phase is 0°; 0: nowhere
	MarginDB float64 `json:"margin_db"` // loop gain there, dB: the start-up margin
}

// Loop is the loop gain of one device of a stage across the dial.
type Loop struct {
	Device   string        `json:"device"`
	Settings []LoopSetting `json:"settings"`
	// GrowthPerS is the linear circuit's growth rate σ at the setting with
	// the largest margin (1/s; the natural frequency's real part).
	GrowthPerS float64 `json:"growth_per_s,omitempty"`
	// BrokenAt says where a loop through several devices is broken, ""
	// for Device's own return ratio: a part's lifted end ("C5's end at
	// q2_c, the Wien series arm", Lift) or Device's control electrode
	// alone ("Q1's base", ac.LoopOptions.AtControl). Its margin is then the
	// loop's gain, not Device's gm's.
	BrokenAt string `json:"broken_at,omitempty"`
	// Lift is the part end lifted, nil when the loop is not broken at one.
	Lift *ac.Lift `json:"-"`
}

// Range gives the lowest and highest oscillation frequency and margin over
// the settings where the loop has a 0° crossing.
func (l Loop) Range() (fMin, fMax, mMin, mMax float64, ok bool) {
	for _, s := range l.Settings {
		if s.F == 0 {
			continue
		}
		if !ok {
			fMin, fMax, mMin, mMax, ok = s.F, s.F, s.MarginDB, s.MarginDB, true
			continue
		}
		fMin, fMax = math.Min(fMin, s.F), math.Max(fMax, s.F)
		mMin, mMax = math.Min(mMin, s.MarginDB), math.Max(mMax, s.MarginDB)
	}
	return
}

// gangSettings are the dial positions a loop is solved at: both ends, the
// middle and the quarters when the circuit has a variable capacitor.
func gangSettings(c *graph.Circuit) []float64 {
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type != graph.CapTrimmer && p.Value.IsSpan() {
			return []float64{0, 0.25, 0.5, 0.75, 1}
		}
	}
	return []float64{0.5}
}

// loopOf solves part ref's loop at every gang setting of the circuit of
// lp (one ac.Loops serves every device of a circuit, elaborating it once
// per setting).
func loopOf(lp *ac.Loops, ref string) (Loop, error) { return loopTurned(lp, ref, false) }

// loopTurned is loopOf, or with inverted the loop with the feedback's sign
// turned over: what a winding with its ends swapped would give.
func loopTurned(lp *ac.Loops, ref string, inverted bool) (Loop, error) {
	c := lp.Circuit()
	l := Loop{Device: ref}
	best, bestAt := math.Inf(-1), -1
	for _, g := range gangSettings(c) {
		r, err := lp.Find(ref, ac.LoopOptions{Options: ac.Options{VarFrac: g, VarSet: true}, Inverted: inverted})
		if err != nil {
			return l, err
		}
		l.Settings = append(l.Settings, LoopSetting{Gang: g, F: r.F, MarginDB: r.MarginDB})
		if r.F > 0 && r.MarginDB > best {
			best, bestAt = r.MarginDB, len(l.Settings)-1
		}
	}
	if bestAt >= 0 {
		s := l.Settings[bestAt]
		if p, err := lp.Pole(ref, s.F, ac.Options{VarFrac: s.Gang, VarSet: true}); err == nil {
			l.GrowthPerS = real(p)
		}
	}
	return l, nil
}

// dialPlace words a gang setting for a repairer.
func dialPlace(g float64, settings int) string {
	switch {
	case settings == 1:
		return ""
	case g == 1:
		return " at the low end of the dial"
	case g == 0:
		return " at the high end of the dial"
	}
	return fmt.Sprintf(" at %.0f %% of the gang's travel", 100*g)
}

// Thresholds of the loop flags: common practice, not standards.
const (
	// pullFlag: a loaded tank more than 2 % off its own resonance.
	pullFlag = 0.02
	// squeggMarginDB and squeggTau: a margin of 10 dB or more while the
	// grid (base) bias network's time constant RC is more than ten times
	// the oscillation's build-up time 1/σ: the bias cannot follow the
	// amplitude, which then grows, blocks and restarts in bursts.
	squeggMarginDB = 10.0
	squeggTau      = 10.0
)

// loopFlags are the sentences for an oscillator's loop: not starting, the
// squegging risk, and a frequency pulled away from the tank's own.
func loopFlags(c *graph.Circuit, st *Stage, l Loop) []string {
	var out []string
	n := len(l.Settings)
	_, _, mMin, mMax, ok := l.Range()
	if !ok {
		return append(out, fmt.Sprintf("does not oscillate as drawn (%s)", l.Device))
	}
	if mMax < 0 {
		return append(out, shortLoopFlag(l))
	}
	if mMin < 0 {
		for _, s := range l.Settings {
			if s.F > 0 && s.MarginDB < 0 {
				out = append(out, fmt.Sprintf("will not start: loop gain %+.1f dB%s (%s, %s)", s.MarginDB, dialPlace(s.Gang, n), l.Device, hzText(s.F)))
			}
		}
	}
	for _, s := range l.Settings {
		if s.F == 0 && n > 1 {
			out = append(out, fmt.Sprintf("will not start: no 0° loop phase%s (%s)", dialPlace(s.Gang, n), l.Device))
		}
	}
	if s := squeggFlag(c, l); s != "" {
		out = append(out, s)
	}
	out = append(out, pullFlags(st, l)...)
	return out
}

// shortLoopFlag words a loop a pattern names as an oscillator that reaches
// 0° of loop phase short of 0 dB (the name is contradicted: "does not
// oscillate as drawn"):
// where, by how much, and what gm it would need.
func shortLoopFlag(l Loop) string {
	var best LoopSetting
	for _, s := range l.Settings {
		if s.F > 0 && (best.F == 0 || s.MarginDB > best.MarginDB) {
			best = s
		}
	}
	return fmt.Sprintf("%s: loop phase 0° at %s%s, loop gain %+.1f dB at best (%s): does not oscillate as drawn",
		l.Device, hzText(best.F), dialPlace(best.Gang, len(l.Settings)), best.MarginDB, marginWords(l, best.MarginDB))
}

// squeggFlag is the squegging risk of an oscillator's loop, "" when there
// is none: a large margin while the grid (base) bias network's time
// constant is long against the build-up time (squeggMarginDB, squeggTau).
// Every oscillator gets it, named by a pattern or found by its loop only.
func squeggFlag(c *graph.Circuit, l Loop) string {
	_, _, _, mMax, ok := l.Range()
	tau := biasTau(c, l.Device)
	if !ok || mMax < squeggMarginDB || l.GrowthPerS <= 0 || tau*l.GrowthPerS <= squeggTau {
		return ""
	}
	return fmt.Sprintf("large margin (%+.1f dB) with a long %s time constant (%s, %.0f× the build-up time): may squegg",
		mMax, biasWord(c, l.Device), secText(tau), tau*l.GrowthPerS)
}

// biasWord names a device's control electrode for the squegging flag.
func biasWord(c *graph.Circuit, ref string) string {
	if p := c.Part(ref); p != nil {
		switch p.Kind {
		case graph.BJT:
			return "base"
		case graph.FET:
			return "gate"
		}
	}
	return "grid"
}

// gmMargin says what a loop margin is: the return ratio of the device's
// controlled source, so the factor its gm could fall by before the loop
// stops (or must rise by to start). It is not the voltage gain a loop
// broken at the grid or base would read, which the loading of the break
// changes (common practice: the return ratio is the loop gain of the
// dependent source, a handbook definition).
func gmMargin(ref string, db float64) string {
	x := math.Pow(10, math.Abs(db)/20)
	if db >= 0 {
		return fmt.Sprintf("%s's gm could fall %.1f dB (%.3g×) before it stops", ref, db, x)
	}
	return fmt.Sprintf("%s's gm would have to rise %.1f dB (%.3g×) to start", ref, -db, x)
}

// pullFlags compares the loop's frequency at the ends of the dial with the
// tank's own resonance (its tank-alone figure, else its f figures): the
// difference is what the device and its loads pull it by.
func pullFlags(st *Stage, l Loop) []string {
	tank := func(keys ...string) float64 {
		for _, k := range keys {
			if v, ok := st.Figures.Lookup(k); ok && v > 0 {
				return v
			}
		}
		return 0
	}
	var out []string
	for _, s := range l.Settings {
		var f0 float64
		switch {
		case len(l.Settings) == 1:
			f0 = tank("f_tank_hz", "osc_f_tank_hz", "f_hz", "osc_f_hz")
		case s.Gang == 0:
			f0 = tank("f_tank_max_hz", "osc_f_tank_max_hz", "f_max_hz", "osc_f_max_hz")
		case s.Gang == 1:
			f0 = tank("f_tank_min_hz", "osc_f_tank_min_hz", "f_min_hz", "osc_f_min_hz")
		default:
			continue
		}
		if f0 == 0 || s.F == 0 {
			continue
		}
		if d := s.F/f0 - 1; math.Abs(d) > pullFlag {
			out = append(out, fmt.Sprintf("frequency pulled %+.1f %% by loading%s (tank alone %s, in circuit %s)", 100*d, dialPlace(s.Gang, len(l.Settings)), hzText(f0), hzText(s.F)))
		}
	}
	return out
}

// biasTau is the time constant of a device's grid-leak (base) bias: the
// resistor from its control net to AC ground times the capacitor in series
// into that net; 0 when there is none.
func biasTau(c *graph.Circuit, ref string) float64 {
	p := c.Part(ref)
	if p == nil {
		return 0
	}
	g := p.NetOf(p.PinWithRole(graph.RoleControl))
	var r, cap float64
	for _, q := range c.Parts {
		if len(q.Pins) != 2 || (q.Pins[0].Net != g && q.Pins[1].Net != g) {
			continue
		}
		other := q.Pins[0].Net
		if other == g {
			other = q.Pins[1].Net
		}
		ground := c.RoleOf(other).IsACGround()
		switch {
		case q.Kind == graph.Resistor && ground:
			r = math.Max(r, q.Value.Max)
		case q.Kind == graph.Capacitor && !ground:
			cap = math.Max(cap, q.Capacitance(0.5))
		}
	}
	return r * cap
}

// addLoops gives every oscillator and mixer stage the loop of its device
// (the innermost stage holding it: a Hartley inside a mixer carries it, the
// mixer does not repeat it), with its flags.
// A loop that cannot be solved (a net the model leaves floating) is said in
// a flag; the stage stays.
//
// A stage whose devices close one loop through a Wien network (reduced
// and acg, the reduced circuit and its AC-ground nets, to find it) carries
// that loop once, broken at the network's series arm (wholeLoop), and no
// device's own: each device's return ratio would read the open amplifier.
func addLoops(lp *ac.Loops, out []Stage, reduced *graph.Circuit, acg map[string]bool) {
	c := lp.Circuit()
	done := map[string]bool{}
	for i := len(out) - 1; i >= 0; i-- { // sub-stages follow their parent
		st := &out[i]
		if st.group != "oscillator" && st.group != "mixer" || injectedMixer(st.Topology) ||
			slices.ContainsFunc(st.Loop, func(l Loop) bool { return l.BrokenAt != "" }) {
			// (a loop through several devices is carried once: joinLoop)
			continue
		}
		if st.group == "oscillator" && wienStageLoop(c, reduced, acg, st) {
			for _, ref := range st.Parts {
				done[ref] = true
			}
			slices.Sort(st.Flags)
			continue
		}
		for _, ref := range st.Parts {
			p := c.Part(ref)
			if p == nil || !p.IsActive() || done[ref] || slices.ContainsFunc(st.Loop, func(l Loop) bool { return l.Device == ref }) {
				continue
			}
			done[ref] = true
			l, err := loopOf(lp, ref)
			if err != nil {
				st.Flags = append(st.Flags, fmt.Sprintf("loop gain of %s not computed: %v", ref, err))
				continue
			}
			if freed, flag, ok := loopInputsOpen(c, st, ref, l); ok {
				l = freed
				st.Flags = append(st.Flags, flag)
			}
			st.Loop = append(st.Loop, l)
			loopFrequencyFigure(st, l)
			if st.group == "mixer" {
				mixerLoopFigures(st, l, c.Band)
			}
			checkLeadTitle(c, st, l)
			st.Flags = append(st.Flags, loopFlags(c, st, l)...)
			if f := swappedWindingFlag(lp, st, l); f != "" {
				st.Flags = append(st.Flags, f)
			}
		}
		if st.group == "mixer" && len(st.Loop) == 0 {
			// a Hartley inside a mixer carries the loop: the mixer's
			// osc f is still where that loop runs
			if l, ok := subLoop(out, st); ok {
				mixerLoopFigures(st, l, c.Band)
			}
		}
		slices.Sort(st.Flags)
	}
}

// subLoop is the loop a stage's oscillator sub-stage carries, if one does.
func subLoop(out []Stage, st *Stage) (Loop, bool) {
	for _, name := range st.Contains {
		for i := range out {
			if out[i].Name == name && out[i].group == "oscillator" && len(out[i].Loop) > 0 {
				return out[i].Loop[0], true
			}
		}
	}
	return Loop{}, false
}

// swappedWindingFlag says, for an oscillator a pattern names whose loop
// does not start and whose feedback runs through a transformer, what the
// loop would give with the feedback's sign turned over, where that starts
// it: a reaction winding connected the wrong way round, the commonest
// fault of a tickler oscillator after a rewind or a careless capture
// (common practice). The same sentence as a regenerative detector's and a
// converter's.
func swappedWindingFlag(lp *ac.Loops, st *Stage, l Loop) string {
	if _, _, _, best, ok := l.Range(); ok && best >= 0 || st.group != "oscillator" {
		return ""
	}
	var xfmr string
	for _, r := range st.Parts {
		if p := lp.Circuit().Part(r); p != nil && p.Kind == graph.Transformer {
			xfmr = r
			break
		}
	}
	if xfmr == "" {
		return ""
	}
	turned, err := loopTurned(lp, l.Device, true)
	if err != nil {
		return ""
	}
	fMin, fMax, _, best, ok := turned.Range()
	if !ok || best < 0 {
		return ""
	}
	return fmt.Sprintf("a winding of %s connected the wrong way round as captured: with its ends swapped the loop would give %+.1f dB at best, %s–%s (%s)",
		xfmr, best, hzText(fMin), hzText(fMax), l.Device)
}

// injectedMixer says whether a topology is a mixer fed by a separate
// oscillator: its device has no oscillator loop of its own, so it has
// none to fail, and a loop searched round it would only say "does not
// oscillate" of a part that is not meant to. Every such pattern's id
// starts "mixer-" and holds "-injected" (TestInjectedMixersByID holds the
// library to it): a list of ids missed mixer-common-injected-tapped when
// it was added, and review19 b02's emitter-injected mixer was flagged
// "does not oscillate as drawn".
func injectedMixer(topology string) bool {
	return strings.HasPrefix(topology, "mixer-") && strings.Contains(topology, "-injected")
}

// LoopLine is a loop in words for the stage list: "loop V1: 982.6 kHz–1.959
// MHz, margin +15.8 to +19.3 dB across the dial; by gang travel, 0 %: …".
func LoopLine(l Loop) string {
	fMin, fMax, mMin, mMax, ok := l.Range()
	if !ok {
		return fmt.Sprintf("loop %s: no 0° loop phase from 10 Hz to 1 GHz", l.Device)
	}
	var b strings.Builder
	if l.BrokenAt != "" {
		fmt.Fprintf(&b, "loop broken at %s: ", l.BrokenAt)
	} else {
		fmt.Fprintf(&b, "loop %s: ", l.Device)
	}
	word := "gm margin"
	if l.BrokenAt != "" {
		word = "margin"
	}
	if fMax/fMin-1 < 1e-4 {
		b.WriteString(hzText(fMin))
	} else {
		fmt.Fprintf(&b, "%s–%s", hzText(fMin), hzText(fMax))
	}
	if mMax-mMin < 0.05 {
		fmt.Fprintf(&b, ", %s %+.1f dB", word, mMin)
	} else {
		fmt.Fprintf(&b, ", %s %+.1f to %+.1f dB", word, mMin, mMax)
	}
	if len(l.Settings) > 1 {
		b.WriteString(" across the dial; by gang travel")
		for _, s := range l.Settings {
			if s.F == 0 {
				fmt.Fprintf(&b, ", %.0f %%: none", 100*s.Gang)
				continue
			}
			fmt.Fprintf(&b, ", %.0f %%: %s %+.1f dB", 100*s.Gang, hzText(s.F), s.MarginDB)
		}
	}
	return b.String()
}

// hzText and secText print with the figures' one formatter.
func hzText(f float64) string  { return figure.Format(f, figure.Hertz, figure.Text) }
func secText(t float64) string { return figure.Format(t, figure.Second, figure.Text) }
