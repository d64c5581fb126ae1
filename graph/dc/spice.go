package dc

import (
	"fmt"
	"io"
	"strings"

	"pare/graph"
	dev "pare/graph/device"
)

// WriteSpiceOP writes a SPICE deck of the DC model of c, for an independent
// check of the operating point with ngspice's `.op`: rails as voltage
// sources, resistors and winding resistances as R cards, the three-halves
// law of each valve as behavioural current sources (B cards), and ngspice's
// own diode, bipolar (IS, BF, BR) and JFET (VTO, BETA, IS) models with the
// parameters pare derived; a rail estimated from a captured rectifier is
// a source at pare's estimate. Every net has its gmin resistor to ground, as in
// pare's own system. The control block prints every node voltage.
func WriteSpiceOP(w io.Writer, c *graph.Circuit) error {
	m, err := build(c)
	if err != nil {
		return err
	}
	if len(m.rects) > 0 {
		// An estimated rail is a source in the deck at pare's estimate: the
		// deck checks the solve around it, the transient check in
		// rectifier_test.go the estimate itself.
		if _, _, _, err := m.solveRails(); err != nil {
			return err
		}
	}
	return m.writeSpice(w, nil, "option numdgt=12\nop\nprint all\n")
}

// spiceNode names a terminal in the deck.
func (m *model) spiceNode(t term) string {
	if t >= 0 {
		return "n_" + spiceName(m.nodeNet[t])
	}
	name := m.fixedNet[-1-t]
	if name == "" || (m.fixedV[-1-t] == 0 && m.circuit.RoleOf(name) == graph.Ground) {
		return "0"
	}
	return "f_" + spiceName(name)
}

func spiceName(s string) string {
	return strings.Map(func(r rune) rune {
		switch {
		case r >= 'a' && r <= 'z', r >= '0' && r <= '9', r == '_':
			return r
		case r >= 'A' && r <= 'Z':
			return r - 'A' + 'a'
		}
		return '_'
	}, s)
}

func (m *model) writeSpice(w io.Writer, extra []branch, control string) error {
	var b strings.Builder
	fmt.Fprintf(&b, "* DC operating point of %s (written by pare for a cross-check)\n", m.circuit.File)
	for i := range m.fixedNet {
		if n := m.spiceNode(-1 - i); n != "0" {
			fmt.Fprintf(&b, "VF%d %s 0 DC %.12g\n", i, n, m.fixedV[i])
		}
	}
	for i := range m.nodeNet {
		fmt.Fprintf(&b, "RGMIN%d %s 0 %.12g\n", i, m.spiceNode(i), 1/m.gmin)
	}
	k := 0
	card := func(br branch) {
		if br.g == 0 {
			return
		}
		k++
		fmt.Fprintf(&b, "R%d_%s %s %s %.12g\n", k, spiceName(br.ref), m.spiceNode(br.a), m.spiceNode(br.b), 1/br.g)
	}
	for _, br := range m.branches {
		card(br)
	}
	for _, br := range m.caps {
		card(br)
	}
	for _, br := range extra {
		card(br)
	}
	for i, d := range m.devices {
		m.deviceCards(&b, i, &d)
	}
	b.WriteString(".options reltol=1e-7 vntol=1e-10 abstol=1e-15 gmin=1e-12\n")
	b.WriteString(".control\n" + control + "quit\n.endc\n.end\n")
	_, err := io.WriteString(w, b.String())
	return err
}

