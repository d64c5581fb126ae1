package render

import (
	"regexp"
	"strings"

	"pare/graph"
)

// numbered matches a net name a capture tool or a hurried hand numbered
// rather than named ("n12", "N$3", "net_7", "12"): on an off-row connector
// it tells the reader nothing to look for on the other row.
var numbered = regexp.MustCompile(`^(?i:n|net|node)?[_$-]?[0-9]+$`)

// connectorLabel is the text both ends of a net's off-row connectors carry:
// the net's drawing label when the netlist gives one, else its name, but a
// numbered name (numbered) gives way to the terminal the net starts from on
// its first row, with that part's stage ("ST2 V1:a", the terminal written
// as IEC 81346 writes one; a valve's or transistor's electrode before a
// passive part's end, as a technician traces a stage from its device): the
// reader finds the part on the sheet before, and the stage by its frame.
func (f *flow) connectorLabel(net string) string {
	c := f.s.Circuit
	if n := c.Net(net); n != nil && n.Label != "" {
		return n.Label
	}
	if !numbered.MatchString(net) {
		return net
	}
	i, ok := f.first[net]
	if !ok {
		return net
	}
	var at *graph.Conn
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind == graph.Port || f.blockOf[cn.Part.Ref] != i {
			continue
		}
		if at == nil || (cn.Part.IsActive() && !at.Part.IsActive()) {
			at = &cn
		}
	}
	if at == nil {
		return net
	}
	t := at.Part.Ref + ":" + at.Pin
	if st := f.stageOf(at.Part.Ref); st != "" {
		t = st + " " + t
	}
	return t
}

// stageOf is the name a frame holding the part opens its title with (its
// stage's number, "ST3"), "" when no frame holds it.
func (f *flow) stageOf(ref string) string {
	for _, fr := range f.s.Frames {
		for _, p := range fr.Parts {
			if p == ref {
				if w := strings.Fields(fr.Title); len(w) > 0 {
					return w[0]
				}
				return ""
			}
		}
	}
	return ""
}
