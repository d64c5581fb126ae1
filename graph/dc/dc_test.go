package dc

import (
	"math"
	"strings"
	"testing"

	"pare/graph"
)

func load(t *testing.T, file string) *graph.Circuit {
	t.Helper()
	c, err := graph.LoadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestHandChecked compares with operating points worked by hand or by
// ngspice in docs/references.md §10.
func TestHandChecked(t *testing.T) {
	cases := []struct {
		file, net string
		want, tol float64
		src       string
	}{
		// Three-halves law, µ 100, gm 1.6 mA/V at 1.2 mA: derived, and ngspice 39 .op 181.4059.
		{"testdata/triode-self-bias.toml", "a", 181.406, 0.001, "derived (docs/references.md §10)"},
		{"testdata/triode-self-bias.toml", "k", 1.02891, 0.00001, "derived (docs/references.md §10)"},
		// Ebers–Moll with the Early effect, Is 1e-14, β 200, VA 100 V (the device model's):
		// ngspice 39 npn(IS=1e-14 BF=200 VAF=100) 2.050232 / 1.387634 / 5.509489 V.
		{"testdata/bjt-divider.toml", "b", 2.050232, 0.0001, "ngspice 39 .op (docs/references.md §10)"},
		{"testdata/bjt-divider.toml", "e", 1.387634, 0.0001, "ngspice 39 .op (docs/references.md §10)"},
		{"testdata/bjt-divider.toml", "c", 5.509489, 0.001, "ngspice 39 .op (docs/references.md §10)"},
	}
	for _, tc := range cases {
		pt, err := Solve(load(t, tc.file))
		if err != nil {
			t.Fatal(err)
		}
		got, _ := pt.Volts(tc.net)
		if math.Abs(got-tc.want) > tc.tol {
			t.Errorf("%s %s: %.6f V, want %.6f (%s)", tc.file, tc.net, got, tc.want, tc.src)
		}
	}
}

// TestPerveanceFromGm checks the derivation K = ia/x^1.5, x = 1.5·ia/gm
// against the worked valve of docs/references.md §10: K 1.005663e-3 A/V^1.5.
func TestPerveanceFromGm(t *testing.T) {
	pt, err := Solve(load(t, "testdata/triode-self-bias.toml"))
	if err != nil {
		t.Fatal(err)
	}
	for _, o := range pt.Origins {
		if o.Ref == "V1" && o.Param == "K" {
			if math.Abs(o.Value-1.005663e-3) > 1e-9 {
				t.Errorf("K = %.7g, want 1.005663e-3 (derived, docs/references.md §10)", o.Value)
			}
			return
		}
	}
	t.Error("no origin for V1's K")
}

// TestNoConvergenceNamesNets forces the failure path (one iteration allowed)
// and checks the message names nets instead of hanging or panicking.
func TestNoConvergenceNamesNets(t *testing.T) {
	defer func(n int) { maxIter = n }(maxIter)
	maxIter = 1
	_, err := Solve(load(t, "testdata/pentode-rc.toml"))
	if !IsNoConvergence(err) {
		t.Fatalf("want a convergence failure, got %v", err)
	}
	if !strings.Contains(err.Error(), "does not settle") || !strings.Contains(err.Error(), "a1") {
		t.Errorf("message should name the moving nets: %v", err)
	}
}

// TestDeterministic: the same circuit gives bit-identical voltages.
func TestDeterministic(t *testing.T) {
	c := load(t, "../../examples/if-detector-audio.toml")
	a, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := Solve(c)
	for i := range a.Nets {
		if a.Nets[i] != b.Nets[i] {
			t.Fatalf("net %s differs between runs", a.Nets[i].Name)
		}
	}
}

// TestMeterLoading: a 20 kΩ/V meter on its 250 V range is 5 MΩ; a 150 V
// source behind 47 kΩ reads 150·5M/(5M+47k) = 148.60 V (docs/references.md §10,
// common practice).
func TestMeterLoading(t *testing.T) {
	src := `title = "meter"
band = "20..20k"
[nets]
s = { role = "supply", volts = 150 }
[parts]
R1 = { r = "47k", pins = ["s", "x"] }
R2 = { r = "100G", pins = ["x", "gnd"] }
`
	c, err := graph.Parse("meter.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	mt, err := ParseMeter("20k/V@250")
	if err != nil {
		t.Fatal(err)
	}
	got, err := pt.Reading("x", mt)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(got-148.60) > 0.005 {
		t.Errorf("reading %.4f V, want 148.60 (derived, docs/references.md §10)", got)
	}
}
