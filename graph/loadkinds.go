// Readers for the kinds with more than one value: inductors (tapped, ganged),
// transformers (windings and couplings) and switches.

package graph

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"pare/graph/value"
)

func (ld *loader) inductor(path string, p *Part, m map[string]any, typ string) {
	p.Type = IndPlain
	if typ != "" {
		if !contains(indTypes, typ) {
			ld.badType(path+".type", "inductor", typ, indTypes)
		}
		p.Type = typ
	}
	q := 0.0
	if x, ok := m["q"]; ok {
		q = ld.num(path+".q", x, value.None)
		if !(q > 0) {
			ld.errVal(path+".q", "q is the unloaded quality factor and must be above 0 (leave it out for a lossless coil)")
		}
	}
	kp := path + ".l"
	if list, ok := m["l"].([]any); ok {
		// Two partial inductances of a tapped coil: ["120u", "8u"], pins 1–t and t–2.
		if len(list) != 2 {
			ld.errVal(kp, "a tapped coil takes two partial inductances, [\"L(1–t)\", \"L(t–2)\"]")
			return
		}
		l1 := ld.num(kp+"[0]", list[0], value.Henry)
		l2 := ld.num(kp+"[1]", list[1], value.Henry)
		k := 1.0
		if x, ok := m["k"]; ok {
			k = ld.num(path+".k", x, value.None)
			if k < 0 || k > 1 {
				ld.errVal(path+".k", "coupling factor k must be between 0 and 1, not %g", k)
			}
		}
		p.Windings = []Winding{{Name: "1t", L: l1, From: "1", To: "t", Q: q}, {Name: "t2", L: l2, From: "t", To: "2", Q: q}}
		p.Coupling = []Coupling{{A: "1t", B: "t2", K: k}}
		if _, ok := m["tap"]; ok {
			ld.errKey(path+".tap", "give either tap or two partial inductances, not both")
		}
		p.Value = value.Range{Min: p.Inductance(), Max: p.Inductance()}
		return
	}
	before := len(ld.errs)
	p.Value = ld.rngOne(kp, m["l"], value.Henry)
	if len(ld.errs) == before && p.Value.Max == 0 {
		ld.errVal(kp, "an inductor must be above 0 H")
	}
	if x, ok := m["tap"]; ok {
		n := ld.num(path+".tap", x, value.None)
		if n <= 0 || n >= 1 {
			ld.errVal(path+".tap", "tap is the fraction of the turns from pin 1 to the tap, between 0 and 1 (not %g)", n)
			return
		}
		// A tap on one tightly wound coil: inductance goes with turns squared,
		// and the sections are fully coupled (k = 1), so L1 + L2 + 2M = L.
		L := p.Value.Max
		p.Windings = []Winding{{Name: "1t", L: n * n * L, From: "1", To: "t", Q: q}, {Name: "t2", L: (1 - n) * (1 - n) * L, From: "t", To: "2", Q: q}}
		p.Coupling = []Coupling{{A: "1t", B: "t2", K: 1}}
		return
	}
	if _, ok := m["k"]; ok {
		ld.errKey(path+".k", "k applies to a tapped coil given as two partial inductances")
	}
	if q > 0 {
		p.Windings = []Winding{{Name: "12", L: p.Value.Max, From: "1", To: "2", Q: q}}
	}
}

var windingKeys = []string{"l", "q", "rdc"}

