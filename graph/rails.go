package graph

import (
	"math"
	"regexp"
	"sort"
	"strconv"
	"strings"
)

// IsRail reports whether a net of this role is a rail: a supply, bias or
// heater net, at AC ground for the signal but never chassis.
func (r Role) IsRail() bool { return r == Supply || r == Bias || r == Heater }

// retireRail records a rail net that a join is about to delete, so that
// the terminals that returned to it keep its name, voltage and label
// (Circuit.Rails, Pin.Rail). It returns the name the moved pins take, or ""
// when gone is not a rail.
func (c *Circuit) retireRail(gone *Net) string {
	if gone == nil || !gone.Role.IsRail() {
		return ""
	}
	i := sort.Search(len(c.Rails), func(i int) bool { return c.Rails[i].Name >= gone.Name })
	if i < len(c.Rails) && c.Rails[i].Name == gone.Name {
		return gone.Name
	}
	c.journal().saveRails()
	n := *gone
	c.Rails = append(c.Rails, nil)
	copy(c.Rails[i+1:], c.Rails[i:])
	c.Rails[i] = &n
	return gone.Name
}

// ReturnOf is the net a terminal returns to for the drawing: the rail it
// sat on before a reduction joined that rail away (from Circuit.Rails),
// else the net it is on now. Nil for a terminal on no known net.
func (c *Circuit) ReturnOf(pin Pin) *Net {
	if pin.Rail != "" {
		for _, n := range c.Rails {
			if n.Name == pin.Rail {
				return n
			}
		}
		if n := c.Net(pin.Rail); n != nil {
			return n
		}
	}
	return c.Net(pin.Net)
}

// MarkDecoupled makes a signal net that a reduction is about to tie to AC
// ground a rail of its own when a resistor or choke feeds it from a rail: a
// decoupled B+ line, a screen feed, a collector or emitter fed from the
// supply through a resistor, but not a divider's tap (a resistor or choke
// to chassis as well: a bias point). It records the rail that feeds it
// (Fed) and, unless it has a label, names it by that rail without the
// rail's voltage and the part it comes through ("HT via R4" from "HT
// +250 V"): the line is not that rail, and a tag that read "HT" would
// claim the rail itself. Its own DC voltage is the rail's less the drop,
// which only the DC solution knows: a tag that copied the rail's would
// state a voltage the line does not have, so the caller that has the
// solution adds it. A line fed from a bias rail takes the bias role and
// that rail's name; one whose DC paths reach device electrodes and only
// control ones (a base bias and AGC line) carries no supply current: it
// takes the bias role and is named a bias line, never after the supply it
// is fed from. A line a detector feeds through a resistor that biases a
// controlled stage is the AGC line (AGCFeed): bias role, "AGC line", fed
// from the detector's net, and a base return the line feeds through a
// resistor is named after the line (agcBranch). Of several rails feeding
// the line the one that supplies its current names it (railFeed); it
// reports whether it marked.
func (c *Circuit) MarkDecoupled(net string) bool {
	n := c.Net(net)
	if n == nil || n.Role != Signal {
		return false
	}
	if det, _, ok := c.AGCFeed(net); ok {
		// a detector feeds it and it biases a controlled stage: the AGC
		// line, whatever rail a standing-bias resistor also brings in
		c.journal().saveNet(net)
		n.Role, n.Fed = Bias, det
		if n.Label == "" {
			n.Label = "AGC line"
		}
		return true
	}
	if line, name, via, ok := c.agcBranch(net); ok {
		// a base or grid return the AGC line feeds: the line's, whatever
		// standing bias a supply adds
		c.journal().saveNet(net)
		n.Role, n.Fed = Bias, line
		if n.Label == "" {
			n.Label = name + " via " + via
		}
		return true
	}
	from, via, ok := c.railFeed(net)
	if !ok {
		return false
	}
	c.journal().saveNet(net)
	n.Role = Supply
	name := FeedName(from)
	switch {
	case from.Role == Bias:
		n.Role = Bias // fed from a bias rail (an AGC line's filter): named after it
	case c.feedsOnlyControl(net):
		n.Role, name = Bias, "bias"
	}
	n.Fed = from.Name
	switch {
	case n.Label != "":
	case from.Fed != "" && strings.Contains(name, " via "):
		// fed from a line that is fed itself: the chain of parts from
		// the rail ("vcc via R10, R4"), not "via" twice
		n.Label = name + ", " + via
	default:
		n.Label = strings.TrimSpace(name + " via " + via)
	}
	return true
}

// feedsOnlyControl reports whether the device electrodes a line reaches,
// on itself and one DC part away (a resistor, a choke, a transformer
// winding) on nets that carry signal, are all control electrodes (a base,
// a control grid): a line that feeds only those delivers no supply
// current, it sets a bias (and, fed from a detector, is the AGC line). A
// line that reaches no electrode at all is not judged here.
func (c *Circuit) feedsOnlyControl(net string) bool {
	nets := []string{net}
	for _, cn := range c.ConnsOf(net) {
		other, ok := dcNeighbour(cn)
		if !ok {
			other, ok = windingEnd(cn)
		}
		if ok && other.Net != net && !c.RoleOf(other.Net).IsACGround() {
			nets = append(nets, other.Net)
		}
	}
	control, supplied := false, false
	for _, nn := range nets {
		for _, cn := range c.ConnsOf(nn) {
			if !cn.Part.IsActive() {
				continue
			}
			switch RoleOfPin(cn.Part.Kind, cn.Pin) {
			case RoleControl:
				control = true
			case RoleOutput, RoleGrid, RoleCommon:
				supplied = true
			}
		}
	}
	return control && !supplied
}

