package stages

import (
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"sync"

	"github.com/BurntSushi/toml"

	"pare/graph"
	"pare/graph/value"
)

//go:embed patterns/*.toml
var builtin embed.FS

// Pattern is one stage topology, loaded from a pattern file.
type Pattern struct {
	ID       string
	Title    string            // may hold {control}, {common}, {output}, {family}
	Titles   map[string]string // per family, where the trade names the stage differently
	Group    string            // oscillator, amplifier, mixer, tuned, detector, coupling, power
	Circuit  string            // "reduced" (default) or "full": power patterns look at the whole set
	Rank     int               // specificity among matches of equal size; higher wins
	Inner    bool              // may be recorded as a sub-stage of a larger stage
	Families []string
	// Context names a condition on the circuit as a whole: "fm" means the
	// stage only exists where FM is received (see fmReceived).
	Context string
	Nets    []PNet
	Parts   []PPart
	Figures []FigureSpec
	Guards  []Guard
	Pos     graph.Pos // where the pattern's id was written

	variants []*variant
}

// PNet is a pattern net: a variable bound to one net of the circuit.
type PNet struct {
	Name string
	// At says what the bound net must be: "signal" (default, not AC ground),
	// "ground" (AC ground), "any", and in full-circuit patterns "rail"
	// (a supply, bias or heater net, not chassis).
	At string
	// Outside constrains the bound net's other connections: "" no constraint,
	// "none" (only the pattern's parts touch it), "some" (something else
	// does), "signal" (the net is fed from elsewhere: a part outside the
	// match reaches another non-ground net, or a port, or the net is a
	// declared input or output), "source" (a part outside the match that is
	// not a resistor or capacitor touches it: a diode, winding, device or
	// port feeds it, not another RC section).
	Outside string
	Pos     graph.Pos
}

// PPart is a pattern part.
type PPart struct {
	Name   string
	Device string   // see deviceKinds
	Types  []string // allowed Part.Type values; empty = any
	// Optional: "" the part must be there; "open" it may be missing; "short"
	// it may be missing, and then its two nets are one net (a coupling
	// capacitor that a reduction has already shorted, say).
	Optional string
	Pins     []PPin     // terminal key (a role, a pin name, or "" for a two-terminal list) → pattern net
	Windings [][]string // transformer: per winding its end nets, or end, tap, end
	Min, Max float64    // bounds on the main value, SI units; 0 = none
	// Shared parts take part in the match but are not claimed by the stage:
	// an IF transformer is the load of one stage and the source of the next.
	Shared bool
	Pos    graph.Pos
}

// PPin binds one terminal of a pattern part to a pattern net.
type PPin struct{ Key, Net string }

// FigureSpec asks for one figure calculation on a match.
type FigureSpec struct {
	Calc   string
	Prefix string              // prepended to every key with "_" (osc_f_min_hz)
	Args   map[string][]string // argument name → pattern part names (or a pattern net, or a word)
	Pos    graph.Pos
}

// Guard rejects a match whose figure lies outside [Min, Max]: the numbers
// separate, say, an AGC filter from an RC coupling of the same shape.
type Guard struct {
	Figure         string
	Min, Max       float64
	HasMin, HasMax bool
	Pos            graph.Pos
}

// device kinds a pattern part may ask for.
var deviceKinds = []string{"active", "valve", "bjt", "fet", "resistor", "capacitor", "inductor",
	"tapped-coil", "transformer", "diode", "double-diode", "crystal", "element", "pot"}

var patternKeys = []string{"id", "title", "titles", "group", "circuit", "rank", "inner", "families", "context", "nets", "parts", "figure", "guard", "note"}
var netKeys = []string{"at", "outside"}
var partKeys = []string{"device", "type", "optional", "pins", "windings", "min", "max", "shared"}
var activeKeys = []string{"control", "common", "output", "grid"}
var groups = []string{"oscillator", "amplifier", "mixer", "tuned", "detector", "coupling", "power"}

// Library is a set of loaded patterns, in id order.
type Library struct{ Patterns []*Pattern }

