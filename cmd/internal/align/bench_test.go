package align_test

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
	"pare/internal/synth"
	"pare/rules"
)

// BenchmarkAlignBank is the guide and the sheet's marks on the bench banks
// of 1,010 and 3,008 parts (bench/gen -parts 1000 and 3000 -seed 1): what
// the main job asks of this package, once for the note and once for each
// view (-shared: the three sharing their reach searches, as the main job
// does). Every stage of a bank is asked whether it tunes an oscillator, so
// this is where a walk over the whole circuit per stage shows, and every
// active device is an injection row, so this is where a row solved on an
// elaboration of its own shows too (Guide.response): the two sizes' ratio
// is the growth, about 3 when linear.
//
//	go test -run XXX -bench AlignBank -benchtime 1x ./cmd/internal/align/
func BenchmarkAlignBank(b *testing.B) {
	for _, parts := range []int{1000, 3000} {
		text, err := synth.Bank(parts, 1)
		if err != nil {
			b.Fatal(err)
		}
		path := filepath.Join(b.TempDir(), fmt.Sprintf("bank%d.toml", parts))
		if err := os.WriteFile(path, text, 0o644); err != nil {
			b.Fatal(err)
		}
		r, err := pipeline.Run(pipeline.Options{Path: path, Until: pipeline.PhaseStages, Level: rules.LevelSignal,
			StepCheck: pipeline.AgainstPrevious})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprint(parts), func(b *testing.B) {
			for range b.N {
				align.Build(r.Title, r.Circuit, r.Stages, r.Caution)
				align.Marks(r.Circuit, r.Stages, nil)
				align.Marks(r.Circuit, r.Stages, r.BandRun)
			}
		})
		// as the main job asks now: the three share one reach search per
		// tank (align.Reaches), a fresh set of them per job
		b.Run(fmt.Sprint(parts, "-shared"), func(b *testing.B) {
			for range b.N {
				rs := align.NewReaches()
				rs.Marks(r.Circuit, r.Stages, nil)
				rs.Marks(r.Circuit, r.Stages, r.BandRun)
				rs.Build(r.Title, r.Circuit, r.Stages, r.Caution)
			}
		})
	}
}
