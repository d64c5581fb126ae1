package stages

import (
	"math"
	"math/cmplx"

	"pare/graph"
	"pare/graph/ac"
	model "pare/graph/device"
	"pare/graph/figure"
	"pare/graph/value"
	"pare/internal/par"
)

// In-circuit figures. A stage's resonance, gain, corner and bandwidth are
// what the AC solver gives on the stage as it sits in the reduced circuit:
// driven from its input, loaded by what follows, at each gang setting. The
// textbook formula is kept beside it as the named cross-check
// (figure.Figure.Check), with words for why the two part where they
// differ by more than figure.CheckAgreement.

// solverCircuit is the circuit a stage's figures are solved in: the whole
// reduced circuit up to wholeCircuitParts, else the piece the stage was
// given (piece.go), which solveFigures chooses and confirms.
func (x *figCtx) solverCircuit() *graph.Circuit {
	if x.sub == nil {
		switch {
		case len(x.w.parts) <= wholeCircuitParts:
			x.sub = x.w.c
		case x.cut != nil:
			x.sub = x.cut
		case x.m == nil: // no match to cut round (a loop-found mixer's tank without its piece)
			x.sub = x.w.c
		default: // a solve outside solveFigures: the first piece, unconfirmed
			x.sub = x.neighbourhood(solverDepth)
		}
	}
	return x.sub
}

// gang is one setting of the variable capacitors the figures are solved
// at: VarFrac 1 is every section at its largest capacitance.
type gang struct {
	frac float64
	at   string
}

var (
	gangMid    = gang{0.5, "gang at mid travel"}
	gangTravel = []gang{{1, "gang at full capacitance"}, gangMid, {0, "gang at least capacitance"}}
)

// gangs are the settings a stage is solved at: the two ends of the travel
// and the middle where a variable capacitor sits within two steps of the
// stage, the middle alone otherwise.
func (x *figCtx) gangs() []gang {
	// a gang section two steps from the stage moves it; one across the
	// set (the other band's tank) does not
	for _, p := range x.neighbourhood(2).Parts {
		if p.Kind == graph.Capacitor && p.Value.IsSpan() && !(p.Type == graph.CapTrimmer && p.Set > 0) {
			return gangTravel
		}
	}
	return []gang{gangMid}
}

func (g gang) options() ac.Options { return ac.Options{VarFrac: g.frac, VarSet: true} }

// overGang is where a figure solved at every gang setting was solved: the
// one setting's words, or the travel's.
func overGang(gs []gang) string {
	if len(gs) == 1 {
		return gs[0].at
	}
	return "gang at each end and mid travel"
}

// magnitude is |r(f)|, NaN where the solver fails.
func magnitude(r *ac.Response, f float64) float64 {
	h, err := r.At(f)
	if err != nil || cmplx.IsNaN(h) || cmplx.IsInf(h) {
		return math.NaN()
	}
	return cmplx.Abs(h)
}

func db(v float64) float64 { return 20 * math.Log10(v) }

// crossing finds, by bisection in log f, where |r| passes level between
// from (where it is above level) and to (where it is below); ok is false
// when it does not pass there.
func crossing(r *ac.Response, level, from, to float64) (float64, bool) {
	above := func(f float64) (bool, bool) {
		m := magnitude(r, f)
		return m >= level, !math.IsNaN(m)
	}
	return bisectLog(above, from, to)
}

// bisectLog finds, by bisection in log f, where above turns from true (at
// from) to false (at to); above's second result is false where the
// quantity cannot be read, which ends the search. ok is false when the
// quantity does not pass between from and to.
func bisectLog(above func(f float64) (bool, bool), from, to float64) (float64, bool) {
	if up, ok := above(from); !ok || !up {
		return 0, false
	}
	if up, ok := above(to); !ok || up {
		return 0, false
	}
	a, b := math.Log(from), math.Log(to)
	for i := 0; i < 36; i++ { // 2⁻³⁶ of the span: far below any figure's digits
		m := (a + b) / 2
		up, ok := above(math.Exp(m))
		if !ok {
			return 0, false
		}
		if up {
			a = m
		} else {
			b = m
		}
	}
	return math.Exp((a + b) / 2), true
}

