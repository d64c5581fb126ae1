package ac

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// SpiceOptions chooses what a SPICE deck drives, sweeps and records.
type SpiceOptions struct {
	Options
	// Input is the net driven by the 1 V AC source; "" takes the circuit's
	// first input, or with none declared the control of its oscillator or
	// first active part (graph.InferredInput).
	Input string
	// Outputs are the nets whose magnitude and phase wrdata records; nil takes
	// the circuit's outputs (or the input alone when it declares none).
	Outputs []string
	// PointsPerDecade of the .ac dec sweep; 0 means 50. The sweep has at
	// least MinSpicePoints points whatever the density, and a band narrower
	// than an octave is swept linearly (see acCard).
	PointsPerDecade int
	// Band of the sweep; the zero Range takes the circuit's full band
	// (default band and every region).
	Band value.Range
	// DataFile is where the deck's control block writes its table; "" means
	// "pare-ac.dat".
	DataFile string
}

// WriteSpice writes the small-signal circuit as a SPICE deck: R, L, C
// elements, K cards for coupled windings, G elements for transconductances,
// a 1 V AC source on the input, an .ac dec card over the band, and a
// .control block that runs it and writes magnitude and phase (radians) of
// each output with wrdata. The deck is the same elaborated circuit pare
// solves, element for element.
func WriteSpice(w io.Writer, c *graph.Circuit, o SpiceOptions) error {
	d, err := planDeck(c, o)
	if err != nil {
		return err
	}
	sw := &spiceWriter{w: bufio.NewWriter(w), nodes: spiceNodes(d.nl.nodes), used: map[string]bool{}}
	sw.header(c, d.nl)
	if d.inferred != "" {
		sw.line("* Driven at %s", oneLine(d.inferred))
	}
	for _, p := range d.nl.prims {
		sw.prim(p)
	}
	for _, g := range d.nl.groups {
		sw.group(g)
	}
	sw.sources(d)
	sw.control(d)
	return sw.w.Flush()
}

// header writes the comment lines that say where the deck came from, what it
// leaves out, and which nets had to be renamed to be SPICE nodes: a reader of
// the deck alone can map it back to the netlist.
func (sw *spiceWriter) header(c *graph.Circuit, nl *netlist) {
	title := c.Title
	if title == "" {
		title = "circuit"
	}
	sw.line("* %s: small-signal equivalent written by pare", oneLine(title))
	if c.File != "" {
		sw.line("* from %s", oneLine(c.File))
	}
	sw.line("* Small-signal only: no bias, no supplies; rails, heater and bias nets are node 0.")
	sw.line("* Device models and defaults: see pare's graph/ac documentation.")
	if len(nl.portHeld) > 0 {
		sw.line("* Node 0 too, as undriven sources reached only through a port: %s", oneLine(strings.Join(nl.portHeld, ", ")))
	}
	var renamed []int
	for i := 1; i < len(nl.nodes); i++ {
		if sw.nodes[i] != nl.nodes[i] {
			renamed = append(renamed, i)
		}
	}
	if len(renamed) == 0 {
		sw.line("* Node names are pare's net names; ground is node 0.")
		return
	}
	sw.line("* Node names are pare's net names, ground is node 0, except (pare net -> deck node):")
	for _, i := range renamed {
		sw.line("*   %s -> %s", oneLine(nl.nodes[i]), sw.nodes[i])
	}
}

// sources writes the input sources and the simulator options that make the
// deck solve the same system pare does.
func (sw *spiceWriter) sources(d *spiceDeck) {
	sw.line("Vpare_in %s 0 DC 0 AC 1", sw.nodes[d.inNode])
	// The other inputs are held at 0 V by their own (silent) sources, as pare solves it.
	for i, n := range d.held {
		sw.line("Vpare_in%d %s 0 DC 0 AC 0", i+2, sw.nodes[n])
	}
	// Nodes reached only through capacitors have no DC path, and the
	// simulator would call the matrix singular in the operating point it
	// solves before an AC sweep. The deck is linear, so that operating point
	// is not needed: noopac skips it. (A shunt resistor on every node would
	// do too, but it loads high-Q nodes: 1 TΩ across a crystal's motional
	// capacitance adds tens of ohms of series loss.)
	sw.line(".option noopac")
}

