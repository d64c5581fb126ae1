package note

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"pare/graph/ac"
	"pare/graph/safety"
)

// sampleNote is a hand-made note of the kind the main job writes for the
// club's frequency changer; the numbers in it are only text to the writer.
func sampleNote() *Note {
	return &Note{
		Title: "Club receiver: frequency changer (MW)", Source: "frequency-changer.toml", Version: "0.1.0",
		Level: "signal", Symbols: "IEC 60617",
		Furniture: []string{"Band 530 kHz–1.6 MHz", "IF 470 kHz", "Level signal"},
		Sheets:    []Sheet{{File: "reduced.svg", Alt: "reduced"}, {File: "faded.svg", Alt: "faded"}},
		Before:    PartCount{26, 15}, After: PartCount{14, 8},
		Removed: []string{"C6", "C9", "P4"},
		Merged:  []Merge{{Into: "C3", From: []string{"C3", "TC2"}}},
		Stages: []Stage{{
			Name: "S1", Title: "Hartley oscillator, cathode tap (valve)", Topology: "hartley-cathode-tap", Family: "valve",
			Parts:   []string{"L1", "V1", "C2"},
			Figures: "f 1 MHz–2.07 MHz, gain |A| 3",
			Flags:   []string{"grid-leak bias"},
		}},
		Steps: []Step{
			{N: 1, Rule: "bypass", Removed: []string{"C6"}, Grounded: []string{"ht_if"},
				Why: "|Xc| = 3.39 Ω at 470 kHz ≤ 0.1·|Z| (R2 2k2)", Where: []Place{{"C6", "frequency-changer.toml:39"}}},
			{N: 2, Rule: "merge_parallel", Merged: []string{"C3", "TC2"}, Result: "C3",
				Why: "parallel capacitors add", Refused: "transfer aerial→if_out off by 0.8 dB at 1.6 MHz",
				Where: []Place{{"C3", "frequency-changer.toml:37"}, {"TC2", "frequency-changer.toml:55"}, {"C20", ""}}},
		},
		NearMisses: []Step{{Rule: "bypass", Why: "C10 is not a bypass at 20 Hz: |Xc| = 796 kΩ > 0.1·|Z|",
			Where: []Place{{"C10", "if-detector-audio.toml:40"}}}},
		Caution: valveCaution(),
		Verify: Verify{OK: true, TolDB: 0.5, TolDeg: 5, Pairs: []Pair{
			{From: "aerial", To: "if_out", What: "transfer", MaxDB: 0.12, MaxDeg: 1.3, AtHz: 1.6e6, Setting: "max", Bands: "520 kHz–1.6 MHz"},
		}},
	}
}

// valveCaution is the caution graph/safety words for a valve set with a
// 250 V rail, as the main job hands it to the note.
func valveCaution() Caution {
	c := safety.Assessment{Class: safety.MainsHT, MaxVolts: 250, Valves: 1, Evidence: []string{"valves V1"}}.Caution()
	return Caution{Heading: c.Heading, Lines: c.Lines, Basis: c.Basis()}
}

