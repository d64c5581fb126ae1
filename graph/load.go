package graph

import (
	"errors"
	"fmt"
	"math"
	"os"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"

	"pare/graph/value"
)

// LoadFile reads and checks a netlist file. On any problem it returns a nil
// circuit and an ErrorList holding every problem found, sorted by position.
func LoadFile(path string) (*Circuit, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(path, data)
}

// Parse reads a netlist from memory; file names it in messages.
func Parse(file string, data []byte) (*Circuit, error) {
	var raw map[string]any
	if _, err := toml.Decode(string(data), &raw); err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			var l ErrorList
			line, col := pe.Position.Line, pe.Position.Col
			if line < 1 {
				line, col = 1, 1
			}
			col = runeCol(data, line, col)
			col = duplicateCol(pe, data, line, col)
			l.Add(Pos{File: file, Line: line, Col: col}, "%s", tomlMessage(pe))
			return nil, l
		}
		var l ErrorList
		l.Add(Pos{File: file, Line: 1, Col: 1}, "%v", err)
		return nil, l
	}
	ld := &loader{ix: indexKeys(file, string(data)), c: &Circuit{File: file, Freqs: map[string]float64{}}}
	ld.circuit(raw)
	if err := ld.errs.Err(); err != nil {
		ld.errs.Sort()
		return nil, ld.errs
	}
	ld.c.Comments = ld.ix.comments
	return ld.c, nil
}

// duplicateKey matches the decoder's message for a key written twice.
var duplicateKey = regexp.MustCompile(`^Key '(.*)' has already been defined\.?$`)

// runeCol turns the decoder's byte column into a character column, the
// unit the key scanner and every other message use (a line with "µF" or "kΩ"
// before the mistake would otherwise point past it).
func runeCol(data []byte, line, col int) int {
	lines := strings.Split(string(data), "\n")
	if line > len(lines) || col < 1 {
		return col
	}
	text := lines[line-1]
	if col-1 > len(text) {
		return col
	}
	return utf8.RuneCountInString(text[:col-1]) + 1
}

// duplicateCol moves the position of a "written twice" error from the
// decoder's spot (inside the second entry) to the start of its key, when the
// line begins with the part's reference designator.
func duplicateCol(pe toml.ParseError, data []byte, line, col int) int {
	m := duplicateKey.FindStringSubmatch(pe.Message)
	if m == nil {
		return col
	}
	rest, ok := strings.CutPrefix(m[1], "parts.")
	if !ok {
		return col
	}
	ref, _, _ := strings.Cut(rest, ".")
	lines := strings.Split(string(data), "\n")
	if line > len(lines) {
		return col
	}
	text := lines[line-1]
	trimmed := strings.TrimLeft(text, " \t")
	if strings.HasPrefix(trimmed, ref) {
		return len([]rune(text)) - len([]rune(trimmed)) + 1
	}
	return col
}

// tomlMessage shortens the decoder's message (the position is printed by us)
// and says in the netlist's own terms what a key written twice means.
func tomlMessage(pe toml.ParseError) string {
	msg := pe.Message
	if msg == "" {
		msg = pe.Error()
	}
	if m := duplicateKey.FindStringSubmatch(msg); m != nil {
		key := m[1]
		if rest, ok := strings.CutPrefix(key, "parts."); ok {
			ref, _, _ := strings.Cut(rest, ".")
			return fmt.Sprintf("part %s is written twice: each reference designator names one part", ref)
		}
		return fmt.Sprintf("key %q is written twice", key)
	}
	return msg
}

type loader struct {
	ix   *keyIndex
	c    *Circuit
	errs ErrorList
	bad  map[string]bool // key paths already reported
}

func (ld *loader) errKey(path, format string, args ...any) {
	ld.errs.Add(ld.ix.key(path), format, args...)
	ld.markBad(path)
}

func (ld *loader) errVal(path, format string, args ...any) {
	ld.errs.Add(ld.ix.val(path), format, args...)
	ld.markBad(path)
}

// markBad remembers that a key was already reported, so that later checks
// on its value do not pile a follow-on message on top.
func (ld *loader) markBad(path string) {
	if ld.bad == nil {
		ld.bad = map[string]bool{}
	}
	ld.bad[path] = true
}

