package graph

// Origins returns the original refs a part stands for: From, or its own Ref.
func (p *Part) Origins() []string {
	if len(p.From) > 0 {
		return p.From
	}
	return []string{p.Ref}
}

// Pin returns the pin with the given terminal name, or nil.
func (p *Part) Pin(name string) *Pin {
	for i := range p.Pins {
		if p.Pins[i].Name == name {
			return &p.Pins[i]
		}
	}
	return nil
}

// NetOf returns the net on terminal name, or "" if the part has no such pin.
func (p *Part) NetOf(name string) string {
	if pin := p.Pin(name); pin != nil {
		return pin.Net
	}
	return ""
}

// IsTwoTerminal reports whether the part is a plain two-terminal element.
func (p *Part) IsTwoTerminal() bool {
	switch p.Kind {
	case Resistor, Capacitor, Crystal, Diode, Loudspeaker:
		return len(p.Pins) == 2
	case Inductor:
		return len(p.Pins) == 2 && len(p.Windings) <= 1
	}
	return false
}

// Param returns a device parameter and whether it was given.
func (p *Part) Param(name string) (float64, bool) {
	v, ok := p.Params[name]
	return v, ok
}

// Inductance is the total inductance of an inductor between its outer pins,
// L1 + L2 + 2M for a tapped coil (windings aiding).
func (p *Part) Inductance() float64 {
	if len(p.Windings) == 0 {
		return p.Value.Max
	}
	total := 0.0
	for _, w := range p.Windings {
		total += w.L
	}
	for _, c := range p.Coupling {
		a, b := p.Winding(c.A), p.Winding(c.B)
		if a != nil && b != nil {
			total += 2 * c.K * sqrt(a.L*b.L)
		}
	}
	return total
}

// Winding returns the winding with the given name, or nil.
func (p *Part) Winding(name string) *Winding {
	for i := range p.Windings {
		if p.Windings[i].Name == name {
			return &p.Windings[i]
		}
	}
	return nil
}

// K returns the coupling factor between two windings (either order), 0 if none.
func (p *Part) K(a, b string) float64 {
	for _, c := range p.Coupling {
		if (c.A == a && c.B == b) || (c.A == b && c.B == a) {
			return c.K
		}
	}
	return 0
}

// Capacitance is the capacitance a capacitor presents at a setting of a
// variable section (frac 0 = minimum, 1 = maximum); a trimmer gives its set
// value, a fixed capacitor its value.
func (p *Part) Capacitance(frac float64) float64 {
	switch {
	case p.Type == CapTrimmer && p.Set > 0:
		return p.Set
	case p.Value.IsSpan():
		return p.Value.At(frac)
	}
	return p.Value.Max
}

// Clone returns a deep copy of the part.
func (p *Part) Clone() *Part {
	q := *p
	q.Pins = append([]Pin(nil), p.Pins...)
	q.Windings = append([]Winding(nil), p.Windings...)
	q.Coupling = append([]Coupling(nil), p.Coupling...)
	q.From = append([]string(nil), p.From...)
	q.Adjust = append([]string(nil), p.Adjust...)
	if p.Closes != nil {
		q.Closes = make([][][2]string, len(p.Closes))
		for i, pos := range p.Closes {
			q.Closes[i] = append([][2]string(nil), pos...)
		}
	}
	if p.Params != nil {
		q.Params = make(map[string]float64, len(p.Params))
		for k, v := range p.Params {
			q.Params[k] = v
		}
	}
	return &q
}
