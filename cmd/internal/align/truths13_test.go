package align_test

import (
	"bytes"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"pare/cmd/internal/align"
)

// guideText is the alignment guide of a circuit as `pare align` prints it,
// with its stages' notes after it.
func guideText(t *testing.T, path string) string {
	t.Helper()
	r, g := build(t, path)
	var b bytes.Buffer
	if err := align.WriteText(&b, g); err != nil {
		t.Fatal(err)
	}
	for _, s := range r.Stages {
		b.WriteString(strings.Join(s.Notes, "\n") + "\n")
	}
	return b.String()
}

// TestDeviceWordsFollowTheKind: a transistor set's guide and stage notes
// speak of bases and transistors. The review's transistor superhet
// (testdata/review13/b05.toml) read "the RF at the mixer's grid", "the
// valve's gm" and "what the grid capacitor, the injection and the valve
// put across the coil" of its BJT mixer; the valve frequency changer keeps
// the valve's words.
func TestDeviceWordsFollowTheKind(t *testing.T) {
	valveWords := regexp.MustCompile(`mixer's grid|valve's gm|grid capacitor, the injection and the valve`)
	for _, tc := range []struct {
		path  string
		valve bool
	}{
		{review13("b05"), false},
		{example("frequency-changer"), true},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			text := guideText(t, tc.path)
			if got := valveWords.FindString(text); (got != "") != tc.valve {
				t.Errorf("valve wording %q, want valve wording %v", got, tc.valve)
			}
			if !tc.valve && !strings.Contains(text, "mixer's base") {
				t.Errorf("no \"mixer's base\" in the transistor set's guide:\n%s", text)
			}
		})
	}
}
