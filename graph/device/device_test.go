package device

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Abs(want)
}

func part(kind graph.Kind, typ string, params map[string]float64) *graph.Part {
	return &graph.Part{Ref: "X1", Kind: kind, Type: typ, Params: params}
}

func TestThermalVoltage(t *testing.T) {
	// docs/references.md §5: VT at 300 K = 25.8520 mV (SI 2019 exact constants).
	if !near(VT, 25.8520e-3, 2e-6) {
		t.Errorf("VT = %.6g V, want 25.8520 mV", VT)
	}
}

// Each parameter resolved from what a part gives, with the flags saying
// what rests on a default.
func TestOf(t *testing.T) {
	cases := []struct {
		name              string
		p                 *graph.Part
		gm, rout, mu, rpi float64
		assumed           Param
		why               string
	}{
		{"triode gm and ra", part(graph.Valve, "triode", map[string]float64{"gm": 2e-3, "ra": 10e3}), 2e-3, 10e3, 20, math.Inf(1), 0,
			"µ = gm·ra (any valve text, from memory)"},
		{"triode mu and ra", part(graph.Valve, "triode", map[string]float64{"mu": 20, "ra": 10e3}), 2e-3, 10e3, 20, math.Inf(1), 0,
			"gm = µ/ra"},
		{"triode gm and mu", part(graph.Valve, "triode", map[string]float64{"gm": 1.6e-3, "mu": 100}), 1.6e-3, 62.5e3, 100, math.Inf(1), 0,
			"ra = µ/gm = 62.5 kΩ (docs/references.md §10)"},
		{"triode all three", part(graph.Valve, "triode", map[string]float64{"gm": 1.6e-3, "mu": 100, "ra": 62.5e3}), 1.6e-3, 62.5e3, 100, math.Inf(1), 0,
			"consistent within 2 %"},
		{"triode gm only", part(graph.Valve, "triode", map[string]float64{"gm": 1e-3}), 1e-3, 20e3, 20, math.Inf(1), ROut | Mu,
			"ra from the triode default 20 kΩ"},
		{"triode nothing", part(graph.Valve, "triode", nil), 2e-3, 20e3, 40, math.Inf(1), Gm | ROut | Mu,
			"triode defaults gm 2 mA/V, ra 20 kΩ (from memory)"},
		{"pentode ra only", part(graph.Valve, "pentode", map[string]float64{"ra": 500e3}), 2e-3, 500e3, 1000, math.Inf(1), Gm | Mu,
			"pentode default gm 2 mA/V"},
		{"heptode mu only", part(graph.Valve, "heptode", map[string]float64{"mu": 100}), 100 / 1e6, 1e6, 100, math.Inf(1), Gm | ROut | GmOsc,
			"multigrid default ra 1 MΩ, gm = µ/ra; g1-to-g2 gmo its default"},
		{"bjt beta and ic", part(graph.BJT, "npn", map[string]float64{"beta": 100, "ic": 1e-3}), 38.6817e-3, 100e3, 38.6817e-3 * 100e3, 2585.20, ROut | Mu,
			"docs/references.md §5: gm = Ic/VT 38.6817 mS, rπ = β/gm 2585.20 Ω; ro = VA/Ic with the default VA 100 V"},
		{"bjt nothing", part(graph.BJT, "pnp", nil), 38.6817e-3, 100e3, 38.6817e-3 * 100e3, 2585.20, Beta | Ic | Gm | ROut | Mu | RPi,
			"defaults β 100, Ic 1 mA, VA 100 V (from memory)"},
		{"bjt given gm rpi ro", part(graph.BJT, "npn", map[string]float64{"gm": 0.02, "rpi": 4e3, "ro": 50e3}), 0.02, 50e3, 1000, 4e3, Beta | Ic,
			"given values win over the bias-derived ones"},
		{"fet given", part(graph.FET, "njfet", map[string]float64{"gm": 5e-3, "rd": 40e3}), 5e-3, 40e3, 200, math.Inf(1), 0,
			"µ = gm·rd"},
		{"fet nothing", part(graph.FET, "nmos", nil), 4e-3, 50e3, 200, math.Inf(1), Gm | ROut | Mu,
			"FET defaults gm 4 mA/V, rd 50 kΩ (from memory)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s, err := Of(tc.p)
			if err != nil {
				t.Fatal(err)
			}
			if !near(s.Gm, tc.gm, 1e-5) || !near(s.ROut, tc.rout, 1e-5) || !near(s.Mu, tc.mu, 1e-5) ||
				!(s.RPi == tc.rpi || near(s.RPi, tc.rpi, 1e-5)) {
				t.Errorf("gm %g rout %g µ %g rπ %g, want %g %g %g %g (%s)", s.Gm, s.ROut, s.Mu, s.RPi, tc.gm, tc.rout, tc.mu, tc.rpi, tc.why)
			}
			if s.Assumed != tc.assumed {
				t.Errorf("assumed %06b, want %06b", s.Assumed, tc.assumed)
			}
		})
	}
}

