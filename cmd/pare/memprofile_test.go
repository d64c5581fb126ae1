package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// TestMemProfileWritten: with PARE_MEMPROFILE set, a job leaves a heap
// profile in the file (pprof's format is gzip-compressed, RFC 1952's magic
// bytes 1f 8b), even one that ends before the watcher's first look; unset,
// no file is made.
func TestMemProfileWritten(t *testing.T) {
	for _, set := range []bool{true, false} {
		path := filepath.Join(t.TempDir(), "heap.prof")
		if set {
			t.Setenv(memProfileEnv, path)
		} else {
			t.Setenv(memProfileEnv, "")
		}
		startMemProfile()()
		b, err := os.ReadFile(path)
		switch {
		case set && err != nil:
			t.Fatalf("no profile written: %v", err)
		case set && !bytes.HasPrefix(b, []byte{0x1f, 0x8b}):
			t.Fatalf("profile does not start with gzip's magic bytes: % x", b[:min(len(b), 4)])
		case !set && err == nil:
			t.Fatalf("a profile was written with %s unset", memProfileEnv)
		}
	}
}
