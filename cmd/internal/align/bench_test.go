package align_test

import (
	"os"
	"path/filepath"
	"testing"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
	"pare/internal/synth"
	"pare/rules"
)

// BenchmarkAlignBank is the guide and the sheet's marks on the 1,010-part
// bench bank (bench/gen -parts 1000 -seed 1): what the main job asks of
// this package, once for the note and once for each view. Every stage of
// a bank is asked whether it tunes an oscillator, so this is where a walk
// over the whole circuit per stage shows.
func BenchmarkAlignBank(b *testing.B) {
	text, err := synth.Bank(1000, 1)
	if err != nil {
		b.Fatal(err)
	}
	path := filepath.Join(b.TempDir(), "bank1000.toml")
	if err := os.WriteFile(path, text, 0o644); err != nil {
		b.Fatal(err)
	}
	r, err := pipeline.Run(pipeline.Options{Path: path, Until: pipeline.PhaseStages, Level: rules.LevelSignal,
		StepCheck: pipeline.AgainstPrevious})
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for range b.N {
		align.Build(r.Title, r.Circuit, r.Stages, r.Caution)
		align.Marks(r.Circuit, r.Stages, nil)
		align.Marks(r.Circuit, r.Stages, r.BandRun)
	}
}
