package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/figure"
)

// A long-tailed pair used as a phase splitter (patterns/long-tailed-pair.toml):
// one half driven on its control electrode, the other's held at AC ground,
// both outputs taken on. The shared tail makes the undriven half follow
// the common electrode: its output swings against the driven half's,
// about as far (handbook: each output ≈ µ·RL/(2(ra+RL)) of the drive with
// a long tail, from memory). The shape alone does not say so (a
// differential amplifier has it too), so "phase splitter" is named only
// where the solver gives the two outputs in antiphase within splitBalance
// of each other; otherwise the stage stays a long-tailed pair.
func init() {
	calcs["ltp_split"] = calc{args: []string{"device", "other", "load", "other_load"},
		required: []string{"device", "other", "load", "other_load"}, fn: calcLTPSplit}
}

func calcLTPSplit(x *figCtx) {
	q1, q2, rl1, rl2 := x.part("device"), x.part("other"), x.part("load"), x.part("other_load")
	if q1 == nil || q2 == nil || rl1 == nil || rl2 == nil || !x.solve {
		return
	}
	inStage := func(p *graph.Part) bool { return slices.Contains(x.m.parts, x.partIndex(p)) }
	f1, f2 := fedFromOutside(x.w.c, q1, inStage), fedFromOutside(x.w.c, q2, inStage)
	if f1 == f2 {
		return // both fed (a differential input) or neither: no splitter
	}
	if f2 {
		// the pattern binds the halves either way round: drive the fed one
		q1, q2, rl1 = q2, q1, rl2
	}
	c, g1, o1, f, ok := x.midbandDrive(q1)
	g2, o2 := q2.NetOf(q2.PinWithRole(graph.RoleControl)), q2.NetOf(q2.PinWithRole(graph.RoleOutput))
	if !ok || o2 == "" || !controlHeld(c, g1, g2, f) {
		return
	}
	a1, ok1 := transferAt(c, g1, o1, f)
	a2, ok2 := transferAt(c, g1, o2, f)
	if !ok1 || !ok2 || !antiphase(a1, a2, splitBalance) {
		return
	}
	x.st.Title = expandTitle("Long-tailed-pair phase splitter ({family})", x.st.Family)
	at := hz(f) + ", " + gangMid.at
	sv := figure.Figure{Name: "gain", Unit: figure.Ratio, Value: a1,
		Origin: figure.BySolver("V("+o1+")/V("+g1+"), "+q1.Ref+"'s "+outputWord(q1), at)}
	var check *figure.Figure
	if d := deviceOf(q1); d.missing == "" {
		if a, name := gainFormula(d, "pair", rl1.Value.Max, 0); name != "" {
			check = &figure.Figure{Name: "gain", Unit: figure.Ratio, Value: a, Origin: figure.ByFormula(name)}
		}
	}
	x.putChecked(&sv, check, func() string {
		return fmt.Sprintf("the formula takes a tail of infinite resistance and %s alone as the load; in circuit the tail passes some of the signal to chassis and what follows loads %s", rl1.Ref, o1)
	})
	x.set("gain", figure.Decibel, 20*math.Log10(math.Abs(a1)), byDecibels)
	x.set("r_load", figure.Ohm, rl1.Value.Max, byLoad)
	x.put(figure.Figure{Name: "gain_other_half", Unit: figure.Ratio, Value: a2,
		Origin: figure.BySolver("V("+o2+")/V("+g1+"), "+q2.Ref+"'s "+outputWord(q2), at)})
}

// heldBelow is the most of the drive the undriven half's control electrode
// may carry for it to count as held at AC ground: a tenth (common
// practice, no source: its leak returns it to a decoupled line or the
// tail's top, which the drive moves by a few per cent at most).
const heldBelow = 0.1

// controlHeld says whether net held stays near AC ground with net driven
// driven at f: on AC ground by its role, or the solver's.
func controlHeld(c *graph.Circuit, driven, held string, f float64) bool {
	if c.RoleOf(held).IsACGround() {
		return true
	}
	g, ok := transferAt(c, driven, held, f)
	return ok && math.Abs(g) < heldBelow
}

// fedFromOutside says whether q's control electrode is reached by a part
// the stage does not hold (inStage false) whose far end is not at AC
// ground: the coupling the drive comes in by, not a leak to a decoupled
// line or chassis.
func fedFromOutside(c *graph.Circuit, q *graph.Part, inStage func(*graph.Part) bool) bool {
	g := q.NetOf(q.PinWithRole(graph.RoleControl))
	if g == "" || c.RoleOf(g).IsACGround() {
		return false
	}
	for _, cn := range c.ConnsOf(g) {
		p := cn.Part
		if p == q || inStage(p) {
			continue
		}
		a, b, ok := passiveEnds(p)
		if !ok || !c.RoleOf(a).IsACGround() && !c.RoleOf(b).IsACGround() {
			return true
		}
	}
	return false
}

// ltpMirror pairs the slots of the long-tailed pair's template (patterns/
// long-tailed-pair.toml) that trade places when its halves do: the
// devices, their loads, their leaks.
var ltpMirror = [][2][2]int{{{0, 0}, {2, 0}}, {{1, -1}, {3, -1}}, {{-1, 1}, {3, 1}}}

// ltpPlaces draws a long-tailed pair with its driven half first, by the
// input: the match binds the halves either way round, and with the held
// half first the drive crossed over it to reach the far grid, the far
// grid's leak standing on the wrong side (review20 a04's splitter).
func ltpPlaces(c *graph.Circuit, st *Stage) {
	if st.Topology != "long-tailed-pair" || len(st.Draw) < 2 {
		return
	}
	at := map[[2]int]int{}
	for i, pl := range st.Draw {
		at[[2]int{pl.Col, pl.Row}] = i
	}
	i0, ok0 := at[[2]int{0, 0}]
	i2, ok2 := at[[2]int{2, 0}]
	if !ok0 || !ok2 {
		return
	}
	q1, q2 := c.Part(st.Draw[i0].Part), c.Part(st.Draw[i2].Part)
	inStage := func(p *graph.Part) bool { return slices.Contains(st.Parts, p.Ref) }
	if q1 == nil || q2 == nil || fedFromOutside(c, q1, inStage) || !fedFromOutside(c, q2, inStage) {
		return
	}
	for _, pair := range ltpMirror {
		ia, oka := at[pair[0]]
		ib, okb := at[pair[1]]
		if oka {
			st.Draw[ia].Col, st.Draw[ia].Row = pair[1][0], pair[1][1]
		}
		if okb {
			st.Draw[ib].Col, st.Draw[ib].Row = pair[0][0], pair[0][1]
		}
	}
	st.Draw[0], st.Draw[i2] = st.Draw[i2], st.Draw[0] // the anchor first
}
