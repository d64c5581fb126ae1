package pipeline

import (
	"pare/graph"
	"pare/render"
	"pare/rules/stages"
)

// supplyHosts gives each supply filter section that sits on a rectifier's
// output (a part of it shares a net with a part of a supply stage that is
// not itself a filter section: the rectifier) the name of that stage. A
// technician draws a set's supply as one piece, rectifier, reservoir,
// choke and smoothing capacitor in a row: such a section is framed, and
// its frame follows the rectifier's and stays on its page (Frame.Joined).
// The decouplers and screen feeds further down the line are left out: they
// sit at the stages they feed.
func supplyHosts(found []stages.Stage, full *graph.Circuit) map[string]string {
	if full == nil {
		return nil
	}
	netsOf := func(s stages.Stage) map[string]bool {
		out := map[string]bool{}
		for _, ref := range s.Parts {
			if p := full.Part(ref); p != nil {
				for _, pn := range p.Pins {
					if pn.Net != graph.NotConnected && full.Net(pn.Net) != nil && !isGroundNet(full, pn.Net) {
						out[pn.Net] = true
					}
				}
			}
		}
		return out
	}
	hosts := map[string]string{}
	for _, s := range found {
		if !filterSection(s, full) {
			continue
		}
		mine := netsOf(s)
		for _, h := range found {
			if !h.Supply || filterSection(h, full) || h.Name == s.Name {
				continue
			}
			if shares(mine, netsOf(h)) {
				hosts[s.Name] = h.Name
				break
			}
		}
	}
	return hosts
}

// isGroundNet tells chassis, which every supply part shares and which
// joins nothing on a sheet.
func isGroundNet(c *graph.Circuit, name string) bool {
	n := c.Net(name)
	return n != nil && n.Role == graph.Ground
}

func shares(a, b map[string]bool) bool {
	for k := range a {
		if b[k] {
			return true
		}
	}
	return false
}

// joinSupply moves each hosted section's frame to just after its host's
// (frames are drawn left to right in order, so the supply reads rectifier
// then filter) and marks it Joined. names[i] is the stage of frames[i].
func joinSupply(frames []render.Frame, names []string, hosts map[string]string) []render.Frame {
	if len(hosts) == 0 {
		return frames
	}
	var out []render.Frame
	for i, f := range frames {
		if hosts[names[i]] != "" {
			continue
		}
		out = append(out, f)
		for j, g := range frames {
			if hosts[names[j]] == names[i] {
				g.Joined = true
				out = append(out, g)
			}
		}
	}
	return out
}

// wiredReservoir is the circuit as the full and faded sheets draw it: a
// rail net whose every terminal is on a supply stretch (a rectifier's
// frame and the filter frames joined to it) is drawn as a wire, the way a
// technician wires the rectifier's cathode to the reservoir and the choke,
// instead of a tag at each pin; rails that run on to the stages stay tags.
// c itself is returned when there is no such net.
func wiredReservoir(c *graph.Circuit, frames []render.Frame) *graph.Circuit {
	stretch := map[string]bool{}
	for i, f := range frames {
		if !f.Joined || i == 0 {
			continue
		}
		for _, g := range []render.Frame{frames[i-1], f} {
			for _, ref := range g.Parts {
				stretch[ref] = true
			}
		}
	}
	if len(stretch) == 0 {
		return c
	}
	on := map[string]bool{}  // rail nets a stretch part has a terminal on
	off := map[string]bool{} // rail nets some other part has one on
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			if !c.RoleOf(pn.Net).IsRail() {
				continue
			}
			if stretch[p.Ref] {
				on[pn.Net] = true
			} else {
				off[pn.Net] = true
			}
		}
	}
	var wire []string
	for _, n := range c.Nets {
		if on[n.Name] && !off[n.Name] {
			wire = append(wire, n.Name)
		}
	}
	if len(wire) == 0 {
		return c
	}
	d := c.Clone()
	for _, name := range wire {
		d.Net(name).Role = graph.Signal // the clone's own copy
	}
	return d
}
