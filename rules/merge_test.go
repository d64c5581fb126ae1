package rules

import (
	"fmt"
	"strings"
	"testing"

	"pare/graph"
)

// twoParts places two parts between nets; mid decides parallel (both a–b)
// or series (a–m, m–b). The valve grid on b and the input on a keep both
// nets alive and give the parts no other company.
func twoParts(p1, p2 string) string {
	return fmt.Sprintf(`
band = "530k..1.6M"
inputs = ["a"]
outputs = ["o"]
[parts]
X1 = %s
X2 = %s
V1 = { valve = "triode", pins = { a = "o", g1 = "b", k = "gnd" } }
R9 = { r = "1M", pins = ["b", "gnd"] }
R8 = { r = "10k", pins = ["o", "gnd"] }
`, p1, p2)
}

func mergedPart(t *testing.T, src, rule string) (*graph.Part, *Log) {
	t.Helper()
	src = strings.ReplaceAll(src, "X1", "C1")
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelTidy})
	steps := stepsOf(log, rule)
	if len(steps) != 1 {
		t.Fatalf("want one %s step, got %d:\n%s", rule, len(steps), logText(log))
	}
	p := r.Part(steps[0].Result)
	if p == nil {
		t.Fatalf("result %q not in the circuit", steps[0].Result)
	}
	return p, log
}

func TestParallelAndSeriesValues(t *testing.T) {
	cases := []struct {
		name     string
		p1, p2   string
		rule     string
		min, max float64 // expected value (range for adjustable capacitors)
		lo, hi   float64 // expected worst-case limits, 0 = not checked
		typ      string
		source   string
	}{
		{"R parallel", `{ r = "10k", tol = "5%", pins = ["a", "b"] }`, `{ r = "22k", tol = "10%", pins = ["b", "a"] }`, "parallel",
			6875, 6875, 6419.80, 7322.77, "", "docs/references.md §4: 6875 Ω, exact limits 6419.80–7322.77 Ω"},
		{"R series", `{ r = "10k", tol = "5%", pins = ["a", "m"] }`, `{ r = "22k", tol = "10%", pins = ["m", "b"] }`, "series",
			32000, 32000, 29300, 34700, "", "docs/references.md §4: 32 kΩ ±8.4375 % (29.3–34.7 kΩ)"},
		{"C series", `{ c = "100p", pins = ["a", "m"] }`, `{ c = "100p", pins = ["b", "m"] }`, "series",
			50e-12, 50e-12, 0, 0, graph.CapFixed, "docs/references.md §4: 100 pF + 100 pF in series = 50 pF"},
		{"C parallel", `{ c = "100p", pins = ["a", "b"] }`, `{ c = "47p", pins = ["a", "b"] }`, "parallel",
			147e-12, 147e-12, 0, 0, graph.CapFixed, "derived: C = C1 + C2"},
		{"gang section with trimmer", `{ c = "12p..365p", gang = "tune", pins = ["a", "b"] }`, `{ c = "5p..50p", set = "31p", pins = ["a", "b"] }`, "parallel",
			43e-12, 396e-12, 0, 0, graph.CapVariable, "derived: the trimmer adds its set value, 12+31 .. 365+31 pF"},
		{"trimmer with fixed", `{ c = "3p..30p", set = "10p", pins = ["a", "b"] }`, `{ c = "22p", pins = ["a", "b"] }`, "parallel",
			25e-12, 52e-12, 0, 0, graph.CapTrimmer, "derived: range and setting shift by 22 pF"},
		{"L parallel", `{ l = "100u", pins = ["a", "b"] }`, `{ l = "100u", pins = ["a", "b"] }`, "parallel",
			50e-6, 50e-6, 0, 0, "", "derived: L1·L2/(L1+L2), uncoupled"},
		{"L series", `{ l = "100u", pins = ["a", "m"] }`, `{ l = "47u", pins = ["m", "b"] }`, "series",
			147e-6, 147e-6, 0, 0, "", "derived: L1 + L2, uncoupled"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p, log := mergedPart(t, twoParts(tc.p1, tc.p2), tc.rule) // source: see tc.source
			v := p.Value
			if p.Kind == graph.Inductor {
				v.Min, v.Max = p.Inductance(), p.Inductance()
			}
			if !near(v.Min, tc.min, 1e-9) || !near(v.Max, tc.max, 1e-9) {
				t.Errorf("%s: value %g..%g, want %g..%g (%s)", tc.name, v.Min, v.Max, tc.min, tc.max, tc.source)
			}
			if tc.lo != 0 {
				lo, hi := v.Max*(1-p.Tol.Minus), v.Max*(1+p.Tol.Plus)
				if !near(lo, tc.lo, 1e-6) || !near(hi, tc.hi, 1e-6) {
					t.Errorf("%s: limits %.2f–%.2f, want %.2f–%.2f (%s)", tc.name, lo, hi, tc.lo, tc.hi, tc.source)
				}
			}
			if tc.typ != "" && p.Type != tc.typ {
				t.Errorf("%s: type %q, want %q", tc.name, p.Type, tc.typ)
			}
			if got := strings.Join(p.From, ","); got != "C1,X2" {
				t.Errorf("%s: From = %s, want C1,X2", tc.name, got)
			}
			if strings.Contains(tc.p1, "gang") && p.Gang != "tune" {
				t.Errorf("%s: the merged section lost its gang", tc.name)
			}
			_ = log
		})
	}
}