var topKeys = []string{"title", "note", "band", "inputs", "outputs", "freqs", "regions", "nets", "parts"}

func (ld *loader) circuit(raw map[string]any) {
	for _, k := range sortedKeys(raw) {
		v := raw[k]
		switch k {
		case "title":
			ld.c.Title = ld.str(k, v)
		case "note":
			ld.c.Note = ld.str(k, v)
		case "band":
			ld.c.Band = ld.rng(k, v, value.Hertz)
		case "inputs":
			ld.c.Inputs = ld.strList(k, v)
		case "outputs":
			ld.c.Outputs = ld.strList(k, v)
		case "freqs":
			for _, name := range ld.tableKeys(k, v) {
				p := k + "." + name
				ld.c.Freqs[name] = ld.num(p, v.(map[string]any)[name], value.Hertz)
			}
		case "regions":
			for _, name := range ld.tableKeys(k, v) {
				ld.region(k+"."+name, name, v.(map[string]any)[name])
			}
		case "nets":
			for _, name := range ld.tableKeys(k, v) {
				ld.net(k+"."+name, name, v.(map[string]any)[name])
			}
		case "parts":
			for _, ref := range ld.tableKeys(k, v) {
				ld.part(k+"."+ref, ref, v.(map[string]any)[ref])
			}
		default:
			ld.unknown(k, k, topKeys)
		}
	}
	if parts, ok := raw["parts"]; !ok {
		ld.errs.Add(Pos{File: ld.ix.file, Line: 1, Col: 1}, "no [parts] table: a netlist needs at least one part")
	} else if m, isTable := parts.(map[string]any); isTable && len(m) == 0 {
		ld.errKey("parts", "[parts] is empty: a netlist needs at least one part")
	}
	if _, ok := raw["band"]; !ok && len(ld.c.Regions) == 0 {
		ld.errs.Add(Pos{File: ld.ix.file, Line: 1, Col: 1}, `no band of interest: add e.g. band = "530k..1700k" (reductions judge reactances at the band's edges)`)
	}
	ld.finish()
}

func (ld *loader) unknown(path, key string, known []string) {
	if s := Suggest(key, known); s != "" {
		ld.errKey(path, "unknown key %q (did you mean %q?)", key, s)
		return
	}
	ld.errKey(path, "unknown key %q; expected one of: %s", key, strings.Join(known, ", "))
}

func (ld *loader) tableKeys(path string, v any) []string {
	m, ok := v.(map[string]any)
	if !ok {
		ld.errVal(path, "%s must be a table", path)
		return nil
	}
	return sortedKeys(m)
}

func (ld *loader) str(path string, v any) string {
	s, ok := v.(string)
	if !ok {
		ld.errVal(path, "%s must be a string, not %s", lastKey(path), typeName(v))
	}
	return s
}

func (ld *loader) strList(path string, v any) []string {
	switch t := v.(type) {
	case string:
		return []string{t}
	case []any:
		out := make([]string, 0, len(t))
		for i, e := range t {
			out = append(out, ld.str(fmt.Sprintf("%s[%d]", path, i), e))
		}
		return out
	}
	ld.errVal(path, "%s must be a list of names, e.g. [\"a\", \"b\"]", lastKey(path))
	return nil
}

func lastKey(path string) string {
	if i := strings.LastIndexByte(path, '.'); i >= 0 {
		return path[i+1:]
	}
	return path
}

func typeName(v any) string {
	switch v.(type) {
	case string:
		return "a string"
	case int64:
		return "an integer"
	case float64:
		return "a number"
	case bool:
		return "a boolean"
	case []any, []map[string]any:
		return "an array"
	case map[string]any:
		return "a table"
	}
	return fmt.Sprintf("%T", v)
}

