package graph

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"pare/graph/value"
)

// LoadFile reads and checks a netlist file. On any problem it returns a nil
// circuit and an ErrorList holding every problem found, sorted by position.
func LoadFile(path string) (*Circuit, error) {
	data, err := ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(path, data)
}

// Parse reads a netlist from memory; file names it in messages.
func Parse(file string, data []byte) (*Circuit, error) {
	if err := CheckTOML(file, data); err != nil {
		return nil, err
	}
	// The key positions are scanned beside the decoder, on another core:
	// the scanner ends on any text (TestKeyScannerTerminates), and its
	// index is dropped if the decoder refuses the file.
	src := string(data)
	scanned := make(chan *keyIndex, 1)
	go scanBeside(file, src, scanned)
	raw, err := decodeTOML(src)
	ix := <-scanned
	if err != nil {
		return nil, DecodeError(file, data, err)
	}
	if ix == nil {
		// The scanner failed on text the decoder accepted: scan again
		// here, where a failure shows as it did before the scan moved.
		ix = indexKeys(file, src)
	}
	ld := &loader{ix: ix, c: &Circuit{File: file, Freqs: map[string]float64{}}}
	ld.circuit(raw)
	if err := ld.errs.Err(); err != nil {
		ld.errs.Sort()
		return nil, ld.errs
	}
	ld.c.Comments = ld.ix.comments
	ld.c.ReferQ()
	return ld.c, nil
}

// scanBeside sends the key index of src, or nil if the scanner failed: a
// failure on another goroutine would end the process, and on text the
// decoder refuses the index is not wanted.
func scanBeside(file, src string, out chan<- *keyIndex) {
	defer func() {
		if recover() != nil {
			out <- nil
		}
	}()
	out <- indexKeys(file, src)
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
	ld.checkCounts()
	ld.checkParams()
	ld.checkPorts()
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
	n := &Net{Name: name, Role: DefaultRole(name), Pos: ld.ix.key(path), Declared: true}
	if !isNetName(name) {
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
			n.VoltsGiven = true
		case "label":
			n.Label = ld.str(p, m[k])
		default:
			ld.unknown(p, k, netKeys)
		}
	}
	ld.c.Nets = append(ld.c.Nets, n)
}

// finish creates nets named only in pin lists, checks cross references, and sorts.
func (ld *loader) finish() {
	c := ld.c
	seen := make(map[string]bool, len(c.Nets)+len(c.Parts))
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
	ld.sort()
	checkNet := func(path, name, what string) {
		if name != "" && c.Net(name) == nil {
			hint := ""
			if g := Suggest(name, netNamesOf(c)); g != "" {
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
				if g := Suggest(ref, refsOf(c)); g != "" {
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
		if given := ld.ix.written(rp + ".band"); given && !ld.bad[rp+".band"] && r.Band.Min <= 0 {
			ld.errVal(rp+".band", "region %s: a band must start above 0 Hz", r.Name)
		}
	}
	if given := ld.ix.written("band"); given && !ld.bad["band"] && c.Band.Min <= 0 {
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

// sort puts what was read in the circuit's order (Circuit.Sort), which on
// a large file was a twentieth of its load through sort.Slice. Every ref,
// net and region name is read once (they are keys of tables, and a net made
// from a pin list is made once), so no order among equals is left to the
// sort, and the result is Circuit.Sort's.
func (ld *loader) sort() {
	c := ld.c
	slices.SortFunc(c.Parts, func(a, b *Part) int { return strings.Compare(a.Ref, b.Ref) })
	slices.SortFunc(c.Nets, func(a, b *Net) int { return strings.Compare(a.Name, b.Name) })
	slices.SortFunc(c.Regions, func(a, b *Region) int { return strings.Compare(a.Name, b.Name) })
	c.ix = nil
}

// netNamesOf and refsOf list the candidates for a "did you mean" hint,
// built only when a name is wrong.
func netNamesOf(c *Circuit) []string {
	names := make([]string, 0, len(c.Nets))
	for _, n := range c.Nets {
		names = append(names, n.Name)
	}
	return names
}

func refsOf(c *Circuit) []string {
	refs := make([]string, 0, len(c.Parts))
	for _, p := range c.Parts {
		refs = append(refs, p.Ref)
	}
	return refs
}

// plural writes "1 pin", "3 pins".
func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return strconv.Itoa(n) + " " + word + "s"
}
