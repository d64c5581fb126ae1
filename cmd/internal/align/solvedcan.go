package align

import (
	"math"
	"math/cmplx"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules/stages"
)

// An IF can that no recognised stage holds (the first can of an IF strip
// captured from the mixer's collector, driven by an input port rather than
// a device pare sees) is still an IF can: the solver finds its winding
// resonant at the IF in circuit. Left out, the guide skipped its core and
// named the device after it as "the device feeding the first IF
// transformer".

// solvedCans are the transformers with an adjustable core, in no
// stage that names a resonance of its own and not in have, whose winding
// the solver finds resonant within ifNear of the IF: the peak of the
// impedance from one of its signal nets to ground, inside a sweep of half
// an octave either side. A plain coil resonant at the IF is left to the
// stages and the trap: at the aerial it is the IF trap, which rejects the
// IF rather than passing it on as a can's windings do.
func solvedCans(c *graph.Circuit, sts []stages.Stage, ifHz float64, have []*graph.Part) []*graph.Part {
	var out []*graph.Part
	for _, p := range c.Parts {
		if p.Kind != graph.Transformer || len(p.Adjust) == 0 || slices.Contains(have, p) || inTunedStage(sts, p.Ref) {
			continue
		}
		if f, ok := peakNear(c, p, ownNets(p, have), ifHz); ok && math.Abs(f-ifHz) <= ifNear*ifHz {
			out = append(out, p)
		}
	}
	return out
}

// ownNets are p's nets less the ends of any winding that touches a net of
// a can in have: an oscillator coil's feedback winding in series with the
// first can's primary (a self-oscillating mixer) sees that can's
// resonance, not its own.
func ownNets(p *graph.Part, have []*graph.Part) []string {
	taken := map[string]bool{}
	for _, h := range have {
		for _, n := range netsOf(h) {
			taken[n] = true
		}
	}
	skip := map[string]bool{}
	for _, w := range p.Windings {
		a, b := p.NetOf(w.From), p.NetOf(w.To)
		if taken[a] || taken[b] {
			skip[a], skip[b] = true, true
		}
	}
	var out []string
	for _, n := range netsOf(p) {
		if !skip[n] && !taken[n] {
			out = append(out, n)
		}
	}
	return out
}

// inTunedStage reports whether a stage holding ref names a resonance or
// runs a loop (an oscillator's or a self-oscillating mixer's coil): its
// tuning is that stage's, at the IF or not.
func inTunedStage(sts []stages.Stage, ref string) bool {
	for _, s := range sts {
		if !slices.Contains(s.Parts, ref) {
			continue
		}
		if len(s.Loop) > 0 {
			return true
		}
		for _, n := range []string{"osc_f", "sig_f", "if"} {
			if _, ok := s.Figures.Get(n); ok {
				return true
			}
		}
		for _, n := range resonanceNames {
			if _, ok := s.Figures.Get(n); ok {
				return true
			}
		}
	}
	return false
}

// canSweep is the number of points of the sweep round the IF: 1 % steps
// over a factor of two, fine enough to place a peak within ifNear.
const canSweep = 71

// peakNear is the frequency of the largest impedance to ground at any of
// the signal nets of p given across IF/√2..IF·√2, when that largest value is a peak
// inside the sweep, twice the impedance at both its ends.
func peakNear(c *graph.Circuit, p *graph.Part, nets []string, ifHz float64) (float64, bool) {
	freqs := make([]float64, canSweep)
	for i := range freqs {
		freqs[i] = ifHz * math.Pow(2, float64(i)/float64(canSweep-1)-0.5)
	}
	best, at := 0.0, -1
	var edge [2]float64
	for _, net := range nets {
		if c.RoleOf(net) != graph.Signal {
			continue
		}
		zs, err := ac.Impedance(c, net, freqs, ac.Options{VarFrac: 0.5, VarSet: true})
		if err != nil {
			continue
		}
		for i, z := range zs {
			if m := cmplx.Abs(z); m > best {
				best, at = m, i
				edge = [2]float64{cmplx.Abs(zs[0]), cmplx.Abs(zs[len(zs)-1])}
			}
		}
	}
	if at <= 0 || at >= canSweep-1 || best < 2*edge[0] || best < 2*edge[1] {
		return 0, false
	}
	return freqs[at], true
}
