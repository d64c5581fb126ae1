package graph

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"pare/graph/value"
)

// Write prints a circuit in the canonical netlist layout: top-level keys,
// then [freqs], [regions], [nets] and [parts], one entry per line, in the
// order they were written (the order a user captured the signal path in),
// entries pare made after them in natural order (C2 before C10).
// The output is itself a valid netlist and loads back to the same circuit;
// comments the user wrote above entries, or after them, are kept.
func Write(w io.Writer, c *Circuit) error {
	bw := bufio.NewWriter(w)
	cw := &cwriter{w: bw, c: c}
	cw.top()
	return bw.Flush()
}

type cwriter struct {
	w *bufio.Writer
	c *Circuit
}

func (cw *cwriter) line(path, text string) {
	if cm, ok := cw.c.Comments[path]; ok {
		if cm.Blank {
			fmt.Fprintln(cw.w)
		}
		for _, a := range cm.Above {
			fmt.Fprintf(cw.w, "#%s\n", a)
		}
		if cm.After != "" {
			fmt.Fprintf(cw.w, "%s #%s\n", text, cm.After)
			return
		}
	}
	fmt.Fprintln(cw.w, text)
}

func (cw *cwriter) top() {
	c := cw.c
	if h, ok := c.Comments[HeaderComment]; ok && len(h.Above) > 0 {
		for _, a := range h.Above {
			fmt.Fprintf(cw.w, "#%s\n", a)
		}
		fmt.Fprintln(cw.w)
	}
	if c.Title != "" {
		cw.line("title", "title = "+quote(c.Title))
	}
	if c.Note != "" {
		cw.line("note", "note = "+quote(c.Note))
	}
	if c.Band.Max > 0 {
		cw.line("band", "band = "+quote(fmtRange(c.Band, value.Hertz)))
	}
	if len(c.Inputs) > 0 {
		cw.line("inputs", "inputs = "+strList(c.Inputs))
	}
	if len(c.Outputs) > 0 {
		cw.line("outputs", "outputs = "+strList(c.Outputs))
	}
	if len(c.Freqs) > 0 {
		fmt.Fprintln(cw.w)
		cw.line("freqs", "[freqs]")
		for _, k := range sortedKeys(c.Freqs) {
			cw.line("freqs."+k, bareKey(k)+" = "+quote(fmtNum(c.Freqs[k], value.Hertz)))
		}
	}
	if len(c.Regions) > 0 {
		fmt.Fprintln(cw.w)
		cw.line("regions", "[regions]")
		for _, r := range inSourceOrder(c.Regions, func(r *Region) (Pos, string) { return r.Pos, r.Name }) {
			kv := []string{"band = " + quote(fmtRange(r.Band, value.Hertz))}
			if len(r.Parts) > 0 {
				kv = append(kv, "parts = "+strList(r.Parts))
			}
			if len(r.Nets) > 0 {
				kv = append(kv, "nets = "+strList(r.Nets))
			}
			if r.Input != "" {
				kv = append(kv, "input = "+quote(r.Input))
			}
			if r.Output != "" {
				kv = append(kv, "output = "+quote(r.Output))
			}
			cw.line("regions."+r.Name, bareKey(r.Name)+" = "+inline(kv))
		}
	}
	// A net needs an entry when it has something to say, or when no pin
	// names it (it would not come back otherwise).
	pinned := map[string]bool{}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			pinned[pin.Net] = true
		}
	}
	var nets []*Net
	for _, n := range inSourceOrder(c.Nets, func(n *Net) (Pos, string) { return n.Pos, n.Name }) {
		if len(netKV(n)) > 0 || !pinned[n.Name] {
			nets = append(nets, n)
		}
	}
	if len(nets) > 0 {
		fmt.Fprintln(cw.w)
		cw.line("nets", "[nets]")
		for _, n := range nets {
			cw.line("nets."+n.Name, bareKey(n.Name)+" = "+inline(netKV(n)))
		}
	}
	fmt.Fprintln(cw.w)
	cw.line("parts", "[parts]")
	for _, p := range inSourceOrder(c.Parts, func(p *Part) (Pos, string) { return p.Pos, p.Ref }) {
		cw.line("parts."+p.Ref, bareKey(p.Ref)+" = "+inline(partKV(p)))
	}
}

func partKV(p *Part) []string {
	var kv []string
	add := func(s string) { kv = append(kv, s) }
	kindKV(p, add)
	add("pins = " + pinsKV(p))
	if p.Tol != (value.Tolerance{}) {
		add("tol = " + quote(tolText(p.Tol)))
	}
	if p.Rating != 0 {
		add("rating = " + quote(fmtNum(p.Rating, value.Volt)+"V"))
	}
	if p.Gang != "" {
		add("gang = " + quote(p.Gang))
	}
	if p.Envelope != "" {
		add("envelope = " + quote(p.Envelope))
	}
	if p.Keep {
		add("keep = true")
	}
	if len(p.Adjust) > 0 {
		add(adjustKV(p))
	}
	for _, k := range sortedKeys(p.Params) {
		add(k + " = " + paramText(k, p.Params[k]))
	}
	if len(p.From) > 0 {
		add("from = " + strList(p.From))
	}
	if p.Note != "" {
		add("note = " + quote(p.Note))
	}
	return kv
}

