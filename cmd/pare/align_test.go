package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/cmd/internal/align"
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

// TestAlignMatchesMainJob: on every example and fixture with something to
// adjust, `pare align` gives the procedure the main job's notes.md gives:
// the note's Alignment section is byte for byte what the align command's
// guide writes as Markdown (the same guide, so the same text as well).
func TestAlignMatchesMainJob(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	var files []string
	for _, pat := range []string{"examples/*.toml", "testdata/good/*.toml"} {
		for _, f := range cliGlob(t, pat) {
			if b, err := os.ReadFile(f); err == nil && strings.Contains(string(b), "adjust") {
				files = append(files, f)
			}
		}
	}
	if len(files) < 8 {
		t.Fatalf("only %d netlists with adjustable parts", len(files))
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			job := cachedJob(t, f)
			if job.code > exitFound {
				t.Fatalf("main job: exit %d: %s", job.code, job.stderr)
			}
			md, err := os.ReadFile(filepath.Join(job.dir, fileNote))
			if err != nil {
				t.Fatal(err)
			}
			g, err := alignGuide(f)
			if err != nil {
				t.Fatal(err)
			}
			var want strings.Builder
			if err := align.WriteMarkdown(&want, g); err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(string(md), want.String()) {
				t.Errorf("notes.md's Alignment differs from pare align's guide; pare align gives:\n%s", want.String())
			}
		})
	}
}
