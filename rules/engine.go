// Package rules reduces a circuit to its small-signal path the way a
// technician redraws a service diagram by hand, but with every step named,
// justified with its numbers and logged: merges of series and parallel
// parts, rails and bypassed nets at AC ground, DC-only feeds and static
// electrodes dropped, RF chokes opened. The rules are listed, in the order
// they are tried, in one table (table.go); each lives in its own file.
package rules

import (
	"strings"

	"pare/graph"
)

// Options steer a reduction.
type Options struct {
	Level Level
	// BypassRatio: |Xc| ≤ ratio·|Z shunted| makes a bypass, and the same
	// ratio judges chokes and coupling capacitors. 0 means the default 0.1
	// (a factor of ten, common practice).
	BypassRatio float64
	// Focus names parts (refs) or nets; the reduction keeps only the stage(s)
	// around them and turns the nets that cross the cut into ports.
	Focus []string
	// Check, when set, is called with the circuit before and after each
	// tentative step; a non-nil error refuses the step: it is undone, it is
	// logged with Refused = err.Error(), and it is not retried. The circuit
	// before shares the parts and nets the step left alone with the one
	// after (graph.Journal.Before): read both, keep neither. Building it
	// walks the circuit: a proof of every step of a whole set uses
	// CheckStep.
	Check func(before, after *graph.Circuit, step *Step) error
	// CheckStep is Check given the journal of the step's edits, which holds
	// the circuit after the step (Journal.Circuit) and answers what it was
	// before at the cost of what the step touched (Journal.BeforePart,
	// BeforeNet, BeforeConns). When both are set, CheckStep runs first and
	// either can refuse the step.
	CheckStep func(j *graph.Journal, step *Step) error
	// Rules replaces the built-in table (nil: Table()).
	Rules []Rule
	// MaxSteps bounds the number of steps; 0 means 10 per part and net, plus 100.
	MaxSteps int
}

// DefaultRatio is the factor a reactance must be below (bypass, coupling) or
// above (choke) the impedance it works against: one tenth, the rule of thumb
// of the trade (common practice, no source).
const DefaultRatio = 0.1

// Rule is one named rewrite. The engine offers it every anchor of its kind
// (parts of Kinds in ref order, or nets in name order, or the whole circuit
// once), Match finds the structure, Guard judges the numbers and writes the
// justification, Apply makes the edit and says what it did.
type Rule struct {
	Name    string
	Purpose string // one line, for `pare help reduce` and the report
	Level   Level
	Kinds   []graph.Kind // part kinds the rule is anchored on
	Nets    bool         // anchored on nets instead of parts
	Whole   bool         // anchored on the whole circuit (one match at a time)
	// Symmetric rules are tried with a two-terminal anchor's pins both ways
	// round, so a part matches however its pins were typed.
	Symmetric bool
	Match     func(x *Ctx, a Anchor) *Plan
	// Guard returns whether the plan is sound and the why (with numbers)
	// either way; a declined plan with a why is reported as a near miss.
	// nil means Match alone decides and sets Plan.Why.
	Guard func(x *Ctx, m *Plan) (bool, string)
	Apply func(x *Ctx, m *Plan) Step
}

// Anchor is what a rule is offered: a part (with Flip saying which way round
// its first two pins are read), a net, or nothing for whole-circuit rules.
type Anchor struct {
	Part *graph.Part
	Net  *graph.Net
	Flip bool
}

// Plan is a match: the parts and nets concerned and rule-private data from
// Match or Guard to Apply.
type Plan struct {
	Parts []*graph.Part
	Nets  []string
	Why   string
	Data  any
}

func (m *Plan) key(rule string) string {
	var b strings.Builder
	b.WriteString(rule)
	for _, p := range m.Parts {
		b.WriteString(" " + p.Ref)
	}
	for _, n := range m.Nets {
		b.WriteString(" @" + n)
	}
	return b.String()
}
