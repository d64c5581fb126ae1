package graph

import (
	"fmt"
	"math"

	"pare/graph/value"
)

// near compares two values within 1e-9 relative (values pass through decimal
// text on the way, so bit equality is not the contract).
func near(a, b float64) bool {
	if a == b {
		return true
	}
	return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b))
}

func nearRange(a, b value.Range) bool { return near(a.Min, b.Min) && near(a.Max, b.Max) }

// Differences lists every way two circuits differ in meaning (positions and
// comment placement are not part of the meaning); Marshal uses it to prove
// that what it wrote loads back as the circuit it was given.
func Differences(a, b *Circuit) []string {
	var d []string
	add := func(format string, args ...any) { d = append(d, fmt.Sprintf(format, args...)) }
	if a.Title != b.Title || a.Note != b.Note {
		add("title/note: %q/%q vs %q/%q", a.Title, a.Note, b.Title, b.Note)
	}
	if !nearRange(a.Band, b.Band) {
		add("band %v vs %v", a.Band, b.Band)
	}
	if fmt.Sprint(a.Inputs) != fmt.Sprint(b.Inputs) || fmt.Sprint(a.Outputs) != fmt.Sprint(b.Outputs) {
		add("inputs/outputs %v %v vs %v %v", a.Inputs, a.Outputs, b.Inputs, b.Outputs)
	}
	if len(a.Freqs) != len(b.Freqs) {
		add("freqs %v vs %v", a.Freqs, b.Freqs)
	}
	for k, v := range a.Freqs {
		if w, ok := b.Freqs[k]; !ok || !near(v, w) {
			add("freq %s: %g vs %g", k, v, w)
		}
	}
	if len(a.Regions) != len(b.Regions) {
		add("%d regions vs %d", len(a.Regions), len(b.Regions))
	} else {
		for i, r := range a.Regions {
			s := b.Regions[i]
			if r.Name != s.Name || !nearRange(r.Band, s.Band) || fmt.Sprint(r.Parts) != fmt.Sprint(s.Parts) ||
				fmt.Sprint(r.Nets) != fmt.Sprint(s.Nets) || r.Input != s.Input || r.Output != s.Output {
				add("region %s: %+v vs %+v", r.Name, *r, *s)
			}
		}
	}
	if len(a.Nets) != len(b.Nets) {
		add("%d nets vs %d", len(a.Nets), len(b.Nets))
	} else {
		for i, n := range a.Nets {
			m := b.Nets[i]
			if n.Name != m.Name || n.Role != m.Role || !near(n.Volts, m.Volts) || n.Label != m.Label {
				add("net %s: %+v vs %+v", n.Name, *n, *m)
			}
		}
	}
	if len(a.Parts) != len(b.Parts) {
		add("%d parts vs %d", len(a.Parts), len(b.Parts))
		return d
	}
	for i, p := range a.Parts {
		d = append(d, diffParts(p, b.Parts[i])...)
	}
	return d
}

func diffParts(p, q *Part) []string {
	var d []string
	add := func(format string, args ...any) { d = append(d, p.Ref+": "+fmt.Sprintf(format, args...)) }
	if p.Ref != q.Ref || p.Kind != q.Kind || p.Type != q.Type {
		add("ref/kind/type %s %s %s vs %s %s %s", p.Ref, p.Kind, p.Type, q.Ref, q.Kind, q.Type)
	}
	if !nearRange(p.Value, q.Value) || !near(p.Set, q.Set) {
		add("value %v set %g vs %v set %g", p.Value, p.Set, q.Value, q.Set)
	}
	if len(p.Pins) != len(q.Pins) {
		add("pins %v vs %v", p.Pins, q.Pins)
	} else {
		for i := range p.Pins {
			if p.Pins[i].Name != q.Pins[i].Name || p.Pins[i].Net != q.Pins[i].Net {
				add("pin %d %s=%s vs %s=%s", i, p.Pins[i].Name, p.Pins[i].Net, q.Pins[i].Name, q.Pins[i].Net)
			}
		}
	}
	if len(p.Windings) != len(q.Windings) {
		add("windings %v vs %v", p.Windings, q.Windings)
	} else {
		for i, w := range p.Windings {
			v := q.Windings[i]
			if w.Name != v.Name || w.From != v.From || w.To != v.To || !near(w.L, v.L) || !near(w.Q, v.Q) {
				add("winding %+v vs %+v", w, v)
			}
		}
	}
	if len(p.Coupling) != len(q.Coupling) {
		add("coupling %v vs %v", p.Coupling, q.Coupling)
	} else {
		for _, c := range p.Coupling {
			if !near(c.K, q.K(c.A, c.B)) {
				add("k %s-%s %g vs %g", c.A, c.B, c.K, q.K(c.A, c.B))
			}
		}
	}
	if fmt.Sprint(p.Closes) != fmt.Sprint(q.Closes) {
		add("closes %v vs %v", p.Closes, q.Closes)
	}
	if !near(p.Tol.Plus, q.Tol.Plus) || !near(p.Tol.Minus, q.Tol.Minus) || !near(p.Rating, q.Rating) {
		add("tol/rating %v %g vs %v %g", p.Tol, p.Rating, q.Tol, q.Rating)
	}
	if p.Gang != q.Gang || p.Envelope != q.Envelope || p.Keep != q.Keep || p.Note != q.Note || p.Label != q.Label {
		add("attributes %q %q %v %q %q vs %q %q %v %q %q", p.Gang, p.Envelope, p.Keep, p.Note, p.Label, q.Gang, q.Envelope, q.Keep, q.Note, q.Label)
	}
	if len(p.Params) != len(q.Params) {
		add("params %v vs %v", p.Params, q.Params)
	}
	for k, v := range p.Params {
		if w, ok := q.Params[k]; !ok || !near(v, w) {
			add("param %s %g vs %g", k, v, w)
		}
	}
	if fmt.Sprint(p.From) != fmt.Sprint(q.From) {
		add("from %v vs %v", p.From, q.From)
	}
	if fmt.Sprint(p.Adjust) != fmt.Sprint(q.Adjust) {
		add("adjust %v vs %v", p.Adjust, q.Adjust)
	}
	return d
}
