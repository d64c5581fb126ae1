package main

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/internal/golden"
	"pare/render"
	"pare/render/check"
	"pare/rules"
)

// The flagship example: the club's whole receiver, the set a user captures
// from a chassis, next to the sections the other examples are.
const (
	flagship     = "../../examples/club-receiver.toml"
	flagshipPack = "../../examples/club-receiver.pack"
	packRegen    = "look at the sheets as PNG, then go test ./cmd/pare -run TestFlagshipPack -update"
)

// TestFlagshipPack: the main job's whole pack for the flagship, with its
// defaults, is byte-identical to the copy kept under examples/ (the
// reduced netlist, every page of both views, both notes; -update rewrites
// it), the job verifies, and the pack holds exactly those files. A whole
// set is wider than one A3 page at 2.5 mm text, so its views come as
// pages (--page auto), as a section of a set wider than that does.
func TestFlagshipPack(t *testing.T) {
	job := cachedJob(t, flagship)
	if job.code != exitOK {
		t.Fatalf("main job: exit %d: %s", job.code, job.stderr)
	}
	got := dirNames(t, job.dir)
	if *updateSheets {
		if err := os.RemoveAll(flagshipPack); err != nil {
			t.Fatal(err)
		}
	}
	for _, name := range got {
		data, err := os.ReadFile(filepath.Join(job.dir, name))
		if err != nil {
			t.Fatal(err)
		}
		golden.Check(t, filepath.Join(flagshipPack, name), data, *updateSheets, packRegen)
	}
	if want := dirNames(t, flagshipPack); !slices.Equal(got, want) {
		t.Errorf("the pack holds %v; the kept copy %v (%s)", got, want, packRegen)
	}
	for _, want := range []string{"reduced-2.svg", "faded-2.svg"} {
		if !slices.Contains(got, want) {
			t.Errorf("a whole set's pack should come on pages: no %s in %v", want, got)
		}
	}
	// a section of a set one row wider than an A3 page (the frequency
	// changer: 182 grid units reduced, A3 holds 136) flows into rows too;
	// a single stage (43 units) keeps one sheet per view
	section := cachedJob(t, "../../examples/frequency-changer.toml")
	if names := dirNames(t, section.dir); !slices.Contains(names, "reduced-1.svg") || !slices.Contains(names, "faded-1.svg") {
		t.Errorf("a section of a set wider than A3 should come on A3 pages: %v", names)
	}
	small := cachedJob(t, "../../rules/stages/testdata/incircuit-pair.toml")
	if names := dirNames(t, small.dir); !slices.Contains(names, fileReducedSheet) || !slices.Contains(names, fileFadedSheet) {
		t.Errorf("a single stage should keep one sheet per view: %v (%s)", names, small.stderr)
	}
}

// TestFlagshipStagesAndPages: every stage of the flagship is named (a
// title with its placeholders filled, the tone control as one), and the
// pages its pack is cut into are clean for the layout checker: no
// overlap, wire through a symbol, broken net, and every off-row connector
// paired.
func TestFlagshipStagesAndPages(t *testing.T) {
	res := cachedResult(t, flagship) // the layout and rail checks' run (sheetcache_test.go)
	var tone bool
	for _, s := range res.Stages {
		if s.Title == "" || strings.Contains(s.Title, "{") {
			t.Errorf("stage %s (%s) is not named: %q", s.Name, s.Topology, s.Title)
		}
		tone = tone || s.Topology == "tone-top-cut"
	}
	if len(res.Stages) < 15 || !tone {
		t.Errorf("%d stages, tone control named: %v", len(res.Stages), tone)
	}
	paper, err := render.ParsePaper(autoPaper)
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range []render.View{render.Reduced, render.Faded} {
		pages, err := render.Config{Page: paper}.Geometries(res.Sheet(v))
		if err != nil {
			t.Fatalf("%s: %v", v, err)
		}
		for i, g := range pages {
			for _, p := range check.Measure(g).Problems() {
				t.Errorf("%s page %d: %s", v, i+1, p)
			}
		}
		for _, p := range check.Connectors(pages) {
			t.Errorf("%s: %s", v, p)
		}
	}
}

// dirNames lists a folder's files, sorted.
func dirNames(t *testing.T, dir string) []string {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range entries {
		out = append(out, e.Name())
	}
	slices.Sort(out)
	return out
}

// TestFlagshipEachBand: the flagship on each band of its wavechange switch
// (every wafer of S1 at 1, MW, as captured; at 2, LW, with the band and
// the oscillator's region the file's header gives for LW) reduces with
// every step proven and verifies within tolerance, including the aerial
// coil's tank whose cold end is decoupled to the AGC line; and the coils
// of the band not selected leave the reduced circuit in logged steps,
// coming back when the switch is turned.
func TestFlagshipEachBand(t *testing.T) {
	src, err := os.ReadFile(flagship)
	if err != nil {
		t.Fatal(err)
	}
	lw := string(src)
	for _, w := range []string{"a", "b", "c", "d", "e", "f", "g"} {
		lw = strings.Replace(lw, "S1"+w+" = { switch = 2,", "S1"+w+" = { switch = 2, set = 2,", 1)
	}
	// LW, 150 kHz to 285 kHz, the oscillator 470 kHz above (the header)
	lw = strings.ReplaceAll(lw, `band = "530k..1.6M"`, `band = "150k..285k"`) // the set's and the rf region's
	lw = strings.Replace(lw, `osc = { band = "1M..2.07M"`, `osc = { band = "620k..755k"`, 1)
	lwPath := filepath.Join(t.TempDir(), "club-receiver-lw.toml")
	if err := os.WriteFile(lwPath, []byte(lw), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		path       string
		idle, kept []string
	}{
		{flagship, []string{"T2", "T4", "L2"}, []string{"T1", "T3", "L1"}},
		{lwPath, []string{"T1", "T3", "L1"}, []string{"T2", "T4", "L2"}},
	} {
		res, err := pipeline.Run(pipeline.Options{Path: tc.path, Level: rules.LevelSignal, Verify: true, Until: pipeline.PhaseVerify})
		if err != nil {
			t.Fatalf("%s: %v", filepath.Base(tc.path), err)
		}
		if res.Report == nil || !res.Report.OK {
			t.Errorf("%s: verification failed: %+v", filepath.Base(tc.path), res.Report)
		}
		front := false
		for _, p := range res.Report.Pairs {
			front = front || (p.What == "transfer" && p.From == "aerial" && p.To == "mix_tank")
		}
		if !front {
			t.Errorf("%s: the proof does not compare the front end, aerial to the mixer's tank: %+v", filepath.Base(tc.path), res.Report.Pairs)
		}
		for _, s := range res.Log.Steps {
			if s.Refused != "" {
				t.Errorf("%s: step refused: %s %s", filepath.Base(tc.path), s.Rule, s.Refused)
			}
		}
		removed := map[string]bool{}
		for _, s := range res.Log.Steps {
			if s.Refused == "" && s.Why != "" {
				for _, r := range s.Removed {
					removed[r] = true
				}
			}
		}
		for _, ref := range tc.idle {
			if res.Reduced.Part(ref) != nil || !removed[ref] {
				t.Errorf("%s: the idle coil %s should leave the reduced circuit in a logged step", filepath.Base(tc.path), ref)
			}
		}
		for _, ref := range tc.kept {
			if res.Reduced.Part(ref) == nil {
				t.Errorf("%s: the selected band's coil %s is gone", filepath.Base(tc.path), ref)
			}
		}
	}
}
