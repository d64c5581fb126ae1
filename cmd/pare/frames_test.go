package main

import (
	"path/filepath"
	"runtime"
	"sync"
	"testing"

	"pare/render"
)

// readSheets are every circuit the gallery draws: the examples and the
// fixtures of galleryFamilies (the review circuits, the oscillators, the
// sets for the caution and the stage fixtures).
func readSheets(t *testing.T) []string {
	return append(exampleFiles(t), galleryFixtures(t)...)
}

// galleryFixtures are the fixtures of galleryFamilies, family by family;
// a family with none fails the test (a moved folder would otherwise
// leave its checks silently empty).
func galleryFixtures(t *testing.T) []string {
	t.Helper()
	var files []string
	for _, fam := range galleryFamilies {
		more, err := filepath.Glob(filepath.Join(fam.dir, "*.toml"))
		if err != nil || len(more) == 0 {
			t.Fatalf("no fixtures in %s: %v", fam.dir, err)
		}
		files = append(files, more...)
	}
	return files
}

// eachAtOnce runs fn(i) for i in [0, n), as many at a time as there are
// cores; each call writes only its own slot of whatever it fills.
func eachAtOnce(n int, fn func(i int)) {
	var wg sync.WaitGroup
	slots := make(chan struct{}, runtime.GOMAXPROCS(0))
	for i := 0; i < n; i++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			slots <- struct{}{}
			defer func() { <-slots }()
			fn(i)
		}()
	}
	wg.Wait()
}

