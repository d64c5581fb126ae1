// One response's system carried from gang setting to gang setting.

package ac

import "slices"

// A tracking walk (rules/stages) solves the same two tanks at some two
// hundred gang settings, and a design's bisection at as many again: each
// setting's system has the pattern, the unknowns' order and the stamps of
// every other, since a setting moves nothing but the capacitors' values
// (atSetting). So a response is assembled once per pair of nets and kind,
// and at a later setting its system is that one with the capacitors'
// coefficients read from the setting's netlist: the system assembling the
// setting afresh builds, value for value and stamp for stamp, so it is
// solved to the same bits.

// shapeKey names a response of a Responses: its kind and its two nodes.
type shapeKey struct{ kind, a, b int }

const (
	shapeTransimpedance = iota
	shapeAcross
)

// shape is a response as assembled at the first setting that shares the
// base netlist's shape, and the piece of the netlist it was assembled on.
type shape struct {
	r   Response
	sub *part
}

// shared tells whether m has the base model's netlist shape: the base
// itself, or a setting made from it.
func (rs *Responses) shared(m *model) bool {
	return rs.base != nil && (m == rs.base || m.from == rs.base)
}

// reshaped is the response k at the model m made from its shape, when it
// has one and m shares the base's shape.
func (rs *Responses) reshaped(k shapeKey, m *model) (*Response, bool) {
	sh, ok := rs.shapes[k]
	if !ok || !rs.shared(m) {
		return nil, false
	}
	r := sh.r
	if r.s != nil {
		r.s = r.s.retuned(m.nl, sh.sub)
	}
	return &r, true
}

// keep remembers r, assembled on sub of model m, as the shape of response
// k, when m shares the base's shape.
func (rs *Responses) keep(k shapeKey, m *model, r *Response, sub *part) *Response {
	if rs.shared(m) {
		if rs.shapes == nil {
			rs.shapes = map[shapeKey]*shape{}
		}
		rs.shapes[k] = &shape{r: *r, sub: sub}
	}
	return r
}

// retuned is s with each capacitor's coefficient taken from nl, a netlist
// of s's shape at another setting: the stamps, the pattern and the order
// of the unknowns are shared (nothing writes them once assembled), the
// values and the factorisation's pivots are the new system's own.
func (s *system) retuned(nl *netlist, sub *part) *system {
	out := &system{nl: nl, n: s.n, unk: s.unk, what: s.what, coefs: slices.Clone(s.coefs), stamps: s.stamps,
		a: csc{n: s.a.n, p: s.a.p, i: s.a.i, x: make([]complex128, len(s.a.x))}}
	// stampPrims makes one coefficient per primitive, in the piece's order
	for k, pi := range sub.prims {
		if p := &nl.prims[pi]; p.kind == primC {
			out.coefs[k].a = p.v
		}
	}
	if s.n > 0 {
		identity := make([]int, s.n)
		for i := range identity {
			identity[i] = i
		}
		out.f = newLU(s.n, identity)
		out.b = make([]complex128, s.n)
		out.y = make([]complex128, s.n)
	}
	return out
}