// num reads a quantity written as a TOML number or as a string in the trade's
// notation ("4k7", "2.5 mA/V").
func (ld *loader) num(path string, v any, u value.Unit) float64 {
	switch t := v.(type) {
	case int64:
		v = strconv.FormatInt(t, 10)
	case float64:
		// A TOML number passes the same checks as text does (finite, within
		// the magnitudes pare reads), so that nan, inf or 1e308 are refused
		// here rather than written out as text that would not load back.
		v = strconv.FormatFloat(t, 'g', -1, 64)
	}
	switch t := v.(type) {
	case string:
		x, err := value.Parse(normaliseUnit(t, u), u)
		if err != nil {
			ld.errVal(path, "%s: %v", lastKey(path), err)
		}
		return x
	}
	ld.errVal(path, "%s must be a value such as \"4k7\" or 470, not %s", lastKey(path), typeName(v))
	return 0
}

// normaliseUnit accepts "mA/V", the valve data sheets' unit of mutual
// conductance, as siemens.
func normaliseUnit(s string, u value.Unit) string {
	if u == value.Siemens {
		s = strings.Replace(s, "A/V", "S", 1)
	}
	return s
}

// dashRange matches a span written with a dash ("530k-1700k"), a slip for "..".
var dashRange = regexp.MustCompile(`^\s*[0-9][0-9.]*\s*[A-Za-zµΩ]*\s*[-–]\s*[0-9]`)

func (ld *loader) rng(path string, v any, u value.Unit) value.Range {
	if s, ok := v.(string); ok && !strings.Contains(s, "..") && !strings.Contains(s, "\u2026") {
		if dashRange.MatchString(s) {
			ld.errVal(path, "%s: %q: write a range with \"..\" between the two values, e.g. \"530k..1700k\"", lastKey(path), s)
			return value.Range{}
		}
		// One value: read it as such, so that messages do not speak of a range.
		x := ld.num(path, s, u)
		if x < 0 {
			ld.errVal(path, "%s must not be negative", lastKey(path))
		}
		return value.Range{Min: x, Max: x}
	}
	if s, ok := v.(string); ok {
		r, err := value.ParseRange(s, u)
		if err != nil {
			ld.errVal(path, "%s: %v", lastKey(path), err)
		}
		return r
	}
	x := ld.num(path, v, u)
	return value.Range{Min: x, Max: x}
}

func (ld *loader) boolean(path string, v any) bool {
	b, ok := v.(bool)
	if !ok {
		ld.errVal(path, "%s must be true or false", lastKey(path))
	}
	return b
}

var regionKeys = []string{"band", "parts", "nets", "input", "output"}

func (ld *loader) region(path, name string, v any) {
	r := &Region{Name: name, Pos: ld.ix.key(path)}
	m, ok := v.(map[string]any)
	if !ok {
		ld.errVal(path, "region %s must be a table such as { band = \"20..20k\", parts = [\"V3\"] }", name)
		return
	}
	for _, k := range sortedKeys(m) {
		p := path + "." + k
		switch k {
		case "band":
			r.Band = ld.rng(p, m[k], value.Hertz)
		case "parts":
			r.Parts = ld.strList(p, m[k])
		case "nets":
			r.Nets = ld.strList(p, m[k])
		case "input":
			r.Input = ld.str(p, m[k])
		case "output":
			r.Output = ld.str(p, m[k])
		default:
			ld.unknown(p, k, regionKeys)
		}
	}
	if _, ok := m["band"]; !ok {
		ld.errKey(path, "region %s has no band", name)
	}
	ld.c.Regions = append(ld.c.Regions, r)
}

var netKeys = []string{"role", "volts", "label"}
var roles = []string{string(Signal), string(Ground), string(Supply), string(Heater), string(Bias), string(PortN)}

