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
// Defaults lists every default parameter with its source:
//
//	class                    param  default      source
//	triode                   gm     2 mA/V       typical small-signal triode, from memory
//	triode                   ra     20 kΩ        typical (µ 40), from memory
//	tetrode, pentode         gm     2 mA/V       typical RF/IF pentode, from memory
//	tetrode, pentode         ra     1 MΩ         typical RF/IF pentode, from memory
//	hexode, heptode, octode  gm     0.5 mA/V     typical conversion conductance, from memory
//	hexode, heptode, octode  ra     1 MΩ         typical frequency changer, from memory
//	valve diode              rd     1 kΩ         conducting signal diode, typical, from memory
//	bjt                      beta   100          typical small-signal transistor, from memory
//	bjt                      ic     1 mA         typical small-signal bias, from memory
//	bjt                      VA     100 V        Early voltage, ro = VA/Ic, typical, from memory
//	fet                      gm     4 mA/V       typical small-signal JFET, from memory
//	fet                      rd     50 kΩ        typical small-signal JFET, from memory
//	diode                    Id     1 mA         rd = VT/Id = 25.85 Ω (Shockley, ideality 1)
//	crystal                  c0     5 pF         typical holder capacitance, from memory
//	crystal                  cm     20 fF        c0/cm = 250, typical, from memory
//	crystal                  q      50 000       typical quartz unit, from memory
//
// Any two of a valve's gm, ra and mu give the third; given alone, gm or mu
// is completed with the class's ra, and ra with the class's gm. All three
// given must agree within 2 %.
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
// The equations are modified nodal analysis over complex frequency, solved by
// a sparse LU after a reverse Cuthill–McKee ordering (sparse.go, order.go):
// about O(N) per frequency point for ladders and chains of stages.
package ac
