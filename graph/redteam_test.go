package graph

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// Regression tests for the red-team defects of the loader and the writer
// (issue 14). Each case names its item; each failed before the fix.

// wantError parses src and wants its first message at line:col holding
// every one of the words. The columns below were counted by hand on the
// source lines: each points at the value (or, for a key that is wrong in
// itself, the key) the message is about.
func wantError(t *testing.T, name, src, at string, words ...string) {
	t.Helper()
	_, err := Parse("t.toml", []byte(src))
	if err == nil {
		t.Errorf("%s: accepted, want an error at %s", name, at)
		return
	}
	list, ok := err.(ErrorList)
	if !ok || len(list) == 0 {
		t.Errorf("%s: error %v is not a positioned list", name, err)
		return
	}
	got := list[0].Error()
	if !strings.HasPrefix(got, "t.toml:"+at+": ") {
		t.Errorf("%s: got %q, want it at t.toml:%s", name, got, at)
	}
	for _, w := range words {
		if !strings.Contains(got, w) {
			t.Errorf("%s: %q lacks %q", name, got, w)
		}
	}
	if strings.Contains(got, "\n") {
		t.Errorf("%s: message spans lines: %q", name, got)
	}
}

const head = "band = \"1k..2k\"\n[parts]\n"

// Item 12 and 13: every device parameter, winding and crystal value out of
// its physical range is refused at load, at its value, with exit-2 text;
// before, 72 of 1,248 such cases loaded and failed later (exit 1).
func TestParameterRanges(t *testing.T) {
	cases := []struct{ name, part, at, word string }{
		{"gm 0", `V1 = { valve = "triode", gm = 0, pins = { a = "a", g1 = "g", k = "gnd" } }`, "3:31", "gm must be above 0"},
		{"gm negative", `V1 = { valve = "triode", gm = "-2mA/V", pins = { a = "a", g1 = "g", k = "gnd" } }`, "3:31", "gm must be above 0"},
		{"mu 0", `V1 = { valve = "triode", mu = 0, pins = { a = "a", g1 = "g", k = "gnd" } }`, "3:31", "mu must be above 0"},
		{"ra negative", `V1 = { valve = "triode", ra = "-10k", pins = { a = "a", g1 = "g", k = "gnd" } }`, "3:31", "ra must be above 0"},
		{"beta 0", `Q1 = { bjt = "npn", beta = 0, pins = { b = "b", c = "c", e = "gnd" } }`, "3:28", "beta must be above 0"},
		{"ic negative", `Q1 = { bjt = "npn", ic = "-1m", pins = { b = "b", c = "c", e = "gnd" } }`, "3:26", "ic must be above 0"},
		{"ro 0", `Q1 = { bjt = "npn", ro = 0, pins = { b = "b", c = "c", e = "gnd" } }`, "3:26", "ro must be above 0"},
		{"FET rd negative", `J1 = { fet = "njfet", rd = "-50k", pins = { g = "g", d = "d", s = "gnd" } }`, "3:28", "rd must be above 0"},
		{"diode rd negative", `D1 = { diode = "signal", rd = -5, pins = ["a", "gnd"] }`, "3:31", "rd must be above 0"},
		{"crystal q negative", `X1 = { xtal = "1M", q = -50, pins = ["a", "gnd"] }`, "3:25", "q must be above 0"},
		{"crystal f 0", `X1 = { xtal = "0", pins = ["a", "gnd"] }`, "3:15", "frequency must be above 0"},
		{"winding l 0", `T1 = { windings = { p = "0", s = "1m" }, k = 0.1, pins = { p1 = "a", p2 = "gnd", s1 = "b", s2 = "gnd" } }`, "3:25", "inductance above 0"},
		{"winding l negative", `T1 = { windings = { p = { l = "-1m" }, s = "1m" }, k = 0.1, pins = { p1 = "a", p2 = "gnd", s1 = "b", s2 = "gnd" } }`, "3:25", "inductance above 0"},
		{"rating negative", `C1 = { c = "10n", rating = "-350V", pins = ["a", "gnd"] }`, "3:28", "rating must not be negative"},
		{"tap at the end", `L1 = { l = "100u", tap = 0.9999999999999999, pins = ["a", "t", "gnd"] }`, "3:26", "outside what pare reads"},
	}
	for _, c := range cases {
		wantError(t, c.name, head+c.part+"\n", c.at, c.word)
	}
	wantError(t, "IF negative", "band = \"1k..2k\"\n[freqs]\nif = \"-470k\"\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"gnd\"] }\n", "3:6", "frequency if must be above 0")
}