// control writes the sweep and the .control block that runs it and writes
// the outputs' magnitude and phase to the data file, then the deck's end.
func (sw *spiceWriter) control(d *spiceDeck) {
	// Keep only the recorded nodes: a large deck would otherwise hold every
	// node's vector in the simulator's memory.
	var saves []string
	for _, n := range d.outNodes {
		saves = append(saves, "v("+sw.nodes[n]+")")
	}
	sw.line(".save %s", strings.Join(saves, " "))
	sw.line("%s", acCard(d.band, d.ppd))
	sw.line(".control")
	sw.line("set wr_singlescale")
	sw.line("set wr_vecnames")
	sw.line("option numdgt=12")
	sw.line("run")
	var vecs []string
	for _, n := range d.outNodes {
		vecs = append(vecs, fmt.Sprintf("vm(%s) vp(%s)", sw.nodes[n], sw.nodes[n]))
	}
	sw.line("wrdata %s %s", d.data, strings.Join(vecs, " "))
	sw.line("quit")
	sw.line(".endc")
	sw.line(".end")
}

type spiceWriter struct {
	w     *bufio.Writer
	nodes []string
	used  map[string]bool // element and internal node names, lower case
	inner int
}

func (sw *spiceWriter) line(format string, args ...any) {
	fmt.Fprintf(sw.w, format+"\n", args...)
}

// name gives an element a SPICE name: the type letter, then the ref unless
// it already starts with that letter, then the piece; unique ignoring case.
func (sw *spiceWriter) name(letter byte, ref, sub string) string {
	base := sanitize(ref)
	if len(base) == 0 || lower(base[0]) != lower(letter) {
		base = string(letter) + base
	}
	if sub != "" {
		base += "_" + sanitize(sub)
	}
	n := base
	for i := 2; sw.used[strings.ToLower(n)]; i++ {
		n = fmt.Sprintf("%s_%d", base, i)
	}
	sw.used[strings.ToLower(n)] = true
	return n
}

// innerNode makes a node inside an element (between a winding's loss and its
// inductance). Net-derived names never start with an underscore.
func (sw *spiceWriter) innerNode(elem string) string {
	sw.inner++
	return fmt.Sprintf("_%s_%d", strings.ToLower(elem), sw.inner)
}

func (sw *spiceWriter) prim(p prim) {
	a, b := sw.nodes[p.a], sw.nodes[p.b]
	switch p.kind {
	case primR:
		sw.line("%s %s %s %s", sw.name('R', p.ref, p.sub), a, b, num(p.v))
	case primC:
		sw.line("%s %s %s %s", sw.name('C', p.ref, p.sub), a, b, num(p.v))
	case primRL:
		ln := sw.name('L', p.ref, p.sub)
		if p.r > 0 {
			mid := sw.innerNode(ln)
			sw.line("%s %s %s %s", sw.name('R', p.ref, joinSub(p.sub, "loss")), a, mid, num(p.r))
			a = mid
		}
		sw.line("%s %s %s %s", ln, a, b, num(p.l))
	case primRLC:
		ln := sw.name('L', p.ref, p.sub)
		m1, m2 := sw.innerNode(ln), sw.innerNode(ln)
		sw.line("%s %s %s %s", sw.name('R', p.ref, p.sub), a, m1, num(p.r))
		sw.line("%s %s %s %s", ln, m1, m2, num(p.l))
		sw.line("%s %s %s %s", sw.name('C', p.ref, p.sub), m2, b, num(p.C))
	case primVCCS:
		sw.line("%s %s %s %s %s %s", sw.name('G', p.ref, p.sub), a, b, sw.nodes[p.c], sw.nodes[p.d], num(p.v))
	}
}

