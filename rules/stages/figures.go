package stages

import (
	"encoding/json"
	"fmt"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// A calc computes figures for a match. Arguments name pattern parts, except
// netArgs (pattern nets) and wordArgs (plain words).
type calc struct {
	args, required, netArgs, wordArgs []string
	fn                                func(x *figCtx)
}

// calcs is the table of figure calculations a pattern may ask for. Each
// names the formula it uses beside the code (tanks.go, rc.go, gain.go,
// mixer.go).
var calcs map[string]calc

func init() {
	calcs = map[string]calc{
		"tank":          {args: []string{"coil", "caps", "winding", "check", "other_caps"}, required: []string{"coil", "caps"}, wordArgs: []string{"winding", "check"}, fn: calcTank},
		"hartley":       {args: []string{"coil", "caps"}, required: []string{"coil", "caps"}, fn: calcHartley},
		"colpitts":      {args: []string{"coil", "c1", "c2", "tune", "block"}, required: []string{"coil", "c1", "c2"}, fn: calcColpitts},
		"clapp":         {args: []string{"coil", "c1", "c2", "c3"}, required: []string{"coil", "c1", "c2", "c3"}, fn: calcClapp},
		"series-share":  {args: []string{"c1", "c2", "c3"}, required: []string{"c1", "c2", "c3"}, fn: calcSeriesShare},
		"crystal":       {args: []string{"xtal"}, required: []string{"xtal"}, fn: calcCrystal},
		"rc":            {args: []string{"r", "c", "use", "load_net", "tau"}, required: []string{"r", "c"}, netArgs: []string{"load_net"}, wordArgs: []string{"use", "tau"}, fn: calcRC},
		"bypass":        {args: []string{"device", "r", "c", "load", "load_net"}, required: []string{"device", "r", "c"}, netArgs: []string{"load_net"}, fn: calcBypass},
		"rc-phase":      {args: []string{"r", "c"}, required: []string{"r", "c"}, fn: calcPhaseShift},
		"wien":          {args: []string{"r1", "c1", "r2", "c2"}, required: []string{"r1", "c1", "r2", "c2"}, fn: calcWien},
		"gain":          {args: []string{"device", "load", "load_net", "degeneration", "degeneration_foot", "form"}, required: []string{"device", "form"}, netArgs: []string{"load_net"}, wordArgs: []string{"form"}, fn: calcGain},
		"discriminator": {args: []string{"xfmr", "caps1", "caps2", "ret", "ends"}, required: []string{"xfmr", "caps2"}, netArgs: []string{"ret", "ends"}, fn: calcDiscriminator},
		"double-tuned":  {args: []string{"xfmr", "caps1", "caps2"}, required: []string{"xfmr", "caps1", "caps2"}, fn: calcDoubleTuned},
		"mixer":         {args: []string{"coil", "caps", "ift", "ift_caps", "winding"}, required: []string{"coil", "caps", "ift", "ift_caps"}, wordArgs: []string{"winding"}, fn: calcMixer},
		"pi":            {args: []string{"c1", "coil", "c2"}, required: []string{"c1", "coil", "c2"}, fn: calcPi},
		"smoothing":     {args: []string{"c1", "series", "c2"}, required: []string{"series", "c2"}, fn: calcSmoothing},
		"coupling":      {args: []string{"c"}, required: []string{"c"}, fn: calcCoupling},
		"value":         {args: []string{"part", "name"}, required: []string{"part", "name"}, wordArgs: []string{"name"}, fn: calcValue},
		"ratio":         {args: []string{"xfmr"}, required: []string{"xfmr"}, fn: calcRatio},
		"tuned-gain":    {args: []string{"device", "coil", "winding", "caps", "secondary", "other_caps"}, required: []string{"device", "coil", "caps"}, netArgs: []string{"secondary"}, wordArgs: []string{"winding"}, fn: calcTunedGain},
	}
}

// MarshalJSON writes a stage with its fields, then "origins": where each
// figure came from, under the same keys as "figures" ("f_hz": "formula
// f = 1/(2π√(LC))"), so a reader of the JSON can tell the solver's numbers
// from the formulas' cross-checks.
func (s Stage) MarshalJSON() ([]byte, error) {
	type plain Stage // the fields without this method
	return json.Marshal(struct {
		plain
		Origins figure.Origins `json:"origins"`
	}{plain(s), figure.Origins(s.Figures)})
}

// figCtx is what a calc sees: the match, and the stage it writes into.
type figCtx struct {
	w    *world
	m    *match
	st   *Stage
	spec FigureSpec
	sub  *graph.Circuit // what the solver sees of the circuit (solverCircuit), built on first use
	// cut is the piece of a large set the figures are solved on
	// (piece.go); nil solves them in the whole circuit.
	cut *graph.Circuit
	// solve: solve the figures in circuit (a stage kept); a candidate has
	// its formulas' alone (solveFigures).
	solve bool
	// tank is the last tank solved in circuit (solveTank) and whether it
	// solved: a tuned amplifier's name is checked on its load's.
	tank   tankPeaks
	tankOK bool
	// pair is the tracking pair found for the stage's oscillator tank
	// (trackPair), nil before the first ask.
	pair *trackPairMemo
	// oscDev is the oscillator device a loop found for the stage (the
	// tracking walk solves its loop); "" leaves the walk to find it.
	oscDev string
}

// put records a figure on the stage under the pattern's prefix ("osc" makes
// "f" "osc_f"), with its label and its place in the one order (figorder.go),
// replacing one of the same name and unit as figure.List.Put does. A
// figure whose number is not finite is left out: no figure is better than
// a wrong one.
func (x *figCtx) put(f figure.Figure) {
	x.putLabelled(x.named(f))
}

// putLabelled is put for a figure whose label, working and group are
// already set (named, then a label made more particular).
func (x *figCtx) putLabelled(f figure.Figure) {
	name := f.Name
	if f.At != nil {
		at := x.named(*f.At)
		at.Name = prefixed(x.spec.Prefix, at.Name)
		f.At = &at
	}
	f.Name = prefixed(x.spec.Prefix, name)
	if !f.Finite() {
		return
	}
	rank := rankOf(x.spec.Prefix, name, f.Unit)
	for i, g := range x.st.Figures {
		if g.Name == f.Name && g.Unit == f.Unit {
			x.st.Figures[i], x.st.figRanks[i] = f, rank
			return
		}
	}
	if x.st.Figures == nil {
		// a stage has a handful of figures; one allocation for them
		x.st.Figures, x.st.figRanks = make(figure.List, 0, 4), make([]figRank, 0, 4)
	}
	x.st.Figures = append(x.st.Figures, f)
	x.st.figRanks = append(x.st.figRanks, rank)
}

// named fills in what the figure table (figorder.go) says about a figure:
// its label, whether it is a working value, the group it belongs to.
func (x *figCtx) named(f figure.Figure) figure.Figure {
	n := nameOf(x.spec.Prefix, f.Name, f.Unit)
	f.Label, f.Working, f.Group = n.label, n.working, n.group
	return f
}

// set records a single value.
func (x *figCtx) set(name string, u figure.Unit, v float64, o figure.Origin) {
	x.put(figure.Figure{Name: name, Unit: u, Value: v, Origin: o})
}

// span records a figure over the travel of a gang or trimmer: lo at one
// end, hi at the other.
func (x *figCtx) span(name string, u figure.Unit, lo, hi float64, o figure.Origin) {
	x.put(figure.Figure{Name: name, Unit: u, Range: &value.Range{Min: lo, Max: hi}, Origin: o})
}

// get returns a figure this stage already has, by its name before the
// prefix ("f" for "osc_f" under prefix osc).
func (x *figCtx) get(name string) (figure.Figure, bool) {
	return x.st.Figures.Get(prefixed(x.spec.Prefix, name))
}

func (x *figCtx) flag(format string, args ...any) {
	f := fmt.Sprintf(format, args...)
	for _, g := range x.st.Flags {
		if g == f {
			return
		}
	}
	x.st.Flags = append(x.st.Flags, f)
}

// index returns the position of a pattern part in the match, -1 when the
// variant left it out.
func (x *figCtx) index(name string) int {
	for i, vp := range x.m.v.parts {
		if vp.pp.Name == name {
			return i
		}
	}
	return -1
}

// parts returns the circuit parts an argument names, skipping absent ones,
// with the capacitors in parallel with a named capacitor (alongside).
func (x *figCtx) parts(arg string) []*graph.Part {
	var out []*graph.Part
	for _, n := range x.spec.Args[arg] {
		if i := x.index(n); i >= 0 {
			out = append(out, x.w.parts[x.m.parts[i]])
			out = append(out, alongside(x.w, x.m, i)...)
		}
	}
	return out
}

func (x *figCtx) part(arg string) *graph.Part {
	if ps := x.parts(arg); len(ps) > 0 {
		return ps[0]
	}
	return nil
}

func (x *figCtx) word(arg, def string) string {
	if v := x.spec.Args[arg]; len(v) > 0 {
		return v[0]
	}
	return def
}

func (x *figCtx) partIndex(p *graph.Part) int {
	if i, ok := x.w.index[p]; ok {
		return i
	}
	return -1
}

// coilEnds is a coil as a tank sees it: the folded nets at its two ends,
// the pin names there, its inductance and Q.
type coilEnds struct {
	ref        string
	a, b       int
	pinA, pinB string
	l, q       float64
	sec        *coilSections // two windings in series, else nil
}

// coil gives the coil an argument names: a plain or tapped inductor end to
// end (L1 + L2 + 2M, graph.Part.Inductance), or the winding of a transformer
// the pattern maps (winding = "1" is the first in the pattern's list;
// "1+2" the first two in series, seriesWindings; a second name, a
// loading coil in series with the winding, loadedWinding).
func (x *figCtx) coil(arg string) (coilEnds, bool) {
	names := x.spec.Args[arg]
	if len(names) == 0 {
		return coilEnds{}, false
	}
	i := x.index(names[0])
	if i < 0 {
		return coilEnds{}, false
	}
	ci := x.m.parts[i]
	p := x.w.parts[ci]
	switch p.Kind {
	case graph.Inductor:
		q := 0.0
		if len(p.Windings) > 0 {
			q = p.Windings[0].Q
		}
		return coilEnds{ref: p.Ref, a: x.w.pinNet(ci, "1"), b: x.w.pinNet(ci, "2"), pinA: "1", pinB: "2", l: p.Inductance(), q: q}, true
	case graph.Transformer:
		if x.word("winding", "1") == "1+2" {
			return x.seriesWindings(i, ci)
		}
		wi := 0
		if x.word("winding", "1") == "2" {
			wi = 1
		}
		if wi >= len(x.m.coils[i]) {
			return coilEnds{}, false
		}
		e := x.windingEnds(ci, x.w.coils[ci][x.m.coils[i][wi]])
		e.ref = p.Ref
		if len(names) > 1 {
			return x.loadedWinding(e, names[1])
		}
		return e, true
	}
	return coilEnds{}, false
}

// hz writes a frequency for a flag or note, as tables write it.
func hz(v float64) string { return figure.Format(v, figure.Hertz, figure.Text) }
