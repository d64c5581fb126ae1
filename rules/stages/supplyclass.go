package stages

import (
	"math"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/dc"
	"pare/graph/figure"
)

// A supply filter section is one of three jobs, read from its wiring (not
// from its values or its refs):
//   - the main smoothing filter: a rectifier sits on its input, or its
//     output feeds the supply lines of several stages (directly or through
//     their decouplers); its figures are the ripple's, since it serves the
//     whole line and no one stage's frequency;
//   - a screen feed: the output is a screen grid itself, a dropper resistor
//     and its bypass capacitor; its figures are the DC drop and whether the
//     bypass holds the screen at AC ground at the stage's frequency;
//   - a stabiliser feed: a shunt stabiliser holds its output (stabfeed.go);
//     its figures are the DC point's volts and currents;
//   - a decoupler: it feeds one stage's supply through that stage's load;
//     its figures are the attenuation at the ripple and at that stage's
//     frequency.
type filterClass int

const (
	mainSmoothing filterClass = iota
	decoupler
	screenFeed
	// a feed into a line a shunt stabiliser holds (stabfeed.go)
	stabiliserFeed
)

// filterClassOf tells what the section from in to out does; fed are the
// stages its output feeds.
func (x *figCtx) filterClassOf(in, out, skip int) (filterClass, []*graph.Part) {
	fed := x.fedStages(out, skip)
	switch {
	case x.stabiliserOn(out) != nil:
		return stabiliserFeed, fed
	case x.rectifierOn(in) || len(fed) > 1:
		return mainSmoothing, fed
	case x.onScreen(out):
		return screenFeed, fed
	}
	return decoupler, fed
}

// rectifierOn tells whether a power rectifier (isPowerRectifier) has a
// terminal on id, or charges it through a surge resistor (surgeres.go).
func (x *figCtx) rectifierOn(id int) bool {
	for _, ci := range x.w.conns[id] {
		if x.isPowerRectifier(ci) {
			return true
		}
	}
	return x.rectifierBehindSurge(id)
}

// onScreen tells whether a further grid (a screen) of an amplifying valve
// sits on id itself.
func (x *figCtx) onScreen(id int) bool {
	for _, ci := range x.w.conns[id] {
		if p := x.w.parts[ci]; p.Kind != graph.Valve || isValveDiode(p) {
			continue
		}
		for j, pid := range x.w.pins[ci] {
			if pid == id && x.w.roles[ci][j] == graph.RoleGrid {
				return true
			}
		}
	}
	return false
}

// fedStages are the devices whose supply out feeds through DC paths (not
// through skip): an output electrode or a further grid, directly or
// behind a load or a decoupler. The walk never climbs to a net nearer the
// source than out (feeds), so a decoupler's walk does not run back up the
// line to every other stage.
func (x *figCtx) fedStages(out, skip int) []*graph.Part {
	var fed []*graph.Part
	seen := map[string]bool{}
	level := x.feeds(out)
	x.walkDC(out, skip, func(id, ci, pin int) bool {
		if ci < 0 || pin < 0 {
			return false
		}
		p := x.w.parts[ci]
		if p.Kind == graph.Valve && isValveDiode(p) || seen[p.Ref] {
			return false
		}
		if role := x.w.roles[ci][pin]; role == graph.RoleGrid || role == graph.RoleOutput && id != out {
			seen[p.Ref] = true
			fed = append(fed, p)
		}
		return false
	}, func(id int) bool { return x.feeds(id) <= level })
	// refs in their natural order (V2 before V10), not the walk's
	sort.Slice(fed, func(i, j int) bool {
		a, b := fed[i].Ref, fed[j].Ref
		return len(a) < len(b) || len(a) == len(b) && a < b
	})
	return fed
}

// refList names parts in the order given: "V1, V2 and V3".
func refList(ps []*graph.Part) string {
	refs := make([]string, len(ps))
	for i, p := range ps {
		refs[i] = p.Ref
	}
	if len(refs) < 2 {
		return strings.Join(refs, "")
	}
	return strings.Join(refs[:len(refs)-1], ", ") + " and " + refs[len(refs)-1]
}

