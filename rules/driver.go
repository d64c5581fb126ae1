package rules

import (
	"crypto/sha256"
	"errors"
	"fmt"
	"sort"
	"strings"

	"pare/graph"
)

// errCycle is wrapped by the error a reduction returns when the rules keep
// undoing each other.
var errCycle = errors.New("rewrite cycle")

// sweepLimit is the number of sweeps over the table after which the driver
// starts hashing the circuit to detect a cycle (a sound table settles in a
// handful of sweeps).
const sweepLimit = 20

type driver struct {
	x        *Ctx
	o        Options
	rules    []Rule
	log      *Log
	hits     map[string]int
	refused  map[string]bool
	maxSteps int
}

// checkOptions resolves the defaults of a reduction's options and refuses
// the ones no reduction can run with.
func checkOptions(c *graph.Circuit, o Options) (ratio float64, rules []Rule, err error) {
	ratio = o.BypassRatio
	if ratio == 0 {
		ratio = DefaultRatio
	}
	if ratio < 0 || ratio >= 1 {
		var l graph.ErrorList
		l.Add(graph.Pos{File: c.File, Line: 1, Col: 1}, "bypass ratio %g: it must be above 0 and below 1 (the default 0.1 means a factor of ten)", ratio)
		return 0, nil, l
	}
	if o.Level < LevelTidy || o.Level > LevelIdeal {
		return 0, nil, fmt.Errorf("reduce: %v is not a level", o.Level)
	}
	rules = o.Rules
	if rules == nil {
		rules = Table()
	}
	if err := checkTable(rules); err != nil {
		return 0, nil, err
	}
	return ratio, rules, nil
}

// Reduce rewrites a copy of c to its small-signal path and returns it with
// the log. c is never modified. Bad input (a focus that names nothing, a
// part with no band where a rule needs one) gives a graph.ErrorList.
func Reduce(c *graph.Circuit, o Options) (rc *graph.Circuit, rl *Log, rerr error) {
	// A rule that trips over input nobody foresaw must not take the program
	// down with a stack trace: the user gets a message and the input is
	// untouched (Reduce works on a copy).
	defer func() {
		if v := recover(); v != nil {
			rc, rl, rerr = nil, nil, fmt.Errorf("reduce: %w (please report, with the netlist): %v", ErrInternal, v)
		}
	}()
	if c == nil {
		return nil, nil, errors.New("reduce: no circuit")
	}
	ratio, rules, err := checkOptions(c, o)
	if err != nil {
		return nil, nil, err
	}
	d := c.Clone()
	d.Sort()
	log := &Log{Level: o.Level, Before: countOf(c), Gangs: gangsOf(d)}
	x := newCtx(d, ratio, o.Level)
	dr := &driver{x: x, o: o, log: log, hits: map[string]int{}, refused: map[string]bool{}}
	for _, r := range rules {
		if r.Level <= o.Level {
			dr.rules = append(dr.rules, r)
		}
	}
	if len(o.Focus) > 0 {
		if err := focusCut(x, o.Focus, log); err != nil {
			return nil, nil, err
		}
	}
	x.orig = d.Clone()
	dr.maxSteps = o.MaxSteps
	if dr.maxSteps == 0 {
		dr.maxSteps = 10*(len(d.Parts)+len(d.Nets)) + 100
	}
	if err := dr.fixpoint(); err != nil {
		return nil, nil, err
	}
	if err := x.errs.Err(); err != nil {
		x.errs.Sort()
		return nil, nil, x.errs
	}
	if len(x.c.Parts) == 0 {
		// No netlist can hold an empty circuit, and an empty sheet helps
		// nobody: say what probably went wrong instead.
		var l graph.ErrorList
		l.Add(endsPos(c), "nothing is left after the reduction at level %s: no part carries signal between the declared inputs and outputs (are the ends declared, and is the signal path on a rail by mistake?)", o.Level)
		return nil, nil, l
	}
	dr.declined()
	finish(x, log)
	for _, r := range dr.rules {
		log.Hits = append(log.Hits, Hit{Rule: r.Name, N: dr.hits[r.Name]})
	}
	return x.c, log, nil
}