func TestOfRefuses(t *testing.T) {
	cases := []struct {
		p    *graph.Part
		want string
	}{
		{part(graph.Valve, "triode", map[string]float64{"gm": 2e-3, "ra": 10e3, "mu": 30}), "give any two of gm, ra, mu"},
		{part(graph.Valve, "double-diode", nil), "has no amplifying model"},
		{part(graph.Valve, "triode", map[string]float64{"gm": 0, "mu": 20}), "do not make a model"},
		{part(graph.BJT, "npn", map[string]float64{"beta": 0}), "must be positive"},
		{part(graph.BJT, "npn", map[string]float64{"ro": -1}), "must be positive"},
		{part(graph.FET, "njfet", map[string]float64{"rd": 0}), "rd must be positive"},
		{part(graph.Resistor, "", nil), "no amplifying model"},
	}
	for _, tc := range cases {
		if _, err := Of(tc.p); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s %s %v: error %v, want %q", tc.p.Kind, tc.p.Type, tc.p.Params, err, tc.want)
		}
	}
}

// The terminal impedances against textbook results with invented parts.
func TestTerminalImpedances(t *testing.T) {
	triode, _ := Of(part(graph.Valve, "triode", map[string]float64{"mu": 20, "ra": 10e3}))
	bjt, _ := Of(part(graph.BJT, "npn", map[string]float64{"beta": 100, "ic": 1e-3, "ro": 1e15}))
	fet, _ := Of(part(graph.FET, "njfet", map[string]float64{"gm": 5e-3, "rd": 1e15}))
	cases := []struct {
		name      string
		got, want float64
		why       string
	}{
		{"triode cathode, anode at AC ground", triode.ZCommon(0), 476.190,
			"docs/references.md §5: ra/(µ+1) = 476.190 Ω for µ 20, ra 10 kΩ (derived)"},
		{"triode cathode, RL 47 kΩ", triode.ZCommon(47e3), 2714.286,
			"(ra+RL)/(µ+1) = 57 kΩ/21, textbook (from memory), derived"},
		{"triode anode, Rk 1 kΩ", triode.ZOutput(1e3), 31e3,
			"ra + (µ+1)Rk = 10 k + 21 k: the denominator of docs/references.md §5's −µRL/(ra+RL+(µ+1)Rk) less RL"},
		{"triode anode, cathode at AC ground", triode.ZOutput(0), 10e3, "ra"},
		{"triode grid", triode.ZControl(1e3), math.Inf(1), "a grid draws no current"},
		{"BJT emitter", bjt.ZCommon(0), 25.5960,
			"re = α/gm = 25.8520 Ω·100/101 (hybrid-π, from memory; derived)"},
		{"BJT base, RE 100 Ω", bjt.ZControl(100), 12685.2,
			"rπ + (β+1)RE = 2585.20 + 10100: the denominator of docs/references.md §5's −βRC/(rπ+(β+1)RE)"},
		{"BJT collector, emitter at AC ground", bjt.ZOutput(0), 1e15, "ro"},
		{"FET source", fet.ZCommon(0), 200, "1/gm for gm 5 mS (docs/references.md §5 source follower, rd large)"},
		{"FET gate", fet.ZControl(0), math.Inf(1), "a gate draws no current"},
		{"pentode screen", mustOf(t, part(graph.Valve, "pentode", map[string]float64{"gm": 2e-3})).ZFurtherGrid(), 2e3,
			"4/gm with the rough screen default (from memory)"},
	}
	for _, tc := range cases {
		if !(tc.got == tc.want || near(tc.got, tc.want, 2e-6)) {
			t.Errorf("%s: %.7g, want %.7g (%s)", tc.name, tc.got, tc.want, tc.why)
		}
	}
	// With ro not given the output resistance is the model's VA/Ic, and the
	// emitter impedance tends to 1/gm as ro grows: an infinite rout is the limit.
	inf := triode
	inf.ROut = math.Inf(1)
	if got := inf.ZCommon(47e3); !near(got, 1/triode.Gm, 1e-12) {
		t.Errorf("infinite ra: cathode %g, want 1/gm %g", got, 1/triode.Gm)
	}
}