// tapGuess reads a winding table whose l is a list of two inductances
// ({ l = ["20u", "180u"], q = 90 }) as the tapped winding it plainly means,
// after one message that shows the accepted form: refused outright, it used
// to bring a knock-on "no terminal NAMEt" for every pin on the tap.
func (ld *loader) tapGuess(np, name string, x any) ([]any, bool) {
	t, ok := x.(map[string]any)
	if !ok {
		return nil, false
	}
	list, ok := t["l"].([]any)
	if !ok || len(list) != 2 {
		return nil, false
	}
	var rest []string
	for _, k := range sortedKeys(t) {
		if k != "l" {
			rest = append(rest, fmt.Sprintf("%s = %s", k, tomlText(t[k])))
		}
	}
	half := func(v any) map[string]any {
		h := map[string]any{"l": v}
		for k, w := range t {
			if k != "l" {
				h[k] = w
			}
		}
		return h
	}
	extra := ""
	if len(rest) > 0 {
		extra = ", " + strings.Join(rest, ", ")
	}
	ld.errVal(np+".l", "a tapped winding is a list of its two sections, each a table: %s = [{ l = %s%s }, { l = %s%s }] (terminals %s1, %st, %s2)",
		name, tomlText(list[0]), extra, tomlText(list[1]), extra, name, name, name)
	return []any{half(list[0]), half(list[1])}, true
}

// tomlText writes a decoded TOML scalar back as it would be written.
func tomlText(v any) string {
	if s, ok := v.(string); ok {
		return strconv.Quote(s)
	}
	return fmt.Sprint(v)
}

// winding reads one winding (or one half of a tapped one): its inductance,
// or a table { l, q, rdc } with its own unloaded Q and DC resistance.
func (ld *loader) winding(np string, w Winding, x any) Winding {
	t, ok := x.(map[string]any)
	if !ok {
		w.L = ld.num(np, x, value.Henry)
		return w
	}
	for _, k := range sortedKeys(t) {
		switch k {
		case "l":
			w.L = ld.num(np+".l", t[k], value.Henry)
		case "q":
			w.Q = ld.num(np+".q", t[k], value.None)
		case "rdc":
			w.Rdc = ld.num(np+".rdc", t[k], value.Ohm)
			if !(w.Rdc > 0) && !ld.bad[np+".rdc"] {
				ld.errVal(np+".rdc", "rdc, the winding's DC resistance, must be above 0 Ω")
			}
		default:
			ld.unknown(np+"."+k, k, windingKeys)
		}
	}
	if _, ok := t["l"]; !ok {
		ld.errKey(np, "winding %s has no inductance l", w.Name)
	}
	return w
}

func (ld *loader) transformer(path string, p *Part, m map[string]any) {
	wp := path + ".windings"
	wm, ok := m["windings"].(map[string]any)
	if !ok || len(wm) == 0 {
		ld.errVal(wp, "windings must be a table such as { p = \"1m\", s = \"1m\" }")
		return
	}
	q := 0.0
	if x, ok := m["q"]; ok {
		q = ld.num(path+".q", x, value.None)
		if !(q > 0) {
			ld.errVal(path+".q", "q is the unloaded quality factor and must be above 0 (leave it out for a lossless coil)")
		}
	}
	for _, name := range sortedKeys(wm) {
		np := wp + "." + name
		w := Winding{Name: name, From: name + "1", To: name + "2", Q: q}
		t, ok := wm[name].([]any)
		if !ok {
			t, ok = ld.tapGuess(np, name, wm[name])
		}
		switch {
		case ok:
			// A centre-tapped winding: two halves, pins NAME1–NAMEt–NAME2, fully coupled.
			if len(t) != 2 {
				ld.errVal(np, "a tapped winding takes two partial inductances")
				continue
			}
			a := ld.winding(fmt.Sprintf("%s[0]", np), Winding{Name: name + "a", From: name + "1", To: name + "t", Q: q}, t[0])
			b := ld.winding(fmt.Sprintf("%s[1]", np), Winding{Name: name + "b", From: name + "t", To: name + "2", Q: q}, t[1])
			p.Windings = append(p.Windings, a, b)
			p.Coupling = append(p.Coupling, Coupling{A: a.Name, B: b.Name, K: 1})
		default:
			p.Windings = append(p.Windings, ld.winding(np, w, wm[name]))
		}
	}
	kp := path + ".k"
	switch t := m["k"].(type) {
	case nil:
		if len(p.Windings) > 1 && len(p.Coupling) == 0 {
			ld.errKey(path, "transformer %s has no coupling: give k (e.g. k = 0.01 for an IF transformer, 0.99 for a mains one)", p.Ref)
		}
	case map[string]any:
		for _, pair := range sortedKeys(t) {
			a, b, ok := strings.Cut(pair, "-")
			as, bs := windingsNamed(p, a), windingsNamed(p, b)
			if !ok || len(as) == 0 || len(bs) == 0 {
				ld.errKey(kp+"."+pair, "coupling key %q must name two windings of %s as \"A-B\" (its windings: %s)", pair, p.Ref, strings.Join(windingsAsWritten(p), ", "))
				continue
			}
			// a tapped winding named whole couples both its halves alike
			for _, x := range as {
				for _, y := range bs {
					ld.addK(kp+"."+pair, p, x, y, t[pair])
				}
			}
		}
	default:
		// One k for every pair of distinct windings (halves of one tapped
		// winding stay fully coupled).
		for i := range p.Windings {
			for j := i + 1; j < len(p.Windings); j++ {
				a, b := p.Windings[i].Name, p.Windings[j].Name
				if p.K(a, b) == 0 {
					ld.addK(kp, p, a, b, t)
				}
			}
		}
	}
}

