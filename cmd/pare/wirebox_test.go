package main

import (
	"fmt"
	"path/filepath"
	"testing"

	"pare/render"
	"pare/render/check"
)

// wireBoxCeiling is how many wires run through a stage frame holding none
// of their net's pins, and how many run on three sides of a stage title or
// a part (render/check's ForeignFrames and WireBoxes), over the gallery and
// the blind-review circuits of testdata/review14, whole sheets (every view,
// both styles) and A3 pages (every view, IEC), as measured when the checker
// learned them (88 and 337 on the a-circuits; the b-circuits brought 9 and
// 43; joined with the flags' and the AGC tags' changes 100 and 384; with
// feedback told from the forward path and the output and splitter
// templates on every view, 77 and 356; with the rows kept across flows, 77
// and 322; with the ladders, pi filters and supply sections of another
// branch joined to those, 79 and 305: two wires more through a frame, 17
// fewer boxes; with the fourth review's circuits, testdata/review15, brought in
// with their own 10 and 52: 89 and 357; with an oscillator's grid leak and
// output feed in its template, 89 and 342; with review15 a03's double-diode-
// triode named and fed in path order and b04's feedback resistor a stage of
// its own, 89 and 339; then 84 and 264; with the fifth review's circuits,
// testdata/review16, brought in with their own 45 and 60: 129 and 324;
// with the off-row connectors stood level with their nets, clear of other
// stages' frames, 118 and 297; joined with review16 b04's and b05's output
// pairs named, 140 and 283: a deliberate trade, 22 wires more through a
// frame on whole sheets, where the pair's frame now spans both halves and
// the feedback and centre-tap lines cross the frames between; with the full
// and faded sheets' IF cans ranked after their collectors and an unframed
// can in the stage of the base it feeds, 114 and 265; with the tickler
// oscillator's padder under its winding and its anode feed over the valve,
// 114 and 267, a deliberate trade: review16 a02's padder came by a loop
// across the sheet, and the tank wire of good/review-align-c1-valve-
// superhet's now boxes its gang section; with the sixth review's circuits,
// testdata/review17, brought in with their own 66 and 27: 180 and 294; with a link winding's
// cold-end bias parts beside their transistor on whole sheets, 172 and 294;
// with merged parts of different jobs no longer tagged with one member's
// line (review17 b05's "R3 422R" screen feed), unchanged; main measured
// 167 foreign by the Early-effect figures; with runs ending in line wired
// once more after undot (render/layout unline.go), 167 and 290). Then 172
// and 282 with the AGC filters named where a double-diode-triode's diode
// returns to its cathode (review18, review15 and review13 a03: R9 was
// framed in the IF amplifier, no AGC filter named): the detector's output
// wire crosses the new filter frame on those sheets, a deliberate trade of
// a frame crossing for a stage that was named wrong.
// A change may lower these, never raise them; a new sheet brings its own.
// 168 foreign when the tank capacitors stood clear of their windings' tap
// tags (render/layout/tankretag.go) and the loose parts took a page's free
// room (render/loosespot.go); 280 boxes measured after the rebase onto
// main's self-oscillating mixer templates. 286 boxes (+6, about 2 %, one
// drawing in six renderings) with push-pull pairs mirrored on the full and
// faded sheets: rules/stages' push-pull-output fixture's lower cathode
// wire goes round the cathode bypass C1 to the shared junction (the
// straight run between C1 and R1 is held by C1's figure), while the pair's
// anode and screen crossings on every a04 family sheet went (anode-lead
// crossings 24 -> 13); the detour is left to the next change.
// 284 boxes with each net running beside a part of its own wired again
// clear of it (render/layout/alongpart.go). 307 when the check measures a
// part with its own earth and rail symbols as well as without (a capacitor
// boxed by its lead running up its side, over its top and under its own
// earth, review19 b02's VC1b, was missed): a new measure, not a worse
// drawing; the same sheets read 2 more under it without the flag-line
// router change that came with it. Foreign frames 166 as measured.
// Foreign 170 (+4, all one net: good/every-kind's cathode k on its full and
// faded views in both styles, now through the BJT output stage's frame
// where it ran round three sides of the Hartley stage's title) and boxes
// 301 once the router prices a crossing of one valve's two leads and
// grids on their own cathode are drawn as the strap: taken for the valve
// sheets' untangled anode leads (wires beside another net's 940 -> 804, in
// line across a gap 66 -> 46, earth and rail symbols on another net 46 -> 18).
var wireBoxCeiling = struct{ foreign, boxes int }{165, 291} // 165 and 291 (from 170 and 299) with the tapped follower's gain calc loading again and a shunt stabiliser's feed framed after its rectifier as a supply section (review15 b05); 299 (+2) with a stretch too big for its page cut from the unframed parts riding on it (render/riders.go; review16 b05's mixer at 2.5 mm) (see alongPartCeiling); // boxes 301 → 297 with the router's undot pass re-wiring a net beside a junction dot from its far end as well (render/layout/undot.go, farFirst)

// TestWiresKeepOutOfFrames: a wire runs through a stage's frame only when
// its net has a pin there (a frame says "these parts are this stage"), and
// no wire boxes a stage title or a part in (a title framed by a wire reads
// as a part; a part in a wire box as a loop of its own). Both counts stay
// under wireBoxCeiling; every finding is logged.
func TestWiresKeepOutOfFrames(t *testing.T) {
	review := reviewCircuits(t)
	files := append(readSheets(t), review...)
	warmSheets(files, "A3")
	foreign, boxes := 0, 0
	count := func(where string, r *check.Report) {
		foreign += len(r.ForeignFrames)
		boxes += len(r.WireBoxes)
		for _, l := range [][]string{r.ForeignFrames, r.WireBoxes} {
			for _, p := range l {
				t.Logf("%s: %s", where, p)
			}
		}
	}
	for _, f := range files {
		for _, v := range drawViews {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				count(fmt.Sprintf("%s %v %v", filepath.Base(f), v, st), cachedSheet(t, f, v, st).report)
			}
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for i, pg := range pages {
				count(pageName(f, v, i), measured(pg))
			}
		}
	}
	t.Logf("wires through a foreign frame: %d (ceiling %d); wire boxes round a title or part: %d (ceiling %d)",
		foreign, wireBoxCeiling.foreign, boxes, wireBoxCeiling.boxes)
	if foreign > wireBoxCeiling.foreign || boxes > wireBoxCeiling.boxes {
		t.Errorf("more wires through foreign frames (%d, ceiling %d) or wire boxes (%d, ceiling %d); the log lists them",
			foreign, wireBoxCeiling.foreign, boxes, wireBoxCeiling.boxes)
	}
}

func pageName(f string, v render.View, i int) string {
	return fmt.Sprintf("%s %v page %d", filepath.Base(f), v, i+1)
}
