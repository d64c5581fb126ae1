package stages

// valveWiringCases are the topology cases of the patterns that name a valve
// part by how it is wired (reviewer A of the twelfth review): a screen
// bypass returned to the cathode, a follower with a tapped cathode load, a
// pentode taking overall feedback at its cathode foot with its screen
// bypassed to that cathode. TestTopologies runs them with the rest.
var valveWiringCases = []topologyCase{
	// A pentode with an unbypassed cathode, its screen fed from the HT
	// through a dropper and bypassed to its own cathode: a screen feed
	// (the calc names it screen-feed, as the chassis-returned one).
	{topology: "screen-feed-cathode-return", as: ScreenFeedTopology, families: []string{"valve"}, full: true,
		parts: `V1 = { valve = "pentode", pins = { g1 = "g", g2 = "s", g3 = "k", k = "k", a = "a" }, gm = "2mA/V", ra = "1M", ia = "1mA" }
R3 = { r = "1M", pins = ["g", "gnd"] }
R2 = { r = "1k", pins = ["k", "gnd"] }
R1 = { r = "47k", pins = ["a", "ht"] }
R5 = { r = "390k", pins = ["ht", "s"] }
C3 = { c = "100n", pins = ["s", "k"] }`,
		// The capacitor returned to another valve's cathode: no bypass of
		// the screen it sits on.
		nearMiss: `V1 = { valve = "pentode", pins = { g1 = "g", g2 = "s", g3 = "k", k = "k", a = "a" }, gm = "2mA/V", ra = "1M", ia = "1mA" }
R3 = { r = "1M", pins = ["g", "gnd"] }
R2 = { r = "1k", pins = ["k", "gnd"] }
R1 = { r = "47k", pins = ["a", "ht"] }
R5 = { r = "390k", pins = ["ht", "s"] }
V2 = { valve = "triode", pins = { g1 = "gnd", k = "k2", a = "ht" }, mu = 20, ra = "10k" }
R6 = { r = "10k", pins = ["k2", "gnd"] }
C3 = { c = "100n", pins = ["s", "k2"] }`},
	// A follower whose common-electrode load is tapped: a bias resistor
	// over the load, the control electrode's leak returned to the tap.
	{topology: "amp-follower-tapped", families: allFamilies,
		parts: `@Q1(in, k, ht)
R1 = { r = "470", pins = ["k", "b"] }
R2 = { r = "4k7", pins = ["b", "gnd"] }
R3 = { r = "470k", pins = ["in", "b"] }`,
		// The output electrode carries a load: no follower.
		nearMiss: `@Q1(in, k, o)
R1 = { r = "470", pins = ["k", "b"] }
R2 = { r = "4k7", pins = ["b", "gnd"] }
R3 = { r = "470k", pins = ["in", "b"] }
R4 = { r = "10k", pins = ["o", "ht"] }`},
	// amp-common-feedback-foot's pair with the first a pentode whose
	// screen bypass returns to its cathode.
	{topology: "amp-common-feedback-foot-screen", families: []string{"valve"},
		parts: `V1 = { valve = "pentode", pins = { g1 = "in", g2 = "s", g3 = "k", k = "k", a = "o" }, gm = "2mA/V", ra = "1M", ia = "1mA" }
R7 = { r = "390k", pins = ["s", "ht"] }
C7 = { c = "100n", pins = ["s", "k"] }
R1 = { r = "100k", pins = ["o", "ht"] }
R3 = { r = "2k2", pins = ["k", "kb"] }
C1 = { c = "22u", pins = ["k", "kb"] }
R2 = { r = "100", pins = ["kb", "gnd"] }
C2 = { c = "1u", pins = ["o", "g2"] }
R4 = { r = "100k", pins = ["g2", "gnd"] }
@Q2(g2, gnd, out)
R5 = { r = "4k7", pins = ["out", "ht"] }
R6 = { r = "10k", pins = ["out", "kb"] }`,
		// The second stage a follower: the loop raises the gain.
		nearMiss: `V1 = { valve = "pentode", pins = { g1 = "in", g2 = "s", g3 = "k", k = "k", a = "o" }, gm = "2mA/V", ra = "1M", ia = "1mA" }
R7 = { r = "390k", pins = ["s", "ht"] }
C7 = { c = "100n", pins = ["s", "k"] }
R1 = { r = "100k", pins = ["o", "ht"] }
R3 = { r = "2k2", pins = ["k", "kb"] }
C1 = { c = "22u", pins = ["k", "kb"] }
R2 = { r = "100", pins = ["kb", "gnd"] }
C2 = { c = "1u", pins = ["o", "g2"] }
R4 = { r = "100k", pins = ["g2", "gnd"] }
@Q2(g2, out, ht)
R5 = { r = "4k7", pins = ["out", "gnd"] }
R6 = { r = "10k", pins = ["out", "kb"] }`},
}
