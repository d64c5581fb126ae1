package main

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/internal/fuzzgen"
)

// FuzzMainJob runs the whole job in memory on generated circuits (every
// part kind, hostile titles, labels, notes and gang names; see fuzzgen).
// Whatever loads must either be refused with positioned messages or give
// four files: a reduced netlist that loads back, two well-formed sheets,
// a note, none with a raw control or bidi character. An internal error is
// a failure. Regressions found are kept under testdata/fuzz/FuzzMainJob.
func FuzzMainJob(f *testing.F) {
	for _, seed := range []string{"", "\x05\x01\x02\x03\x04\x05\x06\x07\x08\x09", "\x08\x02\x01\x14\x00\x03\x04\x05\x13\x09\x04\x07\x00\x02\x01\x03\x05\x06",
		"\x03\x06\x00\x04\x01\x02\x03\x03\x04\x05\x06\x07\x08\x09\x0a\x00\x01\x02"} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		text := fuzzgen.Netlist(data)
		if _, err := graph.Parse("fuzz.toml", []byte(text)); err != nil {
			return // the loader has its own fuzz target
		}
		path := filepath.Join(t.TempDir(), "fuzz.toml")
		if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		cfg, err := configure(&runOpts{level: []string{"tidy", "signal", "ideal"}[len(data)%3], symbols: "iec"})
		if err != nil {
			t.Fatal(err)
		}
		pr, err := pipeline.Run(jobOptions(path, cfg))
		var res *jobResult
		if err == nil {
			res, err = mainJobOn(pr, cfg)
		}
		if err != nil {
			var l graph.ErrorList
			if isInternal(err) || !errors.As(err, &l) {
				t.Fatalf("%v\n--- netlist\n%s", err, text)
			}
			for _, e := range l {
				if !e.Pos.IsValid() {
					t.Fatalf("message without a position: %v", e)
				}
			}
			return
		}
		for _, file := range res.files {
			if err := fuzzgen.Inert(file.name, string(file.data)); err != nil {
				t.Fatal(err)
			}
			switch {
			case strings.HasSuffix(file.name, ".svg"): // one sheet or a page of a view
				if err := fuzzgen.WellFormedXML(file.name, file.data); err != nil {
					t.Fatal(err)
				}
			case file.name == fileReducedNetlist:
				if _, err := graph.Parse(file.name, file.data); err != nil {
					t.Fatalf("reduced netlist does not load: %v", err)
				}
			}
		}
	})
}
