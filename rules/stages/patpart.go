// Reading a pattern's parts (device, pins, windings, counts), its figures and
// its guards.

package stages

import (
	"fmt"
	"strings"

	"pare/graph/value"
)

func (ld *patLoader) part(path, name string, v any) {
	pp := PPart{Name: name, Pos: ld.at.Key(path)}
	m, ok := v.(map[string]any)
	if !ok {
		ld.fail(path, "part %s must be a table such as { device = \"capacitor\", pins = [\"a\", \"b\"] }", name)
		return
	}
	for _, k := range sortedKeys(m) {
		if !contains(partKeys, k) {
			ld.unknown(path+"."+k, k, partKeys)
		}
	}
	if d, ok := m["device"]; ok {
		pp.Device = ld.oneOf(path+".device", d, deviceKinds)
	} else {
		ld.fail(path, "part %s has no device (one of %s)", name, strings.Join(deviceKinds, ", "))
		return
	}
	if t, ok := m["type"]; ok {
		pp.Types = ld.strs(path+".type", t)
	}
	if sh, ok := m["shared"]; ok {
		b, isBool := sh.(bool)
		if !isBool {
			ld.fail(path+".shared", "shared must be true or false")
		}
		pp.Shared = b
	}
	if db, ok := m["dc_block"]; ok {
		b, isBool := db.(bool)
		if !isBool || pp.Device != "capacitor" {
			ld.fail(path+".dc_block", "dc_block must be true or false, on a capacitor")
		}
		pp.DCBlock = b
	}
	if o, ok := m["optional"]; ok {
		pp.Optional = ld.oneOf(path+".optional", o, []string{"open", "short"})
	}
	unit := mainUnit(pp.Device)
	for _, k := range []string{"min", "max"} {
		x, ok := m[k]
		if !ok {
			continue
		}
		kp := path + "." + k
		var f float64
		switch t := x.(type) {
		case string:
			var err error
			f, err = value.Parse(t, unit)
			if err != nil {
				ld.fail(kp, "%s: %v", k, err)
			}
		case int64:
			f = float64(t)
		case float64:
			f = t
		default:
			ld.fail(kp, "%s must be a value such as \"1M\"", k)
		}
		if unit == value.None {
			ld.fail(kp, "%s applies to resistors, capacitors, inductors and crystals", k)
		}
		if k == "min" {
			pp.Min = f
		} else {
			pp.Max = f
		}
	}
	ld.pins(path, &pp, m)
	ld.p.Parts = append(ld.p.Parts, pp)
}

func mainUnit(device string) value.Unit {
	switch device {
	case "resistor", "pot", "loudspeaker":
		return value.Ohm
	case "capacitor":
		return value.Farad
	case "inductor", "tapped-coil":
		return value.Henry
	case "crystal":
		return value.Hertz
	}
	return value.None
}

// pinShape says how a device's terminals are written in a pattern.
func pinShape(device string) (list int, keys []string) {
	switch device {
	case "resistor", "capacitor", "inductor", "crystal", "element", "loudspeaker":
		return 2, nil
	case "tapped-coil", "pot":
		return 3, nil
	case "diode":
		return 2, []string{"a", "k"}
	case "double-diode":
		return 0, []string{"a1", "a2", "k"}
	case "active", "valve", "bjt", "fet":
		return 0, activeKeys
	}
	return 0, nil
}

