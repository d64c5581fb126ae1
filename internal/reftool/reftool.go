// Package reftool finds the outside reference tools that pare's tests check
// against (ngspice, rsvg-convert, Chromium and pdftoppm, all Debian packages) and says
// what a missing one means: a skip on a developer's machine, a failure in
// CI, where .ci/run sets PARE_REQUIRE_NGSPICE and PARE_REQUIRE_TOOLS so that
// a green run always means the reference checks really ran.
package reftool

import (
	"bytes"
	"io"
	"os"
	"os/exec"
	"strings"
	"testing"
)

// Tool is one outside program and how to get it.
type Tool struct {
	Name    string   // for messages
	Paths   []string // absolute paths tried first
	Lookups []string // names looked up on PATH after that
	Env     string   // set (and not "0") means a missing tool fails the test
	Package string   // the Debian package that installs it
}

// The reference tools.
var (
	Ngspice = Tool{Name: "ngspice", Lookups: []string{"ngspice"}, Env: "PARE_REQUIRE_NGSPICE", Package: "ngspice"}
	Rsvg    = Tool{Name: "rsvg-convert", Lookups: []string{"rsvg-convert"}, Env: "PARE_REQUIRE_TOOLS", Package: "librsvg2-bin"}
	// Chromium: the binary under /usr/lib takes the headless flags directly.
	Chromium = Tool{Name: "chromium", Paths: []string{"/usr/lib/chromium/chromium", "/usr/bin/chromium"},
		Lookups: []string{"chromium"}, Env: "PARE_REQUIRE_TOOLS", Package: "chromium"}
	// Pdftoppm turns the pages of a PDF Chromium printed into images, so a
	// test can count them and look at each.
	Pdftoppm = Tool{Name: "pdftoppm", Lookups: []string{"pdftoppm"}, Env: "PARE_REQUIRE_TOOLS", Package: "poppler-utils"}
)

// Required reports whether the environment makes a missing tool a failure.
func (tl Tool) Required() bool {
	v := os.Getenv(tl.Env)
	return v != "" && v != "0"
}

// Find returns the tool's path, or skips the test (fails it when required).
func Find(t testing.TB, tl Tool) string {
	t.Helper()
	p := Lookup(t, tl)
	if p == "" {
		t.Skip(tl.missing() + "; reference check skipped")
	}
	return p
}

// Lookup returns the tool's path, or "" when it is missing and not
// required (it fails the test when required). It is for a test whose
// reference check is one part among others that must still run.
func Lookup(t testing.TB, tl Tool) string {
	t.Helper()
	for _, p := range tl.Paths {
		if st, err := os.Stat(p); err == nil && !st.IsDir() {
			return p
		}
	}
	for _, n := range tl.Lookups {
		if p, err := exec.LookPath(n); err == nil {
			return p
		}
	}
	if tl.Required() {
		t.Fatalf("%s (%s is set, so the reference check may not be skipped)", tl.missing(), tl.Env)
	}
	t.Log(tl.missing() + "; reference check left out")
	return ""
}

func (tl Tool) missing() string {
	return tl.Name + " not found; install the Debian package " + tl.Package
}

// RenderSVG runs rsvg-convert on an SVG file and fails the test when it
// rejects it; it checks that the file is well-formed enough for librsvg.
func RenderSVG(t testing.TB, file string) {
	t.Helper()
	cmd := exec.Command(Find(t, Rsvg), file)
	cmd.Stdout = io.Discard
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		t.Errorf("rsvg-convert %s: %v: %s", file, err, strings.TrimSpace(stderr.String()))
	}
}
