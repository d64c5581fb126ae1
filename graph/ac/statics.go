// The parts of a system's matrix that do not change with frequency.

package ac

// statics is what solveAt keeps of a system from one frequency to the next:
// the sums of the matrix slots and right-hand-side rows whose stamps are all
// constant (resistors, conductances, the windings' unit entries), worked
// out once, and the stamps and coefficients that remain to be redone at each
// frequency. A sweep solves a block at hundreds of points and most of its
// slots hold a resistor or a transconductance alone; the constant sums are
// the very sums the full pass makes (same stamps, same order, from zero),
// so the matrix comes out the same to the bit.
type statics struct {
	ax, b  []complex128 // the constant sums; 0 in the slots and rows redone
	stamps []stamp      // the stamps of the slots and rows redone, in order
	coefs  []int32      // the coefficients that vary with frequency
	varOf  []int32      // each coefficient's place in coefs, or -1 (batch.go)
}

// makeStatics splits s's stamps into the constant sums and the rest; vals
// holds every coefficient's value (at any frequency: the constant ones are
// the same at all).
func (s *system) makeStatics(vals []complex128) *statics {
	st := &statics{ax: make([]complex128, len(s.a.x)), b: make([]complex128, s.n)}
	st.varOf = make([]int32, len(s.coefs))
	for i, k := range s.coefs {
		st.varOf[i] = -1
		if k.kind != valConst {
			st.varOf[i] = int32(len(st.coefs))
			st.coefs = append(st.coefs, int32(i))
		}
	}
	// A slot or row is redone when any of its stamps varies.
	varSlot := make([]bool, len(s.a.x))
	varRow := make([]bool, s.n)
	for _, sp := range s.stamps {
		if s.coefs[sp.val].kind == valConst {
			continue
		}
		if sp.slot >= 0 {
			varSlot[sp.slot] = true
		} else {
			varRow[sp.rhs] = true
		}
	}
	for _, sp := range s.stamps {
		if (sp.slot >= 0 && varSlot[sp.slot]) || (sp.slot < 0 && varRow[sp.rhs]) {
			st.stamps = append(st.stamps, sp)
			continue
		}
		v := vals[sp.val]
		if sp.neg {
			v = -v
		}
		if sp.slot >= 0 {
			st.ax[sp.slot] += v
		} else {
			st.b[sp.rhs] -= v
		}
	}
	return st
}
