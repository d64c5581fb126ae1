package safety

import "pare/graph"

// A switch whose every contact sits in the set's power feed (the mains
// input and what the mains reaches through fuses and switch contacts, a
// supply rail, a heater chain) turns the set on and off: it changes no
// band and no signal path. Alignment must not run a "band" for it (its
// other position is the set switched off) and sheets must not speak of it
// as a band switch (review of an AC/DC set whose double-pole on/off
// switch got a whole second RF alignment).

// PowerSwitches are the refs of the circuit's power switches: switches
// with at least one contact pair, each pair with an end on the power
// feed (feedNets).
func PowerSwitches(c *graph.Circuit) map[string]bool {
	out := map[string]bool{}
	var feed map[string]bool
	for _, p := range c.Parts {
		if p.Kind != graph.Switch {
			continue
		}
		if feed == nil {
			feed = feedNets(c)
		}
		if powerSwitch(p, feed) {
			out[p.Ref] = true
		}
	}
	return out
}

// powerSwitch: every pair p closes in some position has an end on feed.
func powerSwitch(p *graph.Part, feed map[string]bool) bool {
	pairs := passes(p)
	if len(pairs) == 0 {
		return false
	}
	for _, pr := range pairs {
		if !feed[p.NetOf(pr[0])] && !feed[p.NetOf(pr[1])] {
			return false
		}
	}
	return true
}

// feedNets are the nets of the power feed: those a mains port, part or
// net name brings in, spread through fuses and switch contacts (as
// spreadMains does) but never onto chassis, which every part touches (a
// live chassis tied to neutral by a switch pole would make every switch
// to chassis a power switch), plus the declared supply and heater rails.
func feedNets(c *graph.Circuit) map[string]bool {
	feed := map[string]bool{}
	for _, p := range c.Parts {
		if (p.Kind == graph.Port || p.Kind == graph.Generic) && saysMains(p.Label) {
			for _, pin := range p.Pins {
				feed[pin.Net] = true
			}
		}
	}
	for _, n := range c.Nets {
		if saysMains(n.Name) || saysMains(n.Label) {
			feed[n.Name] = true
		}
	}
	grounded := func(n string) bool { return c.RoleOf(n) == graph.Ground }
	for grew := len(feed) > 0; grew; {
		grew = false
		for _, p := range c.Parts {
			for _, pair := range passes(p) {
				a, b := p.NetOf(pair[0]), p.NetOf(pair[1])
				if a == "" || b == "" || a == graph.NotConnected || b == graph.NotConnected || grounded(a) || grounded(b) || feed[a] == feed[b] {
					continue
				}
				feed[a], feed[b] = true, true
				grew = true
			}
		}
	}
	for _, n := range c.Nets {
		if n.Role == graph.Supply || n.Role == graph.Heater {
			feed[n.Name] = true
		}
	}
	for n := range feed {
		if grounded(n) {
			delete(feed, n)
		}
	}
	return feed
}
