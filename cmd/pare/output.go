package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph"
)

// writeFileAtomic writes data to path through a temporary file in the same
// folder and a rename, so a reader never sees half a file and a failure
// leaves any old file as it was.
func writeFileAtomic(path string, data []byte) error {
	if st, err := os.Stat(path); err == nil && st.IsDir() {
		return fmt.Errorf("%s is a directory: give a file name to write", path)
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		os.Remove(name)
		return err
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return err
	}
	// Keep the mode of a file being replaced (pare fmt rewrites in place);
	// a new file gets the usual 0644.
	mode := os.FileMode(0o644)
	if st, err := os.Stat(path); err == nil {
		mode = st.Mode().Perm()
	}
	if err := os.Chmod(name, mode); err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Rename(name, path); err != nil {
		os.Remove(name)
		return err
	}
	return nil
}

// writeOutput renders with fn into memory first, then writes the file
// atomically; "-" writes to stdout.
func writeOutput(e *env, path string, fn func(w io.Writer) error) error {
	var buf bytes.Buffer
	if err := fn(&buf); err != nil {
		return err
	}
	if path == "-" || path == "" {
		_, err := e.stdout.Write(buf.Bytes())
		return err
	}
	return writeFileAtomic(path, buf.Bytes())
}

// loadFailed prints a failure to load the netlist, every problem on
// stderr as file:line:col: message, and reports whether err was one. Other
// pipeline failures are left to the command to word.
func loadFailed(e *env, path string, err error) bool {
	var pe *pipeline.Error
	if !errors.As(err, &pe) || pe.Phase != pipeline.PhaseLoad {
		return false
	}
	var list graph.ErrorList
	if errors.As(err, &list) {
		printErrors(e, "pare", path, err)
	} else {
		fmt.Fprintf(e.stderr, "pare: %v\n", err) // the OS error names the file
	}
	return true
}

// printErrors prints a positioned error list one problem a line, or a
// plain error with context.
func printErrors(e *env, who, path string, err error) {
	var list graph.ErrorList
	if errors.As(err, &list) {
		for _, x := range list {
			fmt.Fprintln(e.stderr, x.Error())
		}
		fmt.Fprintf(e.stderr, "%s: %d error(s)\n", path, len(list))
		return
	}
	fmt.Fprintf(e.stderr, "%s: %s: %v\n", who, path, err)
}

// splitRefs reads a comma-separated list such as --focus V1,C3 (blanks dropped).
func splitRefs(s string) []string {
	var out []string
	for _, f := range strings.Split(s, ",") {
		if f = strings.TrimSpace(f); f != "" {
			out = append(out, f)
		}
	}
	return out
}
