package note

import (
	"bytes"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/rules"
)

// The hover pairs the parts of the reduced sheet as drawn with the
// original's: review15 b01's bias dividers, merged by the reduction (the
// note's merge record says R2 stands for R2 and R3) but drawn on the
// reduced sheet as their halves, light each half alone; the trimmer merged
// into its gang section still lights both.
func TestHoverFollowsDrawnHalves(t *testing.T) {
	r, err := pipeline.Run(pipeline.Options{Path: "../../../testdata/review15/b01.toml", Until: pipeline.PhaseStages, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	n := FromResult(r, Meta{})
	n.Sheets = []Sheet{{View: ViewReduced}, {View: ViewFaded}}
	intos := func(ms []Merge) string {
		var out []string
		for _, m := range ms {
			out = append(out, m.Into+"="+strings.Join(m.From, ","))
		}
		return strings.Join(out, " ")
	}
	if got, want := intos(n.Merged), "R2=R2,R3 R5=R5,R6 VC1=TC1,VC1"; got != want {
		t.Errorf("merge record %q, want %q (the reduction's)", got, want)
	}
	if got, want := intos(n.Drawn), "VC1=TC1,VC1"; got != want {
		t.Errorf("hover merges %q, want %q (the dividers drawn as halves)", got, want)
	}
	var b bytes.Buffer
	hHover(&b, n)
	if !strings.Contains(b.String(), `{"VC1":["TC1","VC1"]}`) {
		t.Errorf("hover data does not follow the drawn sheet: %s", strings.SplitN(b.String(), "\n", 2)[0])
	}
}
