package pipeline

import (
	"bytes"
	"fmt"
	"strings"

	"pare/render"
)

// MarkedOn names the drawn sheets on which a part's alignment mark stands,
// page by page as the note lists them ("the reduced sheet 1 of 3 and the
// faded sheet 2 of 8"; "the faded sheet" when the view is one page): on the
// reduced view a part merged into another is marked on the one it went
// into. Empty when no drawn sheet marks it.
func (r *Result) MarkedOn(ref string) string {
	var out []string
	for _, sh := range r.Sheets {
		to := ref
		if sh.View == render.Reduced && r.Reduced != nil {
			if _, merged := FadedAndMerged(r.Circuit, r.Reduced); merged[ref] != "" {
				to = merged[ref]
			}
		}
		if sh.Sheet == nil || sh.Sheet.Marks[to] == "" {
			continue
		}
		tok := []byte(`data-ref="` + render.RefToken(to) + `"`)
		for i, pg := range sh.Pages {
			if !bytes.Contains(pg, tok) {
				continue
			}
			name := "the " + sh.View.String() + " sheet"
			if len(sh.Pages) > 1 {
				name += fmt.Sprintf(" %d of %d", i+1, len(sh.Pages))
			}
			out = append(out, name)
			break
		}
	}
	return strings.Join(out, " and ")
}