func (dr *driver) fixpoint() error {
	var states map[[32]byte]bool
	for sweep := 0; ; sweep++ {
		changed := false
		for i := range dr.rules {
			ch, err := dr.run(&dr.rules[i])
			if err != nil {
				return err
			}
			changed = changed || ch
			if len(dr.x.errs) > 0 {
				return nil
			}
		}
		if !changed {
			return nil
		}
		if sweep >= sweepLimit {
			if states == nil {
				states = map[[32]byte]bool{}
			}
			h := stateHash(dr.x.c)
			if states[h] {
				return fmt.Errorf("reduce: %w detected after %d sweeps: the rules keep undoing each other (last steps: %s)", errCycle, sweep, lastRules(dr.log, 4))
			}
			states[h] = true
		}
	}
}

func lastRules(l *Log, n int) string {
	var names []string
	for i := len(l.Steps) - 1; i >= 0 && len(names) < n; i-- {
		names = append(names, l.Steps[i].Rule)
	}
	return strings.Join(names, ", ")
}

// stateHash fingerprints the circuit for cycle detection.
func stateHash(c *graph.Circuit) [32]byte {
	var b strings.Builder
	for _, p := range c.Parts {
		fmt.Fprintf(&b, "%s %s %s %v %g;", p.Ref, p.Kind, p.Type, p.Value, p.Set)
		for _, pin := range p.Pins {
			b.WriteString(pin.Name + "=" + pin.Net + ",")
		}
	}
	for _, n := range c.Nets {
		b.WriteString(n.Name + ":" + string(n.Role) + ";")
	}
	return sha256.Sum256([]byte(b.String()))
}

// anchors lists what a rule is offered, as a snapshot taken before the sweep.
func (dr *driver) anchors(r *Rule) []Anchor {
	x := dr.x
	switch {
	case r.Whole:
		return []Anchor{{}}
	case r.Nets:
		out := make([]Anchor, 0, len(x.c.Nets))
		for _, n := range x.c.Nets {
			out = append(out, Anchor{Net: n})
		}
		return out
	}
	var out []Anchor
	for _, p := range x.c.Parts {
		if len(r.Kinds) > 0 && !hasKind(r.Kinds, p.Kind) {
			continue
		}
		out = append(out, Anchor{Part: p})
	}
	return out
}

func hasKind(ks []graph.Kind, k graph.Kind) bool {
	for _, x := range ks {
		if x == k {
			return true
		}
	}
	return false
}

// resolve turns an anchor taken at the start of a sweep into the part or
// net of that name in the circuit as it is now (an edit, or a refused step
// that put the circuit back, may have replaced it); ok is false when it is
// gone.
func (dr *driver) resolve(a Anchor) (Anchor, bool) {
	switch {
	case a.Part != nil:
		p := dr.x.Part(a.Part.Ref)
		return Anchor{Part: p, Flip: a.Flip}, p != nil
	case a.Net != nil:
		n := dr.x.Net(a.Net.Name)
		return Anchor{Net: n}, n != nil
	}
	return a, true
}

// run offers a rule every anchor once, applying each sound match at once (so
// later anchors see the edited circuit); an anchor that matched is offered
// again until it no longer matches. Symmetric rules see a two-terminal part
// both ways round.
func (dr *driver) run(r *Rule) (bool, error) {
	changed := false
	for _, a := range dr.anchors(r) {
		for {
			applied := false
			for _, f := range []bool{false, true} {
				cur, ok := dr.resolve(a)
				if !ok {
					break
				}
				if f && !(r.Symmetric && cur.Part != nil && len(cur.Part.Pins) == 2) {
					break
				}
				cur.Flip = f
				m := r.Match(dr.x, cur)
				if m == nil {
					continue
				}
				done, err := dr.try(r, m)
				if err != nil {
					return changed, err
				}
				if done {
					applied = true
					break
				}
			}
			if !applied {
				break
			}
			changed = true
		}
	}
	return changed, nil
}

