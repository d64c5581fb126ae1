package rules

import (
	"fmt"
	"strings"
)

// Level says how far a reduction goes. Each rule belongs to one level and runs
// at that level and every level above it.
type Level int

// Reduction levels.
const (
	// LevelTidy only merges parts that are exactly one part (series and
	// parallel combinations, a switch at its set position, several ground
	// nets) and prunes what is left dangling: nothing is approximated.
	LevelTidy Level = iota
	// LevelSignal (the default) also treats rails as AC ground, grounds nets
	// that bypass capacitors hold at AC ground, drops DC-only feeds and static
	// electrodes, and opens RF chokes: the view a technician redraws by hand.
	LevelSignal
	// LevelIdeal also shorts coupling capacitors and opens the chokes whose
	// reactances allow it: the bare signal path.
	LevelIdeal
)

var levelNames = [...]string{LevelTidy: "tidy", LevelSignal: "signal", LevelIdeal: "ideal"}

// String gives the level's name as written on the command line.
func (l Level) String() string {
	if l >= 0 && int(l) < len(levelNames) {
		return levelNames[l]
	}
	return fmt.Sprintf("Level(%d)", int(l))
}

// ParseLevel reads "tidy", "signal" or "ideal".
func ParseLevel(s string) (Level, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	for i, n := range levelNames {
		if n == t {
			return Level(i), nil
		}
	}
	return 0, fmt.Errorf("unknown reduction level %q: use tidy, signal or ideal", s)
}
