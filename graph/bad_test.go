package graph

import (
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/internal/golden"
)

// update rewrites the golden .err files from what the loader says now:
// go test ./graph -run TestBadInput -update (then review every diff by eye).
var update = flag.Bool("update", false, "rewrite testdata/bad/*.err from the current loader output")

// repo is the repository root seen from this package's directory.
const repo = ".."

// TestBadInput loads every file under testdata/bad and compares the complete
// error list with the golden NAME.err beside it. The expected messages were
// written against the netlist reference (docs/netlist.md) and checked by eye:
// each names file:line:col of the offending key or value.
func TestBadInput(t *testing.T) {
	files, err := filepath.Glob(filepath.Join(repo, "testdata", "bad", "*.toml"))
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 25 {
		t.Fatalf("only %d bad-input files; the suite wants at least 25", len(files))
	}
	for _, path := range files {
		name := filepath.ToSlash(strings.TrimPrefix(path, repo+string(filepath.Separator)))
		t.Run(strings.TrimSuffix(filepath.Base(path), ".toml"), func(t *testing.T) {
			data, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			c, err := Parse(name, data)
			if err == nil {
				t.Fatalf("%s loaded without error (%d parts); it must be refused", name, len(c.Parts))
			}
			if c != nil {
				t.Errorf("a refused file must give a nil circuit")
			}
			list, ok := err.(ErrorList)
			if !ok {
				t.Fatalf("error is %T, want graph.ErrorList", err)
			}
			var got strings.Builder
			for _, e := range list {
				if !e.Pos.IsValid() || e.Pos.File != name {
					t.Errorf("error without a position in %s: %v", name, e)
				}
				got.WriteString(e.Error())
				got.WriteByte('\n')
			}
			golden.Check(t, strings.TrimSuffix(path, ".toml")+".err", []byte(got.String()), *update, "go test ./graph -update")
		})
	}
}

// TestBadInputSorted checks that a file with several mistakes reports all of
// them, in file order (docs/netlist.md, "Messages").
func TestBadInputSorted(t *testing.T) {
	data, err := os.ReadFile(filepath.Join(repo, "testdata", "bad", "several-errors.toml"))
	if err != nil {
		t.Fatal(err)
	}
	_, err = Parse("several-errors.toml", data)
	list, ok := err.(ErrorList)
	if !ok {
		t.Fatalf("want an ErrorList, got %v", err)
	}
	// The file holds six mistakes: output net, net role, terminal name, value,
	// tolerance, tap (written there on purpose, one per line).
	if len(list) < 6 {
		t.Fatalf("got %d errors, want at least 6:\n%v", len(list), list)
	}
	for i := 1; i < len(list); i++ {
		if list[i].Pos.Before(list[i-1].Pos) {
			t.Errorf("errors out of order: %v before %v", list[i-1], list[i])
		}
	}
}