func writeToString(t *testing.T, n *Note) string {
	t.Helper()
	var b bytes.Buffer
	if err := Write(&b, n); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

func TestNoteSections(t *testing.T) {
	md := writeToString(t, sampleNote())
	cautionHeading := valveCaution().Heading
	// Each line must appear verbatim: the caution wording comes from the
	// project's safety list (docs/references.md §9, common practice), the rest
	// is the note's own layout.
	for _, want := range []string{
		"# Repair note: Club receiver: frequency changer (MW)",
		"> **" + cautionHeading + "**",
		"200–400 V DC",
		"Discharge them through a resistor and confirm with a meter",
		"treat it as lethal", // a transformer set: no live-chassis line (graph/safety)
		"local electrical codes and licensed practice",
		"small-signal only",
		"> *Chosen from the netlist: valves V1.*",
		"![reduced](reduced.svg)",
		"![faded](faded.svg)",
		"| stage | what | family | parts | figures | flags |",
		"| S1 | Hartley oscillator, cathode tap (valve) (`hartley-cathode-tap`) | valve | `L1`, `V1`, `C2` | f 1 MHz–2.07 MHz, gain \\|A\\| 3 | grid-leak bias |",
		"| original | 26 | 15 |",
		"| reduced | 14 | 8 |",
		"Removed (drawn faded on the faded sheet): `C6`, `C9`, `P4`.",
		"- `C3` stands for `C3`, `TC2`",
		"2 step(s): 1 applied, 1 refused by the AC check.",
		"1. **bypass**: removed `C6`; grounded `ht_if`. |Xc| = 3.39 Ω at 470 kHz ≤ 0.1·|Z| (R2 2k2) (`C6` at `frequency-changer.toml:39`)",
		"2. **merge_parallel** REFUSED: merged `C3`, `TC2` into `C3`. parallel capacitors add. Not applied: transfer aerial→if_out off by 0.8 dB at 1.6 MHz. (`C3` at `frequency-changer.toml:37`, `TC2` at `frequency-changer.toml:55`, `C20`)",
		"Near misses: candidates a numeric guard turned down",
		"- **bypass**: C10 is not a bypass at 20 Hz: |Xc| = 796 kΩ \\> 0.1·|Z| (`C10` at `if-detector-audio.toml:40`)",
		"**Verification passed**",
		"| `V(if_out)/V(aerial)` | transfer | 520 kHz–1.6 MHz | 0.12 | 1.3 | 1.6 MHz | max | ok |", // what each pair was swept over
		"what was not compared is said below the table",
	} {
		if !strings.Contains(md, want) {
			t.Errorf("note lacks %q\n--- note ---\n%s", want, md)
		}
	}
	// The caution comes before anything technical: a reader who stops early
	// has still read it.
	if c, s := strings.Index(md, cautionHeading), strings.Index(md, "## Stages"); c < 0 || s < 0 || c > s {
		t.Errorf("caution (at %d) must come before the stage table (at %d)", c, s)
	}
}

func TestNoteVerification(t *testing.T) {
	tests := []struct {
		name   string
		verify Verify
		want   []string
		failed bool
	}{
		{"passed", Verify{OK: true, TolDB: 0.5, TolDeg: 5, Pairs: []Pair{{From: "a", To: "b", What: "transfer", MaxDB: 0.1, MaxDeg: 1, AtHz: 1e3}}},
			[]string{"**Verification passed**", "**Passed** against a tolerance of 0.5 dB and 5°", "| 1 kHz | – | ok |"}, false},
		{"one pair out", Verify{OK: false, TolDB: 0.5, TolDeg: 5, Pairs: []Pair{
			{From: "a", To: "b", What: "transfer", MaxDB: 0.1, MaxDeg: 1, AtHz: 1e3},
			{From: "a", To: "a", What: "impedance", MaxDB: 2.25, MaxDeg: 1, AtHz: 455e3},
			{From: "b", To: "b", What: "impedance", Error: "singular matrix"}},
			Notes: []string{"port p3 has no ground return"}},
			[]string{"**Verification FAILED**: the reduced circuit does not match", "**Failed** against a tolerance", "| 2.25 | 1 | 455 kHz | – | **out of tolerance** |",
				"| 0.1 | 1 | 1 kHz | – | ok |", "| – | – | – | – | **not solved**: singular matrix |", "- port p3 has no ground return"}, true},
		{"could not run", Verify{Err: "net aerial: singular matrix", TolDB: 0.5, TolDeg: 5},
			[]string{"**Verification FAILED**: the AC comparison could not be completed", "could not be completed: net aerial: singular matrix."}, true},
		// An oscillator's output impedance behind a buffer, alone, was once
		// reported as a pass: a proof with no transfer or tank in it is none.
		{"nothing comparable", Verify{OK: false, Empty: true, TolDB: 0.5, TolDeg: 5, Pairs: []Pair{{From: "out", To: "out", What: "impedance", AtHz: 1e6}}},
			[]string{"**Verification proved nothing**: nothing comparable", "**Nothing comparable** (no transfer and no tank impedance; not a pass)"}, true},
		{"skipped", Verify{Skipped: "--no-verify"},
			[]string{"**Verification was not run** (--no-verify)", "Not run (--no-verify)."}, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			n := sampleNote()
			n.Verify = tt.verify
			md := writeToString(t, n)
			for _, w := range tt.want {
				if !strings.Contains(md, w) {
					t.Errorf("note lacks %q\n%s", w, md[strings.Index(md, "## Verification"):])
				}
			}
			if tt.verify.Empty && (strings.Contains(md, "Verification passed") || strings.Contains(md, "**Passed**")) {
				t.Errorf("an empty comparison is reported as a pass")
			}
			if got := tt.verify.Failed(); got != tt.failed {
				t.Errorf("failed() = %v, want %v", got, tt.failed)
			}
		})
	}
}

// Free text from netlists and rules must not turn into markup: a bar would
// split a table cell, an underscore or star start emphasis, a bracket a link,
// an angle bracket raw HTML.
func TestNoteEscaping(t *testing.T) {
	n := sampleNote()
	n.Title = "<b>set</b> [1] *A*"
	n.Stages[0].Title = "split | here"
	n.Stages[0].Flags = []string{"a_b", "_x_"}
	n.Steps[0].Rule = "rule`x"
	md := writeToString(t, n)
	for _, want := range []string{
		"# Repair note: \\<b\\>set\\</b\\> \\[1\\] \\*A\\*",
		"| S1 | split \\| here (`hartley-cathode-tap`)",
		"| a_b, \\_x\\_ |",
		"1. **rule\\`x**",
	} {
		if !strings.Contains(md, want) {
			t.Errorf("note lacks %q", want)
		}
	}
	if strings.Contains(md, "<b>") {
		t.Error("raw HTML from the title reached the note")
	}
}

