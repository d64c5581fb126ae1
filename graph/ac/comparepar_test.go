package ac_test

import (
	"path/filepath"
	"reflect"
	"runtime"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/internal/synth"
	"pare/rules"
)

// A run of step proofs sharing a memo reports the same numbers to the bit
// with its quantities swept side by side as one after the other, and
// leaves the same responses remembered after every step: the reference is
// the sequential loop (GOMAXPROCS 1), which solves each probe's points in
// the order that decides its LU's pivot history.
func TestStepProofsSideBySide(t *testing.T) {
	files := examples(t)
	if testing.Short() {
		files = files[:1]
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			seq := stepProofs(t, f, 1)
			par := stepProofs(t, f, 2)
			if len(seq.reports) < 3 {
				t.Fatalf("%d step proofs: the case checks too little", len(seq.reports))
			}
			if !reflect.DeepEqual(seq.reports, par.reports) {
				t.Errorf("the reports differ between one processor and two")
			}
			if !reflect.DeepEqual(seq.memos, par.memos) {
				t.Errorf("the memo differs between one processor and two")
			}
		})
	}
}

type proofRun struct {
	reports []*ac.Report
	memos   []map[[32]byte]map[float64]complex128
}

// stepProofs reduces file with every step proven against the circuit
// before it through one memo, as the main job does, on procs processors.
func stepProofs(t *testing.T, file string, procs int) proofRun {
	t.Helper()
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
	c, err := graph.LoadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	var run proofRun
	m := ac.NewMemo()
	check := func(before, after *graph.Circuit, _ *rules.Step) error {
		rep, err := ac.Compare(before, after, ac.CompareOptions{Memo: m})
		applied := err == nil && !rep.Broken()
		m.Settle(!applied, applied)
		run.reports = append(run.reports, rep)
		run.memos = append(run.memos, ac.MemoDump(m))
		if err != nil {
			return err
		}
		if rep.Broken() {
			w, _ := rep.Worst()
			return &ac.ToleranceError{Pair: w, TolDB: rep.TolDB, TolDeg: rep.TolDeg}
		}
		return nil
	}
	if _, _, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal, Check: check}); err != nil {
		t.Fatal(err)
	}
	return run
}

// The final proof of a set of channels built alike (no memo: every
// quantity runs on its own, and quantities of two channels alike sweep the
// same pair of systems, the one that starts second waiting for the first)
// reports the same numbers to the bit on one processor and on four, run
// after run.
func TestFinalProofSideBySide(t *testing.T) {
	c, err := synth.BankCircuit(300, 1)
	if err != nil {
		t.Fatal(err)
	}
	reduced, _, err := rules.Reduce(c.Clone(), rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	compare := func(procs int) *ac.Report {
		defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
		rep, err := ac.Compare(c, reduced, ac.CompareOptions{})
		if err != nil {
			t.Fatal(err)
		}
		return rep
	}
	seq := compare(1)
	if len(seq.Pairs) < 20 {
		t.Fatalf("%d pairs compared: the case checks too little", len(seq.Pairs))
	}
	for range 3 {
		if par := compare(4); !reflect.DeepEqual(seq, par) {
			t.Fatalf("the reports differ between one processor and four")
		}
	}
}
