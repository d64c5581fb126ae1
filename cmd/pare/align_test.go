package main

import (
	"strings"
	"testing"
)

// TestAlignCommand: pare align prints the live-set caution first, then the
// procedure and the injection table; a bad netlist is a positioned error,
// exit 2; `pare help align` documents the command.
func TestAlignCommand(t *testing.T) {
	code, stdout, stderr := cliRun(t, "align", redExample)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	lines := strings.Split(stdout, "\n")
	if len(lines) < 3 || !strings.HasPrefix(lines[2], "! Alignment and signal tracing are done with the set switched on") {
		t.Errorf("the caution does not open the output:\n%s", stdout)
	}
	for _, want := range []string{"Procedure, in the trade's order", "1. IF, ", "Signal injection", "Symptoms (common practice)"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("output lacks %q", want)
		}
	}
	code, _, stderr = cliRun(t, "align", "../../testdata/bad/bad-adjust.toml")
	if code != exitBad || !strings.Contains(stderr, "bad-adjust.toml:10:123: adjust names winding") {
		t.Errorf("bad netlist: exit %d, %q", code, stderr)
	}
	code, stdout, _ = cliRun(t, "help", "align")
	if code != exitOK || !strings.Contains(stdout, "usage: pare align FILE") {
		t.Errorf("help: exit %d, %q", code, stdout)
	}
}
