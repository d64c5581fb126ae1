// Reading one part: its kind key, the common keys, device parameters and the
// value that chose the kind.

package graph

import (
	"sort"
	"strings"
	"unicode/utf8"

	"pare/graph/value"
)

// kindKeys choose a part's kind; exactly one must be present.
var kindKeys = map[string]Kind{
	"r": Resistor, "c": Capacitor, "l": Inductor, "windings": Transformer, "valve": Valve,
	"bjt": BJT, "fet": FET, "diode": Diode, "xtal": Crystal, "pot": Pot, "switch": Switch,
	"port": Port, "part": Generic, "spk": Loudspeaker,
}

var commonKeys = []string{"pins", "tol", "rating", "gang", "keep", "note", "from", "type", "envelope"}

// extraKeys are the keys a kind accepts besides the common ones and its device parameters.
var extraKeys = map[Kind][]string{
	Capacitor:   {"set"},
	Inductor:    {"tap", "k", "adjust"},
	Transformer: {"k", "adjust"},
	Pot:         {"set"},
	Switch:      {"set", "closes"},
}

var capTypes = []string{CapFixed, CapElectrolytic, CapVariable, CapTrimmer}

var indTypes = []string{IndPlain, IndChoke}

var potTypes = []string{PotControl, PotPreset}

func (ld *loader) part(path, ref string, v any) {
	p := &Part{Ref: ref, Pos: ld.ix.key(path)}
	m, ok := v.(map[string]any)
	if !ok {
		ld.errVal(path, "part %s must be an inline table such as { r = \"47k\", pins = [\"a\", \"b\"] }", ref)
		return
	}
	keys := sortedKeys(m)
	var kindKey string
	for _, k := range keys {
		if kk, ok := kindKeys[k]; ok {
			if kindKey != "" {
				ld.errKey(path+"."+k, "part %s has two kind keys, %q and %q: use one", ref, kindKey, k)
				continue
			}
			kindKey, p.Kind = k, kk
		}
	}
	if kindKey == "" {
		ld.errKey(path, "part %s has no kind key: give one of %s", ref, strings.Join(sortedKeys(kindKeys), ", "))
		return
	}
	for _, k := range keys {
		if !knownPartKey(p.Kind, kindKey, k) {
			if _, isKind := kindKeys[k]; isKind {
				continue // reported above
			}
			ld.unknown(path+"."+k, k, knownPartKeys(p.Kind, kindKey))
		}
	}
	ld.kindValue(path, p, kindKey, m)
	for _, k := range keys {
		ld.partKey(path, p, k, m[k])
	}
	ld.pins(path, p, m["pins"])
	if !isRefDesignator(ref) {
		ld.errKey(path, "malformed reference designator %q: write letters then a number, e.g. R12, C3, V1a", ref)
	}
	ld.c.Parts = append(ld.c.Parts, p)
}

// knownPartKeys are the keys a part of kind k chosen by kindKey accepts, in
// the order a message lists them.
func knownPartKeys(k Kind, kindKey string) []string {
	known := append(append(append([]string(nil), commonKeys...), extraKeys[k]...), ParamNames(k)...)
	return append(known, kindKey)
}

// knownPartKey tells whether knownPartKeys(k, kindKey) holds key: asked of
// every key of every part, so without building the list.
func knownPartKey(k Kind, kindKey, key string) bool {
	return key == kindKey || contains(commonKeys, key) || contains(extraKeys[k], key) || contains(ParamNames(k), key)
}

// partKey reads one of a part's common keys or device parameters; the kind
// key, type, pins and the kind's settings are read elsewhere.
func (ld *loader) partKey(path string, p *Part, k string, x any) {
	switch k {
	case "tol":
		if s, ok := x.(string); ok {
			t, err := value.ParseTolerance(s)
			if err != nil {
				ld.errVal(path+"."+k, "tol: %v", err)
			}
			p.Tol = t
		} else {
			ld.errVal(path+"."+k, "tol must be a string such as \"5%%\"")
		}
	case "rating":
		p.Rating = ld.num(path+"."+k, x, value.Volt)
	case "gang":
		p.Gang = ld.str(path+"."+k, x)
	case "keep":
		p.Keep = ld.boolean(path+"."+k, x)
	case "note":
		p.Note = ld.str(path+"."+k, x)
	case "envelope":
		p.Envelope = ld.str(path+"."+k, x)
	case "from":
		p.From = ld.strList(path+"."+k, x)
		sort.Strings(p.From)
	case "adjust":
		ld.adjust(path+"."+k, p, x)
	default:
		if contains(ParamNames(p.Kind), k) {
			if p.Params == nil {
				p.Params = map[string]float64{}
			}
			p.Params[k] = ld.num(path+"."+k, x, paramUnit(k))
		}
	}
}