func mustOf(t *testing.T, p *graph.Part) Small {
	t.Helper()
	s, err := Of(p)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func TestGivenOnly(t *testing.T) {
	s := mustOf(t, part(graph.BJT, "npn", map[string]float64{"ic": 1e-3}))
	g := s.GivenOnly()
	// gm rests on the given Ic; β, rπ and ro on defaults.
	if !near(g.Gm, 38.6817e-3, 1e-5) || g.Beta != 0 || !math.IsInf(g.RPi, 1) || !math.IsInf(g.ROut, 1) || g.Mu != 0 {
		t.Errorf("GivenOnly = %+v", g)
	}
}

func TestDiodeRd(t *testing.T) {
	cases := []struct {
		p       *graph.Part
		load    float64 // DC load per section, 0: none
		rd      float64
		assumed bool
		why     string
	}{
		{part(graph.Diode, "signal", nil), 0, 25.8520, true, "VT/1 mA (Shockley, ideality 1; docs/references.md §5 VT)"},
		{part(graph.Diode, "signal", nil), math.Inf(1), 25.8520, true, "no DC load: VT/1 mA"},
		{part(graph.Diode, "signal", map[string]float64{"rd": 100}), 470e3, 100, false, "given wins over the detector default"},
		{part(graph.Diode, "signal", map[string]float64{"off": 1, "rd": 100}), 0, 0, false, "off = 1 opens it"},
		{part(graph.Diode, "varicap", nil), 470e3, 0, true, "a varicap is reverse biased"},
		{part(graph.Valve, "double-diode", nil), 0, 1e3, true, "valve diode default 1 kΩ (from memory)"},
		{part(graph.Valve, "double-diode", nil), 470e3, 235e3, true, "detector into 470 kΩ: Rin = RL/2 (common practice, docs/references.md §17)"},
		{part(graph.Diode, "signal", nil), 100e3, 50e3, true, "detector into 100 kΩ: Rin = RL/2 (common practice, docs/references.md §17)"},
		{part(graph.Diode, "rectifier", nil), 100e3, 25.8520, true, "a rectifier is no detector: VT/1 mA"},
		{part(graph.Valve, "diode", map[string]float64{"rd": 5e3}), 470e3, 5e3, false, "a valve diode's own rd"},
		{part(graph.Valve, "diode", map[string]float64{"off": 1}), 470e3, 0, false, "a valve diode off"},
	}
	for _, tc := range cases {
		rd, a := DiodeRd(tc.p, tc.load)
		if !(rd == tc.rd || near(rd, tc.rd, 1e-5)) || a != tc.assumed {
			t.Errorf("%s %v: rd %g assumed %v, want %g %v (%s)", tc.p.Type, tc.p.Params, rd, a, tc.rd, tc.assumed, tc.why)
		}
	}
}

func TestCrystalDefaults(t *testing.T) {
	// A 1 MHz crystal with the default cm 20 fF and Q 50 000: Lm =
	// 1/((2π·1 MHz)²·20 fF) = 1.26651 H, Rm = 2π·1 MHz·Lm/Q = 159.155 Ω
	// (derived from the four-element equivalent).
	p := &graph.Part{Ref: "X1", Kind: graph.Crystal}
	p.Value.Min, p.Value.Max = 1e6, 1e6
	rm, lm, cm, c0, err := Crystal(p)
	if err != nil {
		t.Fatal(err)
	}
	if !near(rm, 159.155, 1e-5) || !near(lm, 1.26651, 1e-5) || cm != 20e-15 || c0 != 5e-12 {
		t.Errorf("rm %g lm %g cm %g c0 %g", rm, lm, cm, c0)
	}
}

// Every default names its source, and every class the models ask for is in
// the table (def panics otherwise).
func TestDefaultsDocumented(t *testing.T) {
	seen := map[string]bool{}
	for _, d := range Defaults {
		key := d.Class + "." + d.Param
		if seen[key] {
			t.Errorf("%s listed twice", key)
		}
		seen[key] = true
		if d.Source == "" || !(d.Value > 0) {
			t.Errorf("%s: value %g, source %q", key, d.Value, d.Source)
		}
	}
	for _, typ := range append(graph.ValveTypes(), "npn") {
		kind := graph.Valve
		if typ == "npn" {
			kind = graph.BJT
		}
		p := part(kind, typ, nil)
		if _, err := Of(p); err != nil && ValveClass(typ) != "" {
			t.Errorf("%s: %v", typ, err)
		}
	}
}

// A pentagrid converter's g1-to-g2 transconductance: its own gmo when
// given, else the class default (3 mA/V, from memory, rough; flagged
// assumed); other valves have none.
func TestOscillatorAnodeTransconductance(t *testing.T) {
	cases := []struct {
		name    string
		p       *graph.Part
		want    float64
		assumed bool
	}{
		{"heptode given", part(graph.Valve, "heptode", map[string]float64{"gm": 0.45e-3, "gmo": 2e-3}), 2e-3, false},
		{"octode default", part(graph.Valve, "octode", map[string]float64{"gm": 0.45e-3}), 3e-3, true},
		{"hexode none", part(graph.Valve, "hexode", map[string]float64{"gm": 0.45e-3}), 0, false},
		{"triode-heptode's heptode section none", func() *graph.Part {
			p := part(graph.Valve, "heptode", map[string]float64{"gm": 0.45e-3})
			p.Envelope = "V1"
			return p
		}(), 0, false},
		{"pentode none", part(graph.Valve, "pentode", nil), 0, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s, err := Of(tc.p)
			if err != nil {
				t.Fatal(err)
			}
			if s.GmOsc != tc.want || s.Given(GmOsc) == tc.assumed {
				t.Errorf("gmo %g (assumed %v), want %g (assumed %v)", s.GmOsc, !s.Given(GmOsc), tc.want, tc.assumed)
			}
		})
	}
}
