package graph

import (
	"fmt"
	"slices"
	"sort"
	"strings"
)

// CoreWhole is the entry of Part.Adjust that says one adjustable core
// tunes the whole coil or transformer (`adjust = "core"`).
const CoreWhole = "core"

// adjust reads which cores of a coil or transformer can be turned on the
// bench: "core" for one core that tunes the whole part, or, on a
// transformer, the windings whose own core is adjustable (an IF can with a
// core in each winding: ["p", "s"]). Alignment names these parts; a core
// that is not captured cannot be named, so the loader refuses what it
// cannot place on a winding.
func (ld *loader) adjust(path string, p *Part, x any) {
	if s, ok := x.(string); ok {
		if s != CoreWhole {
			ld.errVal(path, "adjust = %q: write \"core\" (one adjustable core) or, on a transformer, the windings whose core is adjustable, e.g. [\"p\", \"s\"]", s)
			return
		}
		p.Adjust = []string{CoreWhole}
		return
	}
	list, ok := x.([]any)
	if !ok || len(list) == 0 {
		ld.errVal(path, "adjust must be \"core\" or a non-empty list of winding names, e.g. [\"p\", \"s\"]")
		return
	}
	if p.Kind != Transformer {
		ld.errVal(path, "adjust on a coil is \"core\": a list of windings applies to a transformer")
		return
	}
	seen := map[string]bool{}
	for i, e := range list {
		ep := fmt.Sprintf("%s[%d]", path, i)
		name := ld.str(ep, e)
		switch {
		case name == "":
		case !slices.Contains(windingsAsWritten(p), name):
			ld.errVal(ep, "adjust names winding %q, which %s does not have (windings: %s)", name, p.Ref, strings.Join(windingsAsWritten(p), ", "))
		case seen[name]:
			ld.errVal(ep, "adjust names winding %q twice", name)
		default:
			seen[name] = true
			p.Adjust = append(p.Adjust, name)
		}
	}
	sort.Strings(p.Adjust)
}

// windingsAsWritten are a transformer's windings by the names the netlist
// gave them: a centre-tapped winding s, loaded as its halves sa and sb, is
// s, and its one core is named so.
func windingsAsWritten(p *Part) []string {
	var names []string
	for _, w := range p.Windings {
		stem, half := w.Name[:len(w.Name)-1], w.Name[len(w.Name)-1]
		if half == 'a' && w.From == stem+"1" && w.To == stem+"t" {
			names = append(names, stem)
			continue
		}
		if half == 'b' && w.From == stem+"t" && w.To == stem+"2" {
			continue
		}
		names = append(names, w.Name)
	}
	return names
}

// adjustKV writes Part.Adjust back in the form the loader reads.
func adjustKV(p *Part) string {
	if len(p.Adjust) == 1 && p.Adjust[0] == CoreWhole {
		return "adjust = " + quote(CoreWhole)
	}
	return "adjust = " + strList(p.Adjust)
}