// valveParams refuses the parameters that do not fit the valve's type: a
// valve diode has an rd (or is off), a valve with a control grid a gm, ra
// and µ.
func (ld *loader) valveParams(path string, p *Part, m map[string]any) {
	diode := p.Type == "diode" || p.Type == "double-diode"
	for _, k := range []string{"gm", "ra", "mu", "rd", "off", "perveance", "kg"} {
		if _, ok := m[k]; !ok {
			continue
		}
		switch isDiodeKey := k == "rd" || k == "off" || k == "perveance"; {
		case diode && !isDiodeKey:
			ld.errKey(path+"."+k, "%s applies to a valve with a control grid; a valve diode takes rd, perveance or off = 1", k)
		case !diode && isDiodeKey:
			ld.errKey(path+"."+k, "%s applies to a valve diode (valve = \"diode\" or \"double-diode\"); a %s takes gm, ra, mu", k, p.Type)
		}
	}
	if _, ok := m["gmo"]; ok && p.Type != "heptode" && p.Type != "octode" {
		ld.errKey(path+".gmo", "gmo, the g1-to-g2 (oscillator anode) transconductance, applies to a pentagrid converter (heptode, octode), not a %s", p.Type)
	}
	screen := p.Type != "triode" && !diode
	for _, k := range []string{"mu2", "share", "vknee"} {
		if _, ok := m[k]; ok && !screen {
			ld.errKey(path+"."+k, "%s applies to a valve with a screen grid (tetrode, pentode, hexode, heptode, octode), not a %s", k, p.Type)
		}
	}
}

// zenerParams refuses a breakdown on a diode that has none to speak of:
// vz and rz describe a zener's reverse conduction, and on a signal diode
// or a rectifier they would silently make it one.
func (ld *loader) zenerParams(path string, p *Part, m map[string]any) {
	for _, k := range []string{"vz", "rz"} {
		if _, ok := m[k]; ok && p.Type != "zener" {
			ld.errKey(path+"."+k, "%s is a zener's breakdown (diode = \"zener\"), not a %s diode's", k, p.Type)
		}
	}
}

// fetParams refuses the DC law parameters of the other kind of FET: a JFET's
// law is set by idss and vp, a MOSFET's by its threshold vth and k.
func (ld *loader) fetParams(path string, p *Part, m map[string]any) {
	mos := p.Type == "nmos" || p.Type == "pmos"
	for _, k := range []string{"idss", "vp", "vth", "k"} {
		if _, ok := m[k]; !ok {
			continue
		}
		switch isMOSKey := k == "vth" || k == "k"; {
		case mos && !isMOSKey:
			ld.errKey(path+"."+k, "%s applies to a JFET; a MOSFET takes vth and k", k)
		case !mos && isMOSKey:
			ld.errKey(path+"."+k, "%s applies to a MOSFET (fet = \"nmos\" or \"pmos\"); a JFET takes idss and vp", k)
		}
	}
}

func paramUnit(name string) value.Unit {
	switch name {
	case "gm", "gmo":
		return value.Siemens
	case "ra", "rd", "ro", "rpi", "rm", "rdc", "leak", "rz":
		return value.Ohm
	case "ic", "ia", "idss", "is", "ih":
		return value.Ampere
	case "vbe", "vp", "vf", "vth", "vac", "vknee", "vz":
		return value.Volt
	case "lm":
		return value.Henry
	case "hz", "q_at":
		return value.Hertz
	case "cm", "c0":
		return value.Farad
	}
	return value.None // mu, mu2, share, n, beta, q, off, watts, pmax (W: no watt unit in value), k (A/V²), kg and perveance (A/V^1.5)
}

