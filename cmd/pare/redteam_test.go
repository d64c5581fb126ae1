package main

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// Regression tests for the red-team defects seen from the command line
// (issue 14); the loader's and the matcher's have their own in graph and
// rules/stages. Each failed before its fix.

const redExample = "../../examples/frequency-changer.toml"

func copyExample(t *testing.T, dir, name string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := os.WriteFile(p, readBytes(t, redExample), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// Items 1, 2 and 5: reduce, draw and spice with -o on a device, a FIFO, the
// input (by name, by a link, by a hard link) are refused with exit 2 and
// nothing changes; a link to another file is followed and stays a link.
func TestOutputsOnlyToRegularFiles(t *testing.T) {
	dir := t.TempDir()
	in := copyExample(t, dir, "set.toml")
	fifo := filepath.Join(dir, "fifo")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.toml")
	os.Symlink("set.toml", link)
	hard := filepath.Join(dir, "hard.toml")
	os.Link(in, hard)
	for _, cmd := range []string{"reduce", "draw", "spice"} {
		for _, out := range []string{os.DevNull, fifo, in, link, hard, dir} {
			code, _, stderr := cliRun(t, cmd, in, "-o", out)
			if code != exitBad || !strings.Contains(stderr, "pare "+cmd+": ") {
				t.Errorf("%s -o %s: exit %d, stderr %q; want 2 and a refusal", cmd, out, code, stderr)
			}
		}
	}
	if st, _ := os.Lstat(fifo); st.Mode()&os.ModeNamedPipe == 0 {
		t.Error("the FIFO was replaced")
	}
	if st, _ := os.Lstat(os.DevNull); st.Mode()&os.ModeCharDevice == 0 {
		t.Fatal("the null device was replaced")
	}
	if got := readString(t, in); got != readString(t, redExample) {
		t.Error("the input changed")
	}
	// A link to a file that is not the input: written through, kept a link.
	target := filepath.Join(dir, "sheet.svg")
	os.WriteFile(target, []byte("old"), 0o644)
	svgLink := filepath.Join(dir, "sheet-link.svg")
	os.Symlink("sheet.svg", svgLink)
	if code, _, stderr := cliRun(t, "draw", in, "-o", svgLink, "--page", "none"); code != exitOK {
		t.Fatalf("draw through a link: exit %d %s", code, stderr)
	}
	if st, _ := os.Lstat(svgLink); st.Mode()&os.ModeSymlink == 0 {
		t.Error("draw replaced the link with a file")
	}
	if !strings.HasPrefix(readString(t, target), "<?xml") {
		t.Error("the link's target did not get the sheet")
	}
}

// Items 5 and 6: fmt on a link formats the target and keeps the link; fmt
// refuses a read-only file; and fmt keeps the typed order of the parts.
func TestFmtLinksReadOnlyOrder(t *testing.T) {
	dir := t.TempDir()
	src := "band = \"1k..2k\"\n[parts]\nC2  = { c = \"1n\", pins = [\"a\", \"gnd\"] }\nC10 = { c = \"1n\", pins = [\"a\", \"b\"] }\nC1 = { c = \"1n\", pins = [\"b\", \"gnd\"] }\n"
	want := "band = \"1k..2k\"\n\n[parts]\nC2 = { c = \"1n\", pins = [\"a\", \"gnd\"] }\nC10 = { c = \"1n\", pins = [\"a\", \"b\"] }\nC1 = { c = \"1n\", pins = [\"b\", \"gnd\"] }\n"
	target := filepath.Join(dir, "net.toml")
	os.WriteFile(target, []byte(src), 0o644)
	link := filepath.Join(dir, "link.toml")
	os.Symlink("net.toml", link)
	if code, _, stderr := cliRun(t, "fmt", link); code != exitOK {
		t.Fatalf("fmt link: exit %d %s", code, stderr)
	}
	if st, _ := os.Lstat(link); st.Mode()&os.ModeSymlink == 0 {
		t.Error("fmt replaced the link with a file")
	}
	if got := readString(t, target); got != want {
		t.Errorf("target:\n%s\nwant (typed order kept)\n%s", got, want)
	}
	ro := filepath.Join(dir, "ro.toml")
	os.WriteFile(ro, []byte(src), 0o444)
	code, _, stderr := cliRun(t, "fmt", ro)
	if code != exitBad || !strings.Contains(stderr, "read-only") || readString(t, ro) != src {
		t.Errorf("fmt on a read-only file: exit %d %q", code, stderr)
	}
}

// Item 3: a folder of results is replaced whole. A folder with files pare
// did not write is refused (the swap would drop them); the previous pack is
// there until the new one is complete (the kill test checks the rest).
func TestResultFolderWhole(t *testing.T) {
	dir := t.TempDir()
	in := copyExample(t, dir, "set.toml")
	out := filepath.Join(dir, "pack")
	if code, _, stderr := cliRun(t, in, "-o", out, "--no-verify"); code != exitOK {
		t.Fatalf("exit %d %s", code, stderr)
	}
	os.WriteFile(filepath.Join(out, "photo.jpg"), []byte("mine"), 0o644)
	code, _, stderr := cliRun(t, in, "-o", out, "--no-verify")
	if code != exitBad || !strings.Contains(stderr, "photo.jpg") {
		t.Errorf("a folder with a foreign file: exit %d %q", code, stderr)
	}
	if readString(t, filepath.Join(out, "photo.jpg")) != "mine" {
		t.Error("the user's file was touched")
	}
}

// Items 7 and 8: hostile text in the title, a gang name, a port label and
// the input file's own name reaches no sink raw: no escape sequence or RTL
// override on the terminal, in the note or on the sheets; no tag, link or
// entity in the note; "&amp;" shows as written.
func TestHostileTextEverySink(t *testing.T) {
	dir := t.TempDir()
	name := "set`\n\n<img src=x onerror=alert(1)>.toml"
	src := strings.NewReplacer(
		`title = "Club receiver: frequency changer (MW)"`, `title = "R&amp;D \u001b[2J\u001b[31mred\u001b]0;pwn\u0007 \u202Eevil"`,
		`gang = "tune"`, `gang = "tune\n\n<img src=x onerror=alert(1)>"`,
		`port = "from aerial coupling"`, `port = "[x](javascript:alert(1)) \u2066iso"`,
	).Replace(readString(t, redExample))
	in := filepath.Join(dir, name)
	if err := os.WriteFile(in, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "pack")
	code, stdout, stderr := cliRun(t, in, "-o", out, "--no-verify")
	if code != exitOK {
		t.Fatalf("exit %d\n%s", code, stderr)
	}
	hidden := func(sink, s string) {
		if strings.ContainsAny(s, "\x1b\x07\u202e\u2066") {
			t.Errorf("%s holds a raw control or bidi character", sink)
		}
	}
	hidden("stdout", stdout)
	hidden("stderr", stderr)
	note := readString(t, filepath.Join(out, fileNote))
	hidden("notes.md", note)
	for _, raw := range []string{"<img", "](javascript:", " &amp;"} {
		if outsideCodeSpan(note, raw) {
			t.Errorf("notes.md holds %q outside a code span", raw)
		}
	}
	if !strings.Contains(note, `R\&amp;D`) {
		t.Error(`notes.md does not show "&amp;" as written`)
	}
	page := readString(t, filepath.Join(out, fileNoteHTML))
	hidden("notes.html", page)
	checkHTMLText(t, page)
	for _, sheet := range packFiles(t, out) {
		if !strings.HasSuffix(sheet, ".svg") {
			continue
		}
		svg := readString(t, filepath.Join(out, sheet))
		hidden(sheet, svg)
		checkXML(t, []byte(svg))
		if !strings.Contains(svg, "R&amp;amp;D") || !strings.Contains(svg, `\u202eevil`) {
			t.Errorf("%s does not show the title as written, with the override as an escape", sheet)
		}
	}
}

// Item 11: check on a device or a FIFO answers at once with exit 2.
func TestCheckRefusesDevicesAndPipes(t *testing.T) {
	fifo := filepath.Join(t.TempDir(), "fifo.toml")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, p := range []string{"/dev/zero", fifo} {
		code, _, stderr := cliRun(t, "check", p)
		if code != exitBad || !strings.Contains(stderr, "regular files only") {
			t.Errorf("check %s: exit %d %q", p, code, stderr)
		}
	}
}

// Items 15, 17 and 19: positions, codes and messages.
func TestCodesAndMessages(t *testing.T) {
	dir := t.TempDir()
	in := copyExample(t, dir, "set.toml")
	cases := []struct {
		name string
		args []string
		code int
		want string
	}{
		{"--ratio NaN", []string{"reduce", in, "--ratio", "NaN"}, exitBad, "not a finite number"},
		{"--tol-db Inf", []string{in, "--tol-db", "Inf"}, exitBad, "not a finite number"},
		{"--at NaN", []string{"sweep", in, "--at", "NaN"}, exitBad, "--at"},
		{"sweep to ground", []string{"sweep", in, "--to", "gnd"}, exitBad, "ground net"},
		{"empty command", []string{""}, exitBad, "empty command"},
		{"root as output", []string{in, "-o", "/"}, exitBad, "root of the file system"},
		{"dangling link", []string{in, "-o", filepath.Join(dir, "dangling")}, exitBad, "which does not exist"},
	}
	os.Symlink("/nonexistent/pack", filepath.Join(dir, "dangling"))
	for _, c := range cases {
		code, _, stderr := cliRun(t, c.args...)
		if code != c.code || !strings.Contains(stderr, c.want) || strings.Contains(stderr, "did you mean") {
			t.Errorf("%s: exit %d, stderr %q; want %d and %q", c.name, code, stderr, c.code, c.want)
		}
	}
	// Flags of the whole job may come before the file.
	for _, args := range [][]string{{"--no-verify", in, "-o", filepath.Join(dir, "a")}, {"-o", filepath.Join(dir, "b"), "--no-verify", in}} {
		if code, _, stderr := cliRun(t, args...); code != exitOK {
			t.Errorf("%v: exit %d %q", args, code, stderr)
		}
	}
	// Nothing left after the reduction: positioned, exit 2.
	empty := filepath.Join(dir, "empty.toml")
	os.WriteFile(empty, []byte("band = \"20..20k\"\n[parts]\nV1 = { valve = \"pentode\", pins = { a = \"gnd\", g1 = \"gnd\", g2 = \"gnd\", g3 = \"gnd\", k = \"gnd\" } }\n"), 0o644)
	code, _, stderr := cliRun(t, "reduce", empty)
	if code != exitBad || !strings.Contains(stderr, empty+":1:1: nothing is left") {
		t.Errorf("nothing left: exit %d %q, want 2 and a line and column", code, stderr)
	}
}

// Item 18: an output on a rail compares nothing; the job says NOT VERIFIED
// and exits 1, never "Verification passed".
func TestOutputOnRailNotVerified(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "rail.toml")
	os.WriteFile(in, []byte(`band = "1k..10k"
inputs = ["in"]
outputs = ["ht"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
R1 = { r = "10k", pins = ["in", "a"] }
C1 = { c = "10n", pins = ["a", "gnd"] }
R2 = { r = "1k", pins = ["a", "ht"] }
`), 0o644)
	out := filepath.Join(dir, "pack")
	code, stdout, _ := cliRun(t, in, "-o", out)
	note := readString(t, filepath.Join(out, fileNote))
	// The verdict is "Not verified" (the rail) or, when nothing else was
	// comparable either, "proved nothing"; never a pass.
	unproven := strings.Contains(note, "**Not verified**") || strings.Contains(note, "**Verification proved nothing**")
	if code != exitFound || !strings.Contains(stdout, "NOT VERIFIED") || strings.Contains(note, "Verification passed") || !unproven {
		t.Errorf("exit %d, summary %q; note verdict wrong", code, stdout)
	}
	if code, stdout, _ := cliRun(t, "verify", in); code != exitFound || !strings.Contains(stdout, "NOT VERIFIED") {
		t.Errorf("verify: exit %d %q", code, stdout)
	}
}

// outsideCodeSpan reports whether s occurs in the Markdown text md where it
// would be read as markup: not inside a code span on its own line (an even
// number of backticks before it on the line means it is outside).
func outsideCodeSpan(md, s string) bool {
	for _, line := range strings.Split(md, "\n") {
		for i := 0; ; {
			j := strings.Index(line[i:], s)
			if j < 0 {
				break
			}
			at := i + j
			if strings.Count(line[:at], "`")%2 == 0 {
				return true
			}
			i = at + len(s)
		}
	}
	return false
}
