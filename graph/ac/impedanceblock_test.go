package ac

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"pare/internal/synth"
)

// TestImpedanceBlockMatchesWhole: Impedance, solved on the block of the
// matrix its net lies in (impedanceSystem), equals the same sweep on the
// whole matrix (the path ImpedanceChecked keeps) to the last bit on one
// copy of every example and three fixtures, at every net the model sees;
// with a second copy beside it, to rounding (a relative 1e-12: the whole
// matrix is factored afresh when either block's reused pivot grows too
// small, as TestBlockProbeMatchesWhole says). Errors agree word for word
// (a floating net is the whole circuit's either way).
func TestImpedanceBlockMatchesWhole(t *testing.T) {
	files := append([]string{"testdata/two-inputs.toml", "testdata/hartley-xtal.toml", "testdata/if-pair.toml"}, exampleFiles(t)...)
	for i := 0; i < 2*len(files); i++ {
		f, n := files[i/2], 1+i%2
		c := copies(t, f, n)
		o := Options{VarSet: true, VarFrac: 0.3}
		freqs := logSweep(c.Band.Min, c.Band.Max, 9)
		checked := 0
		for _, net := range c.Nets {
			got, err := Impedance(c, net.Name, freqs, o)
			want, _, werr := ImpedanceChecked(c, net.Name, freqs, o)
			if fmt.Sprint(err) != fmt.Sprint(werr) {
				t.Errorf("%s ×%d: Z(%s): block error %v, whole %v", f, n, net.Name, err, werr)
				continue
			}
			if err != nil {
				continue
			}
			checked++
			for k := range freqs {
				d := cmplx.Abs(got[k] - want[k])
				if (n == 1 && got[k] != want[k]) || d > 1e-12*cmplx.Abs(want[k]) {
					t.Errorf("%s ×%d: Z(%s) at %g Hz: block %v, whole %v", f, n, net.Name, freqs[k], got[k], want[k])
				}
			}
		}
		if checked == 0 {
			t.Errorf("%s ×%d: no net's impedance solved: nothing compared", f, n)
		}
	}
}

// BenchmarkImpedanceBank is one tank's driving-point impedance on the
// receiver banks of about 1,000 and 10,000 parts (internal/synth, seed 1)
// over 401 points, as cmd/internal/align's reach search asks it per pass:
// solved on the tank's own channel, its cost should not grow with the
// bank.
//
//	go test -run XXX -bench ImpedanceBank -benchtime 3x ./graph/ac/
func BenchmarkImpedanceBank(b *testing.B) {
	for _, parts := range []int{1000, 10000} {
		c, err := synth.BankCircuit(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		net := ""
		for _, n := range c.Nets {
			if len(n.Name) > 8 && n.Name[:8] == "rf_tank_" {
				net = n.Name
				break
			}
		}
		if net == "" {
			b.Fatal("no rf_tank_ net in the bank")
		}
		freqs := logSweep(265e3, 1.06e6, 401)
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			for range b.N {
				zs, err := Impedance(c, net, freqs, Options{VarSet: true, VarFrac: 1})
				if err != nil {
					b.Fatal(err)
				}
				if math.IsNaN(cmplx.Abs(zs[0])) {
					b.Fatal("NaN impedance")
				}
			}
		})
	}
}
