package figure

import (
	"bytes"
	"encoding/json"
	"slices"
	"strings"
)

// List is a stage's figures in the order a person reads them (the stage
// finder sets the order; every medium keeps it).
type List []Figure

// Get returns the first figure of the given name.
func (l List) Get(name string) (Figure, bool) {
	for _, f := range l {
		if f.Name == name {
			return f, true
		}
	}
	return Figure{}, false
}

// Lookup returns the number under a JSON key ("f_min_hz", "gain"): what a
// pattern's guard and a test ask for.
func (l List) Lookup(key string) (float64, bool) {
	for _, f := range l {
		for _, e := range f.Entries() {
			if e.Key == key {
				return e.Value, true
			}
		}
	}
	return 0, false
}

// Put adds a figure, replacing one of the same name and unit in its place
// (a gain and the same gain in decibels are two figures). A figure
// with a number that is not finite (a formula that divided by zero) is
// left out: no figure is better than a wrong one.
func (l *List) Put(f Figure) {
	if !f.Finite() {
		return
	}
	for i := range *l {
		if (*l)[i].Name == f.Name && (*l)[i].Unit == f.Unit {
			(*l)[i] = f
			return
		}
	}
	*l = append(*l, f)
}

// MarshalJSON writes the figures as one object of key → number in SI base
// units, keys sorted, numbers at full precision: {"f_max_hz": 1600000,
// "f_min_hz": 527400.2, …}. The keys are the figures' Entries; a key met
// twice keeps its last number.
func (l List) MarshalJSON() ([]byte, error) {
	var members []member
	for _, f := range l {
		for _, e := range f.Entries() {
			members = append(members, member{e.Key, e.Value})
		}
	}
	return object(members)
}

// Origins is a List seen for JSON as where each number came from: one
// object of key → origin ("f_hz": "formula f = 1/(2π√(LC))",
// "gain_ac": "solver V(o)/V(g) at 54.77 kHz"), keys as List.MarshalJSON
// writes them.
type Origins List

// MarshalJSON writes the origins of the figures' keys, sorted by key.
func (o Origins) MarshalJSON() ([]byte, error) {
	var members []member
	for _, f := range o {
		at, check := f.At, f.checkFigure()
		f.At, f.Check = nil, nil
		for _, g := range []*Figure{&f, at, check} {
			if g == nil {
				continue
			}
			for _, e := range g.Entries() {
				members = append(members, member{e.Key, g.Origin.String()})
			}
		}
	}
	return object(members)
}

// member is one key and value of a JSON object.
type member struct {
	key   string
	value any
}

// object writes a JSON object with its members sorted by key, as
// encoding/json writes a map; of a key met twice the last value stays.
func object(members []member) ([]byte, error) {
	slices.SortStableFunc(members, func(a, b member) int { return strings.Compare(a.key, b.key) })
	var b bytes.Buffer
	b.WriteByte('{')
	for i, m := range members {
		if i+1 < len(members) && members[i+1].key == m.key {
			continue
		}
		if b.Len() > 1 {
			b.WriteByte(',')
		}
		k, err := json.Marshal(m.key)
		if err != nil {
			return nil, err
		}
		v, err := json.Marshal(m.value)
		if err != nil {
			return nil, err
		}
		b.Write(k)
		b.WriteByte(':')
		b.Write(v)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}
