package align_test

import (
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
)

// Guides that share their reach searches (align.Reaches, as the main job's
// sheets and note do) say exactly what guides searching afresh say: the
// same warnings, steps and marks, whichever asks first. Each set here has
// a tank that falls short of its declared band as captured, so its
// coverage warning comes from a reach search (its words name the coil,
// the gang and the trimmer, or alignment bringing the ends in).
func TestSharedReachesSayTheSame(t *testing.T) {
	for _, path := range []string{
		example("transistor-front-end"),
		filepath.Join("..", "..", "..", "testdata", "good", "review-align-c1-valve-superhet.toml"),
		filepath.Join("..", "..", "..", "testdata", "osc", "mixer-heptode-weak.toml"),
	} {
		t.Run(filepath.Base(path), func(t *testing.T) {
			r, fresh := buildWith(t, path, pipeline.AgainstPrevious)
			if !searched(fresh.Warnings) {
				t.Fatalf("no reach search's warning among %q: the case checks nothing", fresh.Warnings)
			}
			rs := align.NewReaches()
			// the order of the main job: the reduced view's marks, the
			// faded view's (every band), then the note's guide
			sharedMarks := rs.Marks(r.Circuit, r.Stages, nil)
			sharedBands := rs.Marks(r.Circuit, r.Stages, r.BandRun)
			shared := rs.Build(r.Title, r.Circuit, r.Stages, r.Caution)
			if !reflect.DeepEqual(shared.Warnings, fresh.Warnings) || !reflect.DeepEqual(shared.Steps, fresh.Steps) {
				t.Errorf("shared guide:\n%q\n%v\nfresh:\n%q\n%v", shared.Warnings, shared.Steps, fresh.Warnings, fresh.Steps)
			}
			if m := align.Marks(r.Circuit, r.Stages, nil); !reflect.DeepEqual(sharedMarks, m) {
				t.Errorf("shared marks %v, fresh %v", sharedMarks, m)
			}
			if m := align.Marks(r.Circuit, r.Stages, r.BandRun); !reflect.DeepEqual(sharedBands, m) {
				t.Errorf("shared marks of every band %v, fresh %v", sharedBands, m)
			}
		})
	}
}

// searched is whether a warning carries a reach search's words (missWarn).
func searched(ws []string) bool {
	for _, w := range ws {
		if strings.Contains(w, "so alignment brings the dial's ends in") || strings.Contains(w, "; check the coil, the gang and the trimmer") {
			return true
		}
	}
	return false
}
