package align

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// tunedTopologies are the stages whose transformer is an IF can when they
// resonate at the IF.
var tunedTopologies = []string{"double-tuned", "tuned-winding", "amp-tuned", "amp-tuned-tapped"}

// resonanceNames are the figures that say where such a stage is tuned.
var resonanceNames = []string{"f", "f1", "f2", "load_f"}

// ifNear is how close a stage's resonance must be to the IF for its
// transformer to count as an IF can: 10 % (an IF can detuned by a few
// per cent is still one; the next tuned circuit, the aerial, is a factor
// away). Common practice, no source.
const ifNear = 0.10

// ifTransformers are the transformers (and tuned coils) of the stages tuned
// to the IF, in signal order, each once. ifHz 0: the set's IF is unknown and
// there are none.
func ifTransformers(c *graph.Circuit, sts []stages.Stage, ifHz float64) []*graph.Part {
	var out []*graph.Part
	if ifHz <= 0 {
		return nil
	}
	for _, s := range sts {
		if !slices.Contains(tunedTopologies, s.Topology) || !tunedAt(s, ifHz) {
			continue
		}
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || (p.Kind != graph.Transformer && p.Kind != graph.Inductor) || slices.Contains(out, p) {
				continue
			}
			out = append(out, p)
		}
	}
	return orderCans(c, append(out, solvedCans(c, sts, ifHz, out)...))
}

func tunedAt(s stages.Stage, ifHz float64) bool {
	for _, n := range resonanceNames {
		f, ok := s.Figures.Get(n)
		if ok && f.Range == nil && math.Abs(f.Value-ifHz) <= ifNear*ifHz {
			return true
		}
	}
	return false
}

// ifSteps adds the IF alignment: each IF transformer from the detector back
// to the mixer (common practice: the can nearest the detector first, its
// secondary before its primary, so each peak is read through cans already
// peaked).
func (g *Guide) ifSteps(c *graph.Circuit, sts []stages.Stage) {
	cans := ifTransformers(c, sts, g.IF)
	watch := "watch " + ifWatch(c, sts, g.FM, ifOutput(c, cans, ifInto(c, sts, g.IF)))
	if w := delayedWatch(c, sts, ifIntoNet(c, sts, g.IF), g.IF, agcNet(c)); w != "" && !g.FM {
		watch = "watch " + w
	}
	if mixerStage(sts) != nil {
		watch += "; keep the oscillator from beating with the generator: tune to a quiet end of the dial or stop it (common practice)"
	}
	into := ifInto(c, sts, g.IF)
	add := func(adj []adjuster, how string) {
		for _, a := range adj {
			g.Steps = append(g.Steps, Step{Phase: "IF", Part: a.ref, Winding: a.winding, What: a.what, Freq: g.IF, Into: into, Watch: how, From: g.IFFrom})
		}
	}
	// An FM detector's transformer: its primary is peaked with the IF cans,
	// its secondary set last for zero (common practice).
	var zero []adjuster
	if det := detectorStage(c, sts); g.FM && det != nil {
		if t := transformerIn(c, *det); t != nil {
			var peak []adjuster
			peak, zero = splitSecondary(c, t)
			g.warnMissing(t, append(peak, zero...))
			add(peak, watch)
			cans = slices.DeleteFunc(cans, func(p *graph.Part) bool { return p == t })
		}
	}
	for i := len(cans) - 1; i >= 0; i-- {
		adj := ifAdjusters(c, cans[i])
		g.warnMissing(cans[i], adj)
		add(adj, watch)
	}
	add(zero, fmt.Sprintf("watch the DC at the detector's audio output (%s) on a centre-zero meter and set it to zero, the generator unmodulated and exactly at the IF (common practice)", detectorOut(c, sts)))
}

func (g *Guide) warnMissing(p *graph.Part, adj []adjuster) {
	if len(adj) == 0 {
		g.Warnings = append(g.Warnings, fmt.Sprintf("%s is tuned to the IF but no adjustable core or trimmer is captured on it: if the can has cores, add adjust = %s to %s (docs/netlist.md)", p.Ref, adjustHint(p), p.Ref))
	}
}