func (ld *patLoader) pins(path string, pp *PPart, m map[string]any) {
	pinsPath := path + ".pins"
	if pp.Device == "transformer" {
		if _, ok := m["pins"]; ok {
			ld.fail(pinsPath, "a transformer's terminals are given as windings = [[\"a\", \"b\"], [\"c\", \"d\"]]")
		}
		list, ok := m["windings"].([]any)
		if !ok || len(list) == 0 {
			ld.fail(path, "transformer %s needs windings = [[end, end], [end, tap, end], ...]", pp.Name)
			return
		}
		for i, w := range list {
			wp := fmt.Sprintf("%s.windings[%d]", path, i)
			nets := ld.strs(wp, w)
			if len(nets) != 2 && len(nets) != 3 {
				ld.fail(wp, "a winding is [end, end] or [end, tap, end]")
				continue
			}
			pp.Windings = append(pp.Windings, nets)
		}
		return
	}
	if _, ok := m["windings"]; ok {
		ld.fail(path+".windings", "windings apply to a transformer only")
	}
	if !contains(deviceKinds, pp.Device) {
		// Reported already; note the nets it names so that no second
		// message follows from the first.
		switch t := m["pins"].(type) {
		case []any:
			for _, e := range t {
				if n, ok := e.(string); ok {
					pp.Pins = append(pp.Pins, PPin{Net: n})
				}
			}
		case map[string]any:
			for _, k := range sortedKeys(t) {
				if n, ok := t[k].(string); ok {
					pp.Pins = append(pp.Pins, PPin{Key: k, Net: n})
				}
			}
		}
		return
	}
	list, keys := pinShape(pp.Device)
	switch t := m["pins"].(type) {
	case nil:
		ld.fail(path, "part %s has no pins", pp.Name)
	case []any:
		if list == 0 {
			ld.fail(pinsPath, "a %s's pins are a table keyed by %s", pp.Device, strings.Join(keys, ", "))
			return
		}
		if len(t) != list {
			ld.fail(pinsPath, "a %s has %d terminals, not %d", pp.Device, list, len(t))
			return
		}
		for i, e := range t {
			pp.Pins = append(pp.Pins, PPin{Net: ld.str(fmt.Sprintf("%s[%d]", pinsPath, i), e)})
		}
	case map[string]any:
		if keys == nil {
			ld.fail(pinsPath, "a %s's pins are a list of %d nets", pp.Device, list)
			return
		}
		for _, k := range sortedKeys(t) {
			if !contains(keys, k) {
				ld.unknown(pinsPath+"."+k, k, keys)
				continue
			}
			pp.Pins = append(pp.Pins, PPin{Key: k, Net: ld.str(pinsPath+"."+k, t[k])})
		}
		if pp.Device == "diode" && len(pp.Pins) != 2 || pp.Device == "double-diode" && len(pp.Pins) != 3 {
			ld.fail(pinsPath, "give every terminal of the %s: %s", pp.Device, strings.Join(keys, ", "))
		}
	default:
		ld.fail(pinsPath, "pins must be a list of nets or a table")
	}
	if pp.Optional == "short" && len(pp.Pins) != 2 {
		ld.fail(path+".optional", "only a two-terminal part can be optional = \"short\"")
	}
}

var figureArgKeys = []string{"calc", "prefix"}

func (ld *patLoader) figure(path string, m map[string]any) {
	f := FigureSpec{Args: map[string][]string{}, Pos: ld.at.Key(path)}
	for _, k := range sortedKeys(m) {
		kp := path + "." + k
		switch k {
		case "calc":
			names := sortedKeys(calcs)
			f.Calc = ld.oneOf(kp, m[k], names)
		case "prefix":
			f.Prefix = ld.str(kp, m[k])
		default:
			f.Args[k] = ld.strs(kp, m[k])
		}
	}
	if f.Calc == "" {
		ld.fail(path, "figure needs calc = one of %s", strings.Join(sortedKeys(calcs), ", "))
		return
	}
	if c, ok := calcs[f.Calc]; ok {
		for _, a := range sortedKeys(f.Args) {
			if !contains(c.args, a) {
				ld.unknown(path+"."+a, a, append(append([]string(nil), figureArgKeys...), c.args...))
			}
		}
		for _, a := range c.required {
			if _, ok := f.Args[a]; !ok {
				ld.fail(path, "calc %q needs %s", f.Calc, a)
			}
		}
	}
	ld.p.Figures = append(ld.p.Figures, f)
}

func (ld *patLoader) guard(path string, m map[string]any) {
	g := Guard{Pos: ld.at.Key(path)}
	for _, k := range sortedKeys(m) {
		kp := path + "." + k
		switch k {
		case "figure":
			g.Figure = ld.str(kp, m[k])
		case "min", "max":
			var f float64
			switch t := m[k].(type) {
			case int64:
				f = float64(t)
			case float64:
				f = t
			case string:
				var err error
				f, err = value.Parse(t, value.None)
				if err != nil {
					ld.fail(kp, "%s: %v", k, err)
				}
			default:
				ld.fail(kp, "%s must be a number", k)
			}
			if k == "min" {
				g.Min, g.HasMin = f, true
			} else {
				g.Max, g.HasMax = f, true
			}
		default:
			ld.unknown(kp, k, []string{"figure", "min", "max"})
		}
	}
	if g.Figure == "" {
		ld.fail(path, "guard needs figure = \"KEY\"")
	}
	ld.p.Guards = append(ld.p.Guards, g)
}
