package ac

import (
	"errors"
	"math"
	"math/cmplx"
	"strings"
	"testing"
)

// A winding reached only through ports (a mains primary) is held at 0 V as
// an undriven source, so the circuit solves: the primary is shorted and the
// secondary shows its leakage inductance Ls·(1−k²) (coupled inductors with
// one winding shorted, textbook: Z = jω(Ls − M²/Lp), M = k√(LpLs)). A stated
// termination on a port net gives the group its own path to ground and the
// primary is open again: the secondary is Ls alone. A group with no port
// still floats and says so.
func TestPortOnlyWindingIsHeld(t *testing.T) {
	const src = `
band = "1k..1k"
inputs = ["in"]
outputs = ["s"]
[parts]
R1 = { r = "1k", pins = ["in", "s"] }
T1 = { windings = { p = "4", s = "1" }, k = 0.98, pins = { p1 = "mains_l", p2 = "mains_n", s1 = "s", s2 = "gnd" } }
P1 = { port = "mains", pins = ["mains_l"] }
P2 = { port = "mains neutral", pins = ["mains_n"] }
`
	w := 2 * math.Pi * 1e3
	divider := func(l float64) complex128 { // V(s)/V(in) = jωL/(R + jωL)
		z := complex(0, w*l)
		return z / (1e3 + z)
	}
	cases := []struct {
		name string
		src  string
		o    Options
		want complex128
	}{
		{"ports held: primary shorted", src, Options{}, divider(1 * (1 - 0.98*0.98))},
		{"a stated termination opens it", src, Options{Terminate: map[string]float64{"mains_l": 1e6}}, divider(1)},
	}
	for _, tc := range cases {
		got, err := Transfer(mustParse(t, tc.src), "in", "s", []float64{1e3}, tc.o)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if d := cmplx.Abs(got[0]-tc.want) / cmplx.Abs(tc.want); d > 1e-6 {
			t.Errorf("%s: V(s)/V(in) = %v, want %v", tc.name, got[0], tc.want)
		}
	}
	noPorts := strings.Replace(strings.Replace(src, "P1 = ", "# ", 1), "P2 = ", "# ", 1)
	_, err := Transfer(mustParse(t, noPorts), "in", "s", []float64{1e3}, Options{})
	var fe *FloatingError
	if !errors.As(err, &fe) || strings.Join(fe.Nets, ",") != "mains_l,mains_n" {
		t.Errorf("without ports the primary floats: want a FloatingError naming mains_l, mains_n, got %v", err)
	}
}

// The bridge on its mains transformer verifies against itself, with a note
// naming the held nets and no impedance asked of them (both would be 0).
func TestCompareHeldPorts(t *testing.T) {
	c := load(t, "testdata/mains-bridge.toml")
	rep, err := Compare(c, c.Clone(), CompareOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !rep.OK {
		t.Errorf("a circuit compared with itself must agree: %+v", rep)
	}
	for _, p := range rep.Pairs {
		if p.From == "mains_l" || p.From == "mains_n" {
			t.Errorf("impedance at a held net compared: %+v", p)
		}
	}
	notes := strings.Join(rep.Notes, "\n")
	if !strings.Contains(notes, "Held at 0 V: net(s) mains_l, mains_n, reached only through a port") {
		t.Errorf("notes do not name the held nets:\n%s", notes)
	}
}

// A two-pin inlet (a generic part, which the model leaves open) is a way in
// just as two ports are: the primary behind it is held, and the secondary
// shows the leakage inductance Ls·(1−k²) of coupled inductors with the
// other winding shorted (textbook, as above). Undriven names only a group
// that nothing brings in: a primary across a resistor and nothing else.
func TestInletPartIsAWayIn(t *testing.T) {
	const base = `
band = "1k..1k"
inputs = ["in"]
outputs = ["s"]
[parts]
R1 = { r = "1k", pins = ["in", "s"] }
T1 = { windings = { p = "4", s = "1" }, k = 0.98, pins = { p1 = "mains_l", p2 = "mains_n", s1 = "s", s2 = "gnd" } }
`
	w := 2 * math.Pi * 1e3
	z := complex(0, w*1*(1-0.98*0.98))
	want := z / (1e3 + z)
	cases := []struct {
		name, extra string
		undriven    string // nets Undriven names, joined
		solves      bool
	}{
		{"two-pin inlet", `P2 = { part = "mains inlet", pins = { l = "mains_l", n = "mains_n" } }`, "", true},
		{"two ports", "P2 = { port = \"line\", pins = [\"mains_l\"] }\nP3 = { port = \"neutral\", pins = [\"mains_n\"] }", "", true},
		{"nothing brings it in", `R2 = { r = "10", pins = ["mains_l", "mains_n"] }`, "mains_l,mains_n", false},
	}
	for _, tc := range cases {
		c := mustParse(t, base+tc.extra+"\n")
		if got := strings.Join(Undriven(c), ","); got != tc.undriven {
			t.Errorf("%s: Undriven = %q, want %q", tc.name, got, tc.undriven)
		}
		got, err := Transfer(c, "in", "s", []float64{1e3}, Options{})
		if !tc.solves {
			var fe *FloatingError
			if !errors.As(err, &fe) {
				t.Errorf("%s: want a FloatingError, got %v", tc.name, err)
			}
			continue
		}
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if d := cmplx.Abs(got[0]-want) / cmplx.Abs(want); d > 1e-6 {
			t.Errorf("%s: V(s)/V(in) = %v, want %v", tc.name, got[0], want)
		}
	}
}
