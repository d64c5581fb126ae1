package note

import (
	"bytes"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/rules"
)

// TestOtherBandsSolved: the note of a wavechange set gives each other
// band's gang-tuned stages from that band's own run. review21 b05 on long
// wave puts the rod's loading winding in series with the medium-wave one;
// its aerial circuit is solved there, 149.9–400.7 kHz against ngspice's
// 149.8–400.6 kHz (testdata/review21/spice/b/c05fe_lw.cir, the reviewer's
// deck), and the oscillator's tracking against it is flagged: at the top
// of the dial the aerial tunes 400.7 kHz while the oscillator brings in
// 304.9 kHz. Markdown and HTML both carry it.
func TestOtherBandsSolved(t *testing.T) {
	r, err := pipeline.Run(pipeline.Options{Path: "../../../testdata/review21/b05.toml", Until: pipeline.PhaseStages, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	n := FromResult(r, Meta{})
	if len(n.OtherBands) != 1 {
		t.Fatalf("%d other bands, want 1 (LW)", len(n.OtherBands))
	}
	var md, html bytes.Buffer
	if err := Write(&md, n); err != nil {
		t.Fatal(err)
	}
	hOtherBands(&html, n)
	for _, want := range []string{
		"Band 2: S1a, S1b, S1c at position 2",
		"tuned-winding-series",
		"f 149.9 kHz–400.7 kHz",
		"sig f 161.2 kHz–304.9 kHz",
		"oscillator tracking is off by up to 95.87 kHz",
	} {
		if !strings.Contains(md.String(), want) {
			t.Errorf("the note lacks %q", want)
		}
		if !strings.Contains(html.String(), want) {
			t.Errorf("the HTML note lacks %q", want)
		}
	}
}
