package pipeline

import (
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules"
)

// Step is the comparison with the original after one tentative rewrite
// step: its worst pair, and whether the step was kept.
type Step struct {
	N     int      `json:"n"`
	Rule  string   `json:"rule"`
	Refs  []string `json:"refs,omitempty"`
	Worst *ac.Pair `json:"worst,omitempty"` // nil when nothing was compared
	OK    bool     `json:"ok"`
}

// stepChecker is the engine's Check hook for the chosen mode. A step that
// cannot be compared or that breaks the tolerance is refused; the engine
// logs why.
//
// Under AgainstPrevious the checks share one memo of solved responses
// (ac.Memo): each step's "before" is the circuit the previous step was
// proven with as "after". A remembered response agrees with a fresh solve
// to the rounding of the LU's pivot history, which only moves where a
// deviation of 10⁻¹⁴ dB peaks; AgainstOriginal prints every step's worst
// pair (`verify --steps`), so it solves afresh and prints what it always did.
func (r *Result) stepChecker(mode StepCheck, whole bool) func(j *graph.Journal, st *rules.Step) error {
	var memo *ac.Memo
	if mode == AgainstPrevious {
		memo = ac.NewMemo()
	}
	return func(j *graph.Journal, st *rules.Step) error {
		var ref, after *graph.Circuit
		switch {
		case mode == AgainstOriginal:
			ref, after = r.acBase(), j.Circuit()
		case whole:
			ref, after = j.Before(), j.Circuit()
		default:
			// Against the previous circuit only the groups of parts the
			// step touched can differ (local.go): compare those, found
			// from the step's journal (localjournal.go).
			b, a, _, none := localJournal(j)
			if none {
				return nil
			}
			ref, after = b, a
		}
		rep, err := r.compare(ref, after, memo)
		applied := err == nil && !rep.Broken()
		if memo != nil {
			memo.Settle(!applied, applied)
		}
		if err != nil {
			if r.StepErr == nil {
				r.StepErr = err
			}
			return err
		}
		w, has := rep.Worst()
		if mode == AgainstOriginal {
			ck := Step{Rule: st.Rule, Refs: st.Refs, OK: !rep.Broken()}
			if has {
				ck.Worst = &w
			}
			r.Steps = append(r.Steps, ck)
		}
		if !rep.Broken() {
			return nil // a step is refused for what it broke, not for an empty comparison
		}
		return &ac.ToleranceError{Pair: w, TolDB: rep.TolDB, TolDeg: rep.TolDeg}
	}
}

// numberSteps gives each check the number of its step in the log. The
// engine calls Check once for every step it logs, applied or refused, in
// log order; a step the log holds without a check (none today) is skipped.
func numberSteps(checks []Step, steps []rules.Step) {
	k := 0
	for _, s := range steps {
		if k < len(checks) && checks[k].Rule == s.Rule && strings.Join(checks[k].Refs, ",") == strings.Join(s.Refs, ",") {
			checks[k].N = s.N
			k++
		}
	}
}
