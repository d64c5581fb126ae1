package device

import (
	"bufio"
	"bytes"
	"context"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"pare/graph"
	"pare/internal/reftool"
)

// The device model against ngspice's own nonlinear devices: a Gummel–Poon
// transistor, a JFET, a junction diode, and a triode written as a
// behavioural source with the three-halves-power law
// (docs/references.md §10). ngspice linearises each at its operating point;
// the impedance it computes into an electrode must equal this package's
// formula fed with the small-signal values of that operating point, and this
// package's laws
// (gm = Ic/VT, rπ = β/gm, ro = VA/Ic, rd = VT/Id, ra = µ/gm) must give those
// values. ngspice runs at 26.85 °C, the 300 K of VT.

// opVec is one operating-point value to read: a name and an ngspice
// expression (v(a), @q1[gm]).
type opVec struct{ name, expr string }

// spiceZ runs a deck whose circuit drives node with a 1 A AC current source
// named IAC (DC 0), and returns the operating-point values asked for and
// the impedance V(node)/1 A at 1 kHz (the models here hold no reactance).
func spiceZ(t *testing.T, circuit, node string, vecs []opVec) (map[string]float64, complex128) {
	t.Helper()
	bin := reftool.Find(t, reftool.Ngspice)
	var b strings.Builder
	b.WriteString("* pare device cross-check\n" + circuit + "\nIAC 0 " + node + " DC 0 AC 1\n.options temp=26.85\n.control\n")
	b.WriteString("set wr_singlescale\nset wr_vecnames\noption numdgt=12\nop\n")
	var names []string
	for _, v := range vecs {
		b.WriteString("let " + v.name + " = " + v.expr + "\n")
		names = append(names, v.name)
	}
	if len(names) > 0 {
		b.WriteString("wrdata op.dat " + strings.Join(names, " ") + "\n")
	}
	b.WriteString("ac lin 1 1k 1k\nwrdata ac.dat vr(" + node + ") vi(" + node + ")\nquit\n.endc\n.end\n")
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 30*time.Second)
	defer cancel()
	cmd := exec.CommandContext(ctx, bin, "-b", "deck.cir")
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("ngspice: %v\n%s", err, stderr.String())
	}
	// ngspice exits 0 on errors inside .control (docs/references.md §15).
	for _, l := range strings.Split(stderr.String(), "\n") {
		if strings.Contains(l, "Error") || strings.Contains(l, "singular") {
			t.Fatalf("ngspice reported: %s\ndeck:\n%s", l, b.String())
		}
	}
	op := map[string]float64{}
	if len(names) > 0 {
		op = readTable(t, filepath.Join(dir, "op.dat"))
	}
	ac := readTable(t, filepath.Join(dir, "ac.dat"))
	return op, complex(ac["vr("+node+")"], ac["vi("+node+")"])
}

// readTable reads a one-row wrdata table with a header of vector names.
func readTable(t *testing.T, path string) map[string]float64 {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("ngspice wrote no %s: %v", filepath.Base(path), err)
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	var head []string
	out := map[string]float64{}
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 0 {
			continue
		}
		if head == nil {
			head = f
			continue
		}
		for i, s := range f {
			v, err := strconv.ParseFloat(s, 64)
			if err != nil || i >= len(head) {
				t.Fatalf("%s: bad row %q", path, sc.Text())
			}
			out[head[i]] = v
		}
	}
	return out
}

func checkNear(t *testing.T, what string, got, want, rel float64, why string) {
	t.Helper()
	t.Logf("%s: pare %.9g, ngspice %.9g, %.2g %% apart", what, got, want, 100*math.Abs(got/want-1))
	if !near(got, want, rel) {
		t.Errorf("%s: pare %.9g, ngspice %.9g (%.3g %%, allowed %.3g %%; %s)", what, got, want, 100*math.Abs(got/want-1), 100*rel, why)
	}
}

// spiceExact is the agreement of a formula fed with ngspice's own
// small-signal values: both are the same linear algebra, so only rounding
// (12 printed digits) separates them.
const spiceExact = 1e-6

