package pipeline

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"pare/graph"
)

// A rail's label that states a voltage ("+12 V") the operating point does
// not give is a transcription warning: the label copied from another set,
// a rectifier winding or a dropper captured wrong, or a rail that really
// runs high. The review's mains transistor set labelled its line "+12 V"
// where the bridge rectifier and its smoothing put 15.9 V, and nothing
// said so. Only a rail whose voltage the netlist does not declare is
// checked: a declared one is held at its volts by the solver.

// labelSlack is how far the operating point may sit from a label's voltage
// before it is said: 25 %. A rectified rail at a light load sits some
// 10–20 % above its nominal figure, and a battery's label is its nominal
// voltage, not a fresh or a run-down cell's (common practice, no source).
const labelSlack = 0.25

// labelVolts finds a stated DC voltage in a label: "+12 V", "-6V",
// "HT 250 V"; not an AC one ("6.3 V~", "240 V AC").
var labelVolts = regexp.MustCompile(`([+\-−]?\d+(?:\.\d+)?)\s*V\b(\s*(~|AC|ac|a\.c\.))?`)

// labelWarnings are the warnings for rails whose label's voltage the
// operating point contradicts.
func (r *Result) labelWarnings() graph.ErrorList {
	if r.DC == nil {
		return nil
	}
	var out graph.ErrorList
	for _, n := range r.Circuit.Nets {
		if n.Role != graph.Supply && n.Role != graph.Bias || n.HasVolts() {
			continue
		}
		m := labelVolts.FindStringSubmatch(n.Label)
		if m == nil || m[3] != "" {
			continue
		}
		want, err := strconv.ParseFloat(strings.Replace(m[1], "−", "-", 1), 64)
		if err != nil || want == 0 {
			continue
		}
		got, ok := r.DC.Volts(n.Name)
		if !ok || math.IsNaN(got) || math.Abs(got-want) <= labelSlack*math.Abs(want) {
			continue
		}
		out = append(out, &graph.Error{Pos: n.Pos, Msg: fmt.Sprintf(
			"net %s is labelled %q but the DC operating point puts it at %.4g V (%+.0f %%): check the label, or the parts that set the rail (a rectifier's winding, a dropper, a regulator) as captured",
			n.Name, n.Label, got, 100*(got-want)/math.Abs(want))})
	}
	return out
}
