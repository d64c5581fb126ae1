package stages

import (
	"reflect"
	"runtime"
	"testing"

	"pare/graph/ac"
)

// The loops solved beside the pattern search give the stages, figures,
// loops and flags the finder gives on one processor, where nothing is
// solved ahead (the reference: the same Find with GOMAXPROCS 1).
func TestPrefetchedLoopsSameStages(t *testing.T) {
	for _, name := range []string{"club-receiver.toml", "frequency-changer.toml"} {
		t.Run(name, func(t *testing.T) {
			c, r, log := reduceExample(t, name)
			find := func(procs int) []Stage {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				ac.ForgetLoops() // each run solves its own loops
				sts, err := Find(r, Options{Full: c, ACGround: log.ACGround})
				if err != nil {
					t.Fatal(err)
				}
				return sts
			}
			two, one := find(2), find(1)
			if len(one) == 0 || !hasAnyLoop(one) {
				t.Fatal("no stage with a loop: the case checks nothing")
			}
			if !reflect.DeepEqual(one, two) {
				t.Errorf("the stages differ between one processor and two")
			}
		})
	}
}

func hasAnyLoop(sts []Stage) bool {
	for _, s := range sts {
		if len(s.Loop) > 0 {
			return true
		}
	}
	return false
}