// transformerIn is a stage's transformer, or nil.
func transformerIn(c *graph.Circuit, s stages.Stage) *graph.Part {
	for _, ref := range s.Parts {
		if p := c.Part(ref); p != nil && p.Kind == graph.Transformer {
			return p
		}
	}
	return nil
}

// splitSecondary parts an FM detector transformer's adjusters into those
// peaked for the largest DC and the secondary's, set for zero.
func splitSecondary(c *graph.Circuit, t *graph.Part) (peak, zero []adjuster) {
	for _, a := range ifAdjusters(c, t) {
		if strings.Contains(a.what, "secondary") {
			zero = append(zero, a)
		} else {
			peak = append(peak, a)
		}
	}
	return peak, zero
}

// detectorOut is the detector's audio output net, for the zero setting.
func detectorOut(c *graph.Circuit, sts []stages.Stage) string {
	if det := detectorSides(c, sts); det != nil {
		return det.load
	}
	return "the audio output"
}

// adjuster is one thing turned on an IF can; winding is the core's
// winding ("s", "p"), empty for a whole core or a trimmer.
type adjuster struct{ ref, what, winding string }

// ifAdjusters are what tunes one IF can: its cores as captured (the
// secondary's first), else the trimmers across its windings.
func ifAdjusters(c *graph.Circuit, p *graph.Part) []adjuster {
	var out []adjuster
	cores := slices.Clone(p.Adjust)
	slices.SortFunc(cores, func(a, b string) int { return windingOrder(a) - windingOrder(b) })
	for _, w := range cores {
		if w == graph.CoreWhole {
			out = append(out, adjuster{p.Ref, "core of " + p.Ref, ""})
			continue
		}
		out = append(out, adjuster{p.Ref, fmt.Sprintf("core of %s's %s (%s)", p.Ref, windingWord(w), w), w})
	}
	if len(out) > 0 {
		return out
	}
	for _, t := range trimmersOn(c, netsOf(p)) {
		out = append(out, adjuster{t.Ref, fmt.Sprintf("trimmer %s across %s", t.Ref, p.Ref), ""})
	}
	return out
}

// windingOrder puts a secondary before a primary, then the rest by name.
func windingOrder(w string) int {
	switch w {
	case "s":
		return 0
	case "p":
		return 1
	}
	return 2
}

func windingWord(w string) string {
	switch w {
	case "s":
		return "secondary"
	case "p":
		return "primary"
	}
	return "winding"
}

// windingShort is a winding's word on a sheet mark.
func windingShort(w string) string {
	switch w {
	case "s":
		return "sec"
	case "p":
		return "pri"
	}
	return w
}

func adjustHint(p *graph.Part) string {
	if p.Kind != graph.Transformer {
		return `"core"`
	}
	var names []string
	for _, w := range p.Windings {
		names = append(names, fmt.Sprintf("%q", w.Name))
	}
	return "[" + strings.Join(names, ", ") + "]"
}

// netsOf are the signal nets a part touches (ground left out).
func netsOf(p *graph.Part) []string {
	var out []string
	for _, pin := range p.Pins {
		if pin.Net != "" && !slices.Contains(out, pin.Net) {
			out = append(out, pin.Net)
		}
	}
	return out
}

// hasNet reports whether one of p's pins is on net, as
// slices.Contains(netsOf(p), net) does, without making the slice: the
// tank and trap searches ask it of every part of the circuit.
func hasNet(p *graph.Part, net string) bool {
	return net != "" && slices.ContainsFunc(p.Pins, func(pin graph.Pin) bool { return pin.Net == net })
}

// trimmersOn are the trimmer capacitors with a pin on one of the nets, in
// the circuit's order.
func trimmersOn(c *graph.Circuit, nets []string) []*graph.Part {
	var out []*graph.Part
	for _, q := range c.Parts {
		if q.Kind != graph.Capacitor || q.Type != graph.CapTrimmer {
			continue
		}
		for _, pin := range q.Pins {
			if slices.Contains(nets, pin.Net) && c.RoleOf(pin.Net) != graph.Ground {
				out = append(out, q)
				break
			}
		}
	}
	return out
}