// Item 13: a pair given twice was summed (k 1.4 accepted), a winding
// coupled to itself and a set of k no transformer can have were accepted.
func TestCouplingChecks(t *testing.T) {
	const pins = `pins = { p1 = "a", p2 = "gnd", s1 = "b", s2 = "gnd", t1 = "c", t2 = "gnd" }`
	cases := []struct{ name, k, at, word string }{
		{"pair twice", `k = { "p-s" = 0.7, "s-p" = 0.7 }`, "3:72", "given twice"},
		{"self", `k = { "p-p" = 0.5, "p-s" = 0.5 }`, "3:59", "coupled to itself"},
		// k(p,s) = k(p,t) = 0.9 force s and t to share most of p's flux; k(s,t)
		// = 0 cannot then hold: the matrix [1 .9 .9; .9 1 0; .9 0 1] has the
		// eigenvalue 1 − 0.9·√2 < 0 (derived by hand).
		{"not realisable", `k = { "p-s" = 0.9, "p-t" = 0.9, "s-t" = 0.01 }`, "3:57", "cannot all hold at once"},
	}
	for _, c := range cases {
		src := head + `T1 = { windings = { p = "1m", s = "1m", t = "1m" }, ` + c.k + ", " + pins + " }\n"
		wantError(t, c.name, src, c.at, c.word)
	}
	// A real set passes: a tight three-winding transformer (all k 0.9,
	// eigenvalues 2.8, 0.1, 0.1).
	ok := head + `T1 = { windings = { p = "1m", s = "1m", t = "1m" }, k = 0.9, ` + pins + " }\n"
	if _, err := Parse("t.toml", []byte(ok)); err != nil {
		t.Errorf("a realisable transformer is refused: %v", err)
	}
}

// Item 14: the exponent's minus in "1e-9" was taken for a range's dash.
// Item 4: fmt wrote c = 1e-16 as "1e-16", which then did not load.
func TestExponentIsNoDash(t *testing.T) {
	for _, v := range []string{`"1e-9"`, `"1E-12"`, `1e-16`, `"2.2e-9F"`} {
		src := head + "C1 = { c = " + v + `, pins = ["a", "gnd"] }` + "\n"
		c, err := Parse("t.toml", []byte(src))
		if err != nil {
			t.Errorf("c = %s: %v", v, err)
			continue
		}
		if _, err := Marshal(c); err != nil {
			t.Errorf("c = %s does not round-trip: %v", v, err)
		}
	}
	wantError(t, "a real dash", head+`C1 = { c = "10p-365p", pins = ["a", "gnd"] }`+"\n", "3:12", `write a range with ".."`)
}

// Item 6: the writer re-sorted parts as text (C1, C10, C2) and dropped a
// [nets] entry that restates the default; it now keeps the typed order and
// every declared net.
func TestWriterKeepsOrderAndDeclarations(t *testing.T) {
	src := "band = \"1k..2k\"\n\n[nets]\ngnd = { role = \"ground\" }\n\n[parts]\n" +
		"C2 = { c = \"1n\", pins = [\"a\", \"gnd\"] }\nC10 = { c = \"1n\", pins = [\"a\", \"b\"] }\nC1 = { c = \"1n\", pins = [\"b\", \"gnd\"] }\n"
	c, err := Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	out, err := Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	if string(out) != src {
		t.Errorf("written\n%s\nwant the input back as it was\n%s", out, src)
	}
	// Parts pare made (no position) follow in natural order.
	c.Parts = append(c.Parts, &Part{Ref: "C11", Kind: Capacitor, Type: CapFixed}, &Part{Ref: "C3", Kind: Capacitor, Type: CapFixed})
	got := inSourceOrder(c.Parts, func(p *Part) (Pos, string) { return p.Pos, p.Ref })
	var refs []string
	for _, p := range got {
		refs = append(refs, p.Ref)
	}
	if strings.Join(refs, " ") != "C2 C10 C1 C3 C11" {
		t.Errorf("order %v, want C2 C10 C1 C3 C11", refs)
	}
}

// Item 9: deep nesting made the key scanner quadratic (200 KB of brackets:
// 48 s and 15 GB). It is refused at the first bracket too deep, at once.
func TestDeepNesting(t *testing.T) {
	// The 17th bracket is the first too deep: column 5 + 16 for arrays,
	// 5 + 16·3 for "{a=" (counted by hand).
	for _, c := range []struct{ name, value, at string }{
		{"arrays", strings.Repeat("[", 100000) + strings.Repeat("]", 100000), "2:21"},
		{"inline tables", strings.Repeat("{a=", 50000) + "1" + strings.Repeat("}", 50000), "2:53"},
	} {
		start := time.Now()
		wantError(t, c.name, "band = \"1k..2k\"\nx = "+c.value+"\n", c.at, "nest deeper than 16")
		if d := time.Since(start); d > 2*time.Second {
			t.Errorf("%s: took %v", c.name, d)
		}
	}
	// Brackets inside strings and comments do not count.
	src := head + `R1 = { r = "1k", pins = ["a", "gnd"], note = "` + strings.Repeat("[", 40) + `" } # ` + strings.Repeat("{", 40) + "\n"
	if _, err := Parse("t.toml", []byte(src)); err != nil {
		t.Errorf("brackets in a string refused: %v", err)
	}
}

