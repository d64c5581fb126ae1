package pipeline

import (
	"strings"

	"pare/graph"
	"pare/graph/dc"
)

// sayBiased marks in the reduced netlist each device figure the AC model
// took at the DC operating point of the set as wired (Result.Biased). The
// reduced file has no supply and no bias network left to solve them from,
// so it carries them as the device's own; without the mark a reader takes
// "ic = 0.394682942087385mA" for a figure someone measured or captured, and a
// program that loads the original alone (without the operating point) gets
// the model's default bias and a response up to 11 dB off (review22 b05):
// the comment says where the figure came from.
func sayBiased(c *graph.Circuit, filled []dc.Origin) {
	if markBiased(c, filled) == 0 {
		return
	}
	// Said once at the top, beside the reduction's own mark, and kept
	// short on each part's line.
	addHeader(c, biasedHeader)
}

// headerPrefixes open the lines pare writes at the top of a reduced
// netlist; annotated drops them from a netlist that was itself reduced.
var headerPrefixes = []string{reducedMark, biasedHeader, switchesHeader, cautionHeader}

// addHeader puts a line under the reduction's mark (annotated puts it
// first) and the lines added before it.
func addHeader(c *graph.Circuit, line string) {
	for key, cm := range c.Comments {
		if len(cm.Above) == 0 || !strings.HasPrefix(cm.Above[0], reducedMark) {
			continue
		}
		at := 1
		for at < len(cm.Above) && isHeader(cm.Above[at]) {
			at++
		}
		cm.Above = append(cm.Above[:at:at], append([]string{line}, cm.Above[at:]...)...)
		c.Comments[key] = cm
		return
	}
}

func isHeader(line string) bool {
	for _, p := range headerPrefixes {
		if strings.HasPrefix(line, p) {
			return true
		}
	}
	return false
}

// biasedHeader is the top line sayBiased adds.
const biasedHeader = " Device figures marked \"at the operating point\" were solved by pare at the DC operating point of the set as wired: this file has no supply or bias network to solve them from, so it carries them."

// markBiased marks each part's figures taken at the operating point, and
// counts the parts marked. The figures keep the writer's full precision:
// rounded to six figures, every-kind's regenerative RF path moved 26 dB
// (TestReducedNetlistRoundTrip), and the file must be the circuit the
// proof passed.
func markBiased(c *graph.Circuit, filled []dc.Origin) int {
	params := map[string][]string{}
	for _, o := range filled {
		params[o.Ref] = append(params[o.Ref], o.Param)
	}
	marked := 0
	for _, p := range c.Parts {
		names := params[p.Ref]
		if len(names) == 0 || p.Params == nil {
			continue
		}
		var said []string
		for _, n := range names {
			if _, ok := p.Params[n]; ok {
				said = append(said, n)
			}
		}
		if len(said) == 0 {
			continue
		}
		key := "parts." + p.Ref
		cm := c.Comments[key]
		text := " " + strings.Join(said, ", ") + " at the operating point"
		if cm.After != "" {
			text = cm.After + ";" + text
		}
		cm.After = text
		c.Comments[key] = cm
		marked++
	}
	return marked
}
