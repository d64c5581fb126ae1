// Package stages recognises stage topologies in a reduced circuit (a Hartley
// oscillator, a self-oscillating mixer, a grounded-grid amplifier, a
// double-tuned IF transformer…) and computes the figures a repairer checks
// for each: resonances and tuning ranges, feedback fractions, time constants,
// mid-band gains, tracking against the IF.
//
// Topologies are data: TOML pattern files (docs/patterns.md) naming pattern
// parts by kind and terminal role, pattern nets as variables, constraints on
// those nets, optional parts, the figures to compute and guards on them. The
// built-in library is embedded from patterns/; users add their own directory.
//
// The matcher is a backtracking subgraph-isomorphism search on the part–net
// graph in the manner of VF2: pattern parts are placed one at a time in a
// fixed order, each new part taken from the terminals of a net already
// placed, candidates filtered by kind, type, terminal role and value before
// any deeper search. Every net that is AC ground for the small signal is one
// node, as it is in the redrawn diagram. The search is bounded by a step
// budget, so a pathological input ends with a "search limit reached" error.
//
// Overlaps are resolved by one rule: larger matches first, then the more
// specific pattern (higher rank), then pattern id and part refs. A match that
// lies wholly inside an accepted stage becomes its sub-stage when its
// pattern allows nesting (a tank inside an oscillator); a match that only
// partly overlaps an accepted stage is dropped.
package stages
