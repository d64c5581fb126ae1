package graph

import (
	"math"
	"path/filepath"
	"reflect"
	"testing"

	"pare/graph/value"
)

func parseOK(t *testing.T, src string) *Circuit {
	t.Helper()
	c, err := Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatalf("parse: %v\n%s", err, src)
	}
	return c
}

func relNear(a, b, tol float64) bool { return math.Abs(a-b) <= tol*math.Abs(b) }

// TestTappedCoilInductance: the Hartley total L = L1 + L2 + 2M, M = k√(L1L2).
// Values from docs/references.md §3 (formula confirmed in oscillator lecture
// notes, ecexplain.in and technosains.com; the numbers are derived).
func TestTappedCoilInductance(t *testing.T) {
	cases := []struct {
		name   string
		l1, l2 string
		k      string
		want   float64 // henries
		fWant  float64 // resonance with cWant, Hz (derived from f = 1/(2π√(LC)))
		cWant  float64
	}{
		{"20u+5u k0.5", "20u", "5u", "0.5", 35e-6, 2690.21e3, 100e-12},
		{"80u+20u k0", "80u", "20u", "0", 100e-6, 1006.58e3, 250e-12},
		{"80u+20u k1", "80u", "20u", "1", 180e-6, 750.264e3, 250e-12},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := parseOK(t, `band = "1M..2M"
[parts]
L1 = { l = ["`+tc.l1+`", "`+tc.l2+`"], k = `+tc.k+`, pins = ["a", "t", "gnd"] }
`)
			p := c.Part("L1")
			if got := p.Inductance(); !relNear(got, tc.want, 1e-12) {
				t.Errorf("Inductance = %g, want %g", got, tc.want)
			}
			if !relNear(p.Value.Max, tc.want, 1e-12) {
				t.Errorf("Value = %g, want the total %g", p.Value.Max, tc.want)
			}
			f := 1 / (2 * math.Pi * math.Sqrt(p.Inductance()*tc.cWant))
			if !relNear(f, tc.fWant, 1e-5) { // table is printed to 6 digits
				t.Errorf("resonance %g Hz, want %g Hz", f, tc.fWant)
			}
		})
	}
}

// TestTapFraction: tap = 0.2 on 100 µH. Inductance goes with turns squared and
// the sections of one winding are fully coupled (derived: L ∝ n², k = 1), so
// the sections are 0.2²·100 = 4 µH and 0.8²·100 = 64 µH, and 4 + 64 + 2√(4·64)
// = 100 µH.
func TestTapFraction(t *testing.T) {
	c := parseOK(t, `band = "1M..2M"
[parts]
L1 = { l = "100u", tap = 0.2, pins = ["gnd", "k", "tank"] }
`)
	p := c.Part("L1")
	if len(p.Windings) != 2 {
		t.Fatalf("want two sections, got %+v", p.Windings)
	}
	if a, b := p.Windings[0], p.Windings[1]; !relNear(a.L, 4e-6, 1e-12) || !relNear(b.L, 64e-6, 1e-12) {
		t.Errorf("sections %g and %g H, want 4 µH and 64 µH", a.L, b.L)
	}
	if a, b := p.Windings[0], p.Windings[1]; a.From != "1" || a.To != "t" || b.From != "t" || b.To != "2" {
		t.Errorf("sections run %s–%s and %s–%s, want 1–t and t–2", a.From, a.To, b.From, b.To)
	}
	if k := p.K("1t", "t2"); k != 1 {
		t.Errorf("k = %g, want 1", k)
	}
	if got := p.Inductance(); !relNear(got, 100e-6, 1e-12) {
		t.Errorf("total %g H, want 100 µH", got)
	}
	if net := p.NetOf("t"); net != "k" {
		t.Errorf("tap on %q, want k", net)
	}
}

