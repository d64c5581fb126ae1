package stages

import (
	"math"
	"math/cmplx"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// The AGC filter on a declared AGC line (patterns/agc-line-filter.toml),
// found on the original circuit: a resistor from the detector's DC output
// to the line and a capacitor from the line to chassis. The time constant
// is the solver's: the −3 dB corner fc of V(line)/V(detector) on the whole
// circuit, everything the line feeds connected, τ = 1/(2π·fc); τ = RC
// (handbook) beside it.
func init() {
	calcs["agc-line"] = calc{args: []string{"r", "c"}, required: []string{"r", "c"}, fn: calcAGCLine}
}

func calcAGCLine(x *figCtx) {
	r, c := x.part("r"), x.part("c")
	if r == nil || c == nil || r.Value.Max <= 0 || c.Capacitance(0.5) <= 0 {
		return
	}
	line := sharedNet(r, c)
	from := r.NetOf("1")
	if from == line {
		from = r.NetOf("2")
	}
	if line == "" || !detectorToLine(x.w.c, from, line, r.Ref) || !reachesControl(x.w.c, line, r.Ref) {
		return // not the detector's output, or a line that biases no grid or base: no figures, the guard drops it
	}
	formula := &figure.Figure{Name: "tau", Unit: figure.Second, Value: r.Value.Max * c.Capacitance(0.5), Origin: byTau}
	sv := x.solvedLag(from, line)
	x.putChecked(sv, formula, func() string {
		return "in circuit the line also charges what it feeds (the " + controlWord(controlledKinds(x.w.c, line, r.Ref)) + " filters' capacitors through their resistors)"
	})
	if f, ok := x.get("tau"); ok {
		x.checkAGC(f.Value)
	}
}

// sharedNet is the net two two-terminal parts share, "" if none.
func sharedNet(a, b *graph.Part) string {
	for _, p := range a.Pins {
		for _, q := range b.Pins {
			if p.Net == q.Net {
				return p.Net
			}
		}
	}
	return ""
}

// solvedLag is the time constant of the low-pass from one net to another
// as the solver gives it: the frequency where |V(to)/V(from)| falls 3 dB
// below its value at 1 mHz, found by bisection on a log scale between
// 1 mHz and 10 kHz, the line freed from the AC ground its bias role puts
// it at; nil where the solver cannot give it.
//
// The solver holds a declared bias net at AC ground, as the signal sees
// it; here the line is what is solved, so it is freed. Only the block of
// the matrix the driven net reaches moves V(line): the parts reached from
// the two nets without passing AC ground (lagPiece), whose diodes take the
// DC loads the whole circuit's DC paths give them.
func (x *figCtx) solvedLag(from, to string) *figure.Figure {
	r, err := ac.NewTransfer(x.lagPiece(from, to), from, to, gangMid.options())
	if err != nil {
		return nil
	}
	mag := func(f float64) float64 {
		h, err := r.At(f)
		if err != nil || cmplx.IsNaN(h) {
			return math.NaN()
		}
		return cmplx.Abs(h)
	}
	lo, hi := 1e-3, 1e4
	ref := mag(lo)
	if !(ref > 0) || !(mag(hi) < ref/math.Sqrt2) {
		return nil
	}
	for i := 0; i < 60; i++ {
		mid := math.Sqrt(lo * hi)
		if mag(mid) > ref/math.Sqrt2 {
			lo = mid
		} else {
			hi = mid
		}
	}
	fc := math.Sqrt(lo * hi)
	return &figure.Figure{Name: "tau", Unit: figure.Second, Value: 1 / (2 * math.Pi * fc),
		Origin: figure.BySolver("1/(2π·fc), fc the −3 dB point of V("+to+")/V("+from+")", hz(fc))}
}

// agcConfirmed tells whether a series resistor into a capacitor to chassis
// is an AGC filter by its wiring, on the circuit as drawn when it is known:
// a detector's DC output feeds the resistor (a diode on its far net, or at
// the other end of a winding from it), and the line the capacitor holds
// runs through DC paths (resistors, coils, windings, pot tracks; never
// back through the filter's resistor) to the control electrode of an
// amplifying device, the grid or base return the control voltage biases.
// An RC with a long time constant in an emitter lead, a supply line or an
// oscillator's network has neither, whatever its time constant says.
func (x *figCtx) agcConfirmed(rs, cs []*graph.Part) bool {
	if len(rs) != 1 || len(cs) != 1 {
		return false
	}
	c := x.w.c
	if x.w.orig != nil {
		c = x.w.orig.c
	}
	r, cp := c.Part(rs[0].Ref), c.Part(cs[0].Ref)
	if r == nil || cp == nil || len(r.Pins) != 2 {
		return false
	}
	line := sharedNet(r, cp)
	if line == "" {
		return false
	}
	from := r.NetOf(r.Pins[0].Name)
	if from == line {
		from = r.NetOf(r.Pins[1].Name)
	}
	return detectorToLine(c, from, line, r.Ref) && reachesControl(c, line, r.Ref)
}

// detectorToLine tells whether resistor r runs from a detector's DC output
// to a line after it: from carries the detector's output (its load, or the
// far end of the IF filter after it: graph.Circuit.DetectorFeeds, never
// counting r itself) and the line has no detector on it, so the pair does
// not run backwards from the IF filter onto the detector's own load.
func detectorToLine(c *graph.Circuit, from, line, r string) bool {
	return c.DetectorFeeds(from, r) && !c.DetectorOn(line)
}

// reachesControl walks from net through the parts that pass DC (resistors,
// inductors, windings, pot tracks), never through skip nor into AC-ground
// nets other than a declared bias line, and tells whether it meets the
// control electrode of an amplifying device.
func reachesControl(c *graph.Circuit, net, skip string) bool {
	return len(controlledKinds(c, net, skip)) > 0
}

// controlledKinds are the kinds of the devices whose control electrode
// the walk of reachesControl reaches, in the order first reached.
func controlledKinds(c *graph.Circuit, net, skip string) []graph.Kind {
	var kinds []graph.Kind
	seen := map[string]bool{net: true}
	queue := []string{net}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		for _, cn := range c.ConnsOf(n) {
			p := cn.Part
			if p.IsActive() && graph.RoleOfPin(p.Kind, cn.Pin) == graph.RoleControl {
				if !slices.Contains(kinds, p.Kind) {
					kinds = append(kinds, p.Kind)
				}
				continue
			}
			if p.Ref == skip {
				continue
			}
			for _, next := range dcEnds(p, cn.Pin) {
				role := c.RoleOf(next)
				if seen[next] || next == "" || role.IsACGround() && role != graph.Bias {
					continue
				}
				seen[next] = true
				queue = append(queue, next)
			}
		}
	}
	return kinds
}

