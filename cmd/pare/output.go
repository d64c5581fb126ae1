package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/internal/outfile"
	"pare/rules"
)

// writeOutput renders with fn into memory first, then writes the file
// through outfile (regular files only, links followed, synced, renamed
// over); "-" or "" writes to stdout. protect names files the output must not
// replace: the input netlist.
func writeOutput(e *env, path string, fn func(w io.Writer) error, protect ...string) error {
	var buf bytes.Buffer
	if err := fn(&buf); err != nil {
		return err
	}
	if path == "-" || path == "" {
		_, err := e.stdout.Write(buf.Bytes())
		return err
	}
	return outfile.WriteFile(path, buf.Bytes(), protect...)
}

// checkOutput refuses an output file before any work is done: a device, a
// pipe, a folder, a link to nothing, a read-only file or the input itself.
func checkOutput(e *env, who, path string, protect ...string) bool {
	if path == "" || path == "-" {
		return true
	}
	if _, err := outfile.Target(path, protect...); err != nil {
		fmt.Fprintf(e.stderr, "%s: %v\n", who, err)
		return false
	}
	return true
}

// internalError reports a failure that is pare's fault, not the input's,
// with its own exit code so that scripts can tell the two apart.
func internalError(e *env, who string, err error) int {
	msg := err.Error()
	if !strings.Contains(msg, "internal error") {
		msg = "internal error, please report: " + msg
	}
	fmt.Fprintf(e.stderr, "%s: %s\n", who, msg)
	return exitInternal
}

// isInternal tells pare's own failures (a rule that broke, a netlist the
// writer could not put back into text) from what the input caused.
func isInternal(err error) bool {
	return errors.Is(err, rules.ErrInternal) || errors.Is(err, graph.ErrWriter)
}

// reportErr prints a failure with printErrors and returns its exit code:
// exitInternal for pare's own failures, exitBad for everything the input or
// the command line caused.
func reportErr(e *env, who, path string, err error) int {
	if isInternal(err) {
		return internalError(e, who, err)
	}
	printErrors(e, who, path, err)
	return exitBad
}

// readInput reads a netlist the way the loader does (a regular file of
// bounded size).
func readInput(path string) ([]byte, error) { return graph.ReadFile(path) }

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