// windingEnd is the far end of the transformer winding a terminal is on.
func windingEnd(cn Conn) (Pin, bool) {
	p := cn.Part
	if p.Kind != Transformer {
		return Pin{}, false
	}
	for _, w := range p.Windings {
		far := ""
		switch cn.Pin {
		case w.From:
			far = w.To
		case w.To:
			far = w.From
		default:
			continue
		}
		if pn := p.Pin(far); pn != nil {
			return *pn, true
		}
	}
	return Pin{}, false
}

// WithoutVolts is a rail's label with its stated voltage taken out ("HT"
// from "HT +250 V"): the name of the line, for a line fed from it at a
// voltage of its own. The voltage is the first signed or plain number of
// volts in the label (declared or not: a label may state what the net
// does not). A label that is only the voltage leaves "".
func WithoutVolts(label string) string {
	loc := statedVolts.FindStringIndex(label)
	if loc == nil {
		return label
	}
	return strings.Join(strings.Fields(label[:loc[0]]+" "+label[loc[1]:]), " ")
}

// FeedName is how a line fed from rail n names it on its tag: the rail's
// label without its voltage and remarks ("HT" from "HT +250 V (reservoir)"),
// since the line has a voltage of its own; a rail named only by its
// voltage keeps it ("+9 V via R5"), which is what the service sheet calls
// it, not the netlist's net name.
func FeedName(n *Net) string {
	if n.Fed != "" && n.Label != "" {
		return withoutRemarks(n.Label) // a line fed itself: its chain as named ("+12 V via R10")
	}
	return RailName(withoutRemarks(railLabel(n))) // "+9 V (stabilised)" feeds "+9 V via R14", not "(stabilised) via R14"
}

// RailName is a rail's label without its stated voltage where the words
// left name the rail ("HT" from "HT +250 V", "bias" from "−6 V bias"). A
// label whose voltage is its only name keeps it: one that is just the
// voltage ("+12V"), or one whose other words only say it is a line
// ("+9 V line", "+12 V supply rail"): stripped, a blind reviewer's "+9 V
// line" fed a tag reading "line via R4", which names no rail at all.
func RailName(label string) string {
	name := WithoutVolts(label)
	for _, w := range strings.Fields(strings.ToLower(name)) {
		if !lineWords[w] {
			return name
		}
	}
	return label
}

// lineWords are the words a supply's label uses to say it is a supply,
// not which: they name no rail without the voltage beside them.
var lineWords = map[string]bool{"line": true, "supply": true, "rail": true, "bus": true, "feed": true, "dc": true, "d.c.": true}

// withoutRemarks is a rail's label without its bracketed remarks ("HT1"
// from "HT1 (reservoir)", "battery" from "battery (neg. earth drawn
// positive)"): a remark describes the rail itself, not a line fed from it
// through a resistor, which is no reservoir, and the tag stays short.
// A label that is only a remark keeps it.
func withoutRemarks(label string) string {
	out := label
	for remark.MatchString(out) { // nested remarks, inside out
		out = remark.ReplaceAllString(out, " ")
	}
	out = strings.Join(strings.Fields(out), " ")
	if out == "" {
		return label
	}
	return out
}

// remark is a bracketed aside in a label, innermost brackets only.
var remark = regexp.MustCompile(`\([^()]*\)`)

// statedVolts is a voltage as a label states it: "+250 V", "−6V", "250 V",
// "6.3 V~" (an a.c. heater line: the mark goes with the voltage).
var statedVolts = regexp.MustCompile(`[+−-]?[0-9]+(?:\.[0-9]+)?\s?V\b~?`)

// dcNeighbour is the far terminal of a resistor or choke on a net: the
// parts that carry a DC feed.
func dcNeighbour(cn Conn) (Pin, bool) {
	p := cn.Part
	if (p.Kind != Resistor && p.Kind != Inductor) || len(p.Pins) != 2 {
		return Pin{}, false
	}
	if p.Pins[0].Name == cn.Pin {
		return p.Pins[1], true
	}
	return p.Pins[0], true
}

// railLabel is how a rail is named on a tag: its label, else its signed
// voltage ("+9 V", "−6 V"), else its net name.
func railLabel(n *Net) string {
	switch {
	case n.Label != "":
		return n.Label
	case n.Volts != 0:
		sign := "+"
		if n.Volts < 0 {
			sign = "−" // U+2212 MINUS SIGN, as typeset
		}
		return sign + strconv.FormatFloat(math.Abs(n.Volts), 'g', -1, 64) + " V"
	}
	return n.Name
}