var (
	builtinOnce sync.Once
	builtinLib  *Library
	builtinErr  error
)

// Builtin returns the embedded pattern library, loaded once and shared (a
// Library is never changed after loading). It is checked by the tests, so
// an error here is a build mistake.
func Builtin() (*Library, error) {
	builtinOnce.Do(func() { builtinLib, builtinErr = loadFS(builtin, "patterns", "patterns") })
	return builtinLib, builtinErr
}

// LoadDir reads every *.toml file in dir as a pattern file.
func LoadDir(dir string) (*Library, error) {
	st, err := os.Stat(dir)
	if err != nil {
		return nil, fmt.Errorf("pattern directory: %w", err)
	}
	if !st.IsDir() {
		return nil, fmt.Errorf("pattern directory %s is not a directory", dir)
	}
	return loadFS(os.DirFS(dir), ".", dir)
}

func loadFS(fsys fs.FS, root, shown string) (*Library, error) {
	names, err := fs.Glob(fsys, filepath.ToSlash(filepath.Join(root, "*.toml")))
	if err != nil {
		return nil, err
	}
	sort.Strings(names)
	lib := &Library{}
	var errs graph.ErrorList
	for _, n := range names {
		data, err := fs.ReadFile(fsys, n)
		if err != nil {
			return nil, err
		}
		file := filepath.Join(shown, filepath.Base(n))
		p, err := ParsePattern(file, data)
		if err != nil {
			var l graph.ErrorList
			if errors.As(err, &l) {
				errs = append(errs, l...)
				continue
			}
			return nil, err
		}
		lib.Patterns = append(lib.Patterns, p)
	}
	errs = append(errs, lib.checkIDs()...)
	if len(errs) > 0 {
		errs.Sort()
		return nil, errs
	}
	lib.sort()
	return lib, nil
}

func (lib *Library) sort() {
	sort.Slice(lib.Patterns, func(i, j int) bool { return lib.Patterns[i].ID < lib.Patterns[j].ID })
}

func (lib *Library) checkIDs() graph.ErrorList {
	var errs graph.ErrorList
	seen := map[string]*Pattern{}
	for _, p := range lib.Patterns {
		if q, dup := seen[p.ID]; dup {
			errs.Add(p.Pos, "pattern id %q is used twice (also at %s)", p.ID, q.Pos)
			continue
		}
		seen[p.ID] = p
	}
	return errs
}

// Merge returns a library with other's patterns added; a pattern in other
// with the id of one in lib replaces it, so users can refine a built-in one.
func (lib *Library) Merge(other *Library) *Library {
	byID := map[string]*Pattern{}
	for _, p := range lib.Patterns {
		byID[p.ID] = p
	}
	for _, p := range other.Patterns {
		byID[p.ID] = p
	}
	out := &Library{}
	for _, p := range byID {
		out.Patterns = append(out.Patterns, p)
	}
	out.sort()
	return out
}

// Pattern returns the pattern with the given id, or nil.
func (lib *Library) Pattern(id string) *Pattern {
	for _, p := range lib.Patterns {
		if p.ID == id {
			return p
		}
	}
	return nil
}

// ParsePattern reads one pattern file; file names it in messages. Every
// problem is reported as file:line:col in a graph.ErrorList.
func ParsePattern(file string, data []byte) (*Pattern, error) {
	var raw map[string]any
	if _, err := toml.Decode(string(data), &raw); err != nil {
		var l graph.ErrorList
		var pe toml.ParseError
		if errors.As(err, &pe) {
			l.Add(graph.Pos{File: file, Line: pe.Position.Line, Col: pe.Position.Col}, "%s", pe.Message)
		} else {
			l.Add(graph.Pos{File: file, Line: 1, Col: 1}, "%v", err)
		}
		return nil, l
	}
	ld := &patLoader{at: graph.IndexKeys(file, string(data)), file: file, p: &Pattern{Inner: false}}
	ld.pattern(raw)
	if err := ld.errs.Err(); err != nil {
		ld.errs.Sort()
		return nil, ld.errs
	}
	return ld.p, nil
}

