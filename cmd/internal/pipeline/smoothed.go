package pipeline

import (
	"fmt"

	"pare/graph"
	"pare/graph/value"
)

// A smoothed HT line is fed from the reservoir through a smoothing
// resistor or choke and held by a smoothing capacitor to chassis (common
// practice: a reservoir, a series R or L, a second electrolytic). When
// only the reservoir is undeclared and estimated, the line after the
// smoothing is still a signal net to the reduction: its resistors to the
// decoupled lines merge into one bundle and its capacitor is judged by its
// reactance (review 17's b05). The line is a supply rail as plainly as the
// reservoir, so a note says so with the fix, beside the reservoir's; the
// reduction is not changed behind the user's back.

// smoothingMinF is the least capacitance read as smoothing: an HT
// smoothing capacitor is microfarads (common practice, 8–50 µF), an RF
// bypass on the line nanofarads.
const smoothingMinF = 1e-6

// smoothedLineNotes are the notes for the undeclared lines fed from the
// reservoir through one resistor or choke and held by a smoothing
// capacitor to a ground net.
func smoothedLineNotes(c *graph.Circuit, reservoir string) []string {
	var out []string
	seen := map[string]bool{}
	for _, cn := range c.ConnsOf(reservoir) {
		p := cn.Part
		line, ok := seriesFar(p, reservoir)
		if !ok {
			continue
		}
		if seen[line] || line == reservoir || c.RoleOf(line) != graph.Signal {
			continue
		}
		sc := smoothingCap(c, line)
		if sc == nil {
			continue
		}
		seen[line] = true
		out = append(out, fmt.Sprintf("%s looks like a supply rail: fed from the reservoir %s through %s and smoothed by %s (%s to chassis); declare it to say so, and the reduction takes it as AC ground for the signal: [nets] %s = { role = \"supply\" }",
			line, reservoir, p.Ref, sc.Ref, value.Format(sc.Value.Max, value.Farad, value.Symbol), line))
	}
	return out
}

// smoothingCap is the largest capacitor of at least smoothingMinF from
// line to a ground net, nil if none.
func smoothingCap(c *graph.Circuit, line string) *graph.Part {
	var best *graph.Part
	for _, cn := range c.ConnsOf(line) {
		q := cn.Part
		if q.Kind != graph.Capacitor || len(q.Pins) != 2 || q.Value.Max < smoothingMinF {
			continue
		}
		other := q.Pins[0].Net
		if other == line {
			other = q.Pins[1].Net
		}
		if c.RoleOf(other) == graph.Ground && (best == nil || q.Value.Max > best.Value.Max) {
			best = q
		}
	}
	return best
}