func joinSub(a, b string) string {
	if a == "" {
		return b
	}
	return a + "_" + b
}

func (sw *spiceWriter) group(g group) {
	names := make([]string, len(g.winds))
	for i, w := range g.winds {
		names[i] = sw.name('L', g.ref, w.name)
		a, b := sw.nodes[w.a], sw.nodes[w.b]
		if w.r > 0 {
			mid := sw.innerNode(names[i])
			sw.line("%s %s %s %s", sw.name('R', g.ref, w.name+"_loss"), a, mid, num(w.r))
			a = mid
		}
		// The dot of a SPICE inductor is its first node: the winding's From pin.
		sw.line("%s %s %s %s", names[i], a, b, num(w.l))
	}
	for _, m := range g.muts {
		sw.line("%s %s %s %s", sw.name('K', g.ref, g.winds[m.i].name+"_"+g.winds[m.j].name), names[m.i], names[m.j], num(m.k))
	}
}

// spiceNodes maps pare node names to SPICE node names: lower case (SPICE
// ignores case), letters, digits and underscores, unique, never starting with
// an underscore (kept for nodes inside elements), ground "0".
func spiceNodes(nodes []string) []string {
	out := make([]string, len(nodes))
	taken := map[string]bool{"0": true}
	out[0] = "0"
	for i := 1; i < len(nodes); i++ {
		s := strings.ToLower(sanitize(nodes[i]))
		if s == "" || s[0] == '_' || s == "0" {
			s = "n" + s
		}
		base := s
		for k := 2; taken[s]; k++ {
			s = fmt.Sprintf("%s_%d", base, k)
		}
		taken[s] = true
		out[i] = s
	}
	return out
}

func sanitize(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '_':
			b.WriteRune(r)
		case r == '+':
			b.WriteString("p")
		case r == '-':
			b.WriteString("m")
		default:
			b.WriteByte('_')
		}
	}
	return b.String()
}

func lower(c byte) byte {
	if c >= 'A' && c <= 'Z' {
		return c + 'a' - 'A'
	}
	return c
}

func oneLine(s string) string {
	return strings.Join(strings.Fields(s), " ")
}

// num prints a value with enough digits to round-trip, in plain exponent
// form (SPICE reads 1e-12; its letter suffixes are ambiguous: M is milli).
func num(v float64) string {
	if v == math.Trunc(v) && math.Abs(v) < 1e15 {
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	return strconv.FormatFloat(v, 'e', -1, 64)
}

// MinSpicePoints is the fewest frequencies a deck's sweep asks for: enough
// to see a tuned circuit's peak on any band.
const MinSpicePoints = 101

// acCard is the deck's sweep card. A logarithmic sweep at ppd points per
// decade over a narrow band asks the simulator for less than one point
// (50 per decade over 10.6–10.8 MHz is 0.4), which ngspice-39 does not
// refuse but turns into a run of minutes and gigabytes. So a band narrower
// than an octave is swept linearly, and a wider one at a density raised to
// give at least MinSpicePoints points over the band; a single frequency is
// one point.
func acCard(band value.Range, ppd int) string {
	f1, f2 := band.Min, band.Max
	if f2 <= f1 {
		return fmt.Sprintf(".ac lin 1 %s %s", num(f1), num(f1))
	}
	decades := math.Log10(f2 / f1)
	if f2/f1 < 2 {
		n := max(MinSpicePoints, int(math.Ceil(float64(ppd)*decades))+1)
		return fmt.Sprintf(".ac lin %d %s %s", n, num(f1), num(f2))
	}
	ppd = max(ppd, int(math.Ceil(float64(MinSpicePoints-1)/decades)))
	return fmt.Sprintf(".ac dec %d %s %s", ppd, num(f1), num(f2))
}