func TestNoteEmptyParts(t *testing.T) {
	n := sampleNote()
	n.Stages, n.Steps, n.Removed, n.Merged = nil, nil, nil, nil
	md := writeToString(t, n)
	for _, want := range []string{"No stage was recognised", "No step applied"} {
		if !strings.Contains(md, want) {
			t.Errorf("note lacks %q", want)
		}
	}
	if strings.Contains(md, "Removed (") || strings.Contains(md, "Merged:") {
		t.Error("empty removed/merged lists should not be printed")
	}
}

func TestNum(t *testing.T) {
	for _, c := range []struct {
		v    float64
		want string
	}{{0.5, "0.5"}, {5, "5"}, {0.0123, "0.012"}, {-0.0001, "0"}, {12.3456, "12.346"}} {
		if got := Num(c.v); got != c.want {
			t.Errorf("Num(%v) = %q, want %q", c.v, got, c.want)
		}
	}
}

// A flagged figure is what a repairer must see first: it stands under the
// verdict, before the sheets and the stage table.
func TestNoteFindingsComeFirst(t *testing.T) {
	out := writeToString(t, sampleNote())
	finding := "- **S1** Hartley oscillator, cathode tap (valve): grid-leak bias"
	at := strings.Index(out, finding)
	if at < 0 {
		t.Fatalf("note lacks the finding %q:\n%s", finding, out)
	}
	if sheets := strings.Index(out, "## Sheets"); sheets < at || strings.Index(out, "Verification passed") > at {
		t.Errorf("finding at %d is not between the verdict and the sheets (%d)", at, sheets)
	}
	n := sampleNote()
	n.Stages[0].Flags = nil
	if strings.Contains(writeToString(t, n), "Figures to check") {
		t.Error("a note without flags has a findings block")
	}
}

// VerifyOf must carry a failed comparison through, so the job exits 1.
func TestVerifyOfFailed(t *testing.T) {
	rep := &ac.Report{OK: false, TolDB: 0.5, TolDeg: 5, Pairs: []ac.Pair{{From: "a", To: "b", MaxDB: 3, What: "transfer"}}}
	if v := VerifyOf(rep, nil, ac.CompareOptions{}); !v.Failed() {
		t.Error("a failed report did not make a failed verification")
	}
	if v := VerifyOf(nil, errors.New("no inputs"), ac.CompareOptions{}); !v.Failed() || v.Err == "" {
		t.Error("a comparison error did not make a failed verification")
	}
}

// TestDCChart: the voltage chart says its readings are taken on a live set
// (graph/safety's live-set line, common practice) and names the meter it
// assumes; a chart that could not be made says why.
func TestDCChart(t *testing.T) {
	n := &Note{Title: "t", DC: DC{Meter: "20 kΩ/V meter", Caution: []string{"Probe with one hand."},
		Rows: []DCRow{{"V1", "anode", "a", "181.4 V", "179 V"}}}}
	var b bytes.Buffer
	if err := Write(&b, n); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"## DC voltage chart", "taken with the set working", "Probe with one hand.", "20 kΩ/V meter", "| V1 | anode | `a` | 181.4 V | 179 V |"} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("chart lacks %q:\n%s", want, b.String())
		}
	}
	b.Reset()
	n.DC = DC{Err: "x.toml: the DC operating point does not settle; still moving: a"}
	if err := Write(&b, n); err != nil || !strings.Contains(b.String(), "was not found: x.toml") {
		t.Errorf("a failed chart must say why:\n%s", b.String())
	}
}

// A warning of the DC chart (a standing current far from the declared one,
// review 14's b04: 83.6 mA solved against 15 mA) is a figure to check: it
// stands in the list under the verdict, in both notes, as well as under
// the chart; a note whose chart warns of nothing keeps the list as it was.
func TestDCWarningsAmongFindings(t *testing.T) {
	const warn = "Q2 collector current solves to 83.6 mA, +457 % from the 15 mA the netlist gives as ic"
	for _, tc := range []struct {
		name     string
		warnings []string
		want     []string // in the findings, before the sheets
		lead     string
	}{
		{"none", nil, nil, "each is also in the stage table):"},
		{"current", []string{warn}, []string{"- **DC operating point**: " + warn}, "each is also in the stage table or under the DC voltage chart):"},
	} {
		n := sampleNote()
		n.DC.Warnings = tc.warnings
		n.DC.Notes = tc.warnings
		out := writeToString(t, n)
		end := strings.Index(out, "## Sheets")
		if end < 0 {
			end = len(out)
		}
		top := out[:end]
		if !strings.Contains(top, tc.lead) {
			t.Errorf("%s: findings lead %q missing:\n%s", tc.name, tc.lead, top)
		}
		for _, w := range tc.want {
			if !strings.Contains(top, w) {
				t.Errorf("%s: %q not among the figures to check:\n%s", tc.name, w, top)
			}
		}
		if tc.want == nil && strings.Contains(top, "DC operating point") {
			t.Errorf("%s: a DC finding with no warning", tc.name)
		}
		html := writeHTMLString(t, n)
		for _, w := range tc.warnings {
			if !strings.Contains(html, "<li><b>DC operating point</b>: "+w) {
				t.Errorf("%s: the HTML note's findings lack %q", tc.name, w)
			}
		}
	}
}