// capRoles names a section's capacitors by what they do in its class: the
// reservoir (the first capacitor after a rectifier) and the smoothing
// capacitor of the main filter, or its input capacitor where no rectifier
// sits on it; a decoupling capacitor; a screen bypass capacitor. A
// decoupler's or screen feed's input capacitor belongs to the line before
// it, so it is not the section's figure. Each figure's label names its
// capacitors ("c reservoir (C2)"): a frame's figure line stands beside
// whichever capacitor the sheet drew nearest, and on a reduced sheet the
// reservoir is often not drawn at all, so a bare "c reservoir" was read as
// the smoothing capacitor's label.
func (x *figCtx) capRoles(class filterClass, in int, c1p, c2p []*graph.Part) {
	c1, c2 := sumCap(c1p, 1), sumCap(c2p, 1)
	switch class {
	case mainSmoothing:
		if c1 > 0 && x.rectifierOn(in) {
			x.setCap("c_reservoir", c1, c1p)
		} else if c1 > 0 {
			x.setCap("c_input", c1, c1p)
		}
		x.setCap("c_smoothing", c2, c2p)
	case decoupler:
		x.setCap("c_decoupling", c2, c2p)
	case screenFeed:
		x.setCap("c_screen_bypass", c2, c2p)
	}
}

// setCap records a capacitance figure taken from the netlist values of
// parts, its label naming them.
func (x *figCtx) setCap(name string, v float64, parts []*graph.Part) {
	f := x.named(figure.Figure{Name: name, Unit: figure.Farad})
	if len(parts) > 0 {
		f.Label += " (" + refList(parts) + ")"
	}
	f.Name, f.Value, f.Origin = name, v, byPartValue
	x.putLabelled(f)
}

// dcPoint is the operating point of the original circuit, nil if unknown.
func (x *figCtx) dcPoint() *dc.Point {
	if x.w.op != nil {
		return x.w.op
	}
	if x.w.orig != nil {
		return x.w.orig.op
	}
	return nil
}

// screenBypassMax is the share of the screen's feed impedance the bypass
// may leave at the stage's lowest frequency and still be called effective:
// a tenth (common practice, no source: the screen then carries a tenth of
// the signal it would unbypassed, about 20 dB of degeneration removed).
const screenBypassMax = 0.1

// sawtoothFundamental is the share of a sawtooth's peak-to-peak swing its
// fundamental has, peak to peak: 2/π (Fourier series of a sawtooth,
// handbook). It stands in only where the estimate gives no waveform of its
// own: a reservoir's ripple recharges fast and is no sawtooth, its
// fundamental a larger share (0.84 of the p-p on review 12's supply against
// 2/π = 0.64), so the sawtooth read hum 25 % low.
const sawtoothFundamental = 2 / math.Pi

// humOut is the hum left on the main filter's output: the fundamental of
// the ripple the DC estimate gives at the reservoir on its input
// (graph/dc, the rectifier's periodic steady state, Fourier coefficient of
// its own waveform), passed by the section as the solver gives it at the
// ripple frequency. A smoothing section passes the harmonics far less, so
// the fundamental is the hum left. Nothing where the input is not an
// estimated reservoir.
func (x *figCtx) humOut(in, out int, r *ac.Response, f float64) {
	op := x.dcPoint()
	if op == nil {
		return
	}
	inName := x.netName(in)
	for _, e := range op.Estimates {
		if e.Net != inName || !(e.Ripple > 0) {
			continue
		}
		m := magnitude(r, f)
		if !(m > 0) {
			return
		}
		x.set("ripple_in", figure.Volt, e.Ripple, figure.BySolver("ripple p-p of the rectifier's estimate on "+inName, "DC operating point"))
		if e.Fundamental > 0 {
			x.set("hum_out", figure.Volt, e.Fundamental*m,
				figure.BySolver("ripple's fundamental p-p × |V("+x.netName(out)+")/V("+inName+")|", hz(f)))
			return
		}
		x.set("hum_out", figure.Volt, e.Ripple*sawtoothFundamental*m,
			figure.BySolver("2/π × ripple p-p (a sawtooth assumed) × |V("+x.netName(out)+")/V("+inName+")|", hz(f)))
		return
	}
}