// misreadCeiling is how many wires beside another net's closer than two
// grid steps, and how many in line with one across a short gap, the
// gallery's sheets hold in all (every view, both styles), as measured when
// the checker learned them: the layout does not yet keep unrelated wires
// two steps apart (most are one-step jogs where a pin's lead or a stub
// meets another net's wire). A change may lower these, never raise them;
// lower the numbers with it. A new sheet in the gallery brings its own:
// raised from 908 and 224 by the self-oscillating converters found by their
// loop (four fixture sheets testdata/osc/mixer-*.toml, the near miss
// rules/stages/testdata/tuned-amp-to-if.toml, and the bench heptode's mixer
// frame that now holds its oscillator), then by the oscillator fixtures with
// the control electrode at AC ground, the common-emitter Clapp and the
// supply-filter fixture (1082, 338); then to 1344 and 368 when the faded
// view became the full view's layout (its count now equals the full
// view's), multi-grid valves kept their static grids, the Wien sheets
// became one two-device stage, and the oscillator review's six circuits
// and near misses joined the gallery. The rise is the sheets issue's to
// bring down: it is counted here so that it cannot grow unseen. Lowered to
// 1340 and 366 when a tuned circuit stacked under another part stood clear
// of its wires and a socket stood with the parts on its net; 1338 and 370
// when the club receiver gained the slug cores and band edge of a set that
// aligns (its sheets drawn anew, four more wires in line); 372 in line
// when its sheets gained the grid stopper's and the AGC filter's frames.
// Stage templates on reduced sheets (the trade's arrangement of each
// recognised stage round its device, render/layout/template.go) brought
// them down to 1306 and 366. The third flagship review's three whole sets
// joined the gallery (about 260 more beside), while a shunt hanging below
// its wire and a cost on runs stopping in line with another net's wire
// took the rest down: 1504 and 348; 1464 and 298 once the naming fixes
// redrew those sets' aerial and mixer stages. The third count, a symbol's
// end within a grid step of another net's wire, was 52 when the checker
// learned it; 40 once a one-pin symbol's tip kept the point beyond it free
// (the rest are transformer leads over a passing wire), and the supply's
// smoothing section framed beside its rectifier took the others to 1452
// and 294; after the rebases onto main (the output transformer's copper,
// the banks flowing channel by channel) and the output stage's cathode
// template, 1460, 298 and 40. Review 12's naming work then lengthened
// every decoupled line's tag ("HT via R4 +241 V", "AGC line via R5") and
// framed new audio stages (Zobel, complementary pair, bootstrap, bass and
// treble), each moving the routes round them: 1480, 288 and 48, the one
// time the ceiling rose, for tags that say what the line is. Tuned
// circuits drawn as one unit (each capacitor across a winding beside it,
// render/layout tankplace.go; a winding's rail tag turned out of its
// capacitor's way, tankretag.go) and parts on rails only kept under their
// stage's signal path took them to 1222, 282 and 18. A supply drawn in
// its own flow (mains to rails, a bridge as a diamond, its rails wired
// along the smoothing chain, render/layout supplyflow.go) took 1188, 260
// and 14 to 1180, 256 and 10.
// The checker then learned two more (issue 12's blind review): wire ends
// in line two grid steps or less apart with a part only beside the gap
// (endsInLine, 186 when learned) and crossings under two steps from a
// junction dot of either net (nearDots, 92). The router then learned the
// same rules as costs (a run stopping or starting within two steps in line
// with another net's wire, pin or stub; a crossing beside a junction, or a
// junction made beside one; a step beside another net's pin tip), with the
// AGC line found by its wiring moving the valve IF strip's routes round its
// tag and filter stage: 1186, 202, 10, 102 and 40. Joined with the supply
// drawn in its flow and the active stages named by their work (their frames
// move the routes): 1170, 194, 10, 106 and 36.
//
// localsOn and localsNear count earth symbols, rail tags and net flags on
// (touching, or within half a step of a pin or dot) and within a grid step
// of another net's wire, pin or junction dot (render/check's LocalsOn,
// LocalsNear), as measured when the checker learned them, after a mains
// transformer's winding earth was kept off the next winding's lane (44 and
// 508). With wires kept out of foreign frames, all seven: 1166, 194, 10,
// 102, 36, 46 and 510 (the frames' detours bring two flags closer). With
// feedback told from the forward path, the output and splitter templates
// on the full and faded sheets and template columns in line: 1156, 186,
// 10, 82, 36, 46 and 510; with the filter branch's ladders and pi filters
// joined: 1152, 184, 10, 80, 36, 46 and 508; with an oscillator's grid
// leak and output feed in its template and parts hanging a step under a
// sideways wire (straight grid wires): 1138, 184, 10, 80, 36, 46 and 502; with the
// phase-shift ladders drawn as ladders on the full sheets and their bias
// feeds over the base wire, the phase-shift fixtures' faded views cleaner:
// 1096, 126, 10, 72, 32, 46 and 500.
//
// nearPins counts crossings under two grid steps from a part's pin on
// either crossing net (render/check's NearPins: the crossing wire reads as
// joined at the pin, a part with pins on both nets as shorted; review16
// a03's anode load), as measured when the checker learned it: 172 (160 on main's later
// layout). With the full and faded sheets ranked without crossing the nets
// the reduction tied to AC ground and their IF cans after their
// collectors: 1020, 114, 10, 68, 32, 46 and 492, and nearPins 168, a
// deliberate trade (spread thinly: +4 on each of three fixtures, -4 on one)
// for the lower counts beside it. With a crossing beside a junction dot or
// within two steps of a part's pin wired again when that leaves the sheet
// no worse otherwise (render/layout undot.go): 1004, 102, 10, 60, 20, 46
// and 492, and nearPins 102.
// inLine 102 → 106 with the Early effect in the transistors' DC law: no
// layout code changed; the pin volts' and figures' text on transistor sets
// moved in the last digit and the labels' widths moved some wires (which
// sheets not yet read from the log).
// With runs ending in line wired once more after undot, on a share of the
// budget of their own and kept only when nothing else grows (render/layout
// unline.go; large sheets had spent the whole budget before unline ran):
// beside 972, inLine 66, endsInLine 52, localsNear 488.
// localsNear 488 → 492 (+0.8 %) and nearPins 102 → 98 with a tank
// capacitor kept half a step clear of its winding's tap tag
// (render/layout/tankretag.go; review18 a04's C8 touched the centre tap's
// "HT +300 V"): good/review-align-c1-valve-superhet's full and faded views
// (both styles) stand C7 a step off T3's primary, its own "HT +250 V" now
// 0.63 of a step from the mixer's grid wire (one finding on each of four
// sheets), where the winding's tag had touched C7's plate; the same move
// on good/review-align-c4-heptode takes a crossing off a pin on four
// sheets. Both sheets read better: no tag on a plate.
// With each net running beside a part of its own wired again clear of it
// (render/layout/alongpart.go; measured on main before it: beside 960,
// endsInLine 52, localsNear 484): beside 940, endsInLine 48, localsNear 432
// (mostly a decoupler's own wire no longer run down beside it and its earth).
// With a crossing of one valve's two leads priced on the full and faded
// sheets and grids on their own cathode drawn as the strap
// (render/layout/siblings.go, pipeline/symmarks.go): beside 804, inLine 46,
// localsOn 18, localsNear 364, nearPins 90. Beside 806 (+2) and inLine 44
// with the detector moved next to its can and static screens on rail bars
// (review13 a03's faded detector net runs beside C14 and C15 on its new
// row; its detector no longer a page from its can).
// A rail tag with its text beside its bar kept a full grid line from
// passing wires, and a cell's tags a step apart (a rectifier's heater pins
// and cathode) no longer drawn over one another: localsOn 14, localsNear
// 348, beside 808 (+2, 0.25 %: two re-routed wires on the changed views,
// each clear of a tag it had run under); localsNear 346 with a smoothed
// supply line fed from a declared supply drawn as a rail (rules/supplyline.go).
// With the router's undot pass re-wiring a net beside a junction dot from its far end as well (render/layout/undot.go, farFirst):
// beside 800, nearDots 12, nearPins 70, and localsNear 350 (+4, 1.2 %: an
// HT tag 0.63 of a step from the scr1 wire on review-align-c1's full and
// faded views, both styles), the trade taken for the crossings.
// localsNear ceiling 350 → 346 as measured with a net wired on a device
// lead's line beyond the device wired again off it (render/layout/unthrough.go).
var misreadCeiling = struct{ beside, inLine, endsNear, endsInLine, nearDots, localsOn, localsNear, nearPins int }{800, 44, 10, 48, 12, 14, 346, 70}

