package dc

import (
	"math"
	"slices"
	"strings"

	"pare/graph"
)

// Faults and the rails. A declared rail is held: a battery or a regulated
// supply keeps its voltage against any load but a short across it
// (collapseRails). An estimated rail (rectifier.go) answers the load the
// faulty circuit draws, through the same capacitor-input estimate, and a
// fault in the rectifier itself changes the estimate: a shorted reservoir
// or rectifier, an open rectifier valve or winding, stop it (the rail reads
// 0 V, the fuse or the valve gone: common practice); one open diode of a
// full-wave rectifier leaves it half-wave.

// isEstimated reports whether held terminal t is an estimated rail.
func (m *model) isEstimated(t term) bool {
	for _, k := range m.rectFixed {
		if -1-k == t {
			return true
		}
	}
	return false
}

// rectifierFault applies f to the rectifiers it reaches.
func (e *faultEdit) rectifierFault(f Fault) {
	for k := range e.c.rects {
		r := &e.c.rects[k]
		switch {
		case slices.Contains(r.parts, f.Ref) && f.Kind == "open":
			if r.valve || !r.full {
				r.dead = true // a valve diode's emission, or the only diode, gone
			} else {
				r.full = false
				r.wave += ", one diode open: half-wave"
			}
		case slices.Contains(r.parts, f.Ref) && f.Kind == "short":
			r.dead = true
		case f.Ref == r.surge && f.Kind == "high":
			// a surge resistor gone high: the pulses see it too (an open
			// one stops the DC solve's feed on its own)
			r.rs += r.rsurge * (highFactor - 1)
			r.rsurge *= highFactor
		case f.Ref == r.xfmr && strings.HasPrefix(f.Kind, "winding "):
			w := strings.TrimSuffix(strings.TrimPrefix(f.Kind, "winding "), " open")
			switch {
			case w == r.sec:
				r.dead = true
			case strings.HasPrefix(w, r.sec) && len(w) == len(r.sec)+1 && r.full:
				r.full = false // one half of a centre-tapped winding
				r.wave += ", one half open: half-wave"
			case e.m.isPrimary(f.Ref, w):
				r.dead = true
			}
		}
	}
}

// isPrimary: a winding of transformer ref none of whose ends is in the DC
// model (the mains side).
func (m *model) isPrimary(ref, winding string) bool {
	p := m.circuit.Part(ref)
	w := p.Winding(winding)
	if w == nil {
		return false
	}
	for _, pin := range []string{w.From, w.To} {
		for _, c := range m.circuit.Index().Conns(p.NetOf(pin)) {
			if c.Part != p && c.Part.Kind != graph.Port {
				return false
			}
		}
	}
	return true
}

// solveFaultRails solves a faulty model on s; with estimated rails, each is
// found where the estimate at the load the circuit draws equals the rail's
// voltage. The load rises with the rail and the estimate falls with the
// load, so their difference is monotonic and bisection on the rail's volts
// always settles, even where a short makes plain alternation swing.
func (p *Point) solveFaultRails(s *system, fm *model, extra []branch, start []float64) ([]float64, error) {
	v, _, _, err := s.solve(start)
	if err != nil || len(fm.rects) == 0 {
		return v, err
	}
	fm.estimates = fm.estimates[:0]
	for k, r := range fm.rects {
		idx := fm.rectFixed[k]
		at := func(rail float64) (float64, Estimate, error) {
			fm.fixedV[idx] = rail
			w, _, _, err := s.solve(v)
			if err != nil {
				return 0, Estimate{}, err
			}
			v = w
			e := r.at(fm.drawn(partCurrents(fm, w), r.held()) + extraDrawn(fm, extra, w, r.held()))
			return rail - r.heldVolts(e), e, nil
		}
		est, ok, err := alternate(at, fm.fixedV[idx], r.heldVolts)
		if err != nil {
			return nil, err
		}
		lo, hi := 0.0, math.Max(r.peak, fm.fixedV[idx])
		for n := 0; !ok && n < 60; n++ {
			mid := (lo + hi) / 2
			g, e, err := at(mid)
			if err != nil {
				return nil, err
			}
			est = e
			if g > 0 {
				hi = mid
			} else {
				lo = mid
			}
			if hi-lo < 1e-6*math.Max(1, r.peak) {
				break
			}
		}
		fm.estimates = append(fm.estimates, est)
	}
	return v, nil
}

// alternate tries the healthy solve's plain alternation (the rail at the
// estimate of the last load) for a few rounds; ok is false when it has not
// settled, as under a heavy fault load.
func alternate(at func(float64) (float64, Estimate, error), rail float64, held func(Estimate) float64) (Estimate, bool, error) {
	for range 8 {
		g, e, err := at(rail)
		if err != nil {
			return e, false, err
		}
		if math.Abs(g) < 1e-6 {
			return e, true, nil
		}
		rail = held(e)
	}
	return Estimate{}, false, nil
}

// extraDrawn is the current a fault's added branches draw from net.
func extraDrawn(m *model, extra []branch, v []float64, net string) float64 {
	t := m.netTerm[net]
	total := 0.0
	for _, b := range extra {
		i := b.g * (m.voltOf(v, b.a) - m.voltOf(v, b.b))
		if b.a == t {
			total += i
		}
		if b.b == t {
			total -= i
		}
	}
	return total
}