// TestCapacitance: a trimmer gives its setting, a gang section the point
// frac of its span, a fixed capacitor its value (docs/netlist.md, Parts).
func TestCapacitance(t *testing.T) {
	c := parseOK(t, `band = "1M..2M"
[parts]
C1 = { c = "12p..365p", pins = ["a", "gnd"] }
C2 = { c = "3p..30p", set = "15p", pins = ["a", "gnd"] }
C3 = { c = "100n", pins = ["a", "gnd"] }
`)
	cases := []struct {
		ref  string
		frac float64
		want float64
	}{
		{"C1", 0, 12e-12}, {"C1", 1, 365e-12}, {"C1", 0.5, 188.5e-12}, // midpoint: (12+365)/2
		{"C2", 0, 15e-12}, {"C2", 1, 15e-12},
		{"C3", 0.3, 100e-9},
	}
	for _, tc := range cases {
		if got := c.Part(tc.ref).Capacitance(tc.frac); !relNear(got, tc.want, 1e-12) {
			t.Errorf("%s.Capacitance(%g) = %g, want %g", tc.ref, tc.frac, got, tc.want)
		}
	}
	if typ := c.Part("C2").Type; typ != CapTrimmer {
		t.Errorf("C2 type %q, want trimmer (a span with set)", typ)
	}
	if typ := c.Part("C1").Type; typ != CapVariable {
		t.Errorf("C1 type %q, want variable", typ)
	}
}

func TestOrigins(t *testing.T) {
	p := &Part{Ref: "C9"}
	if got := p.Origins(); !reflect.DeepEqual(got, []string{"C9"}) {
		t.Errorf("Origins of a plain part = %v", got)
	}
	p.From = []string{"C3", "TC2", "VC1b"}
	if got := p.Origins(); !reflect.DeepEqual(got, p.From) {
		t.Errorf("Origins of a merged part = %v", got)
	}
}

const joinSrc = `band = "1M..2M"
inputs = ["x"]
outputs = ["y"]
[regions]
audio = { band = "20..20k", nets = ["x"], input = "x", output = "y" }
[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
[parts]
R1 = { r = "1k", pins = ["x", "y"] }
R2 = { r = "1k", pins = ["y", "ht"] }
C1 = { c = "1n", pins = ["x", "gnd"] }
`

// TestJoinNets: the kept net takes the stronger role (ground over rails over
// signal) and every reference to the gone net moves to the kept one.
func TestJoinNets(t *testing.T) {
	cases := []struct {
		keep, gone string
		role       Role
		volts      float64
		label      string
	}{
		{"x", "gnd", Ground, 0, ""},
		{"y", "ht", Supply, 250, "HT +250 V"},
		{"ht", "y", Supply, 250, "HT +250 V"},
		{"gnd", "ht", Ground, 0, ""},
		{"y", "x", Signal, 0, ""},
	}
	for _, tc := range cases {
		c := parseOK(t, joinSrc)
		c.JoinNets(tc.keep, tc.gone)
		if c.Net(tc.gone) != nil {
			t.Errorf("join %s<-%s: net %s still there", tc.keep, tc.gone, tc.gone)
		}
		n := c.Net(tc.keep)
		if n == nil || n.Role != tc.role || n.Volts != tc.volts || n.Label != tc.label {
			t.Errorf("join %s<-%s: kept net %+v, want role %s volts %g label %q", tc.keep, tc.gone, n, tc.role, tc.volts, tc.label)
		}
		for _, p := range c.Parts {
			for _, pin := range p.Pins {
				if pin.Net == tc.gone {
					t.Errorf("join %s<-%s: %s.%s still on %s", tc.keep, tc.gone, p.Ref, pin.Name, tc.gone)
				}
			}
		}
		for _, list := range [][]string{c.Inputs, c.Outputs, c.Region("audio").Nets, {c.Region("audio").Input, c.Region("audio").Output}} {
			for _, name := range list {
				if name == tc.gone {
					t.Errorf("join %s<-%s: a reference to %s survived", tc.keep, tc.gone, tc.gone)
				}
			}
		}
	}
}