// docs/references.md §4: 10k ±5 % + 22k ±10 % in series is ±8.4375 % worst case.
func TestSeriesToleranceIsSymmetric(t *testing.T) {
	p, log := mergedPart(t, twoParts(`{ r = "10k", tol = "5%", pins = ["a", "m"] }`, `{ r = "22k", tol = "10%", pins = ["m", "b"] }`), "series")
	if p.Tol.Plus != p.Tol.Minus || !near(p.Tol.Plus, 0.084375, 1e-9) {
		t.Errorf("tolerance %+v, want ±8.4375 %%", p.Tol)
	}
	if !strings.Contains(logText(log), "±8.4375 %") {
		t.Errorf("the why should state ±8.4375 %%:\n%s", logText(log))
	}
}

// A tolerance that is not given is not invented: the merged part has none
// and the why says so.
func TestMergeWithoutTolerance(t *testing.T) {
	p, log := mergedPart(t, twoParts(`{ r = "10k", tol = "5%", pins = ["a", "b"] }`, `{ r = "10k", pins = ["a", "b"] }`), "parallel")
	if p.Tol.Plus != 0 || p.Tol.Minus != 0 {
		t.Errorf("tolerance %+v, want none", p.Tol)
	}
	if !strings.Contains(logText(log), "tolerance not combined: X2 has none given") {
		t.Errorf("why should say the tolerance was not combined:\n%s", logText(log))
	}
}

// Near misses that must not merge.
func TestMergeRefusals(t *testing.T) {
	cases := []struct{ name, p1, p2, extra string }{
		{"middle net has a third part", `{ r = "10k", pins = ["a", "m"] }`, `{ r = "22k", pins = ["m", "b"] }`, `R7 = { r = "1M", pins = ["m", "gnd"] }`},
		{"middle net is labelled", `{ r = "10k", pins = ["a", "m"] }`, `{ r = "22k", pins = ["m", "b"] }`, "[nets]\nm = { label = \"test point TP3\" }"},
		{"kinds differ", `{ r = "10k", pins = ["a", "b"] }`, `{ c = "10n", pins = ["a", "b"] }`, ""},
		{"keep", `{ r = "10k", pins = ["a", "b"], keep = true }`, `{ r = "10k", pins = ["a", "b"] }`, ""},
		{"two gang sections of different gangs", `{ c = "12p..365p", gang = "g1", pins = ["a", "b"] }`, `{ c = "12p..365p", gang = "g2", pins = ["a", "b"] }`, ""},
		{"gang section and padder", `{ c = "12p..365p", gang = "tune", pins = ["a", "m"] }`, `{ c = "380p", pins = ["m", "b"] }`, ""},
		{"electrolytic in series", `{ c = "10u", type = "electrolytic", pins = ["a", "m"] }`, `{ c = "10u", type = "electrolytic", pins = ["m", "b"] }`, ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			src := twoParts(tc.p1, tc.p2)
			if strings.HasPrefix(tc.extra, "[nets]") {
				src = strings.Replace(src, "[parts]", tc.extra+"\n[parts]", 1)
			} else {
				src += tc.extra + "\n"
			}
			r, log := reduceChecked(t, parse(t, src), Options{Level: LevelTidy})
			if len(stepsOf(log, "parallel"))+len(stepsOf(log, "series")) != 0 || r.Part("X1") == nil || r.Part("X2") == nil {
				t.Fatalf("must not merge:\n%s", logText(log))
			}
		})
	}
}

