package dc

import (
	"sort"
)

// PartDC is the DC state of one part: the current into each of its pins and
// the power it dissipates.
type PartDC struct {
	Ref   string  `json:"ref"`
	Pins  []PinI  `json:"pins"`
	Watts float64 `json:"watts"`
}

// PinI is the current flowing from the circuit into a pin of a part.
type PinI struct {
	Pin  string  `json:"pin"`
	Amps float64 `json:"amps"`
}

// Current returns the current into pin of part ref (0 if none flows).
func (p *Point) Current(ref, pin string) float64 {
	for _, pd := range p.Parts {
		if pd.Ref != ref {
			continue
		}
		for _, pi := range pd.Pins {
			if pi.Pin == pin {
				return pi.Amps
			}
		}
	}
	return 0
}

// Part returns the DC state of a part, or nil.
func (p *Point) Part(ref string) *PartDC {
	i := sort.Search(len(p.Parts), func(i int) bool { return p.Parts[i].Ref >= ref })
	if i < len(p.Parts) && p.Parts[i].Ref == ref {
		return &p.Parts[i]
	}
	return nil
}

// partCurrents sums the branch and device currents per part and pin.
func partCurrents(m *model, v []float64) []PartDC {
	byRef := map[string]*PartDC{}
	var refs []string
	get := func(ref string) *PartDC {
		if pd, ok := byRef[ref]; ok {
			return pd
		}
		pd := &PartDC{Ref: ref}
		byRef[ref] = pd
		refs = append(refs, ref)
		return pd
	}
	addPin := func(pd *PartDC, pin string, i float64) {
		for k := range pd.Pins {
			if pd.Pins[k].Pin == pin {
				pd.Pins[k].Amps += i
				return
			}
		}
		pd.Pins = append(pd.Pins, PinI{pin, i})
	}
	for _, b := range m.branches {
		va, vb := m.voltOf(v, b.a), m.voltOf(v, b.b)
		i := b.g * (va - vb)
		pd := get(b.ref)
		pd.Watts += i * (va - vb)
		pa, pb := branchPins(m, b)
		addPin(pd, pa, i)
		addPin(pd, pb, -i)
	}
	for _, c := range m.caps {
		if c.g == 0 {
			continue
		}
		va, vb := m.voltOf(v, c.a), m.voltOf(v, c.b)
		pd := get(c.ref)
		pd.Watts += c.g * (va - vb) * (va - vb)
	}
	for _, d := range m.devices {
		vt := make([]float64, len(d.t))
		cur := make([]float64, len(d.t))
		jac := make([][]float64, len(d.t))
		for i := range jac {
			jac[i] = make([]float64, len(d.t))
		}
		for i, t := range d.t {
			vt[i] = m.voltOf(v, t)
		}
		d.eval(vt, cur, jac)
		pd := get(d.ref)
		for i := range d.t {
			addPin(pd, d.pins[i], cur[i])
			pd.Watts += vt[i] * cur[i]
		}
	}
	sort.Strings(refs)
	out := make([]PartDC, 0, len(refs))
	for _, r := range refs {
		out = append(out, *byRef[r])
	}
	return out
}

// branchPins names the pins a branch runs between.
func branchPins(m *model, b branch) (string, string) {
	p := m.circuit.Part(b.ref)
	switch {
	case p == nil:
		return "1", "2"
	case b.what == "1w":
		return "1", "w"
	case b.what == "w2":
		return "w", "2"
	case b.what != "":
		if w := p.Winding(b.what); w != nil {
			return w.From, w.To
		}
	}
	return p.Pins[0].Name, p.Pins[len(p.Pins)-1].Name
}
