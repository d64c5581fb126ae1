package check

import (
	"testing"

	"pare/render/geom"
)

// Hand-worked geometry (squared paper): C1 from signal net s to the
// return net k. Lying flat its pins are (10,0) and (14,0); standing, (12,0)
// on top and (12,4) below. The expected counts are by eye.
func TestFlatShunts(t *testing.T) {
	flat := withKind(sym("C1", 10, -1, 14, 1, pin("1", "s", 10, 0, geom.Left), pin("2", "k", 14, 0, geom.Right)), "capacitor")
	stand := withKind(sym("C1", 11, 0, 13, 4, pin("1", "s", 12, 0, geom.Up), pin("2", "k", 12, 4, geom.Down)), "capacitor")
	series := withKind(sym("C1", 10, -1, 14, 1, pin("1", "s", 10, 0, geom.Left), pin("2", "t", 14, 0, geom.Right)), "capacitor")
	isReturn := func(n string) bool { return n == "k" }
	cases := []struct {
		name  string
		part  geom.Symbol
		wires []geom.Wire
		want  int
	}{
		// review21 a03's C13: the signal comes in from the left, the
		// return line leaves to the right along the row
		{"flat, in line between wires", flat, []geom.Wire{wire("s", seg(0, 0, 10, 0)), wire("k", seg(14, 0, 20, 0))}, 1},
		// the return wire passes through the pin's point, on to x = 20
		{"flat, return wire through the pin", flat, []geom.Wire{wire("s", seg(0, 0, 10, 0)), wire("k", seg(12, 0, 20, 0))}, 1},
		// the return end turns straight down: the part hangs off its end
		{"flat, return wire turns down", flat, []geom.Wire{wire("s", seg(0, 0, 10, 0)), wire("k", seg(14, 0, 14, 6))}, 0},
		{"standing under the row", stand, []geom.Wire{wire("s", seg(0, 0, 20, 0)), wire("k", seg(12, 4, 20, 4))}, 0},
		{"series part between two signal nets", series, []geom.Wire{wire("s", seg(0, 0, 10, 0)), wire("t", seg(14, 0, 20, 0))}, 0},
	}
	for _, c := range cases {
		g := &geom.Sheet{Symbols: []geom.Symbol{c.part}, Wires: c.wires}
		if got := FlatShunts(g, isReturn); len(got) != c.want {
			t.Errorf("%s: %d findings %q, want %d", c.name, len(got), got, c.want)
		}
	}
}