// TestRemovePartPrunes: a net a removal leaves empty goes with the part,
// unless it is a declared end (common practice for netlists: an input or
// output is named even while nothing is on it).
func TestRemovePartPrunes(t *testing.T) {
	c := parseOK(t, joinSrc)
	if dropped, ok := c.RemovePart("R2"); !ok || !reflect.DeepEqual(dropped, []string{"ht"}) {
		t.Fatalf("RemovePart R2 = %v, %v; want [ht], true", dropped, ok)
	}
	if _, ok := c.RemovePart("R2"); ok {
		t.Error("RemovePart of a removed part reported success")
	}
	// x stays (C1, and it is an input), y stays (an output, though empty now)
	if dropped, _ := c.RemovePart("R1"); len(dropped) != 0 {
		t.Errorf("removing R1 dropped %v, want nothing (x and y are ends)", dropped)
	}
	if gone := c.PruneNets(); len(gone) != 0 {
		t.Errorf("PruneNets found %v left to prune, want nothing", gone)
	}
	var names []string
	for _, n := range c.Nets {
		names = append(names, n.Name)
	}
	if !reflect.DeepEqual(names, []string{"gnd", "x", "y"}) {
		t.Errorf("nets left %v, want [gnd x y]", names)
	}
	if c.Net("ht") != nil {
		t.Error("index still finds the pruned net")
	}
}

func TestAddPartAndEnsureNet(t *testing.T) {
	c := parseOK(t, joinSrc)
	c.AddPart(&Part{Ref: "C0", Kind: Capacitor, Type: CapFixed, Value: value.Range{Min: 1e-9, Max: 1e-9},
		Pins: []Pin{{Name: "1", Net: "new"}, {Name: "2", Net: "chassis"}}})
	if c.Parts[0].Ref != "C0" || c.Part("C0") == nil {
		t.Errorf("AddPart did not keep Parts sorted: first is %s", c.Parts[0].Ref)
	}
	if n := c.Net("new"); n == nil || n.Role != Signal {
		t.Errorf("net new = %+v, want a signal net", n)
	}
	if n := c.Net("chassis"); n == nil || n.Role != Ground {
		t.Errorf("net chassis = %+v, want ground by its name", n)
	}
	for i := 1; i < len(c.Nets); i++ {
		if c.Nets[i-1].Name >= c.Nets[i].Name {
			t.Errorf("nets out of order: %s, %s", c.Nets[i-1].Name, c.Nets[i].Name)
		}
	}
	if n1, n2 := c.EnsureNet("x", Pos{}), c.Net("x"); n1 != n2 {
		t.Error("EnsureNet made a second net x")
	}
}

// TestCloneIndependent: a clone shares nothing with the original.
func TestCloneIndependent(t *testing.T) {
	orig := mustLoad(t, filepath.Join(repo, "testdata", "good", "every-kind.toml"))
	before := writeString(t, orig)
	c := orig.Clone()
	c.Title = "changed"
	c.Freqs["if"] = 1
	c.Inputs[0] = "zz"
	c.Outputs[0] = "zz"
	c.Regions[0].Parts = append(c.Regions[0].Parts, "R1")
	c.Regions[0].Nets[0] = "zz"
	c.Regions[1].Band.Max = 1
	c.Nets[0].Role = Ground
	for _, p := range c.Parts {
		for i := range p.Pins {
			p.Pins[i].Net = "zz"
		}
		for i := range p.Windings {
			p.Windings[i].L = 1
		}
		for i := range p.Coupling {
			p.Coupling[i].K = 0.5
		}
		for k := range p.Params {
			p.Params[k] = -1
		}
		for i := range p.Closes {
			for j := range p.Closes[i] {
				p.Closes[i][j] = [2]string{"z", "z"}
			}
		}
		for i := range p.From {
			p.From[i] = "Z9"
		}
	}
	c.JoinNets("gnd", "b+")
	c.RemovePart("R1")
	if after := writeString(t, orig); after != before {
		t.Errorf("editing the clone changed the original:\n%s", firstDiff(before, after))
	}
}

