// Package ac is pare's small-signal AC solver and the proof that a reduction
// keeps a circuit's signal behaviour.
//
// A circuit is turned into primitive elements (elaborate.go): resistors,
// capacitors, series R–L and R–L–C arms, voltage-controlled current sources,
// and groups of coupled windings. Nets whose role is AC ground (ground,
// supply, heater, bias) are one node, ground. The models:
//
//   - R, L, C as written; a variable capacitor at Options.VarFrac of its
//     travel (mid when VarSet is false), a trimmer at its Set.
//   - Windings: each winding between its pins, mutual inductance
//     M = k·√(La·Lb) for each coupling (dots at each winding's From pin, so a
//     tapped coil's halves aid). Loss: Q is read as the coil's Q at the
//     geometric centre f0 of the band the part works in, a constant series
//     R = 2π·f0·L/Q (see windings in elaborate.go for why); the sections of
//     a tapped winding share the loss of the whole coil (device.WindingLoss).
//   - Valves, BJTs, FETs, diodes and crystals: the small-signal models of
//     package graph/device (one model, shared with the reduction's
//     judgements and the stage figures; its doc lists every default with its
//     source), stamped as elements: a valve's ra from anode to cathode and
//     gm·v(g1, k) from anode to cathode; a BJT's rπ (b–e), ro (c–e) and
//     gm·v(b, e); a FET's rd and gm·v(g, s); a diode's rd; a crystal's
//     motional Rm–Lm–Cm arm with C0 across it. Further grids (g2…) are at
//     their nets but draw no current: screen and injector currents are
//     ignored. In a multi-grid frequency changer g1 is the control grid. A
//     FET's body pin is ignored.
//   - Pots: two resistors at the wiper setting. Switches: the contact pairs
//     closed in the set position join their nets. Ports are open unless
//     Options.Terminate states a termination. Generic parts are open.
//   - A group of nets that no part connects to ground or to a declared
//     input, and that is reached only through ports (a mains primary on
//     its two ports, the far winding of a transformer at a focus cut), is
//     fed or referenced from beyond the ports by a source the sweep does
//     not drive: an undriven ideal source is 0 V, so the port nets are held
//     at ground, as a transfer holds the other declared inputs
//     (superposition). A mains primary is thus shorted by a stiff supply.
//     A port on a declared output is never held; a termination stated on a
//     port net overrides it all. Compare notes the held nets and compares
//     nothing at them.
//
// An impedance is the voltage a 1 A source into the net produces, with the
// circuit's other declared inputs held at 0 V by their ideal sources.
//
// Compare judges a transfer over the bands of its input net and an impedance
// over the bands of its net (the regions holding the net, or the default
// band); see netBands for why. Gang sections are checked at minimum, mid
// travel and maximum unless Options.VarSet picks one setting. Responses more
// than 80 dB below their peak count as that floor.
//
// Past an envelope detector the signal is audio (detpairs.go): the input to
// output pair is replaced by the detector's audio net to each output over
// the audio band and, where the input shares a band with the detector's IF
// net, the input to that net. Where a frequency change lies between them
// (the input's band is not the IF's), the input to the grid of the first
// frequency changer is compared over the input's bands instead
// (changer.go), so the aerial coupling and RF stages are proven; the
// conversion itself is not (a linear model does not mix), and the note
// says so and whether a region's pair starts at the changer's output.
//
// The equations are modified nodal analysis over complex frequency, solved by
// a sparse LU after a reverse Cuthill–McKee ordering (sparse.go, order.go):
// about O(N) per frequency point for ladders and chains of stages.
package ac
