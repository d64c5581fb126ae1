package graph

// Parts that carry the signal back, found before the layers are counted (as
// ASG resolves feedback loops before placement: Jehng, Chen and Parng,
// 1991): a two-terminal part from an active device's control or common
// electrode to a net the signal reaches after leaving that device and
// passing through another one. An overall negative-feedback resistor from
// the loudspeaker to the first cathode is one, and so is the coupling
// capacitor into a later stage's grid inside that loop: both carry the
// signal only into the electrode, never out of it. A breadth-first walk
// that crosses them from the electrode's side counted the output stage one
// step from the first device through the feedback resistor, and drew the
// output stage, its coupling capacitor and loudspeaker before the stages
// that feed them; walked only towards the electrode, a feedback part is
// reached after the stages it spans and is put beside the device it feeds
// back into, the wire running back above or below the stages as the trade
// draws it (render/layout), and the stages are named in the order the
// signal reaches them (rules/stages).

// FeedbackParts lists, per feedback part among parts (view's), the net of
// the electrode it feeds back into; follow says which nets carry signal.
func FeedbackParts(parts []*Part, view *View, follow func(string) bool) map[*Part]string {
	out := map[*Part]string{}
	for _, d := range parts {
		if !d.IsActive() {
			continue
		}
		into := map[string]bool{}
		var outs []string
		for _, pn := range d.Pins {
			if !follow(pn.Net) {
				continue
			}
			switch RoleOfPin(d.Kind, pn.Name) {
			case RoleControl, RoleCommon:
				into[pn.Net] = true
			case RoleOutput:
				outs = append(outs, pn.Net)
			}
		}
		cands := candidates(parts, into, follow)
		if len(cands) == 0 || len(outs) == 0 {
			continue
		}
		after := beyond(view, d, outs, into, follow)
		for _, q := range cands {
			for _, pn := range q.Pins {
				if !into[pn.Net] && after[pn.Net] {
					out[q] = otherNet(q, pn.Net)
				}
			}
		}
	}
	return out
}

// candidates are the two-terminal parts with one pin on a net of into and
// the other on a wired net outside it.
func candidates(parts []*Part, into map[string]bool, follow func(string) bool) []*Part {
	var out []*Part
	for _, q := range parts {
		if q.IsActive() || len(q.Pins) != 2 || q.Kind == Port {
			continue
		}
		a, b := q.Pins[0].Net, q.Pins[1].Net
		if into[a] != into[b] && follow(a) && follow(b) {
			out = append(out, q)
		}
	}
	return out
}

// beyond are the nets the signal reaches from device d's outputs after
// passing through a second active device, never onto d's own control or
// common net, crossing a device only from its control or common electrode
// to its output or common (a follower's signal leaves at its emitter).
func beyond(view *View, d *Part, outs []string, into map[string]bool, follow func(string) bool) map[string]bool {
	walk := func(from []string) *Walk {
		w := NewWalk(view)
		w.Follow = func(n string) bool { return follow(n) && !into[n] }
		w.Enter = func(q *Part, pin string) bool {
			return q != d && (!q.IsActive() || RoleOfPin(q.Kind, pin) != RoleOutput)
		}
		w.Leave = func(q *Part, pin string) bool {
			return !q.IsActive() || RoleOfPin(q.Kind, pin) != RoleControl
		}
		w.FromNets(from, 0)
		return w
	}
	var next []string
	for _, q := range walk(outs).Parts() {
		if !q.IsActive() {
			continue
		}
		for _, pn := range q.Pins {
			r := RoleOfPin(q.Kind, pn.Name)
			if (r == RoleOutput || r == RoleCommon) && follow(pn.Net) && !into[pn.Net] {
				next = append(next, pn.Net)
			}
		}
	}
	out := map[string]bool{}
	if len(next) == 0 {
		return out
	}
	w := walk(next)
	for _, q := range w.Parts() {
		for _, pn := range q.Pins {
			if _, ok := w.NetDist(pn.Net); ok {
				out[pn.Net] = true
			}
		}
	}
	return out
}

// otherNet is the net of q's pin that is not on net.
func otherNet(q *Part, net string) string {
	for _, pn := range q.Pins {
		if pn.Net != net {
			return pn.Net
		}
	}
	return net
}