// TestRegionOf: a part named by a region belongs to it; otherwise the first
// region (by name) naming one of its nets; otherwise the default band.
func TestRegionOf(t *testing.T) {
	c := parseOK(t, `band = "455k..485k"
[regions]
audio = { band = "20..20k", parts = ["R1"], nets = ["af"] }
bass = { band = "20..200", nets = ["af"] }
[parts]
R1 = { r = "1k", pins = ["if", "gnd"] }
R2 = { r = "1k", pins = ["af", "gnd"] }
R3 = { r = "1k", pins = ["if", "gnd"] }
`)
	cases := []struct {
		ref, region string
		band        value.Range
	}{
		{"R1", "audio", value.Range{Min: 20, Max: 20e3}},
		{"R2", "audio", value.Range{Min: 20, Max: 20e3}},
		{"R3", "", value.Range{Min: 455e3, Max: 485e3}},
	}
	for _, tc := range cases {
		p := c.Part(tc.ref)
		r := c.RegionOf(p)
		name := ""
		if r != nil {
			name = r.Name
		}
		if name != tc.region {
			t.Errorf("RegionOf(%s) = %q, want %q", tc.ref, name, tc.region)
		}
		if b := c.BandOf(p); b != tc.band {
			t.Errorf("BandOf(%s) = %v, want %v", tc.ref, b, tc.band)
		}
	}
	merged := &Part{Ref: "R10", From: []string{"R1", "R3"}}
	if r := c.RegionOf(merged); r == nil || r.Name != "audio" {
		t.Errorf("a part merged from R1 should stay in R1's region, got %v", r)
	}
	if fb := c.FullBand(); fb != (value.Range{Min: 20, Max: 485e3}) {
		t.Errorf("FullBand = %v, want 20..485k", fb)
	}
}

// TestTermRoles: control/common/output electrodes across valves, BJTs and
// FETs (the trade's names: grid/base/gate, cathode/emitter/source,
// anode/collector/drain).
func TestTermRoles(t *testing.T) {
	cases := []struct {
		kind Kind
		pin  string
		want TermRole
	}{
		{Valve, "g1", RoleControl}, {Valve, "k", RoleCommon}, {Valve, "a", RoleOutput}, {Valve, "a2", RoleOutput},
		{Valve, "g2", RoleGrid}, {Valve, "h1", RoleHeater}, {Valve, "s", RoleShield},
		{BJT, "b", RoleControl}, {BJT, "e", RoleCommon}, {BJT, "c", RoleOutput},
		{FET, "g", RoleControl}, {FET, "s", RoleCommon}, {FET, "d", RoleOutput},
		{Resistor, "1", RolePassive},
	}
	for _, tc := range cases {
		if got := RoleOfPin(tc.kind, tc.pin); got != tc.want {
			t.Errorf("RoleOfPin(%s, %s) = %s, want %s", tc.kind, tc.pin, got, tc.want)
		}
	}
	c := mustLoad(t, filepath.Join(repo, "examples", "frequency-changer.toml"))
	v := c.Part("V1")
	if v.PinWithRole(RoleControl) != "g1" || v.PinWithRole(RoleCommon) != "k" || v.PinWithRole(RoleOutput) != "a" {
		t.Errorf("V1 roles: control %s common %s output %s", v.PinWithRole(RoleControl), v.PinWithRole(RoleCommon), v.PinWithRole(RoleOutput))
	}
}

func TestSuggest(t *testing.T) {
	valve := Terminals(Valve, "pentode")
	cases := []struct {
		typed string
		from  []string
		want  string
	}{
		{"g", valve, "g1"},
		{"titel", topKeys, "title"},
		{"pentod", ValveTypes(), "pentode"},
		{"xyzzy", topKeys, ""},
		{"title", topKeys, ""}, // exact: nothing to suggest
	}
	for _, tc := range cases {
		if got := Suggest(tc.typed, tc.from); got != tc.want {
			t.Errorf("Suggest(%q) = %q, want %q", tc.typed, got, tc.want)
		}
	}
}