// windingsNamed are the windings a coupling key's name stands for: the
// winding of that name, or both halves of a tapped winding named whole
// (NAMEa and NAMEb); none when the part has no such winding.
func windingsNamed(p *Part, name string) []string {
	if p.Winding(name) != nil {
		return []string{name}
	}
	if p.Winding(name+"a") != nil && p.Winding(name+"b") != nil {
		return []string{name + "a", name + "b"}
	}
	return nil
}

func (ld *loader) addK(path string, p *Part, a, b string, v any) {
	k := ld.num(path, v, value.None)
	if k <= 0 || k > 1 {
		ld.errVal(path, "coupling factor k must be above 0 and at most 1, not %g", k)
	}
	p.Coupling = append(p.Coupling, Coupling{A: a, B: b, K: k})
}

// maxSwitchPositions bounds a switch's positions; real wafer switches have a
// dozen at most, and the bound keeps a typo from allocating without limit.
const maxSwitchPositions = 64

func (ld *loader) switchPart(path string, p *Part, m map[string]any) {
	x := ld.num(path+".switch", m["switch"], value.None)
	if x < 1 || x > maxSwitchPositions || x != math.Trunc(x) {
		ld.errVal(path+".switch", "switch gives the number of positions, a whole number from 1 to %d", maxSwitchPositions)
		return
	}
	n := int(x)
	p.Set = 1
	if s, ok := m["set"]; ok {
		p.Set = ld.num(path+".set", s, value.None)
		if p.Set < 1 || p.Set > float64(n) || p.Set != float64(int(p.Set)) {
			ld.errVal(path+".set", "switch position must be a whole number from 1 to %d", n)
		}
	}
	list, _ := m["closes"].([]any)
	if m["closes"] != nil && list == nil {
		ld.errVal(path+".closes", "closes must be a list with one string per position, e.g. [\"c-1\", \"c-2\"]")
	}
	if list != nil && len(list) != n {
		ld.errVal(path+".closes", "closes lists %d positions but the switch has %d", len(list), n)
	}
	p.Closes = make([][][2]string, n)
	for i, e := range list {
		if i >= n {
			break
		}
		ep := fmt.Sprintf("%s.closes[%d]", path, i)
		if _, nested := e.([]any); nested {
			// A list per position reads naturally but is not the format; say how an open
			// position is written, which is what a user writing [] was after.
			ld.errVal(ep, "each position is one string of its closed contact pairs, not a list: "+
				"write \"1-2\" (or \"1-2 3-4\" for two pairs), and \"\" for a position that closes nothing")
			continue
		}
		for _, pair := range strings.Fields(ld.str(ep, e)) {
			a, b, ok := strings.Cut(pair, "-")
			if !ok || a == "" || b == "" {
				ld.errVal(ep, "contact pair %q must be written \"A-B\"", pair)
				continue
			}
			p.Closes[i] = append(p.Closes[i], [2]string{a, b})
		}
	}
}
