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