type patLoader struct {
	at   *graph.KeyPositions
	file string
	p    *Pattern
	errs graph.ErrorList
}

func (ld *patLoader) fail(path, format string, args ...any) {
	ld.errs.Add(ld.at.Key(path), format, args...)
}

func (ld *patLoader) unknown(path, key string, known []string) {
	if s := graph.Suggest(key, known); s != "" {
		ld.fail(path, "unknown key %q (did you mean %q?)", key, s)
		return
	}
	ld.fail(path, "unknown key %q; expected one of: %s", key, strings.Join(known, ", "))
}

func (ld *patLoader) str(path string, v any) string {
	s, ok := v.(string)
	if !ok {
		ld.fail(path, "%s must be a string", lastKey(path))
	}
	return s
}

func (ld *patLoader) strs(path string, v any) []string {
	switch t := v.(type) {
	case string:
		return []string{t}
	case []any:
		var out []string
		for i, e := range t {
			out = append(out, ld.str(fmt.Sprintf("%s[%d]", path, i), e))
		}
		return out
	}
	ld.fail(path, "%s must be a name or a list of names", lastKey(path))
	return nil
}

func (ld *patLoader) oneOf(path string, v any, allowed []string) string {
	s := ld.str(path, v)
	for _, a := range allowed {
		if s == a {
			return s
		}
	}
	hint := ""
	if g := graph.Suggest(s, allowed); g != "" {
		hint = fmt.Sprintf(" (did you mean %q?)", g)
	}
	ld.fail(path, "%s %q is not known%s; use one of: %s", lastKey(path), s, hint, strings.Join(allowed, ", "))
	return s
}

func lastKey(path string) string {
	if i := strings.LastIndexAny(path, "."); i >= 0 {
		return path[i+1:]
	}
	return path
}

