// Reading a pattern file: the top-level keys, the nets, and the cross-check
// that every net a part names and every part a figure names exists.

package stages

import (
	"fmt"
	"sort"
	"strings"

	"pare/graph"
)

// device kinds a pattern part may ask for.
var deviceKinds = []string{"active", "valve", "bjt", "fet", "resistor", "capacitor", "inductor",
	"tapped-coil", "transformer", "diode", "double-diode", "crystal", "element", "pot", "loudspeaker"}

var patternKeys = []string{"id", "title", "titles", "group", "circuit", "rank", "inner", "families", "context", "nets", "parts", "figure", "guard", "note", "draw"}

var netKeys = []string{"at", "outside"}

var partKeys = []string{"device", "type", "optional", "pins", "windings", "min", "max", "shared", "dc_block"}

var activeKeys = []string{"control", "common", "output", "grid"}

var groups = []string{"oscillator", "amplifier", "mixer", "tuned", "detector", "coupling", "power"}

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
	ld.p.Circuit = "reduced"
	for _, k := range sortedKeys(raw) {
		ld.topKey(k, raw[k])
	}
	ld.required()
	ld.crossCheck()
	ld.checkDraw()
	if len(ld.errs) == 0 {
		if err := ld.p.compile(); err != nil {
			ld.errs.Add(ld.p.Pos, "%v", err)
		}
	}
}

// topKey reads one top-level key of a pattern file.
func (ld *patLoader) topKey(k string, v any) {
	p := ld.p
	switch k {
	case "id":
		p.ID = ld.str(k, v)
		p.Pos = ld.at.Key(k)
	case "title":
		p.Title = ld.str(k, v)
	case "titles":
		ld.titles(k, v)
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
		p.Context = ld.oneOf(k, v, []string{"fm", "supply"})
	case "note":
		ld.str(k, v)
	case "nets", "parts":
		ld.namedTables(k, v)
	case "figure":
		for i, t := range tables(v) {
			ld.figure(fmt.Sprintf("figure[%d]", i), t)
		}
	case "guard":
		for i, t := range tables(v) {
			ld.guard(fmt.Sprintf("guard[%d]", i), t)
		}
	case "draw":
		ld.draw(k, v)
	default:
		ld.unknown(k, k, patternKeys)
	}
}

// titles reads the per-family titles, { valve = "Grounded-grid amplifier" }.
func (ld *patLoader) titles(k string, v any) {
	m, ok := v.(map[string]any)
	if !ok {
		ld.fail(k, "titles must be a table such as { valve = \"Grounded-grid amplifier\" }")
		return
	}
	ld.p.Titles = map[string]string{}
	for _, f := range sortedKeys(m) {
		ld.oneOf(k+"."+f, f, []string{"valve", "bjt", "fet", "passive"})
		ld.p.Titles[f] = ld.str(k+"."+f, m[f])
	}
}

// namedTables reads [nets] or [parts]: one table per name, in name order.
func (ld *patLoader) namedTables(k string, v any) {
	m, ok := v.(map[string]any)
	if !ok {
		ld.fail(k, "[%s] must be a table", k)
		return
	}
	for _, name := range sortedKeys(m) {
		if k == "nets" {
			ld.net(k+"."+name, name, m[name])
		} else {
			ld.part(k+"."+name, name, m[name])
		}
	}
}

// required reports the keys every pattern must have, at the file's start.
func (ld *patLoader) required() {
	p := ld.p
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
			n.At = ld.oneOf(kp, m[k], []string{"signal", "ground", "any", "rail", "not-ground", "bias"})
		case "outside":
			n.Outside = ld.oneOf(kp, m[k], []string{"none", "some", "signal", "source"})
		default:
			ld.unknown(kp, k, netKeys)
		}
	}
	ld.p.Nets = append(ld.p.Nets, n)
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
		if (n.At == "rail" || n.At == "bias") && p.Circuit != "full" {
			ld.errs.Add(n.Pos, "at = %q needs circuit = \"full\": in a reduced circuit every rail is AC ground", n.At)
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