// ifWatch is what to watch while peaking the IF (common practice): on an
// AM set the detector's DC or the AGC line, or the output meter; on an FM
// strip the detector's DC; a section without the detector its IF output.
func ifWatch(c *graph.Circuit, sts []stages.Stage, fm bool, out string) string {
	agc := agcNet(c)
	det := detectorStage(c, sts)
	switch {
	case fm:
		return "the DC across the ratio detector's load (or the discriminator's limiter grid) for a maximum"
	case det != nil && agc != "":
		return fmt.Sprintf("the DC on the AGC line (%s) for %s, or the output meter for a maximum", agc, agcReading(c, sts, agc))
	case det != nil:
		return fmt.Sprintf("the detector's DC (%s%s) for its %s reading, or the output meter for a maximum", det.Name, detOn(c, sts), detWord(detectorSign(c, sts)))
	case out != "":
		w := fmt.Sprintf("the IF at %s on an RF voltmeter or scope for a maximum", out)
		if agc != "" {
			w += fmt.Sprintf(" (on the whole set: the AGC line %s, %s)", agc, strings.TrimPrefix(agcReading(c, sts, agc), "its "))
		}
		return w
	}
	return "the output meter for a maximum"
}

// detOn names the detector's load net for the IF steps (", on det_out"),
// "" when its sides cannot be told.
func detOn(c *graph.Circuit, sts []stages.Stage) string {
	if d := detectorSides(c, sts); d != nil && d.load != "" {
		return ", on " + d.load
	}
	return ""
}

// detWord is the reading a detector's DC peaks at: its most negative where
// its load goes negative with a carrier, most positive where positive.
func detWord(sign int) string {
	switch {
	case sign < 0:
		return "most negative"
	case sign > 0:
		return "most positive"
	}
	return "largest"
}

// agcNet is the AGC line: a bias net named or labelled AGC.
func agcNet(c *graph.Circuit) string {
	for _, n := range c.Nets {
		if n.Role == graph.Bias && (strings.Contains(strings.ToLower(n.Name), "agc") || strings.Contains(strings.ToLower(n.Label), "agc")) {
			return n.Name
		}
	}
	return ""
}

// ifOutput is the net to watch the IF on when no detector is captured: the
// declared output, unless the generator goes into that same net (a capture
// that stops at the mixer's input: review19 b02 told the repairer to
// inject at mix_b and watch mix_b); then the hot end of the winding the
// last IF can passes the signal on by. "" when there is neither.
func ifOutput(c *graph.Circuit, cans []*graph.Part, into string) string {
	if len(c.Outputs) == 0 {
		return ""
	}
	out := c.Outputs[0]
	if !strings.Contains(into, "net "+out+")") || len(cans) == 0 {
		return out
	}
	if n := passedOn(c, cans[len(cans)-1]); n != "" {
		return n
	}
	return out
}

// passedOn is the first net, not at AC ground, of a can's windings other
// than the one a device's output electrode drives (its tapped sections
// share their tap pin, so they count as one winding).
func passedOn(c *graph.Circuit, can *graph.Part) string {
	driven := map[string]bool{}
	for _, pin := range can.Pins {
		for _, k := range c.ConnsOf(pin.Net) {
			if k.Part != nil && k.Part.IsActive() && graph.RoleOfPin(k.Part.Kind, k.Pin) == graph.RoleOutput {
				driven[pin.Name] = true
			}
		}
	}
	for grown := true; grown; {
		grown = false
		for _, w := range can.Windings {
			if driven[w.From] != driven[w.To] {
				driven[w.From], driven[w.To], grown = true, true, true
			}
		}
	}
	if len(driven) == 0 {
		return ""
	}
	for _, pin := range can.Pins {
		if !driven[pin.Name] && !c.RoleOf(pin.Net).IsACGround() {
			return pin.Net
		}
	}
	return ""
}