func (ld *loader) net(path, name string, v any) {
	n := &Net{Name: name, Role: DefaultRole(name), Pos: ld.ix.key(path)}
	if !netPattern.MatchString(name) {
		ld.errKey(path, "net name %q: use letters, digits and _ + - . only", name)
	}
	m, ok := v.(map[string]any)
	if !ok {
		ld.errVal(path, "net %s must be a table such as { role = \"supply\", volts = 250 }", name)
		return
	}
	for _, k := range sortedKeys(m) {
		p := path + "." + k
		switch k {
		case "role":
			s := ld.str(p, m[k])
			if !contains(roles, s) {
				hint := ""
				if g := Suggest(s, roles); g != "" {
					hint = fmt.Sprintf(" (did you mean %q?)", g)
				}
				ld.errVal(p, "unknown net role %q%s; roles: %s", s, hint, strings.Join(roles, ", "))
			}
			n.Role = Role(s)
		case "volts":
			n.Volts = ld.num(p, m[k], value.Volt)
		case "label":
			n.Label = ld.str(p, m[k])
		default:
			ld.unknown(p, k, netKeys)
		}
	}
	ld.c.Nets = append(ld.c.Nets, n)
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// kindKeys choose a part's kind; exactly one must be present.
var kindKeys = map[string]Kind{
	"r": Resistor, "c": Capacitor, "l": Inductor, "windings": Transformer, "valve": Valve,
	"bjt": BJT, "fet": FET, "diode": Diode, "xtal": Crystal, "pot": Pot, "switch": Switch,
	"port": Port, "part": Generic,
}

var commonKeys = []string{"pins", "tol", "rating", "gang", "keep", "note", "from", "type", "envelope"}

// extraKeys are the keys a kind accepts besides the common ones and its device parameters.
var extraKeys = map[Kind][]string{
	Capacitor:   {"set"},
	Inductor:    {"tap", "k"},
	Transformer: {"k"},
	Pot:         {"set"},
	Switch:      {"set", "closes"},
}

var capTypes = []string{CapFixed, CapElectrolytic, CapVariable, CapTrimmer}
var indTypes = []string{IndPlain, IndChoke}

var refPattern = regexp.MustCompile(`^[A-Za-z]+[0-9]+[A-Za-z]?$`)

func (ld *loader) part(path, ref string, v any) {
	p := &Part{Ref: ref, Pos: ld.ix.key(path)}
	m, ok := v.(map[string]any)
	if !ok {
		ld.errVal(path, "part %s must be an inline table such as { r = \"47k\", pins = [\"a\", \"b\"] }", ref)
		return
	}
	var kindKey string
	for _, k := range sortedKeys(m) {
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
	known := append(append(append([]string(nil), commonKeys...), extraKeys[p.Kind]...), ParamNames(p.Kind)...)
	known = append(known, kindKey)
	for _, k := range sortedKeys(m) {
		if !contains(known, k) {
			kp := path + "." + k
			if _, isKind := kindKeys[k]; isKind {
				continue // reported above
			}
			ld.unknown(kp, k, known)
		}
	}
	ld.kindValue(path, p, kindKey, m)
	for _, k := range sortedKeys(m) {
		kp := path + "." + k
		x := m[k]
		switch k {
		case "tol":
			if s, ok := x.(string); ok {
				t, err := value.ParseTolerance(s)
				if err != nil {
					ld.errVal(kp, "tol: %v", err)
				}
				p.Tol = t
			} else {
				ld.errVal(kp, "tol must be a string such as \"5%%\"")
			}
		case "rating":
			p.Rating = ld.num(kp, x, value.Volt)
		case "gang":
			p.Gang = ld.str(kp, x)
		case "keep":
			p.Keep = ld.boolean(kp, x)
		case "note":
			p.Note = ld.str(kp, x)
		case "envelope":
			p.Envelope = ld.str(kp, x)
		case "from":
			p.From = ld.strList(kp, x)
			sort.Strings(p.From)
		default:
			if contains(ParamNames(p.Kind), k) {
				if p.Params == nil {
					p.Params = map[string]float64{}
				}
				p.Params[k] = ld.num(kp, x, paramUnit(k))
			}
		}
	}
	ld.pins(path, p, m["pins"])
	if !refPattern.MatchString(ref) {
		ld.errKey(path, "malformed reference designator %q: write letters then a number, e.g. R12, C3, V1a", ref)
	}
	ld.c.Parts = append(ld.c.Parts, p)
}

func paramUnit(name string) value.Unit {
	switch name {
	case "gm":
		return value.Siemens
	case "ra", "rd", "ro", "rpi", "rm":
		return value.Ohm
	case "ic":
		return value.Ampere
	case "lm":
		return value.Henry
	case "cm", "c0":
		return value.Farad
	}
	return value.None // mu, beta, q, off
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
	case BJT:
		p.Type = ld.deviceType(kp, m[key], "bjt", BJTTypes)
	case FET:
		p.Type = ld.deviceType(kp, m[key], "fet", FETTypes)
	case Diode:
		p.Type = ld.deviceType(kp, m[key], "diode", DiodeTypes)
	case Crystal:
		p.Value = ld.rngOne(kp, m[key], value.Hertz)
	case Pot:
		p.Value = ld.rngOne(kp, m[key], value.Ohm)
		p.Set = 0.5
		if s, ok := m["set"]; ok {
			p.Set = ld.num(path+".set", s, value.None)
			if p.Set < 0 || p.Set > 1 {
				ld.errVal(path+".set", "a pot's set is the wiper position from 0 (pin 1) to 1 (pin 2), not %g", p.Set)
			}
		}
	case Switch:
		ld.switchPart(path, p, m)
	case Port:
		p.Label = ld.str(kp, m[key])
	case Generic:
		p.Label = ld.str(kp, m[key])
	}
	if typ != "" && p.Kind != Capacitor && p.Kind != Inductor {
		ld.errKey(path+".type", "type applies to capacitors (%s) and inductors (%s) only", strings.Join(capTypes, ", "), strings.Join(indTypes, ", "))
	}
}

func (ld *loader) badType(path, what, typ string, types []string) {
	hint := ""
	if g := Suggest(typ, types); g != "" {
		hint = fmt.Sprintf(" (did you mean %q?)", g)
	}
	ld.errVal(path, "unknown %s type %q%s; types: %s", what, typ, hint, strings.Join(types, ", "))
}

func (ld *loader) deviceType(path string, v any, what string, types []string) string {
	s := ld.str(path, v)
	if s != "" && !contains(types, s) {
		ld.badType(path, what, s, types)
	}
	return s
}

// rngOne reads a single value (no span) into a Range.
func (ld *loader) rngOne(path string, v any, u value.Unit) value.Range {
	x := ld.num(path, v, u)
	if x < 0 {
		ld.errVal(path, "%s must not be negative", lastKey(path))
	}
	return value.Range{Min: x, Max: x}
}

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

var windingKeys = []string{"l", "q"}

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
		switch t := wm[name].(type) {
		case map[string]any:
			for _, k := range sortedKeys(t) {
				switch k {
				case "l":
					w.L = ld.num(np+".l", t[k], value.Henry)
				case "q":
					w.Q = ld.num(np+".q", t[k], value.None)
				default:
					ld.unknown(np+"."+k, k, windingKeys)
				}
			}
			if _, ok := t["l"]; !ok {
				ld.errKey(np, "winding %s has no inductance l", name)
			}
			p.Windings = append(p.Windings, w)
		case []any:
			// A centre-tapped winding: two halves, pins NAME1–NAMEt–NAME2, fully coupled.
			if len(t) != 2 {
				ld.errVal(np, "a tapped winding takes two partial inductances")
				continue
			}
			a := Winding{Name: name + "a", L: ld.num(np+"[0]", t[0], value.Henry), From: name + "1", To: name + "t", Q: q}
			b := Winding{Name: name + "b", L: ld.num(np+"[1]", t[1], value.Henry), From: name + "t", To: name + "2", Q: q}
			p.Windings = append(p.Windings, a, b)
			p.Coupling = append(p.Coupling, Coupling{A: a.Name, B: b.Name, K: 1})
		default:
			w.L = ld.num(np, wm[name], value.Henry)
			p.Windings = append(p.Windings, w)
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
			if !ok || p.Winding(a) == nil || p.Winding(b) == nil {
				ld.errKey(kp+"."+pair, "coupling key %q must name two windings as \"A-B\"", pair)
				continue
			}
			ld.addK(kp+"."+pair, p, a, b, t[pair])
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

func (ld *loader) pins(path string, p *Part, v any) {
	pp := path + ".pins"
	if v == nil {
		ld.errKey(path, "part %s has no pins", p.Ref)
		return
	}
	switch t := v.(type) {
	case []any:
		names := ArrayPins(p.Kind, p.Type, len(t))
		if len(p.Windings) == 2 && p.Kind == Inductor && len(t) != 3 {
			ld.errVal(pp, "a tapped coil has three pins: [end, tap, end]")
			return
		}
		if names == nil {
			ld.errVal(pp, "%s %s cannot take %s as a list; %s", p.Kind, p.Ref, plural(len(t), "pin"), pinHint(p))
			return
		}
		for i, e := range t {
			ep := fmt.Sprintf("%s[%d]", pp, i)
			net := ld.netName(ep, e)
			p.Pins = append(p.Pins, Pin{Name: names[i], Net: net, Pos: ld.ix.val(ep)})
		}
	case map[string]any:
		allowed := Terminals(p.Kind, p.Type)
		switch p.Kind {
		case Transformer:
			for _, w := range p.Windings {
				allowed = appendNew(allowed, w.From, w.To)
			}
		case Switch:
			for _, pos := range p.Closes {
				for _, pr := range pos {
					allowed = appendNew(allowed, pr[0], pr[1])
				}
			}
		}
		var guessed []string // terminals a misspelt name was taken for: not reported missing as well
		for _, name := range sortedKeys(t) {
			ep := pp + "." + name
			if allowed != nil && p.Kind != Generic && p.Kind != Switch && !contains(allowed, name) {
				// A misspelt terminal is most likely one not written yet:
				// "p3" beside p1 means p2.
				var unused []string
				for _, a := range allowed {
					if _, given := t[a]; !given {
						unused = append(unused, a)
					}
				}
				g := Suggest(name, unused)
				if g == "" {
					g = Suggest(name, allowed)
				}
				hint := ""
				if g != "" {
					hint = fmt.Sprintf(" (did you mean %q?)", g)
					guessed = append(guessed, g)
				}
				ld.errKey(ep, "%s %s has no terminal %q%s; terminals: %s", kindLabel(p), p.Ref, name, hint, strings.Join(allowed, " "))
				continue
			}
			p.Pins = append(p.Pins, Pin{Name: name, Net: ld.netName(ep, t[name]), Pos: ld.ix.key(ep)})
		}
		ld.requiredPins(pp, p, guessed)
		sortPins(p)
	default:
		ld.errVal(pp, "pins must be a list of nets or a table of terminal = net")
	}
}

func pinHint(p *Part) string {
	switch p.Kind {
	case Valve, BJT, FET, Transformer, Switch, Generic:
		return "name the terminals in a table, e.g. pins = { " + examplePins(p) + " }"
	}
	return "give " + strconv.Itoa(len(Terminals(p.Kind, p.Type))) + " nets"
}

func examplePins(p *Part) string {
	switch p.Kind {
	case Valve:
		return `a = "anode", g1 = "grid", k = "cathode"`
	case BJT:
		return `b = "base", c = "coll", e = "emit"`
	case FET:
		return `g = "gate", d = "drain", s = "source"`
	case Transformer:
		return `p1 = "a", p2 = "ht", s1 = "out", s2 = "gnd"`
	}
	return `"1" = "a", "2" = "b"`
}

func kindLabel(p *Part) string {
	if p.Type != "" && p.Kind != Capacitor && p.Kind != Inductor {
		return p.Type
	}
	return string(p.Kind)
}

func appendNew(list []string, names ...string) []string {
	for _, n := range names {
		if !contains(list, n) {
			list = append(list, n)
		}
	}
	return list
}

// requiredPins checks that a part written with a pin table names every terminal it must have.
func (ld *loader) requiredPins(path string, p *Part, guessed []string) {
	var need []string
	switch p.Kind {
	case Valve:
		need = valveElectrodes[p.Type]
	case BJT:
		need = []string{"b", "c", "e"}
	case FET:
		need = []string{"g", "d", "s"}
	case Transformer:
		for _, w := range p.Windings {
			need = appendNew(need, w.From, w.To)
		}
	case Resistor, Capacitor, Crystal, Diode, Pot, Port:
		need = Terminals(p.Kind, p.Type)
	case Inductor:
		need = []string{"1", "2"}
		if len(p.Windings) == 2 {
			need = []string{"1", "t", "2"}
		}
	}
	var missing []string
	for _, n := range need {
		if p.Pin(n) == nil && !contains(guessed, n) {
			missing = append(missing, n)
		}
	}
	if len(missing) > 0 {
		ld.errVal(path, "%s %s: terminal %s not connected (write it to a net, or to \"nc\" if it is really unconnected)", kindLabel(p), p.Ref, strings.Join(missing, ", "))
	}
}

// sortPins puts pins in the kind's terminal order, then by name.
func sortPins(p *Part) {
	order := Terminals(p.Kind, p.Type)
	rank := func(n string) int {
		for i, o := range order {
			if o == n {
				return i
			}
		}
		return len(order)
	}
	sort.SliceStable(p.Pins, func(i, j int) bool {
		ri, rj := rank(p.Pins[i].Name), rank(p.Pins[j].Name)
		if ri != rj {
			return ri < rj
		}
		return p.Pins[i].Name < p.Pins[j].Name
	})
}

var netPattern = regexp.MustCompile(`^[A-Za-z0-9_+\-.]+$`)

func (ld *loader) netName(path string, v any) string {
	s, ok := v.(string)
	if !ok {
		ld.errVal(path, "a pin's net must be a name in quotes, not %s", typeName(v))
		return ""
	}
	if !netPattern.MatchString(s) {
		ld.errVal(path, "net name %q: use letters, digits and _ + - . only", s)
	}
	return s
}

// finish creates nets named only in pin lists, checks cross references, and sorts.
func (ld *loader) finish() {
	c := ld.c
	seen := map[string]bool{}
	for _, n := range c.Nets {
		seen[n.Name] = true
	}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			if pin.Net != "" && !seen[pin.Net] {
				seen[pin.Net] = true
				c.Nets = append(c.Nets, &Net{Name: pin.Net, Role: DefaultRole(pin.Net), Pos: pin.Pos})
			}
		}
	}
	c.Sort()
	netNames := make([]string, 0, len(c.Nets))
	for _, n := range c.Nets {
		netNames = append(netNames, n.Name)
	}
	refs := make([]string, 0, len(c.Parts))
	for _, p := range c.Parts {
		refs = append(refs, p.Ref)
	}
	checkNet := func(path, name, what string) {
		if name != "" && c.Net(name) == nil {
			hint := ""
			if g := Suggest(name, netNames); g != "" {
				hint = fmt.Sprintf(" (did you mean %q?)", g)
			}
			ld.errVal(path, "%s %q is not a net of this circuit%s", what, name, hint)
		}
	}
	for i, n := range c.Inputs {
		checkNet(fmt.Sprintf("inputs[%d]", i), n, "input")
	}
	for i, n := range c.Outputs {
		checkNet(fmt.Sprintf("outputs[%d]", i), n, "output")
	}
	for _, r := range c.Regions {
		rp := "regions." + r.Name
		for i, ref := range r.Parts {
			if c.Part(ref) == nil {
				hint := ""
				if g := Suggest(ref, refs); g != "" {
					hint = fmt.Sprintf(" (did you mean %q?)", g)
				}
				ld.errVal(fmt.Sprintf("%s.parts[%d]", rp, i), "region %s names part %q, which is not in [parts]%s", r.Name, ref, hint)
			}
		}
		for i, n := range r.Nets {
			checkNet(fmt.Sprintf("%s.nets[%d]", rp, i), n, "region net")
		}
		checkNet(rp+".input", r.Input, "region input")
		checkNet(rp+".output", r.Output, "region output")
		if _, given := ld.ix.vals[rp+".band"]; given && !ld.bad[rp+".band"] && r.Band.Min <= 0 {
			ld.errVal(rp+".band", "region %s: a band must start above 0 Hz", r.Name)
		}
	}
	if _, given := ld.ix.vals["band"]; given && !ld.bad["band"] && c.Band.Min <= 0 {
		ld.errVal("band", "the band must start above 0 Hz (reactances are judged at its low edge)")
	}
	for _, n := range c.Nets {
		if n.Role == Supply && n.Volts == 0 {
			// Not an error: the voltage is for the drawing only.
			continue
		}
	}
	for _, p := range c.Parts {
		if p.Envelope != "" {
			continue
		}
	}
}

// plural writes "1 pin", "3 pins".
func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return strconv.Itoa(n) + " " + word + "s"
}
