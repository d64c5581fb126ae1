package graph

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"pare/graph/value"
)

// Device parameters and the quantities derived from them are checked at
// load, where the position is known: a zero mutual conductance or a negative
// winding used to load without a word and fail later, far from the line
// that caused it, with the exit code of a failed verification.

// positiveParams are the device parameters that only make sense above zero,
// with what each one is, for the message.
var positiveParams = map[string]string{
	"gm":   "the mutual conductance",
	"gmo":  "the g1-to-g2 (oscillator anode) transconductance",
	"mu":   "the amplification factor µ",
	"ra":   "the anode resistance",
	"beta": "the current gain β",
	"ic":   "the collector bias current",
	"ro":   "the output resistance",
	"rpi":  "the base input resistance rπ",
	"rd":   "the small-signal resistance",
	"rm":   "the motional resistance",
	"lm":   "the motional inductance",
	"cm":   "the motional capacitance",
	"q":    "the quality factor",
	"k":    "the MOSFET's square-law factor k",
	"vac":  "the RMS voltage of the rectifier winding or of the mains",
	"hz":   "the mains frequency",
	"rdc":  "the DC resistance of each winding",
	"q_at": "the frequency the coil's q is stated at",
	// The DC laws' own parameters (graph/dc, docs/devices.md).
	"mu2":       "the screen's amplification factor µ2",
	"vknee":     "the anode voltage scale of the knee",
	"kg":        "the grid current's perveance",
	"perveance": "the valve diode's perveance",
	"is":        "the diode's saturation current",
	"vz":        "the zener's breakdown voltage",
	"rz":        "the zener's dynamic resistance in breakdown",
}

func hasParam(p *Part, name string) bool { _, ok := p.Params[name]; return ok }

// checkParams runs after the parts are read (their own keys already
// checked for syntax) and reports every value out of its physical range.
func (ld *loader) checkParams() {
	for name, f := range ld.c.Freqs {
		if p := "freqs." + name; !ld.bad[p] && f <= 0 {
			ld.errVal(p, "frequency %s must be above 0 Hz", name)
		}
	}
	for _, p := range ld.c.Parts {
		path := "parts." + p.Ref
		for _, k := range sortedKeys(p.Params) {
			v := p.Params[k]
			what, positive := positiveParams[k]
			switch {
			case ld.bad[path+"."+k]:
			case positive && !(v > 0):
				ld.errVal(path+"."+k, "%s must be above 0: %s is %s", k, what, fmtParam(v))
			case k == "c0" && v < 0:
				ld.errVal(path+"."+k, "c0, the crystal's shunt capacitance, must not be negative")
			case k == "is" && hasParam(p, "vf"):
				ld.errKey(path+"."+k, "give a diode's vf (Is is then the one that passes 1 mA at vf) or its is, not both")
			case k == "share" && !(v > 0 && v < 1):
				ld.errVal(path+"."+k, "share, the screen's part of the cathode current, must lie between 0 and 1 (not %s)", fmtParam(v))
			case k == "n" && !(v >= 0.5 && v <= 5):
				ld.errVal(path+"."+k, "n, the diode's ideality factor, must lie between 0.5 and 5 (not %s)", fmtParam(v))
			case k == "off" && v != 0 && v != 1:
				ld.errVal(path+"."+k, "off is 1 for a diode that is cut off, or 0; not %s", fmtParam(v))
			}
		}
		if p.Rating < 0 && !ld.bad[path+".rating"] {
			ld.errVal(path+".rating", "a voltage rating must not be negative")
		}
		if p.Kind == Crystal && p.Value.Max <= 0 && !ld.bad[path+".xtal"] {
			ld.errVal(path+".xtal", "a crystal's frequency must be above 0 Hz")
		}
		ld.checkWindings(path, p)
		ld.checkCoupling(path, p)
		ld.checkValveTriple(path, p)
	}
}

// ValveAgreement is how far gm·ra may stray from µ when a valve gives all
// three (docs/devices.md): data-sheet figures are rounded, so exact
// agreement is too much to ask, but a wider gap means one of them is wrong
// and no model can honour all three.
const ValveAgreement = 0.02

// checkValveTriple refuses a valve whose gm, ra and µ are all given but
// disagree, at the µ key: loaded, it used to pass check and fail only in
// verification, with the exit code of a failed proof.
func (ld *loader) checkValveTriple(path string, p *Part) {
	g, hasG := p.Param("gm")
	r, hasR := p.Param("ra")
	mu, hasMu := p.Param("mu")
	if !hasG || !hasR || !hasMu {
		return
	}
	for _, k := range []string{"gm", "ra", "mu"} {
		if ld.bad[path+"."+k] {
			return // already reported as out of range
		}
	}
	if math.Abs(g*r-mu) > ValveAgreement*mu {
		ld.errVal(path+".mu", "gm·ra = %.4g but mu = %.4g: the three must agree within 2 %%; give any two of gm, ra, mu", g*r, mu)
	}
}

