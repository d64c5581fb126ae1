package stages

import (
	"fmt"

	"pare/graph"
	"pare/graph/figure"
)

// A transformer-coupled driver: an amplifying device whose output
// electrode works into the primary of a driver transformer, the
// transformer's centre-tapped secondary feeding the control electrodes of
// a push-pull pair in antiphase (the tap is the pair's bias point). The
// stage holds the driver, the transformer and its common lead (a
// part-bypassed emitter too). Named only where the wiring shows the two
// ends of the secondary on two other devices' control electrodes and the
// solver shows them driven in antiphase at mid-band, about equally
// (driverBalance); the gains are the solver's.
func init() {
	calcs["driver"] = calc{args: []string{"device", "xfmr", "end1", "end2"}, required: []string{"device", "xfmr", "end1", "end2"},
		netArgs: []string{"end1", "end2"}, fn: calcDriver}
}

// driverBalance is the most the two halves' drive may differ, as a ratio,
// for "push-pull" drive: 2 (common practice, no source: a driver
// transformer's halves are wound alike, within a few per cent).
const driverBalance = 2.0

func calcDriver(x *figCtx) {
	q := x.part("device")
	end1, end2 := x.st.nets[x.spec.Args["end1"][0]], x.st.nets[x.spec.Args["end2"][0]]
	if q == nil || end1 == "" || end2 == "" {
		return
	}
	p1, p2 := controlledBy(x.w.c, end1, q), controlledBy(x.w.c, end2, q)
	if p1 == nil || p2 == nil || p1 == p2 {
		return // the secondary feeds no pair: no figures, the guard drops the match
	}
	lead := commonLeadOf(x.w.c, q)
	x.claimInstead(nil, lead.parts)
	calcRatio(x)
	if !x.solve {
		return
	}
	c, ctl, out, f, ok := x.midbandDrive(q)
	if !ok {
		return
	}
	g1, ok1 := transferAt(c, ctl, end1, f)
	g2, ok2 := transferAt(c, ctl, end2, f)
	if !ok1 || !ok2 {
		return
	}
	if !antiphase(g1, g2, driverBalance) {
		x.st.unconfirmed = fmt.Sprintf("in circuit %s drives %s ×%s and %s ×%s: not a push-pull pair's antiphase drive",
			q.Ref, p1.Ref, figure.Plain(g1), p2.Ref, figure.Plain(g2))
		return
	}
	at := hz(f) + ", " + gangMid.at
	x.put(figure.Figure{Name: "gain", Unit: figure.Ratio, Value: g1,
		Origin: figure.BySolver("V("+end1+")/V("+ctl+"), to "+p1.Ref+"'s "+ControlWord(p1), at)})
	x.put(figure.Figure{Name: "gain_other_half", Unit: figure.Ratio, Value: g2,
		Origin: figure.BySolver("V("+end2+")/V("+ctl+"), to "+p2.Ref+"'s "+ControlWord(p2), at)})
	gc, okc := transferAt(c, ctl, out, f)
	if !okc {
		return
	}
	rl, _ := drivenZ(withPart(c, quietPart(q)), out, f)
	check, why := x.partBypass(q, lead, ctl, out, f, gc, rl)
	x.putChecked(&figure.Figure{Name: outputGainName(q), Unit: figure.Ratio, Value: gc,
		Origin: figure.BySolver("V("+out+")/V("+ctl+")", at)}, check, why)
}

// controlledBy is the amplifying device other than not whose control
// electrode is on net, nil when none or more than one.
func controlledBy(c *graph.Circuit, net string, not *graph.Part) *graph.Part {
	var found *graph.Part
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p == not || !p.IsActive() || graph.RoleOfPin(p.Kind, cn.Pin) != graph.RoleControl {
			continue
		}
		if found != nil && found != p {
			return nil
		}
		found = p
	}
	return found
}

// ControlWord is the control electrode's name for a device.
func ControlWord(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "base"
	case graph.FET:
		return "gate"
	}
	return "grid"
}

// outputGainName is the figure of the gain at a device's own output
// electrode, named for the electrode a repairer probes.
func outputGainName(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "gain_collector"
	case graph.FET:
		return "gain_drain"
	}
	return "gain_anode"
}