// TestSheetsReadAsDrawn: no sheet of the gallery, in any view and either
// symbol style, has a stage frame holding another stage's part (a frame
// tells the reader "these parts are this stage"; a transistor inside an
// "RC coupling" frame tells a wrong story), and the wires that read as
// joined when they are not (render/check's Beside and InLine) grow no
// more numerous than misreadCeiling. Every finding is logged; long wires
// and frame strays are reported.
func TestSheetsReadAsDrawn(t *testing.T) {
	beside, inLine, endsNear, nearDots, endsInLine, localsOn, localsNear, nearPins := 0, 0, 0, 0, 0, 0, 0, 0
	warmSheets(readSheets(t), "")
	for _, f := range readSheets(t) {
		for _, v := range drawViews {
			for _, st := range []render.Style{render.IEC, render.IEEE} {
				r := cachedSheet(t, f, v, st).report
				for _, p := range r.FrameIntruders {
					t.Errorf("%s %s %s: %s", filepath.Base(f), v, st, p)
				}
				beside += len(r.Beside)
				inLine += len(r.InLine)
				endsNear += len(r.EndsNear)
				nearDots += len(r.NearDots)
				endsInLine += len(r.EndsInLine)
				localsOn += len(r.LocalsOn)
				localsNear += len(r.LocalsNear)
				nearPins += len(r.NearPins)
				for _, l := range [][]string{r.NearPins, r.Beside, r.InLine, r.EndsNear, r.EndsInLine, r.NearDots, r.LocalsOn, r.LocalsNear, r.LongWires, r.FrameStrays} {
					for _, p := range l {
						t.Logf("%s %s %s: %s", filepath.Base(f), v, st, p)
					}
				}
			}
		}
	}
	t.Logf("wire ends in line beside a part: %d (ceiling %d); crossings near a junction dot: %d (ceiling %d)", endsInLine, misreadCeiling.endsInLine, nearDots, misreadCeiling.nearDots)
	t.Logf("wires beside another net's: %d (ceiling %d); in line across a gap: %d (ceiling %d); symbol ends near another net's wire: %d (ceiling %d)",
		beside, misreadCeiling.beside, inLine, misreadCeiling.inLine, endsNear, misreadCeiling.endsNear)
	t.Logf("earth, rail and flag symbols on another net: %d (ceiling %d); near it: %d (ceiling %d)", localsOn, misreadCeiling.localsOn, localsNear, misreadCeiling.localsNear)
	t.Logf("crossings near a part's pin: %d (ceiling %d)", nearPins, misreadCeiling.nearPins)
	if nearPins > misreadCeiling.nearPins {
		t.Errorf("more crossings near a part's pin (%d, ceiling %d): the log lists them", nearPins, misreadCeiling.nearPins)
	}
	if localsOn > misreadCeiling.localsOn || localsNear > misreadCeiling.localsNear {
		t.Errorf("more earth, rail or flag symbols on (%d, ceiling %d) or within a grid step of (%d, ceiling %d) another net's wire, pin or dot; the log lists them",
			localsOn, misreadCeiling.localsOn, localsNear, misreadCeiling.localsNear)
	}
	if endsInLine > misreadCeiling.endsInLine || nearDots > misreadCeiling.nearDots {
		t.Errorf("more wire ends in line beside a part (%d, ceiling %d) or crossings near a junction dot (%d, ceiling %d); the log lists them",
			endsInLine, misreadCeiling.endsInLine, nearDots, misreadCeiling.nearDots)
	}
	if beside > misreadCeiling.beside || inLine > misreadCeiling.inLine || endsNear > misreadCeiling.endsNear {
		t.Errorf("more wires that read as joined: %d beside (ceiling %d), %d in line (ceiling %d), %d symbol ends near (ceiling %d); the log lists them",
			beside, misreadCeiling.beside, inLine, misreadCeiling.inLine, endsNear, misreadCeiling.endsNear)
	}
}
