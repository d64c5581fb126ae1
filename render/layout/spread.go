package layout

// Spread columns. A column's blocks stack top to bottom, so a stage whose
// shunts all hang off one net at one distance from the input (an
// oscillator's emitter with its bypass, coupling and feedback capacitors
// and its bias resistors; a faded mixer's screen, anode and AGC
// decouplers) draws one column of four to six parts, and its row comes
// out 50 to 65 grid units tall on a page of 88: the row takes a page of
// its own beside nothing (review23 b01's Wien oscillator; review13
// a02's faded mixer). A row laid out again compact (Options.Compact, tried only
// where its height costs the view a page) may also be tried spread
// (Options.Spread), which stands the lower half of such a column
// in a column of its own just right of it: a row's parts then take its
// width, of which a short stage's row has most to spare, rather than its
// height (common practice: a technician draws a long run of shunts side
// by side along the line they hang from, not one under another).

// spreadLeast is the fewest blocks a column holds for its lower half to
// stand in a column of its own: three stack no taller than a device
// with its load above and its common-lead resistor below.
const spreadLeast = 4

// spreadColumns splits, right to left, every column of at least
// spreadLeast blocks whose foot is two or more blocks of two-terminal
// parts alone (allShunts) into two: its upper half, and every block above
// that foot, stays; the rest stands in a new column right after it. The cells' columns and those of the blocks after are
// renumbered, the rail sockets' (feet) with them.
func (ly *state) spreadColumns(cols [][]*block, feet []*block) [][]*block {
	for i := len(cols) - 1; i >= 0; i-- {
		col := cols[i]
		t := 0 // the two-terminal blocks at the column's foot
		for t < len(col) && allShunts(col[len(col)-1-t:len(col)-t]) {
			t++
		}
		if len(col) < spreadLeast || t < 2 {
			continue
		}
		keep := max(len(col)-t, (len(col)+1)/2)
		moved := col[keep:]
		for _, cl := range ly.cells {
			if cl.col > i {
				cl.col++
			}
		}
		for _, b := range feet {
			if b.col > i {
				b.col++
			}
		}
		for _, c := range cols[i+1:] {
			for _, b := range c {
				b.col++
			}
		}
		for _, b := range moved {
			b.col = i + 1
			for _, cl := range b.cells {
				cl.col = i + 1
			}
		}
		out := append([][]*block{}, cols[:i]...)
		out = append(out, col[:keep:keep], append([]*block{}, moved...))
		cols = append(out, cols[i+1:]...)
	}
	return cols
}

// allShunts says whether every block of a column is two-terminal parts
// alone (a lone part or a parallel pair; no chain, no tank, no flag or
// connector, no device, whose slots templates read).
func allShunts(col []*block) bool {
	for _, b := range col {
		if len(b.chain) > 0 || b.tank {
			return false
		}
		for _, cl := range b.cells {
			if cl.edge != 0 || cl.conn || len(cl.shape.Pins) != 2 {
				return false
			}
		}
	}
	return true
}