func sortedKeys[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

func (ld *patLoader) pattern(raw map[string]any) {
	p := ld.p
	p.Circuit = "reduced"
	for _, k := range sortedKeys(raw) {
		v := raw[k]
		switch k {
		case "id":
			p.ID = ld.str(k, v)
			p.Pos = ld.at.Key(k)
		case "title":
			p.Title = ld.str(k, v)
		case "titles":
			m, ok := v.(map[string]any)
			if !ok {
				ld.fail(k, "titles must be a table such as { valve = \"Grounded-grid amplifier\" }")
				continue
			}
			p.Titles = map[string]string{}
			for _, f := range sortedKeys(m) {
				ld.oneOf(k+"."+f, f, []string{"valve", "bjt", "fet", "passive"})
				p.Titles[f] = ld.str(k+"."+f, m[f])
			}
		case "group":
			p.Group = ld.oneOf(k, v, groups)
		case "circuit":
			p.Circuit = ld.oneOf(k, v, []string{"reduced", "full"})
		case "rank":
			n, ok := v.(int64)
			if !ok {
				ld.fail(k, "rank must be a whole number")
			}
			p.Rank = int(n)
		case "inner":
			b, ok := v.(bool)
			if !ok {
				ld.fail(k, "inner must be true or false")
			}
			p.Inner = b
		case "families":
			for i, f := range ld.strs(k, v) {
				p.Families = append(p.Families, ld.oneOf(fmt.Sprintf("%s[%d]", k, i), f, []string{"valve", "bjt", "fet", "passive"}))
			}
		case "context":
			p.Context = ld.oneOf(k, v, []string{"fm"})
		case "note":
			ld.str(k, v)
		case "nets":
			m, ok := v.(map[string]any)
			if !ok {
				ld.fail(k, "[nets] must be a table")
				continue
			}
			for _, name := range sortedKeys(m) {
				ld.net("nets."+name, name, m[name])
			}
		case "parts":
			m, ok := v.(map[string]any)
			if !ok {
				ld.fail(k, "[parts] must be a table")
				continue
			}
			for _, name := range sortedKeys(m) {
				ld.part("parts."+name, name, m[name])
			}
		case "figure":
			for i, t := range tables(v) {
				ld.figure(fmt.Sprintf("figure[%d]", i), t)
			}
		case "guard":
			for i, t := range tables(v) {
				ld.guard(fmt.Sprintf("guard[%d]", i), t)
			}
		default:
			ld.unknown(k, k, patternKeys)
		}
	}
	top := graph.Pos{File: ld.file, Line: 1, Col: 1}
	if p.ID == "" {
		ld.errs.Add(top, "pattern has no id")
	}
	if p.Title == "" {
		ld.errs.Add(top, "pattern %s has no title", p.ID)
	}
	if p.Group == "" {
		ld.errs.Add(top, "pattern %s has no group (one of %s)", p.ID, strings.Join(groups, ", "))
	}
	if len(p.Parts) == 0 {
		ld.errs.Add(top, "pattern %s has no [parts]", p.ID)
	}
	ld.crossCheck()
	if len(ld.errs) == 0 {
		if err := p.compile(); err != nil {
			ld.errs.Add(p.Pos, "%v", err)
		}
	}
}

// tables accepts both an array of tables ([[figure]]) and a single table.
func tables(v any) []map[string]any {
	switch t := v.(type) {
	case []map[string]any:
		return t
	case map[string]any:
		return []map[string]any{t}
	case []any:
		var out []map[string]any
		for _, e := range t {
			if m, ok := e.(map[string]any); ok {
				out = append(out, m)
			}
		}
		return out
	}
	return nil
}

func (ld *patLoader) net(path, name string, v any) {
	n := PNet{Name: name, At: "signal", Pos: ld.at.Key(path)}
	m, ok := v.(map[string]any)
	if !ok {
		ld.fail(path, "net %s must be a table such as { at = \"ground\" }", name)
		return
	}
	for _, k := range sortedKeys(m) {
		kp := path + "." + k
		switch k {
		case "at":
			n.At = ld.oneOf(kp, m[k], []string{"signal", "ground", "any", "rail", "not-ground"})
		case "outside":
			n.Outside = ld.oneOf(kp, m[k], []string{"none", "some", "signal", "source"})
		default:
			ld.unknown(kp, k, netKeys)
		}
	}
	ld.p.Nets = append(ld.p.Nets, n)
}

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
	case "resistor", "pot":
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
	case "resistor", "capacitor", "inductor", "crystal", "element":
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

// crossCheck makes sure every net a part names is declared and every part a
// figure names exists.
func (ld *patLoader) crossCheck() {
	p := ld.p
	nets := map[string]bool{}
	for _, n := range p.Nets {
		nets[n.Name] = true
	}
	used := map[string]bool{}
	for _, pp := range p.Parts {
		var all []string
		for _, pin := range pp.Pins {
			all = append(all, pin.Net)
		}
		for _, w := range pp.Windings {
			all = append(all, w...)
		}
		for _, n := range all {
			used[n] = true
			if !nets[n] {
				ld.errs.Add(pp.Pos, "part %s names net %q, which [nets] does not declare", pp.Name, n)
			}
		}
	}
	for _, n := range p.Nets {
		if !used[n.Name] {
			ld.errs.Add(n.Pos, "net %s is declared but no part uses it", n.Name)
		}
		if n.At == "rail" && p.Circuit != "full" {
			ld.errs.Add(n.Pos, "at = \"rail\" needs circuit = \"full\": in a reduced circuit every rail is AC ground")
		}
	}
	parts := map[string]bool{}
	for _, pp := range p.Parts {
		parts[pp.Name] = true
	}
	for _, f := range p.Figures {
		c, ok := calcs[f.Calc]
		if !ok {
			continue
		}
		for _, a := range sortedKeys(f.Args) {
			if contains(c.netArgs, a) {
				for _, n := range f.Args[a] {
					if !nets[n] {
						ld.errs.Add(f.Pos, "figure %s: %s names net %q, which [nets] does not declare", f.Calc, a, n)
					}
				}
				continue
			}
			if contains(c.wordArgs, a) {
				continue
			}
			for _, n := range f.Args[a] {
				if !parts[n] {
					ld.errs.Add(f.Pos, "figure %s: %s names part %q, which [parts] does not declare", f.Calc, a, n)
				}
			}
		}
	}
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