// TestConnsOf: the terminals on a net in part-ref then pin-name order, the
// same as a from-scratch index.
func TestConnsOf(t *testing.T) {
	c := mustLoad(t, filepath.Join(repo, "examples", "frequency-changer.toml"))
	got := c.ConnsOf("k1")
	var names []string
	for _, cn := range got {
		names = append(names, cn.Part.Ref+"."+cn.Pin)
	}
	// The cathode net: L1's tap, and V1's cathode with the suppressor strapped
	// to it (read off the example's netlist).
	if want := []string{"L1.t", "V1.g3", "V1.k"}; !reflect.DeepEqual(names, want) {
		t.Errorf("ConnsOf(k1) = %v, want %v", names, want)
	}
	fresh := NewIndex(c.Parts, c.Nets)
	for _, n := range c.Nets {
		if !reflect.DeepEqual(fresh.Conns(n.Name), c.ConnsOf(n.Name)) {
			t.Errorf("ConnsOf(%s) and a fresh index disagree", n.Name)
		}
	}
}

func TestIsTwoTerminalAndParam(t *testing.T) {
	c := mustLoad(t, filepath.Join(repo, "testdata", "good", "every-kind.toml"))
	cases := map[string]bool{"R1": true, "C3": true, "L1": true, "D1": true, "X1": true,
		"L2": false, "T1": false, "V1a": false, "RV1": false, "S1": false, "P1": false}
	for ref, want := range cases {
		if got := c.Part(ref).IsTwoTerminal(); got != want {
			t.Errorf("%s.IsTwoTerminal() = %v, want %v", ref, got, want)
		}
	}
	// 0.45 mA/V written in the data-sheet unit is 0.45 mS.
	if gm, ok := c.Part("V1b").Param("gm"); !ok || !relNear(gm, 0.45e-3, 1e-12) {
		t.Errorf("V1b gm = %g, %v; want 0.45e-3 S", gm, ok)
	}
	if _, ok := c.Part("V1b").Param("mu"); ok {
		t.Error("V1b has no mu, but Param says it does")
	}
}

func TestPosAndErrorList(t *testing.T) {
	cases := []struct {
		p           Pos
		long, short string
		valid       bool
	}{
		{Pos{File: "a.toml", Line: 3, Col: 17}, "a.toml:3:17", "a.toml:3", true},
		{Pos{File: "a.toml", Line: 3}, "a.toml:3", "a.toml:3", true},
		{Pos{File: "a.toml"}, "a.toml", "a.toml", false},
		{Pos{}, "-", "-", false},
	}
	for _, tc := range cases {
		if tc.p.String() != tc.long || tc.p.Short() != tc.short || tc.p.IsValid() != tc.valid {
			t.Errorf("%#v: String %q Short %q IsValid %v", tc.p, tc.p.String(), tc.p.Short(), tc.p.IsValid())
		}
	}
	var l ErrorList
	if l.Err() != nil {
		t.Error("an empty list is not an error")
	}
	l.Add(Pos{File: "b.toml", Line: 2, Col: 1}, "second")
	l.Add(Pos{File: "a.toml", Line: 9, Col: 1}, "first")
	l.Add(Pos{File: "b.toml", Line: 2, Col: 1}, "second") // exact repeat: dropped
	l.Add(Pos{File: "b.toml", Line: 1, Col: 5}, "between")
	l.Sort()
	if got, want := l.Error(), "a.toml:9:1: first\nb.toml:1:5: between\nb.toml:2:1: second"; got != want {
		t.Errorf("sorted list:\n%s\nwant\n%s", got, want)
	}
	c := mustLoad(t, filepath.Join(repo, "examples", "frequency-changer.toml"))
	if got := Summary(c, 2); got != "26 parts, 15 nets, 2 warnings" {
		t.Errorf("Summary = %q", got)
	}
}