// The three-halves-power triode of docs/references.md §10: µ 100, gm
// 1.6 mA/V at 1.2 mA, K = 1.005663e-3 A/V^1.5.
const triodeLaw = "B1 a k I = 1.005663e-3*pow(max(v(g,k)+v(a,k)/100,0),1.5)"

// triodeGm is the law's gm at its operating point: 1.5·K·√(Vgk + Vak/µ).
func triodeGm(op map[string]float64) float64 {
	x := op["vg"] - op["vk"] + (op["va"]-op["vk"])/100
	return 1.5 * 1.005663e-3 * math.Sqrt(x)
}

var triodeVecs = []opVec{{"va", "v(a)"}, {"vg", "v(g)"}, {"vk", "v(k)"}}

func TestTriodeAgainstNgspice(t *testing.T) {
	// Cathode: anode load 100 kΩ from 250 V, grid at 0 V, 1.2 mA drawn out
	// of the cathode by a current source (open at AC).
	// A node set near the answer: from 0 V the law's slope is zero and the
	// cathode, fed only by current sources, would float.
	op, z := spiceZ(t, "VHT ht 0 DC 250\nRL ht a 100k\nVG g 0 DC 0\nIK k 0 DC 1.2m\n"+triodeLaw+"\n.nodeset v(k)=0.17 v(a)=130", "k", triodeVecs)
	gm := triodeGm(op)
	checkNear(t, "gm at 1.2 mA", gm, 1.6e-3, 1e-4, "docs/references.md §10: the law's stated operating point")
	s := mustOf(t, part(graph.Valve, "triode", map[string]float64{"gm": gm, "mu": 100}))
	checkNear(t, "cathode (ra+RL)/(µ+1)", s.ZCommon(100e3), real(z), spiceExact, "ra = µ/gm follows from the law")
	// Anode: cathode resistor 1.5 kΩ, anode fed through 100 kΩ; the
	// measured impedance is that feed in parallel with ra + (µ+1)·Rk.
	op, z = spiceZ(t, "VHT ht 0 DC 250\nRL ht a 100k\nVG g 0 DC 0\nRK k 0 1.5k\n"+triodeLaw, "a", triodeVecs)
	s = mustOf(t, part(graph.Valve, "triode", map[string]float64{"gm": triodeGm(op), "mu": 100}))
	checkNear(t, "anode ra+(µ+1)Rk", 1/(1/s.ZOutput(1.5e3)+1/100e3), real(z), spiceExact, "derived from the law")
}

var bjtModel = ".model qn npn(IS=1e-14 BF=100 VAF=100)"

var bjtVecs = []opVec{{"gm", "@q1[gm]"}, {"gpi", "@q1[gpi]"}, {"go", "@q1[go]"}, {"ic", "@q1[ic]"}, {"ib", "@q1[ib]"}}

// bjtFromOp is the model of a part that gives the operating point's bias
// current and DC current gain, as a repairer would from a measurement.
func bjtFromOp(t *testing.T, op map[string]float64) Small {
	return mustOf(t, part(graph.BJT, "npn", map[string]float64{"ic": op["ic"], "beta": op["ic"] / op["ib"]}))
}

