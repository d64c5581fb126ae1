package safety

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"pare/graph"
)

// repo is the repository root, where examples/ and testdata/ live.
const repo = "../.."

// inline netlists for the classes no file covers; each is the smallest
// circuit that carries the evidence.
const (
	// A passive band-pass with no rail declared: nothing says what
	// powers the set.
	passiveNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "10k", pins = ["out", "gnd"] }
`
	// A transistor stage on a 90 V rail: no valve, no mains, but above the
	// extra-low-voltage band.
	highRailNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 90 }
[parts]
C1 = { c = "10n", pins = ["in", "b"] }
Q1 = { bjt = "npn", pins = { b = "b", c = "out", e = "gnd" } }
R1 = { r = "10k", pins = ["vcc", "out"] }
R2 = { r = "1M", pins = ["vcc", "b"] }
`
	// Two valves with their heaters in series and nothing else: the chain
	// alone says the set is fed from the mains without a transformer.
	chainNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "out", g1 = "g", k = "gnd", h1 = "h0", h2 = "h1" } }
V2 = { valve = "triode", pins = { a = "out", g1 = "g", k = "gnd", h1 = "h1", h2 = "gnd" } }
`
	// The same two valves with their heaters in parallel on one winding:
	// a valve set, not an AC/DC one.
	parallelNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "out", g1 = "g", k = "gnd", h1 = "hx", h2 = "hy" } }
V2 = { valve = "triode", pins = { a = "out", g1 = "g", k = "gnd", h1 = "hx", h2 = "hy" } }
`
	// A mains port whose label names the transformer beyond the sheet's
	// cut: mains, but not live-chassis.
	offSheetNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[nets]
vcc = { role = "supply", volts = 12 }
[parts]
P1 = { port = "6 V from the mains transformer", pins = ["hx"] }
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "10k", pins = ["vcc", "out"] }
R2 = { r = "10k", pins = ["hx", "gnd"] }
`
	// The mains comes in through a fuse and the double-pole on/off switch
	// before it reaches the transformer's primary: a transformer set, the
	// switch and the fuse pass the mains on (common practice).
	switchedNet = `band = "1k..10k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
