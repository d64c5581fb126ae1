package note

import (
	"fmt"
	"strconv"
	"strings"

	"pare/cmd/internal/align"
)

// alignMarksIntro heads the list of where the sheets mark the parts the
// alignment turns.
const alignMarksIntro = "Where the sheets mark each part the alignment turns (the steps of the Alignment section):"

// alignMarks are the lines of that list: each part turned, in the order
// of its first step, with its steps and the sheets (and pages) that mark
// it, from where (pipeline.Result.MarkedOn); a part no drawn sheet marks
// says so.
func alignMarks(g *align.Guide, where func(ref string) string) []string {
	var refs []string
	steps := map[string][]string{}
	for _, s := range g.Steps {
		if steps[s.Part] == nil {
			refs = append(refs, s.Part)
		}
		steps[s.Part] = append(steps[s.Part], strconv.Itoa(s.N))
	}
	var out []string
	for _, ref := range refs {
		ns := steps[ref]
		which := "step " + ns[0]
		if len(ns) > 1 {
			which = "steps " + strings.Join(ns[:len(ns)-1], ", ") + " and " + ns[len(ns)-1]
		}
		on := where(ref)
		if on == "" {
			on = "on no sheet drawn"
		}
		out = append(out, fmt.Sprintf("%s, %s: %s.", ref, which, on))
	}
	return out
}