// kindKV writes the part's kind key with its value and the keys that go
// with that kind.
func kindKV(p *Part, add func(string)) {
	switch p.Kind {
	case Resistor:
		add("r = " + quote(fmtNum(p.Value.Max, value.Ohm)))
	case Capacitor:
		add("c = " + quote(fmtRange(p.Value, value.Farad)))
		defType := CapFixed
		if p.Value.IsSpan() {
			defType = CapVariable
		}
		if p.Type == CapTrimmer {
			add("set = " + quote(fmtNum(p.Set, value.Farad)))
		} else if p.Type != defType {
			add("type = " + quote(p.Type))
		}
	case Inductor:
		inductorKV(p, add)
	case Transformer:
		add("windings = " + windingsKV(p))
		if k := couplingKV(p); k != "" {
			add("k = " + k)
		}
	case Valve, BJT, FET:
		add(activeKeys[p.Kind] + " = " + quote(p.Type))
		if p.Designation != "" {
			add("type = " + quote(p.Designation)) // the type it is marked with
		}
	case Diode:
		add("diode = " + quote(p.Type))
	case Crystal:
		add("xtal = " + quote(fmtNum(p.Value.Max, value.Hertz)))
	case Loudspeaker:
		add("spk = " + quote(fmtNum(p.Value.Max, value.Ohm)))
	case Pot:
		add("pot = " + quote(fmtNum(p.Value.Max, value.Ohm)))
		if p.Set != 0.5 {
			add("set = " + fmtFloat(p.Set))
		}
		if p.Type != "" {
			add("type = " + quote(p.Type))
		}
	case Switch:
		switchKV(p, add)
	case Port:
		add("port = " + quote(p.Label))
	case Generic:
		add("part = " + quote(p.Label))
	}
}

// inductorKV writes an inductor: one value, a tapped coil, or two windings
// with their coupling.
func inductorKV(p *Part, add func(string)) {
	switch {
	case len(p.Windings) == 2:
		if tap, ok := tapOf(p); ok {
			add("l = " + quote(fmtNum(p.Value.Max, value.Henry)))
			add("tap = " + tap)
			break
		}
		add(fmt.Sprintf("l = [%s, %s]", quote(fmtNum(p.Windings[0].L, value.Henry)), quote(fmtNum(p.Windings[1].L, value.Henry))))
		if k := p.K(p.Windings[0].Name, p.Windings[1].Name); k != 1 {
			add("k = " + fmtFloat(k))
		}
	default:
		add("l = " + quote(fmtNum(p.Value.Max, value.Henry)))
	}
	if p.Type != IndPlain && p.Type != "" {
		add("type = " + quote(p.Type))
	}
	// q is written once: with the device parameters (partKV) when the
	// netlist gave it there, else from the windings (a part built in code).
	if _, ok := p.Params["q"]; !ok && len(p.Windings) > 0 && p.Windings[0].Q > 0 {
		add("q = " + fmtFloat(p.Windings[0].Q))
	}
}

// switchKV writes a switch: its positions, the one selected, and the pin
// pairs each position closes.
func switchKV(p *Part, add func(string)) {
	add(fmt.Sprintf("switch = %d", len(p.Closes)))
	if p.Set != 1 {
		add("set = " + fmtFloat(p.Set))
	}
	var pos []string
	for _, prs := range p.Closes {
		var s []string
		for _, pr := range prs {
			s = append(s, pr[0]+"-"+pr[1])
		}
		pos = append(pos, strings.Join(s, " "))
	}
	add("closes = " + strList(pos))
}

// tolText writes a tolerance the way ParseTolerance reads it.
func tolText(t value.Tolerance) string {
	if t.Plus == t.Minus {
		return fmtFloat(t.Plus*100) + "%"
	}
	return "+" + fmtFloat(t.Plus*100) + "/-" + fmtFloat(t.Minus*100) + "%"
}

func windingsKV(p *Part) string {
	var kv []string
	done := map[string]bool{}
	for _, w := range p.Windings {
		if done[w.Name] {
			continue
		}
		if strings.HasSuffix(w.Name, "a") && strings.HasSuffix(w.To, "t") {
			base := strings.TrimSuffix(w.Name, "a")
			if b := p.Winding(base + "b"); b != nil {
				done[b.Name] = true
				kv = append(kv, fmt.Sprintf("%s = [%s, %s]", bareKey(base), windingVal(p, w), windingVal(p, *b)))
				continue
			}
		}
		kv = append(kv, fmt.Sprintf("%s = %s", bareKey(w.Name), windingVal(p, w)))
	}
	return inline(kv)
}

