package graph

// checkOutputDCPaths warns for a valve's anode or a transistor's collector
// or drain whose net reaches nothing that carries DC: only capacitors (or
// nothing) besides the device. It draws no current then, so the DC chart
// shows it at 0 A and the stage dead; on a capture it is mostly a wire left
// out (a blind reviewer's driver collector joined only to its coupling
// capacitor went unremarked). A port or a part of unknown kind may carry
// the supply from elsewhere, so either one silences the warning.
func checkOutputDCPaths(c *Circuit) ErrorList {
	var w ErrorList
	for _, p := range c.Parts {
		if !p.IsActive() {
			continue
		}
		for _, pin := range p.Pins {
			if RoleOfPin(p.Kind, pin.Name) != RoleOutput || pin.Net == "nc" || c.RoleOf(pin.Net).IsACGround() {
				continue
			}
			if !carriesDC(c, p, pin.Net) {
				w.Add(pin.Pos, "%s's %s (%s) is on net %s, which has no DC path but through capacitors: it draws no current (a wire to its load missing?)", p.Ref, outputName(p), pin.Name, pin.Net)
			}
		}
	}
	return w
}

// carriesDC reports whether net holds a connection other than dev that can
// carry DC: anything but a capacitor.
func carriesDC(c *Circuit, dev *Part, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		if cn.Part != dev && cn.Part.Kind != Capacitor {
			return true
		}
	}
	return false
}

// outputName is what the trade calls a device's output electrode.
func outputName(p *Part) string {
	switch p.Kind {
	case Valve:
		return "anode"
	case FET:
		return "drain"
	}
	return "collector"
}