P1 = { port = "230 V mains, line", pins = ["mains_l"] }
P2 = { port = "230 V mains, neutral", pins = ["mains_n"] }
F1 = { part = "fuse 1 A", pins = { a = "mains_l", b = "fused" } }
S1 = { switch = 2, set = 2, closes = ["", "c-1 d-2"], pins = { c = "fused", "1" = "pri_l", d = "mains_n", "2" = "pri_n" } }
T1 = { windings = { p = "10", s = "100m" }, k = 0.98, pins = { p1 = "pri_l", p2 = "pri_n", s1 = "s1", s2 = "gnd" } }
C1 = { c = "10n", pins = ["in", "out"] }
R1 = { r = "10k", pins = ["ht", "out"] }
`
)

// TestAssess: the class of every example and fixture, and of the inline
// circuits above, with the piece of evidence that decided it. The classes
// follow the trade's usual split (common practice): valves or anything on
// the mains is lethal; no mains transformer means a possibly live chassis;
// a set whose rails all sit in the extra-low-voltage band (IEC 60449 band
// I, 50 V) is a battery set.
func TestAssess(t *testing.T) {
	for _, tc := range []struct {
		name, file, text string
		want             Class
		because          string // a piece of the evidence
	}{
		{name: "valve frequency changer", file: "examples/frequency-changer.toml", want: MainsHT, because: "valve V1"},
		{name: "valve IF strip", file: "examples/if-detector-audio.toml", want: MainsHT, because: "rail above 50 V: ht 250 V"},
		{name: "9 V transistor portable", file: "examples/transistor-front-end.toml", want: Battery, because: "vcc 9 V"},
		{name: "AC/DC output stage", file: "testdata/safety/acdc-output.toml", want: LiveChassis, because: "series heaters: V1–V2"},
		{name: "AC/DC rectifier on the mains", file: "testdata/safety/acdc-output.toml", want: LiveChassis, because: "rectifier on the mains: V2"},
		{name: "mains transistor amplifier", file: "testdata/safety/mains-transistor.toml", want: MainsHT, because: "mains transformer T1"},
		{name: "kitchen-sink fixture", file: "testdata/good/every-kind.toml", want: MainsHT, because: "valves V1a"},
		{name: "no rail declared", text: passiveNet, want: Unknown},
		{name: "transistor on 90 V", text: highRailNet, want: MainsHT, because: "vcc 90 V"},
		{name: "series heaters alone", text: chainNet, want: LiveChassis, because: "series heaters: V1–V2"},
		{name: "heater chain declared", text: strings.Replace(parallelNet, "[parts]", "[nets]\nhx = { role = \"heater\", volts = 120 }\n[parts]", 1),
			want: LiveChassis, because: "heater net hx at 120 V"},
		{name: "parallel heaters", text: parallelNet, want: MainsHT, because: "valves V1, V2"},
		{name: "transformer off the sheet", text: offSheetNet, want: MainsHT, because: "mains transformer off the sheet (P1)"},
		{name: "mains through a fuse and a switch", text: switchedNet, want: MainsHT, because: "mains transformer T1"},
		// Near miss: the neutral contact lifted and a lamp, not a fuse, in
		// the line: nothing carries the mains to T1.
		{name: "mains stopped by a lamp", text: strings.NewReplacer(`d = "mains_n"`, `d = "nc"`, `"fuse 1 A"`, `"dial lamp"`).Replace(switchedNet),
			want: LiveChassis, because: "mains inputs"},
		// review19 b04: an 18 V transistor output stage whose netlist note
		// says the rail comes from a mains transformer in the set, off this
		// sheet: the mains caution, not the battery one (README "Safety").
		{name: "mains transformer named in the note", file: "testdata/review19/b04.toml", want: MainsHT, because: "mains transformer off the sheet (the netlist's note)"},
		{name: "mains transformer named in the title", text: "title = \"Mains transformer set, output stage\"\n" + strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1),
			want: MainsHT, because: "mains transformer off the sheet (the title)"},
		// Near misses: a note that denies the transformer, or speaks of a
		// transformer without the mains, leaves a 12 V set a battery set.
		{name: "note denies a mains transformer", text: "note = \"Battery set: no mains transformer, no mains input.\"\n" + strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1),
			want: Battery, because: "vcc 12 V"},
		{name: "note names a mains adaptor", text: "note = \"Battery set, also run from a 12 V mains adaptor.\"\n" + strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1),
			want: Battery, because: "vcc 12 V"},
		{name: "note names a transformer, not the mains", text: "note = \"The output transformer is a 1k:8 type.\"\n" + strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1),
			want: Battery, because: "vcc 12 V"},
		{name: "the whole club receiver", file: "examples/club-receiver.toml", want: MainsHT, because: "mains transformer T9"},
		// review20 b01: a 12 V bench VFO whose port says "+12 V from the
		// supply board" got "never short the battery". A low-voltage
		// circuit whose port or rail names the supply it comes from, and
		// nothing a battery, gets the outside-supply caution.
		{name: "VFO fed from a supply board", file: "testdata/review20/b01.toml", want: OutsideSupply, because: "fed from outside by P1"},
		// review24 d01: "+12 V from the mains unit" on a transistor
		// oscillator's supply port got the live-chassis caution.
		{name: "rail from a mains unit", text: strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1) + "P9 = { port = \"+12 V from the mains unit\", pins = [\"vcc\"] }\n",
			want: OutsideSupply, because: "P9"},
		{name: "rail from a bench PSU", text: strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1) + "P9 = { port = \"+12 V bench PSU\", pins = [\"vcc\"] }\n",
			want: OutsideSupply, because: "P9"},
		// Near misses: the bare word "supply", or a battery named beside
		// an adaptor, leaves a battery set a battery set.
		{name: "bare supply word", text: strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1) + "P9 = { port = \"+12 V supply\", pins = [\"vcc\"] }\n",
			want: Battery, because: "vcc 12 V"},
		{name: "battery beside an adaptor", text: strings.Replace(offSheetNet, "6 V from the mains transformer", "6 V heater", 1) + "P9 = { port = \"+12 V battery or adaptor\", pins = [\"vcc\"] }\n",
			want: Battery, because: "vcc 12 V"},
		// A valve set whose HT rail is called a battery and nothing comes
		// from the mains: the battery valve caution, not the mains one.
		{name: "battery valve portable", file: "testdata/good/review17-battery.toml", want: BatteryValve, because: "battery sources: B1, B2, net ht"},
		{name: "battery valve strip", text: strings.Replace(parallelNet, "[parts]", "[nets]\nht = { role = \"supply\", volts = 90, label = \"HT battery\" }\n[parts]", 1),
			want: BatteryValve, because: "no mains input, mains transformer or rectifier"},
		// Near misses: a battery named but a mains transformer (a mains /
		// battery set) or a rectifier on the HT: the mains caution stays.
		{name: "battery named beside a mains transformer", text: strings.NewReplacer("[nets]\n", "[nets]\nlt = { role = \"heater\", volts = 1.4, label = \"LT cell\" }\n",
			"[parts]\n", "[parts]\nV1 = { valve = \"triode\", pins = { a = \"out\", g1 = \"in\", k = \"gnd\", h1 = \"lt\", h2 = \"gnd\" } }\n").Replace(switchedNet),
			want: MainsHT, because: "mains transformer T1"},
		{name: "battery named, AC/DC chain", text: strings.Replace(chainNet, "[parts]", "[nets]\nht = { role = \"supply\", volts = 90, label = \"HT battery\" }\n[parts]", 1),
			want: LiveChassis, because: "series heaters"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := caseCircuit(t, tc.file, tc.name, tc.text)
			a := Assess(c)
			if a.Class != tc.want {
				t.Fatalf("class %s, want %s (evidence %q)", a.Class, tc.want, a.Evidence)
			}
			if tc.because != "" && !strings.Contains(strings.Join(a.Evidence, "; "), tc.because) {
				t.Errorf("evidence %q lacks %q", a.Evidence, tc.because)
			}
			if tc.want == Unknown && len(a.Evidence) != 0 {
				t.Errorf("unknown class with evidence %q", a.Evidence)
			}
		})
	}
}

// TestMainsWords: which labels bring the mains in. A public supply is
// 100–250 V AC (common practice); a 6.3 V heater winding is not the mains.
func TestMainsWords(t *testing.T) {
	for _, tc := range []struct {
		s    string
		want bool
	}{
		{"230 V~ mains, live", true},
		{"mains_l", true},
		{"240 V AC in", true},
		{"120VAC", true},
		{"6.3 V~", false},
		{"HT +250 V from power supply", false}, // DC, not an AC supply
		{"remains of the chassis", false},      // a word that only contains "mains"
		// a low DC voltage a mains unit makes is fed in, not the mains
		// (common practice: a bench unit's output is isolated low voltage)
		{"+12 V from the mains unit", false},
		{"9V mains adaptor", false},
		{"230 V~ to the mains unit", true},
		{"+250 V from the mains unit", true},
		{"mains unit", true},
		{"", false},
	} {
		if got := saysMains(tc.s); got != tc.want {
			t.Errorf("saysMains(%q) = %v, want %v", tc.s, got, tc.want)
		}
	}
}

// TestCautionTexts: every class's caution defers to local codes and
// licensed practice, says the reduced diagram is small-signal only where a
// reduced or modelled output goes with it, and the battery caution names
// the rail it read.
func TestCautionTexts(t *testing.T) {
	for _, a := range []Assessment{
		{Class: Unknown}, {Class: Battery, MaxVolts: 9}, {Class: MainsHT, MaxVolts: 250, Valves: 2},
		{Class: MainsHT, MaxVolts: 24}, {Class: LiveChassis}, {Class: OutsideSupply, MaxVolts: 12},
	} {
		c := a.Caution()
		all := []string{c.Heading, strings.Join(c.Lines, " "), c.Sheet(false), c.Sheet(true)}
		for o := ReduceLog; o <= SweepModel; o++ {
			all = append(all, c.Report(o))
		}
		for i, s := range all {
			if i > 0 && !strings.Contains(s, "local") || i > 0 && !strings.Contains(s, "licensed practice") {
				t.Errorf("%s: text %d does not defer to local codes and licensed practice: %q", a.Class, i, s)
			}
			if strings.Contains(s, "{volts}") {
				t.Errorf("%s: placeholder left in %q", a.Class, s)
			}
		}
		if !strings.Contains(c.Lines[len(c.Lines)-1], "small-signal only") || !strings.Contains(c.Sheet(true), "Small-signal only") ||
			strings.Contains(c.Sheet(false), "Small-signal") {
			t.Errorf("%s: the small-signal warning is missing or on a full sheet", a.Class)
		}
		for o := ReduceLog; o <= SweepModel; o++ {
			if !strings.Contains(strings.ToLower(c.Report(o)), "small-signal") {
				t.Errorf("%s: report %d does not say small-signal", a.Class, o)
			}
		}
		// The isolation transformer and the live chassis only where the
		// netlist shows (LiveChassis) or cannot rule out (Unknown) a mains
		// input without a mains transformer: the README's rule. Failed
		// before: the mains/HT class carried the AC/DC line on every
		// valve set.
		mayBeLive := a.Class == LiveChassis || a.Class == Unknown
		if mayBeLive && !strings.Contains(c.Sheet(false), "isolation transformer") {
			t.Errorf("%s: a set that may be on the mains needs the isolation transformer on its sheet", a.Class)
		}
		if !mayBeLive {
			for i, s := range append(all, c.Lines...) {
				if liveWord.MatchString(s) || strings.Contains(s, "AC/DC") {
					t.Errorf("%s: text %d speaks of a live chassis the netlist does not show: %q", a.Class, i, s)
				}
			}
		}
	}
	if s := (Assessment{Class: Battery, MaxVolts: 9}).Caution().Sheet(false); !strings.Contains(s, "battery set (9 V)") {
		t.Errorf("battery sheet caution does not name the rail: %q", s)
	}
	if b := (Assessment{Class: Unknown}).Caution().Basis(); !strings.Contains(b, "cannot tell") {
		t.Errorf("unknown basis %q", b)
	}
}

// TestReadingsCaution: the caution above a voltage chart opens with the
// live-set line and keeps the class's lines, but not the line about the
// reduced diagram, which a chart of the whole set is not (common practice).
func TestReadingsCaution(t *testing.T) {
	for _, a := range []Assessment{{Class: MainsHT}, {Class: Battery, MaxVolts: 9}, {Class: LiveChassis}, {Class: Unknown}, {Class: OutsideSupply, MaxVolts: 12}} {
		c := a.Caution()
		readLine := liveLine
		if a.Class == OutsideSupply {
			readLine = supplyLiveLine
			for _, l := range append(c.Readings(), c.Sheet(false), c.Heading) {
				if strings.Contains(l, "battery connected") || strings.Contains(l, "never short the battery") {
					t.Errorf("outside-supply text %q speaks as if the set had its own battery", l)
				}
			}
		}
		if a.Class == Battery {
			// Failed before: a battery set's chart told the reader to
			// clip to chassis and probe one-handed, the mains-HT wording.
			readLine = batteryLiveLine
			if r := c.Readings()[0]; strings.Contains(r, "one hand") || !strings.Contains(r, "battery connected") {
				t.Errorf("battery chart line %q: want the set on with its battery, no mains-HT wording", r)
			}
		}
		// The alignment guide is worked on a live set too (common practice).
		for first, r := range map[string][]string{readLine: c.Readings(), alignLine: c.Alignment()} {
			if r[0] != first {
				t.Errorf("class %v: first line %q, want %q", a.Class, r[0], first)
			}
			if len(r) != len(c.Lines) {
				t.Errorf("class %v: %d lines, want %d (the class's lines less the small-signal one, plus the live-set one)", a.Class, len(r), len(c.Lines))
			}
			for _, l := range r {
				if l == smallSignalLine {
					t.Errorf("class %v: the small-signal line does not belong above a DC chart or an alignment guide", a.Class)
				}
			}
		}
	}
}

// liveWord finds "live" as a word (not inside "deliver").
var liveWord = regexp.MustCompile(`(?i)\blive\b`)

// TestHotHeaterWinding: a heater winding with an end on the HT (a directly
// heated rectifier's filament is its cathode) gets its own caution line,
// and only then (common practice: technicians are warned that the
// rectifier's filament winding sits at the full HT; docs/references.md §9).
func TestHotHeaterWinding(t *testing.T) {
	direct, err := os.ReadFile(filepath.Join(repo, "graph/dc/testdata/rectifier-direct.toml"))
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, text string
		want       string // the winding named, "" for none
	}{
		{"directly heated rectifier", string(direct), "T1 winding r, V1's heater, on ht"},
		{"directly heated, HT declared", strings.Replace(string(direct), `role = "supply",`, `role = "supply", volts = 300,`, 1), "T1 winding r, V1's heater, on ht"},
		// Near miss: the same rectifier indirectly heated from the 6.3 V
		// winding returned to chassis: no winding at HT.
		{"indirectly heated rectifier", strings.Replace(string(direct), `h1 = "ht", h2 = "fil"`, `h1 = "hx", h2 = "gnd"`, 1), ""},
		// Near miss: valves heated from a chassis-returned winding, a
		// semiconductor rectifier.
		{"heaters to chassis", parallelNet, ""},
		// review21 a04: the rectifier's reservoir is not declared (pare
		// estimates it), so the valve diode was not taken for a rectifier
		// and the line went missing; its anodes on a mains transformer's
		// winding make it one.
		{"reservoir not declared", "file:../../testdata/review21/a04.toml", "T2 winding r, V5's heater, on ht_res"},
		// Near miss: the output transformer's primary on that same HT has
		// the rectifier's filament on one end only: no heater winding.
		{"primary on the hot line", "file:../../testdata/review17/b05.toml", "T6 winding r, V5's heater, on ht_res"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if f, ok := strings.CutPrefix(tc.text, "file:"); ok {
				b, err := os.ReadFile(f)
				if err != nil {
					t.Fatal(err)
				}
				tc.text = string(b)
			}
			c, err := graph.Parse(tc.name+".toml", []byte(tc.text))
			if err != nil {
				t.Fatal(err)
			}
			ca := For(c)
			lines := strings.Join(ca.Lines, "\n")
			has := strings.Contains(lines, "sits at the full HT")
			if tc.want == "" {
				if has || len(ca.HotHeaters) > 0 {
					t.Errorf("caution speaks of a heater winding at HT: %q", ca.HotHeaters)
				}
				return
			}
			if !has || !strings.Contains(lines, tc.want) {
				t.Errorf("caution lines lack the heater winding at HT %q:\n%s", tc.want, lines)
			}
			if len(ca.HotHeaters) != 1 {
				t.Errorf("heater windings at HT %q, want only %q", ca.HotHeaters, tc.want)
			}
			if !strings.Contains(lines, "licensed practice") {
				t.Errorf("caution no longer defers to licensed practice")
			}
		})
	}
}

// TestCautionFitsTheSet: the caution speaks of what the set has. A
// transistor set run from a mains transformer (the review's 16 V set,
// testdata/review13/b05.toml) got the valve set's "mains and valve HT can
// kill … HT typically 200–400 V": its mains side is the danger, its rails
// are not HT. Valve HT only where there are valves; the mains side where
// the netlist shows a mains input (common practice; docs/references.md §9).
func TestCautionFitsTheSet(t *testing.T) {
	valveWords := regexp.MustCompile(`(?i)\bvalve|\bHT\b|200–400`)
	for _, tc := range []struct {
		name, file, text string
		mains, valveHT   bool
	}{
		{name: "mains transistor set", file: "testdata/review13/b05.toml", mains: true},
		{name: "mains transistor amplifier", file: "testdata/safety/mains-transistor.toml", mains: true},
		{name: "transistor on 90 V", text: highRailNet},
		{name: "valve set", file: "examples/frequency-changer.toml", valveHT: true},
		{name: "mains valve set", file: "examples/club-receiver.toml", mains: true, valveHT: true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c := caseCircuit(t, tc.file, tc.name, tc.text)
			ca := For(c)
			all := []string{ca.Heading, ca.Sheet(false), ca.Report(SweepModel)}
			all = append(all, ca.Lines...)
			text := strings.Join(all, "\n")
			if got := valveWords.MatchString(text); got != tc.valveHT {
				t.Errorf("speaks of valve HT: %v, want %v\n%s", got, tc.valveHT, text)
			}
			if tc.valveHT {
				return // the valve set's own text, held by TestCautionTexts
			}
			if got := strings.Contains(text, "mains transformer's primary"); got != tc.mains {
				t.Errorf("names the mains side: %v, want %v\n%s", got, tc.mains, text)
			}
			if !tc.mains && strings.Contains(strings.ToLower(ca.Heading+ca.Sheet(false)), "mains") {
				t.Errorf("a set with no mains input shown is cautioned about the mains:\n%s", text)
			}
		})
	}
}

// caseCircuit is a table case's circuit: the repository's file when one is
// named, else the case's own text.
func caseCircuit(t *testing.T, file, name, text string) *graph.Circuit {
	t.Helper()
	var c *graph.Circuit
	var err error
	if file != "" {
		c, err = graph.LoadFile(filepath.Join(repo, file))
	} else {
		c, err = graph.Parse(name+".toml", []byte(text))
	}
	if err != nil {
		t.Fatal(err)
	}
	return c
}
