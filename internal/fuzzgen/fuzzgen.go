// Package fuzzgen turns the bytes a fuzzer hands out into a netlist that
// loads more often than not: parts of every kind with plausible values, on
// a handful of nets, with titles, labels and notes drawn from a table of
// hostile text. Random bytes alone almost never make a netlist, so a fuzz
// target of the main job, the matcher or the drawer feeds them through
// here to reach the code past the loader. Used by tests only.
package fuzzgen

import (
	"fmt"
	"strings"
)

// Hostile is text a red-team run put into titles, labels and notes: escape
// sequences, bidi overrides, HTML, Markdown links, entities, line breaks,
// TOML and SVG metacharacters. Every sink must show it, never obey it.
var Hostile = []string{
	"plain title",
	"R&amp;D <b>bold</b> \"quoted\" 'single'",
	"\x1b[2J\x1b[31mred\x1b]0;pwn\x07",
	"abc\u202edcba \u2066iso\u2069 \u200fmark",
	"<img src=x onerror=alert(1)>",
	"[x](javascript:alert(1)) ![i](y.png)",
	"a`b\n\n<script>alert(1)</script>`",
	"- item\n# heading\n> quote\n1. one",
	"nul\x00 del\x7f c1\u0085 tab\t",
	"µΩ ±5 % – 4k7 \U0001F4FB",
	"]]> --> <!-- \\ \\\\ ${x} %s %d",
}

var (
	resistors  = []string{"10", "220", "1k", "4k7", "47k", "1M", "10M"}
	capacitors = []string{"10p", "100p", "2n2", "10n", "100n", "1u", "25u", "12p..365p"}
	inductors  = []string{"10u", "230u", "1m147", "10m", "10"}
	valves     = []string{"triode", "pentode", "heptode", "diode"}
)

type reader struct {
	data []byte
	i    int
}

// next returns the next byte, or 0 once the data is used up, so that any
// input, even an empty one, gives a netlist.
func (r *reader) next() int {
	if r.i >= len(r.data) {
		return 0
	}
	b := r.data[r.i]
	r.i++
	return int(b)
}

func (r *reader) pick(list []string) string { return list[r.next()%len(list)] }

// quote writes a TOML basic string (control characters as \u escapes).
func quote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, c := range s {
		switch {
		case c == '"' || c == '\\':
			b.WriteByte('\\')
			b.WriteRune(c)
		case c < 0x20 || c == 0x7f:
			fmt.Fprintf(&b, `\u%04X`, c)
		default:
			b.WriteRune(c)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// Netlist makes a netlist from data.
func Netlist(data []byte) string {
	r := &reader{data: data}
	nets := []string{"gnd", "ht"}
	for i := 1; i <= 2+r.next()%7; i++ {
		nets = append(nets, fmt.Sprintf("n%d", i))
	}
	sig := nets[2:]
	var b strings.Builder
	fmt.Fprintf(&b, "title = %s\n", quote(r.pick(Hostile)))
	fmt.Fprintf(&b, "band = %s\n", quote([]string{"20..20k", "530k..1.6M", "455k..485k"}[r.next()%3]))
	fmt.Fprintf(&b, "inputs = [%q]\noutputs = [%q]\n", sig[0], sig[len(sig)-1])
	fmt.Fprintf(&b, "[nets]\nht = { role = \"supply\", volts = 250, label = %s }\n", quote(r.pick(Hostile)))
	for _, n := range sig { // declared, so that the ends exist even when no part touches them
		fmt.Fprintf(&b, "%s = { label = %s }\n", n, quote(r.pick(Hostile)))
	}
	b.WriteString("[parts]\n")
	net := func() string { return nets[r.next()%len(nets)] }
	for i := 1; i <= 1+r.next()%20; i++ {
		b.WriteString(part(r, i, net))
		b.WriteByte('\n')
	}
	return b.String()
}

// part writes the i-th part, of a kind the next byte chooses.
func part(r *reader, i int, net func() string) string {
	note := ""
	if r.next()%4 == 0 {
		note = ", note = " + quote(r.pick(Hostile))
	}
	switch r.next() % 10 {
	case 0:
		return fmt.Sprintf("C%d = { c = %q, pins = [%q, %q], gang = %s%s }", i, r.pick(capacitors[7:]), net(), net(), quote(r.pick(Hostile)), note)
	case 1:
		return fmt.Sprintf("C%d = { c = %q, pins = [%q, %q]%s }", i, r.pick(capacitors[:7]), net(), net(), note)
	case 2:
		return fmt.Sprintf("L%d = { l = %q, pins = [%q, %q]%s }", i, r.pick(inductors), net(), net(), note)
	case 3:
		return fmt.Sprintf("T%d = { windings = { p = %q, s = %q }, k = 0.%d, pins = { p1 = %q, p2 = %q, s1 = %q, s2 = %q }%s }",
			i, r.pick(inductors), r.pick(inductors), 1+r.next()%9, net(), net(), net(), net(), note)
	case 4:
		typ := r.pick(valves)
		pins := fmt.Sprintf("a = %q, k = %q", net(), net())
		if typ != "diode" {
			pins += fmt.Sprintf(", g1 = %q", net())
		}
		if typ == "pentode" || typ == "heptode" {
			pins += fmt.Sprintf(", g2 = %q, g3 = %q", net(), net())
		}
		if typ == "heptode" {
			pins += fmt.Sprintf(", g4 = %q, g5 = %q", net(), net())
		}
		return fmt.Sprintf("V%d = { valve = %q, pins = { %s }%s }", i, typ, pins, note)
	case 5:
		return fmt.Sprintf("Q%d = { bjt = \"npn\", pins = { b = %q, c = %q, e = %q }%s }", i, net(), net(), net(), note)
	case 6:
		return fmt.Sprintf("D%d = { diode = \"signal\", pins = [%q, %q]%s }", i, net(), net(), note)
	case 7:
		return fmt.Sprintf("P%d = { port = %s, pins = [%q] }", i, quote(r.pick(Hostile)), net())
	case 8:
		return fmt.Sprintf("RV%d = { pot = %q, pins = [%q, %q, %q]%s }", i, r.pick(resistors), net(), net(), net(), note)
	}
	return fmt.Sprintf("R%d = { r = %q, pins = [%q, %q]%s }", i, r.pick(resistors), net(), net(), note)
}
