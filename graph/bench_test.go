package graph

import (
	"io"
	"os"
	"path/filepath"
	"testing"
)

// BenchmarkParse loads the largest example (the IF strip, 37 parts): the cost
// of `pare check` per file, decoder plus key scanner plus model.
func BenchmarkParse(b *testing.B) {
	path := filepath.Join(repo, "examples", "if-detector-audio.toml")
	data, err := os.ReadFile(path)
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := Parse(path, data); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkWrite prints the same circuit in the canonical layout.
func BenchmarkWrite(b *testing.B) {
	c, err := LoadFile(filepath.Join(repo, "examples", "if-detector-audio.toml"))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if err := Write(io.Discard, c); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkCheck runs the transcription checks on it.
func BenchmarkCheck(b *testing.B) {
	c, err := LoadFile(filepath.Join(repo, "examples", "if-detector-audio.toml"))
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		Check(c)
	}
}

// handDistances is the breadth-first walk written by hand over the index,
// as find.go had it before the shared graph.Walk: kept here only to measure
// what gonum's traverse costs (DEVELOPERS.md, "Graph algorithms").
func handDistances(c *Circuit, starts []string) map[*Part]int {
	dist := map[*Part]int{}
	depth := map[string]int{}
	var queue []string
	for _, n := range starts {
		if _, ok := depth[n]; !ok {
			depth[n] = 0
			queue = append(queue, n)
		}
	}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		for _, cn := range c.ConnsOf(n) {
			if _, ok := dist[cn.Part]; ok {
				continue
			}
			dist[cn.Part] = depth[n]
			for _, pin := range cn.Part.Pins {
				if _, ok := depth[pin.Net]; !ok && !c.RoleOf(pin.Net).IsACGround() {
					depth[pin.Net] = depth[n] + 1
					queue = append(queue, pin.Net)
				}
			}
		}
	}
	return dist
}

// BenchmarkWalk: distance from the inputs on the largest example, through
// gonum (view built each time, as the callers do) and by hand on the index.
func BenchmarkWalk(b *testing.B) {
	c, err := LoadFile(filepath.Join(repo, "examples", "if-detector-audio.toml"))
	if err != nil {
		b.Fatal(err)
	}
	follow := func(n string) bool { return !c.RoleOf(n).IsACGround() }
	b.Run("gonum", func(b *testing.B) {
		for b.Loop() {
			w := NewWalk(c.View())
			w.Follow = follow
			w.FromNets(c.Inputs, 0)
		}
	})
	b.Run("gonum-walk-only", func(b *testing.B) {
		v := c.View()
		for b.Loop() {
			w := NewWalk(v)
			w.Follow = follow
			w.FromNets(c.Inputs, 0)
		}
	})
	b.Run("hand", func(b *testing.B) {
		for b.Loop() {
			handDistances(c, c.Inputs)
		}
	})
	b.Run("index-lookup", func(b *testing.B) { // what a rule's "what is on this net" costs
		for b.Loop() {
			for _, n := range c.Nets {
				_ = c.ConnsOf(n.Name)
			}
		}
	})
	b.Run("view-from", func(b *testing.B) { // the same question through the gonum view
		v := c.View()
		for b.Loop() {
			for _, n := range c.Nets {
				id, _ := v.NetNode(n.Name)
				it := v.From(id)
				for it.Next() {
					_ = v.PartOf(it.Node().ID())
				}
			}
		}
	})
}