func (m *model) deviceCards(b *strings.Builder, i int, d *device) {
	n := func(j int) string { return m.spiceNode(d.t[j]) }
	id := fmt.Sprintf("%d_%s", i, spiceName(d.ref))
	pow := func(k float64, expr string) string {
		return fmt.Sprintf("%.12g*pow(max(%s,0),1.5)", k, expr)
	}
	switch d.kind {
	case devValveDiode:
		fmt.Fprintf(b, "BD%s %s %s I=%s\n", id, n(0), n(1), pow(d.is*d.emission, fmt.Sprintf("v(%s,%s)", n(0), n(1))))
	case devValve:
		l := d.valve
		k := l.k * d.emission
		if !l.pentode {
			u := fmt.Sprintf("v(%s,%s)+v(%s,%s)/%.12g", n(1), n(2), n(0), n(2), l.mu)
			fmt.Fprintf(b, "BA%s %s %s I=%s\n", id, n(0), n(2), pow(k, u))
			fmt.Fprintf(b, "BG%s %s %s I=%s\n", id, n(1), n(2), pow(l.kg, fmt.Sprintf("v(%s,%s)", n(1), n(2))))
			return
		}
		ik := pow(k, fmt.Sprintf("v(%s,%s)+v(%s,%s)/%.12g", n(1), n(3), n(2), n(3), l.mu))
		share := fmt.Sprintf("%.12g*tanh(max(v(%s,%s),0)/%.12g)", 1-l.share, n(0), n(3), l.vknee)
		fmt.Fprintf(b, "BA%s %s %s I=%s*%s\n", id, n(0), n(3), ik, share)
		fmt.Fprintf(b, "BS%s %s %s I=%s*(1-%s)\n", id, n(2), n(3), ik, share)
		fmt.Fprintf(b, "BG%s %s %s I=%s\n", id, n(1), n(3), pow(l.kg, fmt.Sprintf("v(%s,%s)", n(1), n(3))))
	case devDiode:
		if d.is == 0 { // an open diode (a fault): no element at all
			fmt.Fprintf(b, "* D%s open\n", id)
			return
		}
		fmt.Fprintf(b, "D%s %s %s DM%s\n.model DM%s D(IS=%.12g N=%.12g)\n", id, n(0), n(1), id, id, d.is, d.n)
		if d.breaks {
			// the breakdown as graph/device's law, cathode to anode:
			// (Vk/Rz)·ln(1 + e^x) written so that no exponent overflows
			x := fmt.Sprintf("(v(%s,%s)-%.12g)/%.12g", n(1), n(0), d.zener.Vz, dev.ZenerKnee)
			fmt.Fprintf(b, "BZ%s %s %s I=%.12g*(max(%s,0)+ln(1+exp(-abs(%s))))\n", id, n(1), n(0), dev.ZenerKnee/d.zener.Rz, x, x)
		}
	case devBJT:
		typ := "npn"
		if d.bjt.sign < 0 {
			typ = "pnp"
		}
		fmt.Fprintf(b, "Q%s %s %s %s QM%s\n.model QM%s %s(IS=%.12g BF=%.12g BR=%.12g VAF=%.12g)\n",
			id, n(1), n(0), n(2), id, id, typ, d.bjt.is, d.bjt.bf, d.bjt.br, d.bjt.va)
	case devFET:
		if d.fet.mos {
			// Level 1 with W = L, so KP = 2k; bulk tied to the source (no body effect).
			typ := "nmos"
			if d.fet.sign < 0 {
				typ = "pmos"
			}
			fmt.Fprintf(b, "M%s %s %s %s %s MM%s W=10u L=10u\n.model MM%s %s(LEVEL=1 VTO=%.12g KP=%.12g)\n",
				id, n(1), n(0), n(2), n(2), id, id, typ, d.fet.vto*d.fet.sign, 2*d.fet.beta)
			return
		}
		typ := "njf"
		if d.fet.sign < 0 {
			typ = "pjf"
		}
		fmt.Fprintf(b, "J%s %s %s %s JM%s\n.model JM%s %s(VTO=%.12g BETA=%.12g IS=%.12g)\n",
			id, n(1), n(0), n(2), id, id, typ, d.fet.vto, d.fet.beta, d.fet.is)
	}
}

// SpiceNodes maps each net of c to the node name the deck uses for it, so a
// test can read ngspice's answer back per net.
func SpiceNodes(c *graph.Circuit) (map[string]string, error) {
	m, err := build(c)
	if err != nil {
		return nil, err
	}
	out := map[string]string{}
	for net, t := range m.netTerm {
		out[net] = m.spiceNode(t)
	}
	return out, nil
}

// WriteSpiceReadings writes the faulty circuit as a deck that takes one
// reading per net with a meter of the given resistance (an R card from the
// net to chassis, switched in by `alter` for its own `op` only), printing
// "v(node) = value" once per reading in order.
func (fd *Faulted) WriteSpiceReadings(w io.Writer, nets []string, ohms []float64) error {
	m := fd.m
	var meters, ctl strings.Builder
	ctl.WriteString("option numdgt=12\n")
	for i, net := range nets {
		node := m.spiceNode(m.netTerm[net])
		fmt.Fprintf(&meters, "RMETER%d %s 0 1e18\n", i, node)
		fmt.Fprintf(&ctl, "alter rmeter%d = %.12g\nop\nprint v(%s)\nalter rmeter%d = 1e18\n", i, ohms[i], node, i)
	}
	var deck strings.Builder
	if err := m.writeSpice(&deck, fd.extra, ctl.String()); err != nil {
		return err
	}
	text := strings.Replace(deck.String(), ".options", meters.String()+".options", 1)
	_, err := io.WriteString(w, text)
	return err
}

// SpiceNode is the deck's node name for net in the faulty circuit.
func (fd *Faulted) SpiceNode(net string) string { return fd.m.spiceNode(fd.m.netTerm[net]) }