// Three capacitors in parallel merge step by step into one, with all origins.
func TestParallelChain(t *testing.T) {
	src := twoParts(`{ c = "10p", pins = ["a", "b"] }`, `{ c = "20p", pins = ["b", "a"] }`) + `X3 = { c = "30p", pins = ["a", "b"] }` + "\n"
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelTidy})
	var caps []*graph.Part
	for _, p := range r.Parts {
		if p.Kind == graph.Capacitor {
			caps = append(caps, p)
		}
	}
	if len(caps) != 1 || !near(caps[0].Value.Max, 60e-12, 1e-12) || strings.Join(caps[0].From, ",") != "X1,X2,X3" {
		t.Fatalf("want one 60 pF part from X1,X2,X3 (derived: sum), got %v\n%s", caps, logText(log))
	}
}

// A gang section in series with a padder is a near miss at every level: the
// series combination C·Cp/(C+Cp) does not vary linearly with rotation, so one
// variable capacitor of range Cmin·Cp/(Cmin+Cp) .. Cmax·Cp/(Cmax+Cp) is right
// at the ends of the travel only. Derived: with 12–365 pF and 380 pF, at
// mid-travel (188.5 pF) the pair is 188.5·380/568.5 = 126.0 pF, while a
// linear range 11.63–186.2 pF gives 98.9 pF, 27 % less. The tank (coil
// across the pair) keeps the padder from being a coupling capacitor.
func TestGangSectionAndPadderAreNotMerged(t *testing.T) {
	const src = `
band = "530k..1.6M"
inputs = ["tank"]
outputs = ["o"]
[parts]
L1 = { l = "128u", pins = ["tank", "gnd"] }
VC1 = { c = "12p..365p", gang = "tune", pins = ["pad", "gnd"] }
C3 = { c = "380p", pins = ["tank", "pad"] }
V1 = { valve = "triode", pins = { a = "o", g1 = "tank", k = "gnd" } }
R8 = { r = "10k", pins = ["o", "gnd"] }
`
	for _, lvl := range levels {
		t.Run(lvl.String(), func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, src), Options{Level: lvl})
			vc, c3 := r.Part("VC1"), r.Part("C3")
			if vc == nil || c3 == nil || len(vc.From) != 0 || len(c3.From) != 0 {
				t.Fatalf("VC1 and C3 must stay apart:\n%s", logText(log))
			}
			if !near(vc.Value.Min, 12e-12, 1e-9) || !near(vc.Value.Max, 365e-12, 1e-9) || !near(c3.Value.Max, 380e-12, 1e-9) {
				t.Errorf("values changed: VC1 %v, C3 %v", vc.Value, c3.Value)
			}
			found := false
			for _, d := range log.Declined {
				if d.Rule == "series" && strings.Contains(d.Why, "does not vary linearly with rotation") {
					found = true
				}
			}
			if !found {
				t.Errorf("the series rule should report the pair as a near miss:\n%s", logText(log))
			}
		})
	}
}

// Two resistors in parallel once their far ends are both AC ground (a
// 33 kΩ bias resistor to a bypassed bias point, a 330 Ω feed from the
// supply): the merged part says what the one carrying the current says,
// its ref and the rail its terminal returns to, whichever ref survives
// (review 13's b02: common practice, the smaller resistor sets the pair).
// Its note is neutral: the members do different jobs (a bias resistor, a
// supply feed), and one member's note would say the pair does that job.
func TestParallelTakesTheDominantMember(t *testing.T) {
	src := `band = "530k..1.6M"
inputs = ["in"]
[nets]
vcc = { role = "supply", volts = 9, label = "+9 V" }
agc = { role = "bias", volts = 1.4, label = "AGC line" }
[parts]
P1 = { port = "AGC in", pins = ["agc"] }
R1 = { r = "33k", pins = ["line", "bias"], note = "base bias, upper" }
R2 = { r = "4k7", pins = ["bias", "agc"], note = "base bias from the AGC line" }
C1 = { c = "47n", pins = ["bias", "gnd"] }
R4 = { r = "330R", pins = ["vcc", "line"], note = "supply feed" }
C9 = { c = "1n", pins = ["in", "line"] }
R9 = { r = "100k", pins = ["in", "gnd"] }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal})
	var m *graph.Part
	for _, st := range stepsOf(log, "parallel") {
		if p := r.Part(st.Result); p != nil && p.Kind == graph.Resistor && len(p.From) == 2 {
			m = p
		}
	}
	if m == nil {
		t.Fatalf("R1 and R4 not merged:\n%s", logText(log))
	}
	if m.Ref != "R4" || m.Note != "2 resistors from line to AC ground in parallel" {
		t.Errorf("merged %s note %q, want R4's ref and a neutral note", m.Ref, m.Note)
	}
	for _, pn := range m.Pins {
		if pn.Net != "line" && pn.Rail != "vcc" {
			t.Errorf("merged %s returns to rail %q, want vcc (R4's)", m.Ref, pn.Rail)
		}
	}
}
