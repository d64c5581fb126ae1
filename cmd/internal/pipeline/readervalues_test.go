package pipeline

import (
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules"
)

var nonDigit = regexp.MustCompile(`[^0-9]`)

// A merged part's value is written for a reader: review22 b02's R2 22k ∥
// R4 330R had been written "325R12315270936". 22000·330/22330 = 325.12 Ω
// (arithmetic), written to four significant figures in the IEC 60062 code
// as 325R1, and its line says the sheet draws it as R2 22k and R4 330R
// (feeds from two lines, drawn apart). The file still loads and matches the original circuit by AC
// analysis (the proof the main job gives, redone on the written text).
func TestReducedNetlistValuesForReader(t *testing.T) {
	code := regexp.MustCompile(`(?m)^(\w+) = \{ (?:r|c|l) = "([^"]+)"[^\n]*from = `)
	for _, tc := range []struct{ file, ref, want string }{
		{filepath.Join("review22", "b02.toml"), "R4", "325R1"},
		{filepath.Join("review22", "b05.toml"), "", ""},
		{filepath.Join("review21", "b05.toml"), "", ""},
	} {
		t.Run(tc.file, func(t *testing.T) {
			path := filepath.Join("..", "..", "..", "testdata", tc.file)
			res, err := Run(Options{Path: path, Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			text, err := res.ReducedNetlist()
			if err != nil {
				t.Fatal(err)
			}
			for _, m := range code.FindAllStringSubmatch(string(text), -1) {
				for _, end := range strings.Split(m[2], "..") {
					if digits := strings.Trim(nonDigit.ReplaceAllString(end, ""), "0"); len(digits) > readerDigits {
						t.Errorf("%s = %q: more than %d significant figures", m[1], m[2], readerDigits)
					}
				}
				if m[1] == tc.ref && m[2] != tc.want {
					t.Errorf("%s = %q, want %q", m[1], m[2], tc.want)
				}
			}
			if tc.ref == "R4" && !strings.Contains(string(text), "draws it as R2 22k and R4 330R") {
				t.Errorf("R4's line does not say how the sheet draws it:\n%s", text)
			}
			back, err := graph.Parse("reduced.toml", text)
			if err != nil {
				t.Fatalf("reduced.toml does not load: %v", err)
			}
			exactText, err := graph.Marshal(annotated(res.Reduced, res.Level))
			if err != nil {
				t.Fatal(err)
			}
			exact, err := graph.Parse("exact.toml", exactText)
			if err != nil {
				t.Fatal(err)
			}
			// a tenth of the main job's tolerance: the rounding is no
			// change a verification could see
			rep, err := ac.Compare(exact, back, ac.CompareOptions{TolDB: 0.05, TolDeg: 0.5})
			if err != nil || !rep.OK {
				t.Errorf("the rounded file against the exact one: %v %+v", err, rep)
			}
		})
	}
}