func fmtParam(v float64) string { return fmt.Sprintf("%g", v) }

// checkWindings refuses a winding that is not a positive inductance within
// the magnitudes pare reads: a tap at 0.9999999999999999 left a section of
// 1e-36 H that no file could hold.
func (ld *loader) checkWindings(path string, p *Part) {
	for _, w := range p.Windings {
		wp := ld.windingPath(path, p, w)
		if ld.bad[wp] {
			continue
		}
		switch {
		case !(w.L > 0):
			ld.errVal(wp, "winding %s must have an inductance above 0 H", w.Name)
		case w.L < value.MinMagnitude || w.L > value.MaxMagnitude:
			ld.errVal(wp, "winding %s comes to %s H, outside what pare reads (1e-24 to 1e24): move the tap away from the end", w.Name, fmtParam(w.L))
		case w.Q < 0:
			ld.errVal(wp, "winding %s: q must be above 0 (leave it out for a lossless winding)", w.Name)
		}
	}
}

// windingPath finds the key a winding was written under, for the message:
// a coil's tap or l, a transformer's windings.NAME (a tapped winding's
// halves NAMEa and NAMEb run from NAME1 and NAMEt).
func (ld *loader) windingPath(path string, p *Part, w Winding) string {
	if p.Kind == Inductor {
		if ld.ix.written(path + ".tap") {
			return path + ".tap"
		}
		return path + ".l"
	}
	if w.From == "" {
		return path + ".windings"
	}
	return path + ".windings." + w.From[:len(w.From)-1]
}

// checkCoupling refuses a pair given twice ("p-s" and "s-p"), a winding
// coupled to itself, and a set of k that no real transformer can have: the
// matrix of couplings (1 on the diagonal) must be positive semidefinite,
// or the inductance matrix would promise energy out of nothing. Exactly 1
// is allowed (the halves of a tapped winding are fully coupled).
func (ld *loader) checkCoupling(path string, p *Part) {
	if len(p.Coupling) == 0 {
		return
	}
	kp := path + ".k"
	seen := map[[2]string]bool{}
	ok := true
	for _, c := range p.Coupling {
		at := kp
		if ld.ix.written(kp + "." + c.A + "-" + c.B) {
			at = kp + "." + c.A + "-" + c.B
		}
		pair := [2]string{min(c.A, c.B), max(c.A, c.B)}
		switch {
		case ld.bad[at]:
			ok = false
		case c.A == c.B:
			ld.errKey(at, "winding %s cannot be coupled to itself: name two windings as \"A-B\"", c.A)
			ok = false
		case seen[pair]:
			ld.errKey(at, "the coupling of %s and %s is given twice: give each pair once", pair[0], pair[1])
			ok = false
		}
		seen[pair] = true
	}
	if ok && !realisable(p) {
		ld.errVal(kp, "these couplings cannot all hold at once (no set of windings has them): lower the larger k or raise the smaller")
	}
}

// realisable reports whether the coupling matrix of p's windings is
// positive semidefinite, to a tolerance that lets exact k = 1 pass.
func realisable(p *Part) bool {
	n := len(p.Windings)
	if n < 3 {
		return true // one pair: 0 < k ≤ 1 is checked where k is read
	}
	m := mat.NewSymDense(n, nil)
	for i := range p.Windings {
		m.SetSym(i, i, 1)
		for j := i + 1; j < n; j++ {
			m.SetSym(i, j, p.K(p.Windings[i].Name, p.Windings[j].Name))
		}
	}
	var eig mat.EigenSym
	if !eig.Factorize(m, false) {
		return false
	}
	for _, v := range eig.Values(nil) {
		if v < -1e-9 {
			return false
		}
	}
	return true
}

// isOneValue tells a single value with an exponent ("1e-9") from a span
// written with a dash ("530k-1700k"): the exponent's minus is no dash.
func isOneValue(s string, u value.Unit) bool {
	_, err := value.Parse(normaliseUnit(s, u), u)
	return err == nil
}

// checkPorts refuses a signal input or output on a ground net: ground is
// the reference every voltage is taken against, so no signal enters or
// leaves there, and a comparison at it would "pass" with nothing compared.
// (A supply rail may be an output, of a smoothing filter for one; the
// verification reports it as not comparable.)
func (ld *loader) checkPorts() {
	c := ld.c
	check := func(path, name, what, verb string) {
		if name == "" || ld.bad[path] || c.Net(name) == nil || c.RoleOf(name) != Ground {
			return
		}
		ld.errVal(path, "%s %s is a ground net, the reference for every voltage: name the net where the signal %s", what, name, verb)
	}
	for i, n := range c.Inputs {
		check(fmt.Sprintf("inputs[%d]", i), n, "input", "enters")
	}
	for i, n := range c.Outputs {
		check(fmt.Sprintf("outputs[%d]", i), n, "output", "leaves")
	}
}
