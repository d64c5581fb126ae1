package ac

// readPiece is the part of the matrix a response read at the nodes from,
// and driven only there, depends on: the nodes from, and every unknown
// whose column has an entry in the row of one already in it, closed. Its
// rows hold no entry outside it, so after renumbering the matrix is
// block triangular, [A_SS 0; A_RS A_RR]: A_SS x_S = b_S alone gives the
// voltages read, exactly, and A_SS is regular wherever the whole block
// is (det A = det A_SS · det A_RR). What lies beyond a one-way stamp is
// left out: a device's controlled source puts its control electrode's
// voltage in its output's rows, never the other way, so a tank on a
// quiet mixer's grid (rules/stages, a tracking walk at every gang
// setting) is solved without the IF strip and the audio stages behind
// the anode. The result is the whole block's to rounding (a smaller
// system eliminated in another order), not to the bit.
//
// A two-terminal primitive stamps its two nodes' rows with their two
// columns, so one end in the piece brings the other; a VCCS stamps its
// output nodes' rows with its control nodes' columns, so only an output
// node in the piece brings its control nodes, and a control node alone
// brings nothing; a winding group's branch rows tie every winding's ends
// and the group's mutuals together, so one winding end brings the group.
// Ground and held nodes are no unknowns and are not followed.
func (m *model) readPiece(from []int, isHeld []bool) *part {
	return m.floodFrom(from, isHeld, nil, true)
}
