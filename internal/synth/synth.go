// Package synth builds whole sets of any size for benchmarks and scaling
// tests: receiver banks whose every channel is a complete stage chain taken
// from pare's own examples (a valve superhet channel, or the transistor
// portable's front end), with all their decoupling, heaters, screens and
// trimmers, renamed so that channels never share a signal net. The same
// size and seed always give the same bytes.
package synth

import (
	"bytes"
	"embed"
	"fmt"
	"math/rand/v2"
	"regexp"
	"strconv"

	"pare/graph"
	"pare/graph/value"
)

//go:embed templates/*.toml
var templates embed.FS

// Template names a channel the generator can stamp.
type Template string

// The channel templates (templates/*.toml).
const (
	Superhet Template = "superhet" // valve frequency changer, IF, detector, AGC, audio: 50 parts
	Portable Template = "portable" // transistor mixer-oscillator and first IF: 32 parts
)

// Load returns a template as a circuit.
func Load(t Template) (*graph.Circuit, error) {
	name := "templates/" + string(t) + ".toml"
	src, err := templates.ReadFile(name)
	if err != nil {
		return nil, fmt.Errorf("synth: no template %q", t)
	}
	return graph.Parse(name, src)
}

// BankCircuit is Bank loaded: the circuit every benchmark and test of a
// whole set starts from.
func BankCircuit(parts int, seed uint64) (*graph.Circuit, error) {
	src, err := Bank(parts, seed)
	if err != nil {
		return nil, err
	}
	return graph.Parse("bank.toml", src)
}

// Bank returns the netlist of a receiver bank of about parts parts: as
// many channels as fit, each a superhet or (one time in four, as the seed
// draws it) a portable front end, with resistor values jittered by one
// E12 step where the seed says so. Every channel has its own input and
// output; the supply, heater and ground nets are shared.
func Bank(parts int, seed uint64) ([]byte, error) {
	sh, err := Load(Superhet)
	if err != nil {
		return nil, err
	}
	pt, err := Load(Portable)
	if err != nil {
		return nil, err
	}
	rng := rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15))
	out := newSet(fmt.Sprintf("Synthetic receiver bank, about %d parts, seed %d", parts, seed), sh)
	for k := 1; len(out.c.Parts) < parts || k == 1; k++ {
		tpl := sh
		if rng.IntN(4) == 0 {
			tpl = pt
		}
		out.add(tpl, k, rng)
	}
	return out.write()
}

// Copies returns n renamed copies of one netlist side by side in one file,
// as a club archive's multi-board set would be captured.
func Copies(src []byte, n int) ([]byte, error) {
	c, err := graph.Parse("copies.toml", src)
	if err != nil {
		return nil, err
	}
	out := newSet(fmt.Sprintf("%d copies of %s", n, c.Title), c)
	for k := 1; k <= n; k++ {
		out.add(c, k, nil)
	}
	return out.write()
}

// set is a netlist being stamped together; nets indexes its nets by name
// (the circuit's own index rebuilds on every change).
type set struct {
	c    *graph.Circuit
	nets map[string]bool
}

func newSet(title string, like *graph.Circuit) *set {
	c := &graph.Circuit{Title: title, Band: like.Band, Freqs: map[string]float64{}}
	for k, v := range like.Freqs {
		c.Freqs[k] = v
	}
	return &set{c: c, nets: map[string]bool{}}
}