// kindValue reads the value that chose the kind, and the type and settings that go with it.
func (ld *loader) kindValue(path string, p *Part, key string, m map[string]any) {
	kp := path + "." + key
	typ := ""
	if t, ok := m["type"]; ok {
		typ = ld.str(path+".type", t)
	}
	switch p.Kind {
	case Resistor:
		p.Value = ld.rngOne(kp, m[key], value.Ohm)
	case Capacitor:
		before := len(ld.errs)
		p.Value = ld.rng(kp, m[key], value.Farad)
		if isBare(m[key]) {
			p.bareValue = ld.ix.val(kp)
		}
		if len(ld.errs) == before && p.Value.Max <= 0 {
			// No capacitor has 0 F; a missing multiplier or a slip of the pen.
			ld.errVal(kp, "a capacitor must be above 0 F")
		}
		switch {
		case typ != "":
			if !contains(capTypes, typ) {
				ld.badType(path+".type", "capacitor", typ, capTypes)
			}
			p.Type = typ
		case m["set"] != nil:
			p.Type = CapTrimmer
		case p.Value.IsSpan():
			p.Type = CapVariable
		default:
			p.Type = CapFixed
		}
		if (p.Type == CapVariable || p.Type == CapTrimmer) && !p.Value.IsSpan() {
			ld.errVal(kp, "a %s capacitor needs a range such as \"12p..420p\"", p.Type)
		}
		if (p.Type == CapFixed || p.Type == CapElectrolytic) && p.Value.IsSpan() {
			ld.errVal(kp, "a %s capacitor has one value, not a range", p.Type)
		}
		if s, ok := m["set"]; ok {
			p.Set = ld.num(path+".set", s, value.Farad)
			if p.Type != CapTrimmer {
				ld.errKey(path+".set", "set applies to a trimmer capacitor only")
			} else if p.Set < p.Value.Min || p.Set > p.Value.Max {
				ld.errVal(path+".set", "trimmer set to %s, outside its range %s", value.Format(p.Set, value.Farad, value.Symbol), value.FormatRange(p.Value, value.Farad, value.Symbol))
			}
		}
	case Inductor:
		ld.inductor(path, p, m, typ)
	case Transformer:
		ld.transformer(path, p, m)
	case Valve:
		p.Type = ld.deviceType(kp, m[key], "valve", ValveTypes())
		ld.valveParams(path, p, m)
		p.Designation = ld.designation(path, typ)
	case BJT:
		p.Type = ld.deviceType(kp, m[key], "bjt", BJTTypes)
		p.Designation = ld.designation(path, typ)
	case FET:
		p.Type = ld.deviceType(kp, m[key], "fet", FETTypes)
		ld.fetParams(path, p, m)
		p.Designation = ld.designation(path, typ)
	case Diode:
		p.Type = ld.deviceType(kp, m[key], "diode", DiodeTypes)
		ld.zenerParams(path, p, m)
	case Crystal:
		p.Value = ld.rngOne(kp, m[key], value.Hertz)
	case Loudspeaker:
		p.Value = ld.rngOne(kp, m[key], value.Ohm)
	case Pot:
		p.Value = ld.rngOne(kp, m[key], value.Ohm)
		p.Set = 0.5
		if s, ok := m["set"]; ok {
			p.Set = ld.num(path+".set", s, value.None)
			if p.Set < 0 || p.Set > 1 {
				ld.errVal(path+".set", "a pot's set is the wiper position from 0 (pin 1) to 1 (pin 2), not %g", p.Set)
			}
		}
		if typ != "" {
			if !contains(potTypes, typ) {
				ld.badType(path+".type", "pot", typ, potTypes)
			}
			p.Type = typ
		}
	case Switch:
		ld.switchPart(path, p, m)
	case Port:
		p.Label = ld.str(kp, m[key])
	case Generic:
		p.Label = ld.str(kp, m[key])
	}
	if typ != "" && p.Kind != Capacitor && p.Kind != Inductor && p.Kind != Pot && p.Kind != Valve && p.Kind != BJT && p.Kind != FET {
		ld.errKey(path+".type", "type applies to capacitors (%s), inductors (%s), pots (%s), and valves and transistors (the type they are marked with)", strings.Join(capTypes, ", "), strings.Join(indTypes, ", "), strings.Join(potTypes, ", "))
	}
}

// isBare tells whether a value was written as a bare number: a TOML number,
// or a string of digits alone ("0.05").
func isBare(v any) bool {
	switch t := v.(type) {
	case int64, float64:
		return true
	case string:
		return isBareNumber(t)
	}
	return false
}

// designation reads the type a valve or transistor is marked with: free
// text, one line of at most 24 characters, so that it fits beside the ref
// on a sheet.
func (ld *loader) designation(path, typ string) string {
	t := strings.TrimSpace(typ)
	switch {
	case typ == "":
		return ""
	case t == "" || strings.ContainsAny(t, "\n\r\t") || utf8.RuneCountInString(t) > 24:
		ld.errVal(path+".type", "type %q: give the type the part is marked with, one line of at most 24 characters", typ)
		return ""
	}
	return t
}
