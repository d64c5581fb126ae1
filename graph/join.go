package graph

// JoinNets moves every terminal on net gone onto net keep and deletes gone.
// The kept net takes the stronger role (ground over rails over signal), so
// a signal net shorted to ground by a reduction becomes ground, and it
// takes gone's label when it has none and their roles now agree (a rail's
// label never lands on ground). Inputs, outputs and regions that named gone
// name keep, each list holding keep once.
func (c *Circuit) JoinNets(keep, gone string) {
	if keep == gone {
		return
	}
	ix := c.index()
	jr := c.journal()
	k := c.EnsureNet(keep, Pos{})
	jr.saveNet(keep)
	rail := c.retireRail(ix.nets[gone])
	if g := ix.nets[gone]; g != nil {
		if roleRank(g.Role) > roleRank(k.Role) {
			k.Role, k.Volts = g.Role, g.Volts
		}
		if k.Label == "" && g.Label != "" && g.Role == k.Role {
			k.Label = g.Label
		}
	}
	for _, cn := range ix.conns[gone] {
		jr.savePart(cn.Part.Ref)
		for i := range cn.Part.Pins {
			if pn := &cn.Part.Pins[i]; pn.Net == gone && pn.Name == cn.Pin {
				pn.Net = keep
				if pn.Rail == "" {
					pn.Rail = rail
				}
			}
		}
	}
	ix.moveConns(keep, gone)
	if renames(c.Inputs, gone) || renames(c.Outputs, gone) {
		jr.saveEnds()
		c.Inputs = rename(c.Inputs, keep, gone)
		c.Outputs = rename(c.Outputs, keep, gone)
	}
	for _, r := range c.Regions {
		if r.Input != gone && r.Output != gone && !renames(r.Nets, gone) {
			continue
		}
		jr.saveRegion(r)
		if r.Input == gone {
			r.Input = keep
		}
		if r.Output == gone {
			r.Output = keep
		}
		r.Nets = rename(r.Nets, keep, gone)
	}
	c.deleteNet(gone)
}

// rename renames gone to keep in a list of nets, in place, keeping the
// first of any names the list then holds twice.
func rename(list []string, keep, gone string) []string {
	out := list[:0]
	seen := map[string]bool{}
	for _, n := range list {
		if n == gone {
			n = keep
		}
		if !seen[n] {
			seen[n] = true
			out = append(out, n)
		}
	}
	return out
}

// renames reports whether rename would change a list: it names gone, or
// holds a name twice. Every join of a reduction asks this of every region,
// and most lists are empty or short and name neither.
func renames(list []string, gone string) bool {
	switch len(list) {
	case 0:
		return false
	case 1:
		return list[0] == gone
	}
	if len(list) <= 16 {
		for i, n := range list {
			if n == gone {
				return true
			}
			for _, m := range list[:i] {
				if m == n {
					return true
				}
			}
		}
		return false
	}
	seen := make(map[string]bool, len(list))
	for _, n := range list {
		if n == gone || seen[n] {
			return true
		}
		seen[n] = true
	}
	return false
}

// roleRank orders roles by how strongly they hold a net: ground over
// supply, bias, heater and port, over signal.
func roleRank(r Role) int {
	switch r {
	case Ground:
		return 5
	case Supply:
		return 4
	case Bias:
		return 3
	case Heater:
		return 2
	case PortN:
		return 1
	}
	return 0
}

// groundNames are the conventional names of the ground net, in the order a
// reduction prefers them.
var groundNames = []string{"gnd", "0", "ground", "chassis"}

// GroundNet returns the name of the circuit's ground net, creating "gnd"
// when there is none: the conventional names first, then the first ground
// net by name.
func (c *Circuit) GroundNet() string {
	if name := c.GroundName(); name != "" {
		return name
	}
	c.EnsureNet("gnd", Pos{})
	return "gnd"
}

// GroundName is the name of the circuit's ground net as GroundNet finds it,
// or "" when there is none; unlike GroundNet it never adds one.
func (c *Circuit) GroundName() string {
	for _, name := range groundNames {
		if n := c.Net(name); n != nil && n.Role == Ground {
			return name
		}
	}
	for _, n := range c.Nets {
		if n.Role == Ground {
			return n.Name
		}
	}
	return ""
}

// ChooseKeep decides which of two nets keeps its name when they are joined:
// ground first, then a declared end, a labelled net, the stronger role, and
// finally the smaller name, so the result does not depend on input order.
func (c *Circuit) ChooseKeep(a, b string) (keep, gone string) {
	score := func(n string) int {
		role := c.RoleOf(n)
		s := roleRank(role) * 4
		if c.IsEnd(n) {
			s += 100
		}
		if role == Ground {
			s += 1000
		}
		if net := c.Net(n); net != nil && net.Label != "" {
			s += 2
		}
		return s
	}
	sa, sb := score(a), score(b)
	if sa > sb || (sa == sb && a < b) {
		return a, b
	}
	return b, a
}
