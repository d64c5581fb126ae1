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
//     R = 2π·f0·L/Q (see windings in elaborate.go for why).
//   - Valves: a conductance 1/ra from anode to cathode and a current gm·Vg1k
//     from anode to cathode; µ = gm·ra, any two of gm, ra, mu give the third.
//     Further grids (g2…) are at their nets but draw no current: screen and
//     injector currents are ignored. In a multi-grid frequency changer g1 is
//     the control grid. Valve diodes are a resistance rd, or open with off = 1.
//   - BJTs (npn and pnp alike): hybrid-π, gm = Ic/VT with VT = kT/q at 300 K
//     (25.8520 mV, SI 2019 exact constants), rπ = β/gm, ro = VA/Ic; gm, rpi
//     and ro given on the part win.
//   - FETs: gm·Vgs from drain to source and rd; the body pin is ignored.
//   - Diodes: a resistance rd (default VT/1 mA), or open with off = 1;
//     varicaps are open (their capacitance is not in the netlist format).
//   - Crystals: the four-element equivalent, motional Rm–Lm–Cm in series with
//     the holder capacitance C0 across it. From the series frequency fs:
//     lm or cm given fixes the other by (2π·fs)² = 1/(Lm·Cm), with neither cm
//     takes its default; rm given wins, else Rm = 2π·fs·Lm/Q.
//   - Pots: two resistors at the wiper setting. Switches: the contact pairs
//     closed in the set position join their nets. Ports are open unless
//     Options.Terminate states a termination. Generic parts are open.
//
// Defaults lists every default parameter with its source.
//
// The equations are modified nodal analysis over complex frequency, solved by
// a sparse LU after a reverse Cuthill–McKee ordering (sparse.go, order.go):
// about O(N) per frequency point for ladders and chains of stages.
package ac
