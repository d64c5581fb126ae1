package pipeline

import (
	"math/cmplx"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pare/cmd/internal/align"
	"pare/graph"
	"pare/graph/ac"
	"pare/rules"
)

// reducedRoundTripSets is every example and fixture the main job runs on
// (examples and testdata/*/ netlists); under -short the examples alone.
func reducedRoundTripSets(t *testing.T) []string {
	t.Helper()
	pats := []string{"examples/*.toml"}
	if !testing.Short() {
		pats = append(pats, "testdata/*/*.toml")
	}
	var paths []string
	for _, pat := range pats {
		m, err := filepath.Glob(filepath.Join("..", "..", "..", pat))
		if err != nil {
			t.Fatal(err)
		}
		paths = append(paths, m...)
	}
	if len(paths) < 10 {
		t.Fatalf("found only %d netlists", len(paths))
	}
	return paths
}

// reduced.toml is the circuit the proof passed: the file the main job
// writes, loaded the way `pare sweep`/`pare spice` load a file (through
// the operating-point phase, which leaves a file that gives every figure
// as written), is compared by the main job's own proof (ac.Compare, its
// default tolerances 0.5 dB / 5°) with the reduced circuit in memory and
// with the circuit the proof started from. Review22 b02, b05 and review21
// b05 were once "failing" by up to 11 dB: not the file, but the original
// loaded without its operating point (the model's default bias); the file
// carries the figures taken at it, and says so (sayBiased).
func TestReducedNetlistRoundTrip(t *testing.T) {
	checked := 0
	for _, path := range reducedRoundTripSets(t) {
		res, err := Run(Options{Path: path, Level: rules.LevelSignal, Verify: true, Until: PhaseStages, BandSets: align.BandSets})
		if err != nil {
			continue // a netlist the main job refuses writes no reduced.toml
		}
		text, err := res.ReducedNetlist()
		if err != nil {
			t.Errorf("%s: %v", path, err)
			continue
		}
		file := filepath.Join(t.TempDir(), "reduced.toml")
		if err := os.WriteFile(file, text, 0o644); err != nil {
			t.Fatal(err)
		}
		back, err := Run(Options{Path: file, Until: PhaseBias, CircuitOnly: true})
		if err != nil {
			t.Errorf("%s: reduced.toml does not load: %v", path, err)
			continue
		}
		checked++
		against := []struct {
			what string
			c    *graph.Circuit
			// only a proof that passed promises the file matches the
			// original; the in-memory reduction is what any file must be
			need bool
		}{{"the reduced circuit in memory", res.Reduced, true}, {"the original the proof passed", res.acBase(), res.Report != nil && res.Report.OK}}
		for _, a := range against {
			if !a.need {
				continue
			}
			rep, err := ac.Compare(a.c, back.Circuit, res.Compare)
			if err != nil && unsolvable(a.c, res.Compare) && unsolvable(back.Circuit, res.Compare) {
				// a circuit pare cannot solve (warn/unconnected-terminal:
				// a grid left open) is written as one it cannot solve
				continue
			}
			if err != nil {
				t.Errorf("%s: reduced.toml against %s: %v", path, a.what, err)
				continue
			}
			if bad := brokenPairs(rep, a.c, back.Circuit); len(bad) > 0 {
				t.Errorf("%s: reduced.toml differs from %s:\n%s", path, a.what, strings.Join(bad, "\n"))
			}
		}
	}
	if checked < 10 {
		t.Fatalf("only %d reduced netlists checked", checked)
	}
}

// unsolvable tells whether a circuit cannot be compared even with itself.
func unsolvable(c *graph.Circuit, o ac.CompareOptions) bool {
	_, err := ac.Compare(c, c, o)
	return err != nil
}

// noSignal is the level, against the 1 V drive, under which a response is
// rounding in the solve and not a signal: double precision carries some 16
// digits (IEEE 754, common knowledge), and -240 dB leaves four of margin.
const noSignal = 1e-12

// brokenPairs lists the pairs out of tolerance, except a transfer that
// carries no signal in either circuit at any frequency compared (review
// fixture warn/cathode-nowhere: a cathode going nowhere passes nothing; the
// circuit in memory solves it as exactly 0 and the file, whose figures
// differ in the last written digit, as 1e-16, which the comparison's
// peak-relative floor reads as a signal appearing from nowhere).
func brokenPairs(rep *ac.Report, a, b *graph.Circuit) []string {
	var bad []string
	for _, p := range rep.Pairs {
		if p.Within(rep.TolDB, rep.TolDeg) {
			continue
		}
		if p.What != "impedance" && silent(a, p) && silent(b, p) {
			continue
		}
		bad = append(bad, "  "+p.String())
	}
	return bad
}

