package align

import (
	"fmt"
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules/stages"
)

// Where the dial stands for an RF row. The repairer sets the dial to the
// generator's frequency: the gang turned until the set's tuned circuit
// resonates there. Where the gang tunes the row's path, that is the
// response's peak (peakGang); where it does not (an ideal source on a
// tank's hot end, a ferrite rod's, or a row past every tuned circuit, a
// VFO's buffer) the response barely moves over the travel and its peak
// lands anywhere (review20 b01 read "gang 2 %" at 2.828 MHz where the
// VFO's own tank stands at about 55 %): the setting is then read from the
// tank itself, its impedance's phase through zero at the frequency (the
// resonance of a parallel tank, handbook).

// dialScan is the points of the first pass over the gang's travel; a
// bisection on the bracket with the largest impedance then refines it to
// a thousandth of the travel and better.
const (
	dialScan   = 20
	dialBisect = 30
)

// rowTank is the tuned circuit that reads the dial for a row from net to
// ref: the signal-frequency tuning capacitor (a gang section or a single
// tuning capacitor) between them nearest ref (the one the row's signal
// passes last, as tuneNet), else the one nearest the row, else an
// oscillator's (a VFO, whose tank is the dial); nil with none.
func rowTank(c *graph.Circuit, sts []stages.Stage, net, ref string) *graph.Part {
	tuners := tuningCaps(c)
	if len(tuners) == 0 {
		return nil
	}
	osc := oscTuners(c, sts)
	dist := netDistances(c)
	from, to := dist(net), dist(ref)
	var between, nearest *graph.Part
	bestB, bestN := -1, 1<<31-1
	for _, gp := range tuners {
		hot := hotNet(c, gp)
		if osc[gp] || hot == "" {
			continue
		}
		d := dist(hot)
		if d >= from && d <= to && d > bestB {
			between, bestB = gp, d
		}
		if a := abs(d - from); a < bestN {
			nearest, bestN = gp, a
		}
	}
	switch {
	case between != nil:
		return between
	case nearest != nil:
		return nearest
	}
	for _, gp := range tuners {
		if osc[gp] {
			return gp
		}
	}
	return nil
}

// tuningCaps are the variable capacitors the solver's gang setting turns
// (graph/ac: every capacitor of type variable, ganged or alone), in the
// circuit's order.
func tuningCaps(c *graph.Circuit) []*graph.Part {
	var out []*graph.Part
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type == graph.CapVariable {
			out = append(out, p)
		}
	}
	return out
}

// oscTuners are the tuning capacitors that tune an oscillator: the gang
// sections of oscSections, and the one across the tank coil of a stage
// whose loop oscillates (a VFO's single tuning capacitor, ganged with
// nothing).
func oscTuners(c *graph.Circuit, sts []stages.Stage) map[*graph.Part]bool {
	out := oscSections(c, sts)
	for i := range sts {
		if lo, hi := loopRange(&sts[i]); hi > lo {
			if _, tuner := tankOf(c, sts[i]); tuner != nil {
				out[tuner] = true
			}
		}
	}
	return out
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// dialSetting is the gang setting (fraction of travel from fully open)
// at which the tank on section gp resonates at f in c: where the
// imaginary part of its impedance at the section's hot net turns from
// inductive (the tank above f, gang more open) to capacitive, in the
// bracket of the largest impedance (the parallel resonance, not a series
// one between windings). ok is false when the tank does not reach f
// anywhere on the travel. The tank is solved as the set stands with no
// generator on it (no declared input held at 0 V): the dial is the set's,
// and a source held on a VFO's emitter would add the feedback divider's
// upper capacitor across the tank (review20 b01: 2.66–3.08 MHz with the
// divider in series, as the reviewer's ngspice, not 2.39–2.71 MHz).
func dialSetting(c *graph.Circuit, gp *graph.Part, f float64) (th float64, ok bool) {
	net := hotNet(c, gp)
	if len(c.Inputs) > 0 {
		c = c.Clone()
		c.Inputs = nil
	}
	z := func(th float64) complex128 {
		zs, err := ac.Impedance(c, net, []float64{f}, ac.Options{VarFrac: th, VarSet: true})
		if err != nil || len(zs) == 0 {
			return complex(math.NaN(), math.NaN())
		}
		return zs[0]
	}
	lo, best := -1.0, -1.0
	prev := z(0)
	for k := 1; k <= dialScan; k++ {
		a, b := float64(k-1)/dialScan, float64(k)/dialScan
		next := z(b)
		if imag(prev) > 0 && imag(next) <= 0 {
			if m := cmplx.Abs(prev) + cmplx.Abs(next); m > best {
				lo, best = a, m
			}
		}
		prev = next
	}
	if lo < 0 {
		return 0, false
	}
	hi := lo + 1.0/dialScan
	for range dialBisect {
		mid := (lo + hi) / 2
		if imag(z(mid)) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2, true
}

// dialGang sets row in's gang where the tank that reads the dial for it
// resonates at the row's frequency (in.Gang, in.Tuned, in.DialTank); a
// row with no ganged tank, or one whose tank does not reach the
// frequency, keeps the gang at mid-travel, untuned, and says which.
func (g *Guide) dialGang(c *graph.Circuit, sts []stages.Stage, in *Injection) {
	gp := rowTank(c, sts, in.Net, in.RefNet)
	if gp == nil {
		return
	}
	in.DialTank = tankWord(c, sts, gp)
	key := fmt.Sprintf("%s@%g", gp.Ref, in.Freq)
	if g.dials == nil {
		g.dials = map[string][2]float64{}
	}
	d, seen := g.dials[key]
	if !seen {
		th, ok := dialSetting(c, gp, in.Freq)
		d = [2]float64{th, 0}
		if ok {
			d[1] = 1
		}
		g.dials[key] = d
	}
	if d[1] == 1 {
		in.Gang, in.Tuned = d[0], true
	}
}

// tankWord names the tuned circuit on tuning capacitor gp by the stage it
// serves, with the capacitor's ref: "the aerial circuit (C1a)".
func tankWord(c *graph.Circuit, sts []stages.Stage, gp *graph.Part) string {
	return tankKind(c, sts, gp) + " (" + gp.Ref + ")"
}

// tankKind is what the tuned circuit on gp serves: an oscillator (a
// mixer's or an oscillator stage's section, a VFO's capacitor), the aerial
// (its coil fed from the aerial input), else the RF path.
func tankKind(c *graph.Circuit, sts []stages.Stage, gp *graph.Part) string {
	if oscTuners(c, sts)[gp] {
		return "the oscillator's tuned circuit"
	}
	if coil := tankOn(c, gp).coil; coil != nil && len(c.Inputs) > 0 && fedFromAerial(c, coil, c.Inputs[0]) {
		return "the aerial circuit"
	}
	return "the RF circuit"
}
