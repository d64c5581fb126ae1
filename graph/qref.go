package graph

import "math"

// A coil's q is its unloaded Q at one frequency; the loss resistance that
// stands for it (R = ω·L/q, graph/device.WindingLoss) depends on which. A
// coil's Q is stated where it works: at the resonance of the tank it tunes.
// Referring every coil to the centre of its region's band would misstate
// a coil that tunes elsewhere: a long-wave coil in a set whose band is the
// medium waves, or an IF trap at the aerial, whose loss sets its depth.

// maxTuningC is the largest capacitance a coil is taken to tune with
// (common practice, no source): the tuning capacitance of a receiver's
// tanks, down to long waves, stays below a few nanofarads; a coil that
// resonates only with more (an RF choke against its decoupler) tunes
// nothing, and its q stays referred to its band's centre.
const maxTuningC = 10e-9

// minTuningC is the least capacitance taken as tuning a coil: a picofarad,
// below any trimmer's minimum (common practice, no source); less is the
// rounding of a network whose capacitors do not reach across the coil.
const minTuningC = 1e-12

// ReferQ sets each winding's QAt, the frequency its q is referred to: the
// part's q_at when the netlist gives one; else, for a part whose tuned
// winding resonates with its tuning capacitance (the gang from fully open to
// fully meshed, a fixed capacitor at its value) wholly outside the band the
// part works in (an IF trap below a medium-wave band, a long-wave coil in a
// set whose band is the medium waves), the geometric centre of its own
// range, which the part's other windings share (they sit on the same former);
// else 0: a coil that tunes inside its band, or tunes nothing, has its q
// referred to that band's centre (Circuit.BandCentre). The loader calls it
// once, so a reduced circuit, cloned from the loaded one, keeps the same
// loss resistance for every coil.
func (c *Circuit) ReferQ() {
	t := newTuner(c)
	for _, p := range c.Parts {
		if len(p.Windings) == 0 {
			continue
		}
		f := p.Params["q_at"]
		if f <= 0 {
			f = t.ownRange(p)
		}
		for i := range p.Windings {
			p.Windings[i].QAt = f
		}
	}
}

// ownRange is the geometric centre of the range the part's first tuned coil
// resonates over when that range lies wholly outside the part's band (the
// one BandCentre takes), else 0.
func (t *tuner) ownRange(p *Part) float64 {
	lo, hi := t.tankRange(p)
	if lo <= 0 {
		return 0
	}
	b := t.rx.BandOf(p)
	if b.Min <= 0 || b.Max <= 0 {
		b = t.c.FullBand()
	}
	if b.Min > 0 && hi >= b.Min && lo <= b.Max {
		return 0
	}
	return math.Sqrt(lo * hi)
}

// tankRange is the range the part's first tuned coil (a whole tapped
// coil, or one winding) resonates over, zeros when no winding is tuned.
func (t *tuner) tankRange(p *Part) (lo, hi float64) {
	for _, coil := range coilsOf(p) {
		a, b := p.NetOf(coil.from), p.NetOf(coil.to)
		v := t.view(t.position(a, b))
		// A coil in series with a capacitor from a signal net to chassis
		// (a series trap) tunes with it through whatever drives that net,
		// which closes the loop: failing a capacitive path across the coil,
		// each end in turn is taken as AC ground.
		for _, held := range []string{"", a, b} {
			cOpen, cMeshed := v.between(a, b, held, 0), v.between(a, b, held, 1)
			if cOpen >= minTuningC && cMeshed >= minTuningC && cMeshed <= maxTuningC && coil.l > 0 {
				f := func(cv float64) float64 { return 1 / (2 * math.Pi * math.Sqrt(coil.l*cv)) }
				return f(cMeshed), f(cOpen)
			}
		}
	}
	return 0, 0
}

type coilEnds struct {
	from, to string
	l        float64
}

// coilsOf lists a part's coils end to end: a tapped inductor is one coil
// (pins 1 and 2, its whole inductance), and so are the two sections of a
// tapped winding (L = La + Lb + 2k·√(La·Lb), device.WindingLoss's whole
// coil); each other winding of a transformer that has a q is its own (a
// winding given no q, a reaction or coupling winding, is no tank whose
// loss matters).
func coilsOf(p *Part) []coilEnds {
	if p.Kind == Inductor {
		return []coilEnds{{"1", "2", p.Inductance()}}
	}
	var out []coilEnds
	inPair := map[int]bool{}
	for i, a := range p.Windings {
		for j, b := range p.Windings {
			if i != j && a.To == b.From && a.Q > 0 && b.Q > 0 {
				k := p.K(a.Name, b.Name)
				out = append(out, coilEnds{a.From, b.To, a.L + b.L + 2*k*math.Sqrt(a.L*b.L)})
				inPair[i], inPair[j] = true, true
			}
		}
	}
	for i, w := range p.Windings {
		if w.Q > 0 && !inPair[i] {
			out = append(out, coilEnds{w.From, w.To, w.L})
		}
	}
	return out
}
