package main

import (
	"encoding/json"
	"path/filepath"
	"testing"

	"pare/cmd/internal/note"
	"pare/cmd/internal/pipeline"
	"pare/rules"
)

// sameCircuitFiles are the examples and the fixtures that must load: every
// command must show each of them through the one reduction.
func sameCircuitFiles(t *testing.T) []string {
	t.Helper()
	good, err := filepath.Glob("../../testdata/good/*.toml")
	if err != nil || len(good) == 0 {
		t.Fatalf("no fixtures under testdata/good (%v)", err)
	}
	return append(examples(t), good...)
}

// TestStagesAndVerifyMatchMainJob: `pare stages` prints the figures of the
// main job's reduction and `pare verify` gives its verdict, for every
// example and fixture. Failed before on review-ifstrip.toml (issue 10,
// item 1): the main job refused grounding the AGC line, `stages` used that
// step silently (gain -422, Q 58.4, bandwidth 6.30 kHz against the main
// job's -404, 53.0, 6.164 kHz; ngspice 404.2, 53.05, 6.163 kHz in the
// reviewer's decks) and `verify` failed the reduction the main job never
// made.
func TestStagesAndVerifyMatchMainJob(t *testing.T) {
	t.Parallel() // files and runs of its own only (sheetcache_test.go)
	for _, path := range sameCircuitFiles(t) {
		t.Run(filepath.Base(path), func(t *testing.T) {
			po := jobOptions(path, jobConfig{level: rules.LevelSignal})
			po.Until = pipeline.PhaseStages // the sheets come after and change nothing above
			job, err := pipeline.Run(po)
			if err != nil {
				t.Fatalf("main job: %v", err)
			}
			want, err := json.Marshal(job.Stages)
			if err != nil {
				t.Fatal(err)
			}
			code, out, errs := runJob(t, "stages", "--json", path)
			if code != exitOK {
				t.Fatalf("stages: exit %d: %s", code, errs)
			}
			var got struct {
				Stages json.RawMessage `json:"stages"`
			}
			if err := json.Unmarshal([]byte(out), &got); err != nil {
				t.Fatal(err)
			}
			if !jsonEqual(t, got.Stages, want) {
				t.Errorf("pare stages shows other stages or figures than the main job")
			}
			v := note.VerifyOf(job.Report, job.CompareErr, job.Compare)
			v.Rails = note.RailOutputs(job.Circuit)
			code, _, errs = runJob(t, "verify", path)
			if failed := code == exitFound; failed != v.Failed() || code != exitOK && code != exitFound {
				t.Errorf("pare verify exits %d (%s), the main job's verification failed=%v", code, errs, v.Failed())
			}
		})
	}
}

// jsonEqual compares two JSON texts as values.
func jsonEqual(t *testing.T, a, b []byte) bool {
	t.Helper()
	var x, y any
	if err := json.Unmarshal(a, &x); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, &y); err != nil {
		t.Fatal(err)
	}
	ja, _ := json.Marshal(x)
	jb, _ := json.Marshal(y)
	return string(ja) == string(jb)
}
