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
