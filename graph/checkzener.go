package graph

// checkZeners warns of a zener that declares no breakdown voltage (vz)
// where the line it holds is not held by a declaration: the DC analysis
// (graph/dc) then knows no breakdown and treats the zener as open, so the
// line reads what its dropper and loads alone give, high of the set's. A
// blind review's VFO read its 8.2 V line at 10 V with no word said. A zener
// across chassis and a rail declared with its volts changes nothing the
// analysis shows, and is passed over.
func checkZeners(c *Circuit) ErrorList {
	var w ErrorList
	for _, p := range c.Parts {
		if p.Kind != Diode || p.Type != "zener" || hasParam(p, "vz") {
			continue
		}
		if heldNet(c, p.NetOf("a")) && heldNet(c, p.NetOf("k")) {
			continue
		}
		w.Add(p.Pos, "%s (zener) has no breakdown voltage declared: the DC analysis treats it as open, and the line it holds may read high; give its vz (vz = \"8V2\" for an 8.2 V zener)", p.Ref)
	}
	return w
}

// heldNet: chassis, or a net that declares its volts (a rail, a bias line).
func heldNet(c *Circuit, name string) bool {
	if c.RoleOf(name) == Ground {
		return true
	}
	n := c.Net(name)
	return n != nil && n.HasVolts()
}
