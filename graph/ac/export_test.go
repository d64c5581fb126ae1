package ac

import "pare/graph"

// SetReducer lets the external tests hand in the rules engine.
func SetReducer(f func(c *graph.Circuit) (*graph.Circuit, error)) { reduceDefault = f }

// MemoLen is the number of responses sets a memo holds.
func MemoLen(m *Memo) int { return len(m.series) }

// MemoDump is every response a memo holds, by system digest and frequency.
func MemoDump(m *Memo) map[[32]byte]map[float64]complex128 {
	out := map[[32]byte]map[float64]complex128{}
	for k, h := range m.series {
		c := map[float64]complex128{}
		for f, v := range h {
			c[f] = v
		}
		out[k] = c
	}
	return out
}