// controlWord names the electrode a control line feeds in the words of
// the devices it reaches: a transistor set's AGC filters feed bases, not
// grids (review20 b03 read "the grid filters' capacitors"). Devices of
// more than one kind get the neutral word.
func controlWord(kinds []graph.Kind) string {
	if len(kinds) != 1 {
		return "feed"
	}
	switch kinds[0] {
	case graph.Valve:
		return "grid"
	case graph.BJT:
		return "base"
	case graph.FET:
		return "gate"
	}
	return "feed"
}

// dcEnds are the nets a part joins to pin's net for DC: a resistor's
// or inductor's other end, a pot's other terminals, the other ends of the
// windings the pin belongs to.
func dcEnds(p *graph.Part, pin string) []string {
	var out []string
	switch p.Kind {
	case graph.Resistor, graph.Inductor, graph.Pot:
		for _, q := range p.Pins {
			if q.Name != pin {
				out = append(out, q.Net)
			}
		}
	case graph.Transformer:
		for _, w := range p.Windings {
			switch pin {
			case w.From:
				out = append(out, p.NetOf(w.To))
			case w.To:
				out = append(out, p.NetOf(w.From))
			}
		}
	}
	return out
}

// withAGCLines is full with each net the reduction took for an AGC line
// (graph.Circuit.AGCFeed: it marked the net a bias rail fed from the
// detector as it tied it to AC ground) given the bias role an AGC line
// declared in the netlist has, so that on the circuit as drawn the AGC
// filter is found on it (patterns/agc-line-filter.toml) and the detector
// gives up its feed resistor, whether or not the netlist declares the
// line. full is copied only when there is a line to mark.
func withAGCLines(full, reduced *graph.Circuit) *graph.Circuit {
	if full == nil || reduced == nil {
		return full
	}
	bias := map[string]bool{}
	for _, list := range [][]*graph.Net{reduced.Nets, reduced.Rails} {
		for _, n := range list {
			if n.Role == graph.Bias {
				bias[n.Name] = true
			}
		}
	}
	var lines []*graph.Net
	for _, list := range [][]*graph.Net{reduced.Nets, reduced.Rails} {
		for _, n := range list {
			if n.Role != graph.Bias || n.Fed == "" || bias[n.Fed] {
				// not a line, or one fed from the line (a grid's or base's
				// decoupled feed), which stays as drawn: the solver's time
				// constant of the line counts the capacitors there
				continue
			}
			if fn := full.Net(n.Name); fn != nil && fn.Role == graph.Signal {
				if _, _, ok := full.AGCFeed(n.Name); ok {
					lines = append(lines, n)
				}
			}
		}
	}
	if len(lines) == 0 {
		return full
	}
	out := full.Clone()
	for _, n := range lines {
		fn := out.Net(n.Name)
		fn.Role = graph.Bias
		if fn.Label == "" {
			fn.Label = n.Label
		}
	}
	return out
}

// lagPiece is the circuit solvedLag solves: the parts reached from the nets
// from and to (to freed from AC ground) without passing a net the solver
// holds at AC ground, cut as a supply filter section is (cutFreed), with
// the DC loads of its diodes taken on the whole circuit with the line
// freed, which is what the whole circuit was solved with before. A whole
// set has an AGC line per channel, and each elaborated the whole set.
func (x *figCtx) lagPiece(from, to string) *graph.Circuit {
	w := x.w
	fi, fok := w.netID[from]
	ti, tok := w.netID[to]
	if solveWide || !fok || !tok || fi == groundNet || ti == groundNet || w.role[fi].IsACGround() {
		return freedWhole(w.c, to) // no piece to cut: the whole, as before
	}
	keep := w.reach([]int{fi, ti}, nil, true)
	sub := x.cutFreed(keep, []string{from, to}, []string{to})
	if x.keepsDiode(keep) {
		dc, ok := x.dcCut(keep, -1, []string{to})
		if !ok {
			dc = freedWhole(w.c, to)
		}
		sub.DetectorLoads = withLoads(w.c.DetectorLoads, ac.DetectorLoads(dc, sub.Parts))
	}
	return sub
}

// freedWhole is c with the net to made a signal net, sharing every part and
// every other net.
func freedWhole(c *graph.Circuit, to string) *graph.Circuit {
	out := withPart(c, &graph.Part{})
	out.Nets = slices.Clone(c.Nets)
	for i, n := range out.Nets {
		if n.Name == to {
			m := *n
			m.Role = graph.Signal
			out.Nets[i] = &m
		}
	}
	return out
}