// try judges and applies one plan, logging it; it reports whether the circuit changed.
func (dr *driver) try(r *Rule, m *Plan) (bool, error) {
	key := m.key(r.Name)
	if dr.refused[key] {
		return false, nil
	}
	if r.Guard != nil {
		ok, why := r.Guard(dr.x, m)
		if !ok {
			return false, nil
		}
		m.Why = why
	}
	if len(dr.log.Steps) >= dr.maxSteps {
		return false, fmt.Errorf("reduce: more than %d steps; the rules do not settle (last steps: %s)", dr.maxSteps, lastRules(dr.log, 4))
	}
	refs := make([]string, len(m.Parts))
	where := make([]graph.Pos, len(m.Parts))
	for i, p := range m.Parts {
		refs[i], where[i] = p.Ref, p.Pos
	}
	if len(m.Parts) == 0 {
		for _, n := range m.Nets {
			if net := dr.x.Net(n); net != nil {
				refs, where = append(refs, n), append(where, net.Pos)
			}
		}
	}
	// A step to be proven is journaled, not preceded by a copy of the
	// circuit: the proof reads the circuit before the step from the
	// journal, and a refused step is undone in place, at the cost of what
	// the step touched rather than of the whole set.
	var jr *graph.Journal
	if dr.o.Check != nil || dr.o.CheckStep != nil {
		jr = dr.x.c.StartJournal()
		dr.x.newGround = dr.x.newGround[:0]
	}
	dr.x.dropped = nil
	st := r.Apply(dr.x, m)
	st.Rule, st.Refs, st.Where = r.Name, refs, where
	if st.Why == "" {
		st.Why = m.Why
	}
	st.Dropped = append(st.Dropped, dr.x.dropped...)
	sort.Strings(st.Dropped)
	dr.x.dropped = nil
	if jr != nil {
		jr.Stop()
		if err := dr.check(jr, &st); err != nil {
			dr.x.undo(jr)
			st.Refused = err.Error()
			st.N = len(dr.log.Steps) + 1
			dr.log.Steps = append(dr.log.Steps, st)
			dr.refused[key] = true
			return false, nil
		}
	}
	st.N = len(dr.log.Steps) + 1
	dr.log.Steps = append(dr.log.Steps, st)
	dr.hits[r.Name]++
	return true, nil
}

// check runs the step's proofs: CheckStep on the journal, then Check on
// the circuits before and after.
func (dr *driver) check(jr *graph.Journal, st *Step) error {
	if dr.o.CheckStep != nil {
		if err := dr.o.CheckStep(jr, st); err != nil {
			return err
		}
	}
	if dr.o.Check != nil {
		return dr.o.Check(jr.Before(), jr.Circuit(), st)
	}
	return nil
}

// declined collects the near misses of the final circuit: matches whose
// guard said no, with its numbers.
func (dr *driver) declined() {
	for i := range dr.rules {
		r := &dr.rules[i]
		if r.Guard == nil {
			continue
		}
		seen := map[string]bool{}
		for _, a := range dr.anchors(r) {
			flips := []bool{false}
			if r.Symmetric && a.Part != nil && len(a.Part.Pins) == 2 {
				flips = []bool{false, true}
			}
			for _, f := range flips {
				a.Flip = f
				m := r.Match(dr.x, a)
				if m == nil {
					continue
				}
				ok, why := r.Guard(dr.x, m)
				k := m.key(r.Name)
				if ok || why == "" || seen[k] {
					continue
				}
				seen[k] = true
				st := Step{Rule: r.Name, Why: why}
				for _, p := range m.Parts {
					st.Refs, st.Where = append(st.Refs, p.Ref), append(st.Where, p.Pos)
				}
				dr.log.Declined = append(dr.log.Declined, st)
			}
		}
	}
	dr.x.errs = nil // a band problem met only while explaining is not fatal
}