// silent tells whether a pair's transfer stays under noSignal at its worst
// frequency and a decade either side.
func silent(c *graph.Circuit, p ac.Pair) bool {
	if p.AtHz <= 0 {
		return false
	}
	h, err := ac.Transfer(c, p.From, p.To, []float64{p.AtHz / 10, p.AtHz, p.AtHz * 10}, ac.Options{})
	if err != nil {
		return false
	}
	for _, v := range h {
		if cmplx.Abs(v) >= noSignal {
			return false
		}
	}
	return true
}

// A switch is taken out by the reduction, so reduced.toml says at which
// position each was: the club receiver turned to LW (--switch S1=2) writes
// the LW circuit under its user's header "shown on MW". The file, loaded
// back, is the LW circuit the proof passed (same comparison as above).
func TestReducedNetlistSaysSwitches(t *testing.T) {
	path := filepath.Join("..", "..", "..", "examples", "club-receiver.toml")
	for _, tc := range []struct {
		set  []SwitchSetting
		want []string
	}{
		{nil, []string{"# Switches as reduced: S1a at 1, S1b at 1,", "S3 at 1 (taken out"}},
		// the LW band RetuneBands works out from the LW tanks, written to
		// four figures rounded outwards (150.477k..289.098k as solved)
		{[]SwitchSetting{{"S1", 2}}, []string{"S1a at 2, S1b at 2,", "S1g at 2,", "turned for this run by --switch S1=2.", `band = "150.4k..289.1k"`}},
	} {
		res, err := Run(Options{Path: path, Level: rules.LevelSignal, Verify: true, Until: PhaseStages, Switches: tc.set})
		if err != nil {
			t.Fatal(err)
		}
		text, err := res.ReducedNetlist()
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range tc.want {
			if !strings.Contains(string(text), w) {
				t.Errorf("switches %v: reduced.toml lacks %q", tc.set, w)
			}
		}
		back, err := graph.Parse("reduced.toml", text)
		if err != nil {
			t.Fatal(err)
		}
		rep, err := ac.Compare(res.acBase(), back, res.Compare)
		if err != nil || !rep.OK {
			t.Errorf("switches %v: the file is not the circuit the proof passed: %v %+v", tc.set, err, rep)
		}
	}
}

// roundOut rounds to four significant figures away from the band's inside
// (arithmetic): a band's low end down, its high end up; a value with four
// figures or fewer stays as it is.
func TestRoundOut(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		up   bool
		want float64
	}{
		{150476.87044591, false, 150400},
		{289097.764478464, true, 289100},
		{289091, true, 289100},
		{540e3, false, 540e3},
		{1.6e6, true, 1.6e6},
		{20, false, 20},
		{0.012345, true, 0.01235},
		{0.012345, false, 0.01234},
		{9999.5, true, 10000},
	} {
		if got := roundOut(tc.v, tc.up); got != tc.want {
			t.Errorf("roundOut(%v, %v) = %v, want %v", tc.v, tc.up, got, tc.want)
		}
	}
}

// The reduction takes the supply out, so the reduced file alone reads as a
// set that does not show what powers it; reduced.toml then carries the
// original's caution (graph/safety's wording for the original), and
// leaves it out where the file alone is given the same one (a valve set:
// the valves stay).
func TestReducedNetlistSaysCaution(t *testing.T) {
	for _, tc := range []struct {
		file string
		want bool
	}{
		{filepath.Join("testdata", "review22", "b05.toml"), true}, // 9 V battery portable
		{filepath.Join("testdata", "review13", "b05.toml"), true}, // mains transistor set
		{filepath.Join("examples", "club-receiver.toml"), false},
	} {
		res, err := Run(Options{Path: filepath.Join("..", "..", "..", tc.file), Level: rules.LevelSignal, Until: PhaseStages})
		if err != nil {
			t.Fatal(err)
		}
		text, err := res.ReducedNetlist()
		if err != nil {
			t.Fatal(err)
		}
		line := "#" + cautionHeader + " " + res.Caution.Heading + "\n"
		if got := strings.Contains(string(text), line); got != tc.want {
			t.Errorf("%s: caution line %q written %v, want %v", tc.file, line, got, tc.want)
		}
	}
}