func TestBJTAgainstNgspice(t *testing.T) {
	// Emitter: 1 mA drawn out of the emitter, base at 0 V, collector 4.7 kΩ
	// from 4.8 V (Vcb about 0.1 V, so the Early voltage is VAF itself).
	op, z := spiceZ(t, "VCC vcc 0 DC 4.8\nRL vcc c 4.7k\nVB b 0 DC 0\nIE e 0 DC 1m\nQ1 c b e qn\n"+bjtModel, "e", bjtVecs)
	s := bjtFromOp(t, op)
	// Gummel–Poon's Early factor adds a term of VT/VAF (0.03 %) to dIc/dVbe.
	checkNear(t, "gm = Ic/VT", s.Gm, op["gm"], 1e-3, "Ebers–Moll, forward active")
	checkNear(t, "rπ = β/gm", s.RPi, 1/op["gpi"], 1e-3, "Ebers–Moll: gπ = Ib/VT")
	// ngspice's ro is (VAF + Vcb)/Ic; the textbook VA/Ic leaves out Vcb.
	checkNear(t, "ro = VA/Ic", s.ROut, 1/op["go"], 5e-3, "Early effect, Vcb ≈ 0.1 V against VA 100 V")
	checkNear(t, "emitter, model", s.ZCommon(4.7e3), real(z), 5e-3, "the laws above, then ZCommon")
	ng := Small{Gm: op["gm"], RPi: 1 / op["gpi"], ROut: 1 / op["go"]}
	checkNear(t, "emitter rπ ∥ (ro+RL)/(1+gm·ro)", ng.ZCommon(4.7e3), real(z), spiceExact, "ngspice's own gm, gπ, go")

	// Base: 10 µA into the base, emitter 1 kΩ to ground, collector at 10 V.
	op, z = spiceZ(t, "VCC c 0 DC 10\nIB 0 b DC 10u\nRE e 0 1k\nQ1 c b e qn\n"+bjtModel, "b", bjtVecs)
	ng = Small{Gm: op["gm"], RPi: 1 / op["gpi"], ROut: 1 / op["go"]}
	checkNear(t, "base rπ+(β+1)(RE∥ro)", ng.ZControl(1e3), real(z), spiceExact, "ngspice's own gm, gπ, go")

	// Collector: base at 1.7 V, emitter 1 kΩ to ground, collector fed
	// through 4.7 kΩ from 12 V; the measured impedance is that feed in
	// parallel with ro(1+gm·(RE∥rπ)) + RE∥rπ.
	op, z = spiceZ(t, "VCC vcc 0 DC 12\nRC vcc c 4.7k\nVB b 0 DC 1.7\nRE e 0 1k\nQ1 c b e qn\n"+bjtModel, "c", bjtVecs)
	ng = Small{Gm: op["gm"], RPi: 1 / op["gpi"], ROut: 1 / op["go"]}
	checkNear(t, "collector ro(1+gm·r)+r", 1/(1/ng.ZOutput(1e3)+1/4.7e3), real(z), spiceExact, "ngspice's own gm, gπ, go")
}

func TestJFETAgainstNgspice(t *testing.T) {
	vecs := []opVec{{"gm", "@j1[gm]"}, {"gds", "@j1[gds]"}}
	model := ".model jn njf(VTO=-2 BETA=1m LAMBDA=0.02)"
	// Source: gate at 0 V, 1 mA drawn out of the source, drain 10 kΩ from 15 V.
	op, z := spiceZ(t, "VDD vdd 0 DC 15\nRL vdd d 10k\nVG g 0 DC 0\nIS s 0 DC 1m\nJ1 d g s jn\n"+model, "s", vecs)
	s := mustOf(t, part(graph.FET, "njfet", map[string]float64{"gm": op["gm"], "rd": 1 / op["gds"]}))
	checkNear(t, "source (rd+RL)/(1+gm·rd)", s.ZCommon(10e3), real(z), spiceExact, "ngspice's own gm, gds")
	// Drain: source 1 kΩ to ground, drain fed through 10 kΩ from 15 V.
	op, z = spiceZ(t, "VDD vdd 0 DC 15\nRL vdd d 10k\nVG g 0 DC 0\nRS s 0 1k\nJ1 d g s jn\n"+model, "d", vecs)
	s = mustOf(t, part(graph.FET, "njfet", map[string]float64{"gm": op["gm"], "rd": 1 / op["gds"]}))
	checkNear(t, "drain rd+(µ+1)RS", 1/(1/s.ZOutput(1e3)+1/10e3), real(z), spiceExact, "ngspice's own gm, gds")
}

func TestDiodeAgainstNgspice(t *testing.T) {
	// 1 mA through a junction diode of ideality 1: its resistance is the
	// default rd = VT/1 mA (Shockley).
	_, z := spiceZ(t, "ID 0 a DC 1m\nD1 a 0 dn\n.model dn d(IS=1e-14 N=1)", "a", nil)
	rd, _ := DiodeRd(part(graph.Diode, "signal", nil), 0)
	// ngspice's own constants (CODATA 2014 k and q) and GMIN across the
	// junction move the last digits only.
	checkNear(t, "rd = VT/Id", rd, real(z), 2e-5, "Shockley, ideality 1, 300 K")
}