func (s *set) write() ([]byte, error) {
	c := s.c
	c.Sort()
	var b bytes.Buffer
	if err := graph.Write(&b, c); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// shared says whether a net is common to every channel: ground, supplies
// and heaters are one wire through the whole set.
func shared(n *graph.Net) bool {
	return n.Role == graph.Ground || n.Role == graph.Supply || n.Role == graph.Heater
}

var refForm = regexp.MustCompile(`^([A-Za-z]+)([0-9]+)(.*)$`)

// renumber gives a reference designator its channel: R4 of channel 3 is
// R304, VC1a is VC301a, the way a multi-board diagram numbers by board.
func renumber(ref string, k int) string {
	m := refForm.FindStringSubmatch(ref)
	if m == nil {
		return ref + strconv.Itoa(k)
	}
	n, _ := strconv.Atoi(m[2])
	return m[1] + strconv.Itoa(k*100+n) + m[3]
}

// add stamps channel k of template t into the set.
func (s *set) add(t *graph.Circuit, k int, rng *rand.Rand) {
	c := s.c
	suffix := "_" + strconv.Itoa(k)
	netName := map[string]string{}
	for _, n := range t.Nets {
		nn := *n
		if !shared(n) {
			nn.Name += suffix
		}
		netName[n.Name] = nn.Name
		if !s.nets[nn.Name] {
			s.nets[nn.Name] = true
			c.Nets = append(c.Nets, &nn)
		}
	}
	rename := func(n string) string {
		if v, ok := netName[n]; ok {
			return v
		}
		return n
	}
	for _, p := range t.Parts {
		q := p.Clone()
		q.Ref = renumber(p.Ref, k)
		q.Pos = graph.Pos{}
		for i := range q.Pins {
			q.Pins[i].Net, q.Pins[i].Pos = rename(q.Pins[i].Net), graph.Pos{}
		}
		if q.Gang != "" {
			q.Gang += suffix
		}
		if rng != nil && q.Kind == graph.Resistor && q.Value.Min >= 10e3 && rng.IntN(3) == 0 {
			v := jitter(q.Value.Min, rng.IntN(2) == 0)
			q.Value = value.Range{Min: v, Max: v}
		}
		c.Parts = append(c.Parts, q)
	}
	for _, r := range t.Regions {
		rr := &graph.Region{Name: r.Name + suffix, Band: r.Band, Input: rename(r.Input), Output: rename(r.Output)}
		for _, ref := range r.Parts {
			rr.Parts = append(rr.Parts, renumber(ref, k))
		}
		for _, n := range r.Nets {
			rr.Nets = append(rr.Nets, rename(n))
		}
		c.Regions = append(c.Regions, rr)
	}
	for _, n := range t.Inputs {
		c.Inputs = append(c.Inputs, rename(n))
	}
	for _, n := range t.Outputs {
		c.Outputs = append(c.Outputs, rename(n))
	}
	c.Sort() // the direct appends above: sorted again, the index rebuilt on next use
}

// jitter moves a value one step up or down the IEC 60063 E12 series, as a
// different maker's choice of a grid leak or anode load would.
func jitter(v float64, up bool) float64 {
	e12 := []float64{1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2} // IEC 60063 E12
	dec := 1.0
	for v/dec >= 10 {
		dec *= 10
	}
	m := v / dec
	i := 0
	for i < len(e12)-1 && e12[i]+1e-9 < m {
		i++
	}
	switch {
	case up && i == len(e12)-1:
		return 10 * dec
	case up:
		return e12[i+1] * dec
	case i == 0:
		return e12[len(e12)-1] * dec / 10
	}
	return e12[i-1] * dec
}

// Ladder returns the netlist of an RC ladder of n sections, 1 kΩ in series
// and 10 nF to ground, swept from 10 Hz to 1 MHz: the circuit on which
// pare's whole-process sweep is timed against ngspice.
func Ladder(n int) ([]byte, error) {
	c := &graph.Circuit{Title: fmt.Sprintf("RC ladder, %d sections", n), Band: value.Range{Min: 10, Max: 1e6},
		Inputs: []string{"n0"}, Outputs: []string{"n" + strconv.Itoa(n)}}
	s := &set{c: c, nets: map[string]bool{}}
	s.net(&graph.Net{Name: "gnd", Role: graph.Ground})
	for i := 1; i <= n; i++ {
		prev, cur := "n"+strconv.Itoa(i-1), "n"+strconv.Itoa(i)
		s.net(&graph.Net{Name: prev, Role: graph.Signal})
		s.net(&graph.Net{Name: cur, Role: graph.Signal})
		c.Parts = append(c.Parts,
			&graph.Part{Ref: "R" + strconv.Itoa(i), Kind: graph.Resistor, Value: value.Range{Min: 1e3, Max: 1e3},
				Pins: []graph.Pin{{Name: "1", Net: prev}, {Name: "2", Net: cur}}},
			&graph.Part{Ref: "C" + strconv.Itoa(i), Kind: graph.Capacitor, Type: graph.CapFixed, Value: value.Range{Min: 10e-9, Max: 10e-9},
				Pins: []graph.Pin{{Name: "1", Net: cur}, {Name: "2", Net: "gnd"}}})
	}
	return s.write()
}

func (s *set) net(n *graph.Net) {
	if !s.nets[n.Name] {
		s.nets[n.Name] = true
		s.c.Nets = append(s.c.Nets, n)
	}
}
