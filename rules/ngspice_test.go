package rules

import (
	"bufio"
	"bytes"
	"math"
	"math/cmplx"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/value"
	"pare/internal/reftool"
)

// An independent solver agrees that the reductions keep the signal: ngspice
// (Debian package, docs/references.md §15) sweeps the original and the reduced
// circuit from the same input over the input's own bands (a small-signal
// transfer keeps frequency: an IF input is not asked to behave at audio,
// where its bypasses were never meant to bypass), and the responses at every
// declared output stay within 0.5 dB and 5° (the project's verification
// tolerance, common practice) wherever the response is within 60 dB of its
// peak (below that, a deep null's exact depth is not the signal's behaviour).
func TestReductionsAgainstNgspice(t *testing.T) {
	bin := reftool.Find(t, reftool.Ngspice)
	for _, path := range fixtures(t) {
		c := loadFile(t, path)
		if len(c.Inputs) == 0 || len(c.Outputs) == 0 {
			continue
		}
		// As the pipeline does: the detectors keep the wiring's DC load
		// (a grounded AGC line returns no DC), and the reduced deck says so.
		ac.KeepDetectorLoads(c)
		r, _ := reduceChecked(t, c, Options{Level: LevelSignal})
		for _, in := range c.Inputs {
			for _, band := range inputBands(c, in) {
				o := ac.SpiceOptions{Input: in, Outputs: c.Outputs, PointsPerDecade: 40, Band: band}
				fo, ro := spice(t, bin, c, o)
				fr, rr := spice(t, bin, r, o)
				if len(fo) != len(fr) {
					t.Fatalf("%s: sweeps differ in length", path)
				}
				for k, out := range c.Outputs {
					peak := 0.0
					for _, v := range ro[k] {
						peak = math.Max(peak, cmplx.Abs(v))
					}
					worstDB, worstDeg, at := 0.0, 0.0, 0.0
					for i := range fo {
						a, b := ro[k][i], rr[k][i]
						if cmplx.Abs(a) < peak*1e-3 {
							continue
						}
						dB := math.Abs(20 * math.Log10(cmplx.Abs(b)/cmplx.Abs(a)))
						deg := math.Abs(cmplx.Phase(b/a)) * 180 / math.Pi
						if dB > worstDB || deg > worstDeg {
							worstDB, worstDeg, at = math.Max(worstDB, dB), math.Max(worstDeg, deg), fo[i]
						}
					}
					if worstDB > 0.5 || worstDeg > 5 {
						t.Errorf("%s: V(%s)/V(%s) after reduction differs by %.3f dB, %.2f° (near %.4g Hz) in ngspice", path, out, in, worstDB, worstDeg, at)
					}
				}
			}
		}
	}
}

// inputBands are the bands of the parts on an input net, each once.
func inputBands(c *graph.Circuit, in string) []value.Range {
	var out []value.Range
	for _, cn := range c.ConnsOf(in) {
		b := c.BandOf(cn.Part)
		if b.Max > 0 && !containsRange(out, b) {
			out = append(out, b)
		}
	}
	return out
}

func containsRange(list []value.Range, r value.Range) bool {
	for _, x := range list {
		if x == r {
			return true
		}
	}
	return false
}

func spice(t *testing.T, bin string, c *graph.Circuit, o ac.SpiceOptions) ([]float64, [][]complex128) {
	t.Helper()
	dir := t.TempDir()
	o.DataFile = "sweep.dat"
	var deck bytes.Buffer
	if err := ac.WriteSpice(&deck, c, o); err != nil {
		t.Fatalf("WriteSpice: %v", err)
	}
	if err := os.WriteFile(filepath.Join(dir, "deck.cir"), deck.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(bin, "-b", "deck.cir")
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("ngspice: %v\n%s", err, stderr.String())
	}
	// ngspice exits 0 after errors in .control and on singular matrices
	// (docs/references.md §15), so its complaints are looked for on stderr.
	for _, l := range strings.Split(stderr.String(), "\n") {
		if strings.Contains(l, "Error") || strings.Contains(l, "singular") {
			t.Fatalf("ngspice: %s\n%s", l, deck.String())
		}
	}
	data, err := os.ReadFile(filepath.Join(dir, "sweep.dat"))
	if err != nil {
		t.Fatalf("ngspice wrote no table: %v\n%s", err, stderr.String())
	}
	var freqs []float64
	var outs [][]complex128
	sc := bufio.NewScanner(bytes.NewReader(data))
	header := true
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 0 {
			continue
		}
		if header { // wr_vecnames: frequency, then magnitude and phase per output
			header = false
			outs = make([][]complex128, (len(f)-1)/2)
			continue
		}
		v := make([]float64, len(f))
		for i, s := range f {
			if v[i], err = strconv.ParseFloat(s, 64); err != nil {
				t.Fatalf("table: %v", err)
			}
		}
		freqs = append(freqs, v[0])
		for k := range outs {
			outs[k] = append(outs[k], cmplx.Rect(v[1+2*k], v[2+2*k]))
		}
	}
	if len(freqs) == 0 {
		t.Fatal("empty table")
	}
	return freqs, outs
}