// Item 11 and the limits: a device, a pipe or a folder is refused before it
// is read (/dev/zero filled memory, a FIFO hung); so are too many parts and
// too many terminals on one net, at the first entry past the limit.
func TestInputLimits(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "fifo.toml")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ path, want string }{
		{"/dev/zero", "is a device"},
		{fifo, "is a named pipe"},
		{dir, "is a folder"},
	} {
		done := make(chan error, 1)
		go func() { _, err := LoadFile(c.path); done <- err }()
		select {
		case err := <-done:
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("%s: got %v, want %q", c.path, err, c.want)
			}
		case <-time.After(5 * time.Second):
			t.Fatalf("%s: still reading after 5 s", c.path)
		}
	}
	var b strings.Builder
	b.WriteString(head)
	for i := 1; i <= MaxParts+1; i++ {
		b.WriteString("R" + itoa(i) + " = { r = \"1k\", pins = [\"n" + itoa(i) + "\", \"gnd\"] }\n")
	}
	_, err := Parse("t.toml", []byte(b.String()))
	if err == nil || !strings.Contains(err.Error(), "more than 20000 parts") {
		t.Errorf("too many parts: got %.200v", err)
	}
	// The first terminal past the limit on one net is named (here all on
	// "bus" and gnd, so gnd goes past the limit first in reference order).
	if err == nil || !strings.Contains(err.Error(), "terminals") {
		t.Errorf("too many terminals on gnd: got %.200v", err)
	}
	big := filepath.Join(dir, "big.toml")
	os.WriteFile(big, make([]byte, MaxFileSize+1), 0o644)
	if _, err := LoadFile(big); err == nil || !strings.Contains(err.Error(), "larger than 8 MiB") {
		t.Errorf("a file over the size limit: got %v", err)
	}
}

func itoa(i int) string {
	if i == 0 {
		return "0"
	}
	var d []byte
	for ; i > 0; i /= 10 {
		d = append([]byte{byte('0' + i%10)}, d...)
	}
	return string(d)
}

// Item 16: columns after invalid UTF-8 or a non-ASCII character at a line
// start, an unclosed header, duplicate parts in dotted headers and dotted
// keys; a message quoting a line break stays on one line.
func TestDecoderPositions(t *testing.T) {
	cases := []struct{ name, src, at, word string }{
		{"invalid UTF-8 at a line start", "band = \"1k..2k\"\n\xff = 1\n", "2:1", "invalid UTF-8"},
		{"µ at a line start", "band = \"1k..2k\"\nµ = 1\n", "2:1", "µ"},
		{"unclosed header", "band = \"1k..2k\"\n[parts\nR1 = 1\n", "2:7", "table name"},
		{"dotted header twice", head + "R9 = { r = \"1k\", pins = [\"a\", \"gnd\"] }\n[parts.R1]\nr = \"1k\"\n[parts.R1]\nr = \"2k\"\n", "6:8", "R1 is written twice"},
		{"dotted key twice", "band = \"1k..2k\"\nparts.R1.r = \"1k\"\nparts.R1.pins = [\"a\", \"gnd\"]\nparts.R1.r = \"2k\"\n", "4:7", "R1 is written twice"},
		{"break in a message", "band = \"1k..2k\"\nx = 0b\n", "2:5", `'0b\n'`},
	}
	for _, c := range cases {
		wantError(t, c.name, c.src, c.at, c.word)
	}
}

// Item 12 (end) and 18: a signal input or output on ground compares and
// drives nothing; it is refused at its place in the list.
func TestPortOnGround(t *testing.T) {
	wantError(t, "input on ground", "band = \"1k..2k\"\ninputs = [\"gnd\"]\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"gnd\"] }\n", "2:11", "input gnd is a ground net")
	wantError(t, "output on ground", "band = \"1k..2k\"\noutputs = [\"a\", \"gnd\"]\n[parts]\nR1 = { r = \"1k\", pins = [\"a\", \"gnd\"] }\n", "2:17", "output gnd is a ground net")
}

// A tapped winding written as one table with a list for l (a natural slip,
// met in a blind review) gets one message at l that spells out the accepted
// form, and no knock-on "no terminal pt" for the pin on the tap.
func TestTappedWindingSlip(t *testing.T) {
	src := head + `T1 = { windings = { p = { l = ["20u", "180u"], q = 90 }, s = "6u" }, k = 0.6, pins = { p1 = "a", pt = "b", p2 = "c", s1 = "d", s2 = "gnd" } }` + "\n"
	wantError(t, "tap slip", src, "3:31", `p = [{ l = "20u", q = 90 }, { l = "180u", q = 90 }]`, "pt")
	_, err := Parse("t.toml", []byte(src))
	if list, ok := err.(ErrorList); ok && len(list) != 1 {
		t.Errorf("tap slip: %d messages, want 1: %v", len(list), err)
	}
}