// windingVal is a winding's inductance, or a table with its own Q and DC
// resistance where it has them.
func windingVal(p *Part, w Winding) string {
	l := quote(fmtNum(w.L, value.Henry))
	var kv []string
	if w.Q > 0 && w.Q != p.Params["q"] {
		kv = append(kv, "q = "+fmtFloat(w.Q))
	}
	if w.Rdc > 0 {
		kv = append(kv, "rdc = "+quote(fmtNum(w.Rdc, value.Ohm)))
	}
	if len(kv) == 0 {
		return l
	}
	return inline(append([]string{"l = " + l}, kv...))
}

func isHalfPair(p *Part, c Coupling) bool {
	return strings.TrimSuffix(c.A, "a") == strings.TrimSuffix(c.B, "b") && strings.HasSuffix(c.A, "a") && strings.HasSuffix(c.B, "b") && c.K == 1
}

func couplingKV(p *Part) string {
	var list []Coupling
	for _, c := range p.Coupling {
		if !isHalfPair(p, c) {
			list = append(list, c)
		}
	}
	if len(list) == 0 {
		return ""
	}
	// One number when every pair of distinct windings has the same k, as the
	// loader reads a single k.
	pairs := 0
	for i := range p.Windings {
		for j := i + 1; j < len(p.Windings); j++ {
			if !isHalfPair(p, Coupling{A: p.Windings[i].Name, B: p.Windings[j].Name, K: p.K(p.Windings[i].Name, p.Windings[j].Name)}) {
				pairs++
			}
		}
	}
	same := true
	for _, c := range list {
		if c.K != list[0].K {
			same = false
		}
	}
	if same && len(list) == pairs {
		return fmtFloat(list[0].K)
	}
	sort.Slice(list, func(i, j int) bool {
		if list[i].A != list[j].A {
			return list[i].A < list[j].A
		}
		return list[i].B < list[j].B
	})
	var kv []string
	for _, c := range list {
		kv = append(kv, quote(c.A+"-"+c.B)+" = "+fmtFloat(c.K))
	}
	return inline(kv)
}

func pinsKV(p *Part) string {
	names := ArrayPins(p.Kind, p.Type, len(p.Pins))
	if names != nil && !(p.Kind == Inductor && len(p.Windings) != 2 && len(p.Pins) == 3) {
		match := true
		for i, pin := range p.Pins {
			if pin.Name != names[i] {
				match = false
			}
		}
		if match {
			nets := make([]string, len(p.Pins))
			for i, pin := range p.Pins {
				nets[i] = pin.Net
			}
			return strList(nets)
		}
	}
	var kv []string
	for _, pin := range p.Pins {
		kv = append(kv, bareKey(pin.Name)+" = "+quote(pin.Net))
	}
	return inline(kv)
}

// tapOf finds the tap fraction of a tapped coil whose sections are fully
// coupled and go with the turns squared (as `tap = n` loads), so that such a
// coil is written back the way it was typed. It gives the shortest decimal
// that reproduces both sections to 1e-12.
func tapOf(p *Part) (string, bool) {
	if len(p.Windings) != 2 || len(p.Coupling) != 1 || p.Coupling[0].K != 1 {
		return "", false
	}
	a, b := p.Windings[0], p.Windings[1]
	if a.Name != "1t" || b.Name != "t2" || a.L <= 0 || b.L <= 0 || a.Q != b.Q {
		return "", false
	}
	L := p.Value.Max
	n := math.Sqrt(a.L) / (math.Sqrt(a.L) + math.Sqrt(b.L))
	for digits := 1; digits <= 17; digits++ {
		s := strconv.FormatFloat(n, 'g', digits, 64)
		m, err := strconv.ParseFloat(s, 64)
		if err != nil || m <= 0 || m >= 1 {
			continue
		}
		if closeEnough(m*m*L, a.L, 12) && closeEnough((1-m)*(1-m)*L, b.L, 12) {
			return s, true
		}
	}
	return "", false
}

// netKV lists what a [nets] entry says about a net; empty when the net needs
// no entry. A role that the name implies anyway ("gnd") is still written when
// the entry is there for a label or a voltage, so the entry reads in full.
func netKV(n *Net) []string {
	var kv []string
	if n.HasVolts() {
		kv = append(kv, "volts = "+fmtFloat(n.Volts))
	}
	if n.Label != "" {
		kv = append(kv, "label = "+quote(n.Label))
	}
	// A declared net keeps its entry, even one that restates the default
	// (gnd = { role = "ground" }): the user wrote it to be sure.
	if n.Role != DefaultRole(n.Name) || (len(kv) > 0 && n.Role != Signal) || (len(kv) == 0 && n.Declared) {
		kv = append([]string{"role = " + quote(string(n.Role))}, kv...)
	}
	return kv
}

// activeKeys is the kind key of each amplifying kind.
var activeKeys = map[Kind]string{Valve: "valve", BJT: "bjt", FET: "fet"}
