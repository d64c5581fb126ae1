// Package device is pare's one small-signal model of its parts: the
// parameters of every amplifying part (valve sections with a control grid,
// BJTs, FETs), of diodes and of crystals, resolved from the part's netlist
// keys with documented defaults, and the impedances looking into an
// amplifying part's electrodes. The AC solver stamps these values, the
// reduction's bypass and choke judgements bound impedances with them, and
// the stage figures read them: one model, so the three cannot disagree.
//
// The models (Small, terminal.go):
//
//   - Valves: a current gm·v(g1, k) from anode to cathode and ra across
//     them; µ = gm·ra, any two of gm, ra, mu give the third, all three given
//     must agree within 2 %; one alone is completed with the class's ra (gm
//     when only ra is given). Valve diodes: a resistance rd per section.
//   - BJTs, npn and pnp alike: hybrid-π, gm = Ic/VT with VT = kT/q at 300 K
//     (25.8520 mV, SI 2019 exact constants), rπ = β/gm, ro = VA/Ic
//     (Ebers–Moll in forward activity, linearised; any transistor text);
//     gm, rpi and ro given on the part win.
//   - FETs: gm·v(g, s) from drain to source and rd across them.
//   - Diodes: rd given, else, for a signal diode with a DC load RL, a peak
//     detector of input resistance RL/2 (DetectorRd), else VT/Id
//     (Shockley, ideality 1) or the valve diode default; off = 1 opens
//     them; a varicap without rd is open. A zener with its breakdown
//     voltage vz is rz in breakdown (zener.go; the DC solve uses the same
//     breakdown law, and the operating point fills rd, or off when it does
//     not conduct); a zener without vz is open, as the DC solve takes it.
//   - Crystals: motional Rm–Lm–Cm with the holder capacitance C0 across it.
//
// The impedances into the electrodes, one formula each (nodal analysis of
// the model above; textbook forms from memory; checked against ngspice):
//
//	ZCommon(rl)  = rπ ∥ (rout + rl)/(1 + gm·rout)   valve (ra + RL)/(µ + 1)
//	ZControl(rs) = rπ + (β + 1)·(rs ∥ rout)          valve, FET: open
//	ZOutput(rs)  = rout·(1 + gm·(rs ∥ rπ)) + rs ∥ rπ valve ra + (µ + 1)·Rk
//
// Defaults, with their sources (the table Defaults holds them):
//
//	class                    param   default   source
//	triode                   gm      2 mA/V    typical small-signal triode, from memory
//	triode                   ra      20 kΩ     typical (µ 40), from memory
//	tetrode, pentode         gm      2 mA/V    typical RF/IF pentode, from memory
//	tetrode, pentode         ra      1 MΩ      typical RF/IF pentode, from memory
//	hexode, heptode, octode  gm      0.5 mA/V  typical conversion conductance, from memory
//	hexode, heptode, octode  ra      1 MΩ      typical frequency changer, from memory
//	valve                    screen  4         a current-drawing further grid looks like 4/gm, from memory, rough
//	valve diode              rd      1 kΩ      conducting signal diode, typical, from memory
//	bjt                      beta    100       typical small-signal transistor, from memory
//	bjt                      ic      1 mA      typical small-signal bias, from memory
//	bjt                      va      100 V     Early voltage, ro = VA/Ic, typical, from memory
//	fet                      gm      4 mA/V    typical small-signal JFET, from memory
//	fet                      rd      50 kΩ     typical small-signal JFET, from memory
//	detector                 rin/rl  0.5       peak detector: Rin = RL/2, common practice (power balance)
//	diode                    id      1 mA      rd = VT/Id = 25.85 Ω (Shockley, ideality 1)
//	zener                    rz      10 Ω      small zener of 6–10 V at a few mA, from memory
//	crystal                  c0      5 pF      typical HC-6 holder capacitance, from memory
//	crystal                  cm      20 fF     c0/cm = 250, typical, from memory
//	crystal                  q       50 000    typical quartz unit, from memory
//
// Small.Assumed says which values rest on a default, so a figure meant for a
// repairer can refuse to be computed from a guess while the solver and the
// judgements, which need some value, use the default.
package device