// solved is a figure solved at each gang setting (vals in the order of
// gs): one value, or a range over the gang; nil when a value is missing.
func solved(name string, u figure.Unit, vals []float64, what string, gs []gang) *figure.Figure {
	f := figure.Figure{Name: name, Unit: u, Origin: figure.BySolver(what, overGang(gs))}
	if len(vals) == 0 || len(vals) != len(gs) {
		return nil
	}
	lo, hi := vals[0], vals[0]
	for _, v := range vals {
		if math.IsNaN(v) || v == 0 {
			return nil
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	if len(vals) == 1 || hi <= lo*1.0001 {
		f.Value = vals[len(vals)/2]
		f.Origin.At = gangMid.at
		if len(vals) == 1 {
			f.Origin.At = gs[0].at
		}
		return &f
	}
	f.Range = &value.Range{Min: lo, Max: hi}
	return &f
}

// putChecked records the solver's figure with the formula's beside it
// (check may be nil: no formula for it), and the reason words when they
// part by more than figure.CheckAgreement. Without a solver figure the
// formula's stands alone, as before: a figure the solver could not reach
// is still better read from its formula than not at all.
func (x *figCtx) putChecked(sv *figure.Figure, check *figure.Figure, why func() string) {
	switch {
	case sv == nil && check == nil:
		return
	case sv == nil:
		x.put(*check)
		return
	}
	f := *sv
	if check != nil && check.Finite() {
		c := *check
		c.Name, c.Label = f.Name, ""
		f.Check = &c
		if f.CheckDiffers() && why != nil {
			f.Why = why()
		}
	}
	x.put(f)
}

// netName is the circuit's name of a folded net, "" for the folded ground.
func (x *figCtx) netName(id int) string {
	if id <= groundNet || id >= len(x.w.names) {
		return ""
	}
	return x.w.names[id]
}

// withPart is c with one part replaced (same ref) by p: a new circuit
// sharing every other part and net, for a solve with one part changed
// (a coupling taken out, a capacitor made a full bypass).
func withPart(c *graph.Circuit, p *graph.Part) *graph.Circuit {
	out := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Regions: c.Regions,
		Inputs: c.Inputs, Outputs: c.Outputs, Nets: c.Nets, Parts: make([]*graph.Part, len(c.Parts)),
		DetectorLoads: c.DetectorLoads}
	out.ShareRegionIndex(c) // the same regions: c's snapshot, when it has one
	for i, q := range c.Parts {
		out.Parts[i] = q
		if q.Ref == p.Ref {
			out.Parts[i] = p
		}
	}
	return out
}

// quietGm is the transconductance a device keeps in a quiet copy: small
// enough that no loop through it matters, not zero, which the model
// refuses for a valve (µ = gm·ra must make a model).
const quietGm = 1e-12

// quiet is the circuit with every amplifying device made passive:
// transconductance gone, input and output resistances kept. A tank is
// solved so: where a device closes a loop around it (an oscillator, or a
// tank coupled into an oscillator's grid) the peak would be the loop's,
// not the tank's; quiet, the resonance is the tank's, loaded as it sits,
// as a dip meter finds it with the set off.
func quiet(c *graph.Circuit) *graph.Circuit {
	var parts []*graph.Part
	changed := false
	for _, p := range c.Parts {
		if q := quietPart(p); q != nil {
			parts, changed = append(parts, q), true
			continue
		}
		parts = append(parts, p)
	}
	if !changed {
		return c
	}
	out := withPart(c, &graph.Part{})
	out.Parts = parts
	return out
}

// quietPart is a copy of an amplifying part with its transconductance
// gone, nil for any other part.
func quietPart(p *graph.Part) *graph.Part {
	if p.Kind != graph.Valve && p.Kind != graph.BJT && p.Kind != graph.FET {
		return nil
	}
	s, err := model.Of(p)
	if err != nil {
		return nil
	}
	q := *p
	q.Params = map[string]float64{"gm": quietGm}
	switch p.Kind {
	case graph.Valve:
		q.Params["ra"] = s.ROut
		// a pentagrid's oscillator section too: left out, its gmo falls
		// back to the class default and the "quiet" copy oscillates
		// through g2 (review20 a05's oscillator tank read 2.6 % high)
		q.Params["gmo"] = quietGm
	case graph.BJT:
		q.Params["beta"], q.Params["ic"] = s.Beta, s.Ic
		q.Params["rpi"], q.Params["ro"] = s.RPi, s.ROut
	case graph.FET:
		q.Params["rd"] = s.ROut
	}
	return &q
}

// solveFigures evaluates the stages kept once more, now with the AC solver
// on each in circuit (figures.go, incircuit.go): a candidate's figures are
// the formulas' alone, so the search over thousands of candidates costs no
// solve, and only a stage a person will read is solved. A stage whose
// guard the solver's figures fail keeps its formulas' figures: the guard
// chose it on them.
func solveFigures(w *world, level []*found) []*found {
	var all []*found
	var walk func([]*found)
	walk = func(l []*found) {
		for _, f := range l {
			all = append(all, f)
			walk(f.subs)
		}
	}
	walk(level)
	// Each stage's figures are solved on its own piece and read the
	// world only (its lazily built parts under world.lazy), so they are
	// solved side by side and kept by stage, in the tree's order (a sub-
	// stage of a stage dropped below is solved and not used).
	solved := make(map[*found]*Stage, len(all))
	sts := make([]*Stage, len(all))
	par.Do(len(all), func(i int) { sts[i] = evaluatePiece(w, all[i].m) })
	for i, f := range all {
		solved[f] = sts[i]
	}
	return keepSolved(level, solved)
}

// keepSolved takes each stage's solved figures (solveFigures), dropping a
// stage the solver did not bear out, with its sub-stages.
func keepSolved(level []*found, solved map[*found]*Stage) []*found {
	kept := level[:0]
	for _, f := range level {
		st := solved[f]
		if st != nil && st.unconfirmed != "" {
			continue // named by its shape, not borne out in circuit (confirmTank)
		}
		if st != nil {
			f.Title, f.Figures, f.figRanks, f.Flags, f.Notes = st.Title, st.Figures, st.figRanks, st.Flags, st.Notes
		}
		f.subs = keepSolved(f.subs, solved)
		kept = append(kept, f)
	}
	return kept
}
