package stages

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/figure"
)

// How far a device's common lead is bypassed, judged by the solver. A
// name that says "partly bypassed" claims two things: the capacitor does
// bypass (the gain is higher with it than without it), and part of the
// lead is left unbypassed (the gain is short of the one with the whole
// lead tied to AC ground). The shape alone says neither: the degenerated
// phase-shift pattern takes any resistor from the common electrode with
// or without a capacitor across it, and a 100 µF capacitor across 1 kΩ at
// 1 kHz (1.6 Ω) leaves nothing of the resistor (testdata/review14/b01.toml
// was named "emitter resistor partly bypassed" so, and so again with the
// capacitor removed).

// Lead bypass states.
const (
	leadBypassed   = iota // the whole lead at AC ground at f: no clause
	leadPartly            // the capacitor bypasses, part of the lead is left
	leadUnbypassed        // no capacitor, or one that does little at f
)

// leadJudgement is the solver's gains from control to output at f: as
// drawn (g), with the lead's capacitors open (open) and with the whole
// lead tied to AC ground by a perfect bypass (full); and the state they
// give.
type leadJudgement struct {
	f, g, open, full float64
	caps             []*graph.Part
	state            int
}

// leadCaps are the capacitors of dev's common lead on c: from the common
// net, or from a foot net a resistor joins it to, to AC ground.
func leadCaps(c *graph.Circuit, dev *graph.Part, k string) []*graph.Part {
	ground := func(n string) bool { return c.RoleOf(n).IsACGround() }
	nets := []string{k}
	for _, cn := range c.ConnsOf(k) {
		if a, b, ok := passiveEnds(cn.Part); ok && cn.Part.Kind == graph.Resistor && !ground(a) && !ground(b) {
			nets = append(nets, a, b)
		}
	}
	var caps []*graph.Part
	for _, p := range c.Parts {
		a, b, ok := passiveEnds(p)
		if ok && p.Kind == graph.Capacitor && ground(a) != ground(b) && (slices.Contains(nets, a) || slices.Contains(nets, b)) && !slices.Contains(caps, p) {
			caps = append(caps, p)
		}
	}
	return caps
}

// judgeLead solves dev's common lead on c at f; ok is false when its
// common electrode is at AC ground or the solver cannot say.
func judgeLead(c *graph.Circuit, dev *graph.Part, f float64) (j leadJudgement, ok bool) {
	k := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	ctl := dev.NetOf(dev.PinWithRole(graph.RoleControl))
	out := dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	if k == "" || ctl == "" || out == "" || c.RoleOf(k).IsACGround() || !(f > 0) {
		return j, false
	}
	j.f, j.caps = f, leadCaps(c, dev, k)
	if j.g, ok = transferAt(c, ctl, out, f); !ok {
		return j, false
	}
	if len(j.caps) == 0 {
		j.state = leadUnbypassed
		return j, true
	}
	j.open, ok = transferAt(withoutRefs(c, refsOf(j.caps)), ctl, out, f)
	if !ok {
		return j, false
	}
	if j.full, ok = transferAt(wholeBypass(c, k, j.caps), ctl, out, f); !ok {
		return j, false
	}
	switch g, o, w := math.Abs(j.g), math.Abs(j.open), math.Abs(j.full); {
	case g >= (1-bypassAgreement)*w:
		j.state = leadBypassed
	case g >= partBypassMin*o:
		j.state = leadPartly
	default:
		j.state = leadUnbypassed
	}
	return j, true
}

// wholeBypass is c with a perfect bypass of a whole common lead: a
// capacitor like the lead's first, fullBypassC times larger, from the
// common net k to the ground that capacitor returns to.
func wholeBypass(c *graph.Circuit, k string, caps []*graph.Part) *graph.Circuit {
	whole := scaledCap(caps[0], fullBypassC)
	whole.Ref = caps[0].Ref + "~whole"
	gnd := whole.Pins[0].Net
	if !c.RoleOf(gnd).IsACGround() {
		gnd = whole.Pins[1].Net
	}
	whole.Pins = []graph.Pin{{Name: whole.Pins[0].Name, Net: k}, {Name: whole.Pins[1].Name, Net: gnd}}
	cw := withPart(c, &graph.Part{})
	cw.Parts = append(slices.Clone(c.Parts), whole)
	return cw
}

// gainsText words a judgement's three gains for a note.
func (j leadJudgement) gainsText() string {
	refs := strings.Join(refsOf(j.caps), ", ")
	return fmt.Sprintf("at %s the gain in circuit is %s, %s with %s open and %s with the whole lead tied to AC ground",
		hz(j.f), figure.Format(j.g, figure.Ratio, figure.Text), figure.Format(j.open, figure.Ratio, figure.Text), refs, figure.Format(j.full, figure.Ratio, figure.Text))
}

// degeneratedTitles are the oscillator patterns whose title claims a
// partly bypassed common lead, with the titles the solver may give
// instead: bypassed (no clause), unbypassed.
var degeneratedTitles = map[string][2]string{
	"rc-phase-shift-degenerated": {"RC phase-shift oscillator ({family})", "RC phase-shift oscillator, {common} resistor unbypassed ({family})"},
}

// checkLeadTitle keeps an oscillator pattern's "partly bypassed" only
// where the solver shows it at the loop's frequency (the formula's where
// the loop has no 0° point), on the circuit the loop is solved in.
func checkLeadTitle(c *graph.Circuit, st *Stage, l Loop) {
	alt, claimed := degeneratedTitles[st.Topology]
	dev := c.Part(l.Device)
	if !claimed || dev == nil {
		return
	}
	f, _, _, _, ok := l.Range()
	if !ok {
		f, ok = st.Figures.Lookup("f_hz")
	}
	if !ok {
		return
	}
	j, ok := judgeLead(c, dev, f)
	if !ok {
		return
	}
	switch j.state {
	case leadBypassed:
		st.Title = expandTitle(alt[0], st.Family)
		if len(j.caps) > 0 {
			st.Notes = append(st.Notes, "named bypassed: "+j.gainsText()+"; the lead is bypassed at the oscillator's frequency")
		}
	case leadUnbypassed:
		st.Title = expandTitle(alt[1], st.Family)
		if len(j.caps) > 0 {
			st.Notes = append(st.Notes, "named unbypassed: "+j.gainsText()+"; the bypass does little at the oscillator's frequency")
		}
	default:
		st.Notes = append(st.Notes, "named partly bypassed: "+j.gainsText())
	}
}

// acrossWholeLead tells whether capacitor ck joins dev's common electrode
// itself to AC ground: nothing of the lead lies outside it.
func (x *figCtx) acrossWholeLead(dev, ck *graph.Part) bool {
	a, b, ok := passiveEnds(ck)
	k := dev.NetOf(dev.PinWithRole(graph.RoleCommon))
	if !ok || k == "" {
		return false
	}
	c := x.solverCircuit()
	ground := func(n string) bool { return c.RoleOf(n).IsACGround() }
	return (a == k && ground(b)) || (b == k && ground(a))
}
