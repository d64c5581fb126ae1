package check

import (
	"fmt"
	"sort"

	"pare/render/geom"
)

// Connectors checks the off-row connectors of a sheet cut into rows and
// pages (all pages of one view): every outgoing connector has an incoming
// partner with the same label somewhere on the sheet and every incoming one
// an outgoing partner, so a reader who follows a net off the end of a row
// always finds where it goes on. The findings are sorted.
func Connectors(pages []*geom.Sheet) []string {
	type ends struct{ in, out int }
	byLabel := map[string]*ends{}
	for _, g := range pages {
		for _, s := range g.Symbols {
			net, in, ok := geom.ConnectorOf(s.Ref)
			if !ok {
				continue
			}
			e := byLabel[net]
			if e == nil {
				e = &ends{}
				byLabel[net] = e
			}
			if in {
				e.in++
			} else {
				e.out++
			}
		}
	}
	var out []string
	for net, e := range byLabel {
		switch {
		case e.in == 0:
			out = append(out, fmt.Sprintf("off-row connector %s goes on nowhere: no incoming partner", net))
		case e.out == 0:
			out = append(out, fmt.Sprintf("off-row connector %s comes from nowhere: no outgoing partner", net))
		}
	}
	sort.Strings(out)
	return out
}
