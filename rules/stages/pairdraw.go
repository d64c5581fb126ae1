package stages

import (
	"strings"

	"pare/graph"
)

// pairPlaces extends the template of an output pair (complementary or
// quasi-complementary) with the resistors the stage holds that serve its
// drivers but that the pattern does not name (its optional parts are
// spent on the bias chain and the emitter resistors): a resistor on a
// placed device's common or output electrode stands in the free slot
// straight below that device (a Darlington driver's emitter resistor to
// the output, the lower output transistor's base resistor), and the bias
// chain's feed from the rail (a resistor from the upper base to AC
// ground) stands over the chain's column. Left to the generic placement
// they stood across the pair, their wires tangled through the chain
// (testdata/pairs/quasi-comp.toml).
func pairPlaces(c *graph.Circuit, st *Stage) {
	if !strings.Contains(st.Topology, "complementary-pair") || len(st.Draw) < 2 {
		return
	}
	taken, placed := map[[2]int]bool{}, map[string]bool{}
	chainCol := 0
	for _, pl := range st.Draw {
		taken[[2]int{pl.Col, pl.Row}] = true
		placed[pl.Part] = true
		chainCol = min(chainCol, pl.Col)
	}
	anchor := c.Part(st.Draw[0].Part)
	if anchor == nil || !anchor.IsActive() || chainCol == 0 {
		return
	}
	top := anchor.NetOf(anchor.PinWithRole(graph.RoleControl))
	put := func(ref string, col, row int) bool {
		if taken[[2]int{col, row}] {
			return false
		}
		taken[[2]int{col, row}] = true
		st.Draw = append(st.Draw, Place{Part: ref, Col: col, Row: row, Stand: "vertical"})
		return true
	}
	mid, midRow := pairMid(c, st)
	for _, ref := range st.Parts {
		p := c.Part(ref)
		if p == nil || placed[ref] || p.Kind != graph.Resistor || len(p.Pins) != 2 {
			continue
		}
		if onNet(p, top) && c.RoleOf(other(p, top)).IsACGround() {
			put(ref, chainCol, -1)
			continue
		}
		if mid != "" && onNet(p, mid) && c.RoleOf(other(p, mid)).IsACGround() && put(ref, 1, midRow) {
			continue
		}
		for _, pl := range st.Draw {
			d := c.Part(pl.Part)
			if d == nil || !d.IsActive() || !servesLead(c, p, d) {
				continue
			}
			if put(ref, pl.Col, pl.Row+1) {
				break
			}
		}
	}
}

// servesLead says whether resistor p hangs on d's common or output
// electrode, off AC ground.
func servesLead(c *graph.Circuit, p, d *graph.Part) bool {
	for _, role := range []graph.TermRole{graph.RoleCommon, graph.RoleOutput} {
		n := d.NetOf(d.PinWithRole(role))
		if n != "" && !c.RoleOf(n).IsACGround() && onNet(p, n) {
			return true
		}
	}
	return false
}

// pairMid is the pair's mid-point as the template draws it: the net two
// parts of the device column (col 0) of one kind share off AC ground and
// off any device's control electrode (the emitter resistors' joint, or
// the devices' joined common electrodes when the template shorts the
// resistors out), with the row between them. A resistor from
// it to AC ground (a DC feedback resistor from the mid-point, its far end
// bypassed) stands right of that row; left to the generic placement it
// pulled the pair out of its column (review20 b04's R2).
func pairMid(c *graph.Circuit, st *Stage) (string, int) {
	controls := map[string]bool{}
	for _, pl := range st.Draw {
		if d := c.Part(pl.Part); d != nil && d.IsActive() {
			controls[d.NetOf(d.PinWithRole(graph.RoleControl))] = true
		}
	}
	for i, a := range st.Draw {
		pa := c.Part(a.Part)
		if a.Col != 0 || pa == nil {
			continue
		}
		for _, b := range st.Draw[i+1:] {
			pb := c.Part(b.Part)
			if b.Col != 0 || pb == nil || pa.IsActive() != pb.IsActive() {
				continue
			}
			for _, pin := range pa.Pins {
				n := pin.Net
				if n != "" && onNet(pb, n) && !controls[n] && !c.RoleOf(n).IsACGround() {
					return n, (a.Row + b.Row) / 2
				}
			}
		}
	}
	return "", 0
}
