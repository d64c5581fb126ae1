// Readers of the netlist's scalar values (strings, quantities, ranges, flags),
// each reporting a bad value at its key's position.

package graph

import (
	"fmt"
	"strconv"
	"strings"

	"pare/graph/value"
)

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

func (ld *loader) rng(path string, v any, u value.Unit) value.Range {
	if s, ok := v.(string); ok && !strings.Contains(s, "..") && !strings.Contains(s, "\u2026") {
		if looksDashRange(s) && !isOneValue(s, u) {
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

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
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
