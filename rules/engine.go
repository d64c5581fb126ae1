// Package rules reduces a circuit to its small-signal path the way a
// technician redraws a service diagram by hand, but with every step named,
// justified with its numbers and logged: merges of series and parallel
// parts, rails and bypassed nets at AC ground, DC-only feeds and static
// electrodes dropped, RF chokes opened. The rules are listed, in the order
// they are tried, in one table (table.go); each lives in its own file.
package rules

import (
	"crypto/sha256"
	"errors"
	"fmt"
	"sort"
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
	// tentative step; a non-nil error refuses the step: it is not applied, it
	// is logged with Refused = err.Error(), and it is not retried.
	Check func(before, after *graph.Circuit, step *Step) error
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

// Ctx is a reduction in progress: the circuit being rewritten, with a
// terminal index kept up to date by the edit helpers, so that rules ask
// "what is on this net" in time proportional to the answer.
type Ctx struct {
	c        *graph.Circuit
	orig     *graph.Circuit // the input (after a focus cut), for describing parts as written
	ratio    float64
	level    Level
	conns    map[string][]graph.Conn // sorted by ref, then pin
	parts    map[string]*graph.Part
	nets     map[string]*graph.Net
	dropped  []string
	grounded map[string]bool // nets (by the names they had) joined to ground
	errs     graph.ErrorList
	errSeen  map[string]bool
	// focusPorts are the ports a focus cut made: they mark where the
	// signal enters and leaves the stage even when no declared end is left.
	focusPorts map[string]bool
}

func newCtx(c *graph.Circuit, ratio float64, level Level) *Ctx {
	x := &Ctx{c: c, ratio: ratio, level: level, grounded: map[string]bool{}, errSeen: map[string]bool{}}
	x.rebuild()
	return x
}

func (x *Ctx) rebuild() {
	x.conns = make(map[string][]graph.Conn, len(x.c.Nets))
	x.parts = make(map[string]*graph.Part, len(x.c.Parts))
	x.nets = make(map[string]*graph.Net, len(x.c.Nets))
	for _, n := range x.c.Nets {
		x.nets[n.Name] = n
	}
	for _, p := range x.c.Parts {
		x.parts[p.Ref] = p
		for _, pin := range p.Pins {
			x.conns[pin.Net] = append(x.conns[pin.Net], graph.Conn{Part: p, Pin: pin.Name})
		}
	}
	// Parts come in ref order but a part's pins in terminal order: sort
	// fully, so that lookups can search.
	for _, list := range x.conns {
		sort.Slice(list, func(i, j int) bool { return connLess(list[i], list[j]) })
	}
}

// Circuit is the circuit being reduced.
func (x *Ctx) Circuit() *graph.Circuit { return x.c }

// Ratio is the bypass ratio in force.
func (x *Ctx) Ratio() float64 { return x.ratio }

// Conns lists the terminals on a net, by ref then pin.
func (x *Ctx) Conns(net string) []graph.Conn { return x.conns[net] }

// Part returns a part by ref, or nil.
func (x *Ctx) Part(ref string) *graph.Part { return x.parts[ref] }

// Net returns a net by name, or nil. The Ctx keeps its own index: the
// circuit's rebuilds itself after every edit, which would make a reduction
// quadratic.
func (x *Ctx) Net(name string) *graph.Net { return x.nets[name] }

// RoleOf is the role of a net; unknown nets are signal nets.
func (x *Ctx) RoleOf(name string) graph.Role {
	if n := x.nets[name]; n != nil {
		return n.Role
	}
	return graph.Signal
}

// IsACGround reports whether a net is at AC ground by its role (ground, or a
// rail assumed stiff).
func (x *Ctx) IsACGround(net string) bool { return x.RoleOf(net).IsACGround() }

// ensureNet returns the named net, creating it (with the default role for
// its name) in sorted place when it does not exist.
func (x *Ctx) ensureNet(name string) *graph.Net {
	if n := x.nets[name]; n != nil {
		return n
	}
	n := &graph.Net{Name: name, Role: graph.DefaultRole(name)}
	i := sort.Search(len(x.c.Nets), func(i int) bool { return x.c.Nets[i].Name >= name })
	x.c.Nets = append(x.c.Nets, nil)
	copy(x.c.Nets[i+1:], x.c.Nets[i:])
	x.c.Nets[i] = n
	x.nets[name] = n
	x.c.Touch()
	return n
}

// IsEnd reports whether a net is a declared signal input or output of the
// circuit or of a region: such nets carry the signal by definition and are
// never grounded or merged away.
func (x *Ctx) IsEnd(net string) bool {
	for _, n := range x.c.Inputs {
		if n == net {
			return true
		}
	}
	for _, n := range x.c.Outputs {
		if n == net {
			return true
		}
	}
	for _, r := range x.c.Regions {
		if r.Input == net || r.Output == net {
			return true
		}
	}
	return false
}

// Ends gives the nets of a two-terminal part's first two pins, swapped when flip is set.
func Ends(p *graph.Part, flip bool) (string, string) {
	if len(p.Pins) < 2 {
		return "", ""
	}
	a, b := p.Pins[0].Net, p.Pins[1].Net
	if flip {
		return b, a
	}
	return a, b
}

// ground returns the name of the circuit's ground net, creating "gnd" when
// there is none: the conventional names first, then the first by name.
func (x *Ctx) ground() string {
	for _, name := range []string{"gnd", "0", "ground", "chassis"} {
		if n := x.Net(name); n != nil && n.Role == graph.Ground {
			return name
		}
	}
	for _, n := range x.c.Nets {
		if n.Role == graph.Ground {
			return n.Name
		}
	}
	x.ensureNet("gnd")
	return "gnd"
}

// fail records a problem with the input that stops the reduction (a part
// with no band where a rule needs one); each is reported once.
func (x *Ctx) fail(pos graph.Pos, format string, args ...any) {
	msg := fmt.Sprintf(format, args...)
	if x.errSeen[msg] {
		return
	}
	x.errSeen[msg] = true
	x.errs.Add(pos, "%s", msg)
}

// ---- edits: every change to the circuit goes through these, keeping the index true ----

func connLess(a, b graph.Conn) bool {
	if a.Part.Ref != b.Part.Ref {
		return a.Part.Ref < b.Part.Ref
	}
	return a.Pin < b.Pin
}

func (x *Ctx) addConn(net string, cn graph.Conn) {
	list := x.conns[net]
	i := sort.Search(len(list), func(i int) bool { return !connLess(list[i], cn) })
	list = append(list, graph.Conn{})
	copy(list[i+1:], list[i:])
	list[i] = cn
	x.conns[net] = list
}

func (x *Ctx) delConn(net string, p *graph.Part, pin string) {
	list := x.conns[net]
	key := graph.Conn{Part: p, Pin: pin}
	i := sort.Search(len(list), func(i int) bool { return !connLess(list[i], key) })
	for ; i < len(list) && list[i].Part.Ref == p.Ref; i++ { // sorted by ref and pin: a short look
		if list[i].Part == p && list[i].Pin == pin {
			x.conns[net] = append(list[:i], list[i+1:]...)
			break
		}
	}
	if len(x.conns[net]) == 0 {
		delete(x.conns, net)
		x.pruneNet(net)
	}
}

// pruneNet deletes a net nothing uses any more, unless it is a declared end.
func (x *Ctx) pruneNet(net string) {
	if len(x.conns[net]) > 0 || x.IsEnd(net) {
		return
	}
	i := sort.Search(len(x.c.Nets), func(i int) bool { return x.c.Nets[i].Name >= net })
	if i < len(x.c.Nets) && x.c.Nets[i].Name == net {
		x.c.Nets = append(x.c.Nets[:i], x.c.Nets[i+1:]...)
		delete(x.nets, net)
		x.c.Touch()
		x.dropped = append(x.dropped, net)
	}
}

// Remove takes a part out of the circuit; nets it leaves empty go too.
func (x *Ctx) Remove(p *graph.Part) {
	i := sort.Search(len(x.c.Parts), func(i int) bool { return x.c.Parts[i].Ref >= p.Ref })
	if i < len(x.c.Parts) && x.c.Parts[i] == p {
		x.c.Parts = append(x.c.Parts[:i], x.c.Parts[i+1:]...)
		x.c.Touch()
	}
	delete(x.parts, p.Ref)
	for _, pin := range p.Pins {
		x.delConn(pin.Net, p, pin.Name)
	}
}

// Add puts a part into the circuit, creating the nets its pins name.
func (x *Ctx) Add(p *graph.Part) {
	i := sort.Search(len(x.c.Parts), func(i int) bool { return x.c.Parts[i].Ref >= p.Ref })
	x.c.Parts = append(x.c.Parts, nil)
	copy(x.c.Parts[i+1:], x.c.Parts[i:])
	x.c.Parts[i] = p
	x.c.Touch()
	x.parts[p.Ref] = p
	for _, pin := range p.Pins {
		x.ensureNet(pin.Net)
		x.addConn(pin.Net, graph.Conn{Part: p, Pin: pin.Name})
	}
}

// DropPin removes one terminal from a part (a static electrode).
func (x *Ctx) DropPin(p *graph.Part, name string) {
	for i, pin := range p.Pins {
		if pin.Name == name {
			p.Pins = append(p.Pins[:i], p.Pins[i+1:]...)
			x.delConn(pin.Net, p, name)
			return
		}
	}
}

// Unconnect moves a terminal to "nc", the netlist's "not connected".
func (x *Ctx) Unconnect(p *graph.Part, name string) {
	for i, pin := range p.Pins {
		if pin.Name == name && pin.Net != "nc" {
			p.Pins[i].Net = "nc"
			x.delConn(pin.Net, p, name)
			x.ensureNet("nc")
			x.addConn("nc", graph.Conn{Part: p, Pin: name})
			return
		}
	}
}

// Join moves every terminal on net gone onto net keep and deletes gone, with
// graph.JoinNets' rules for roles, inputs, outputs and regions.
func (x *Ctx) Join(keep, gone string) {
	if keep == gone {
		return
	}
	k := x.ensureNet(keep)
	if g := x.nets[gone]; g != nil {
		if roleRank(g.Role) > roleRank(k.Role) {
			k.Role, k.Volts = g.Role, g.Volts
		}
		if k.Label == "" && g.Label != "" && g.Role == k.Role {
			k.Label = g.Label
		}
	}
	for _, cn := range x.conns[gone] {
		for i := range cn.Part.Pins {
			if cn.Part.Pins[i].Net == gone && cn.Part.Pins[i].Name == cn.Pin {
				cn.Part.Pins[i].Net = keep
			}
		}
		x.addConn(keep, cn)
	}
	delete(x.conns, gone)
	rename := func(list []string) []string {
		out := list[:0]
		seen := map[string]bool{}
		for _, n := range list {
			if n == gone {
				n = keep
			}
			if !seen[n] {
				seen[n] = true
				out = append(out, n)
			}
		}
		return out
	}
	x.c.Inputs = rename(x.c.Inputs)
	x.c.Outputs = rename(x.c.Outputs)
	for _, r := range x.c.Regions {
		if r.Input == gone {
			r.Input = keep
		}
		if r.Output == gone {
			r.Output = keep
		}
		r.Nets = rename(r.Nets)
	}
	i := sort.Search(len(x.c.Nets), func(i int) bool { return x.c.Nets[i].Name >= gone })
	if i < len(x.c.Nets) && x.c.Nets[i].Name == gone {
		x.c.Nets = append(x.c.Nets[:i], x.c.Nets[i+1:]...)
	}
	delete(x.nets, gone)
	x.c.Touch()
}

// GroundNet joins a net to the ground net and remembers it as AC ground.
func (x *Ctx) GroundNet(net string) string {
	g := x.ground()
	x.grounded[net] = true
	x.Join(g, net)
	return g
}

func roleRank(r graph.Role) int {
	switch r {
	case graph.Ground:
		return 5
	case graph.Supply:
		return 4
	case graph.Bias:
		return 3
	case graph.Heater:
		return 2
	case graph.PortN:
		return 1
	}
	return 0
}

// ChooseKeep decides which of two nets keeps its name when they are joined:
// ground first, then a declared end, a labelled net, the stronger role, and
// finally the smaller name, so the result does not depend on input order.
func (x *Ctx) ChooseKeep(a, b string) (keep, gone string) {
	score := func(n string) int {
		s := roleRank(x.RoleOf(n)) * 4
		if x.IsEnd(n) {
			s += 100
		}
		if x.RoleOf(n) == graph.Ground {
			s += 1000
		}
		if net := x.Net(n); net != nil && net.Label != "" {
			s += 2
		}
		return s
	}
	sa, sb := score(a), score(b)
	if sa > sb || (sa == sb && a < b) {
		return a, b
	}
	return b, a
}

// ---- the driver ----

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

// Reduce rewrites a copy of c to its small-signal path and returns it with
// the log. c is never modified. Bad input (a focus that names nothing, a
// part with no band where a rule needs one) gives a graph.ErrorList.
func Reduce(c *graph.Circuit, o Options) (rc *graph.Circuit, rl *Log, rerr error) {
	// A rule that trips over input nobody foresaw must not take the program
	// down with a stack trace: the user gets a message and the input is
	// untouched (Reduce works on a copy).
	defer func() {
		if v := recover(); v != nil {
			rc, rl, rerr = nil, nil, fmt.Errorf("reduce: internal error (please report, with the netlist): %v", v)
		}
	}()
	if c == nil {
		return nil, nil, errors.New("reduce: no circuit")
	}
	ratio := o.BypassRatio
	if ratio == 0 {
		ratio = DefaultRatio
	}
	if ratio < 0 || ratio >= 1 {
		var l graph.ErrorList
		l.Add(graph.Pos{File: c.File}, "bypass ratio %g: it must be above 0 and below 1 (the default 0.1 means a factor of ten)", ratio)
		return nil, nil, l
	}
	if o.Level < LevelTidy || o.Level > LevelIdeal {
		return nil, nil, fmt.Errorf("reduce: %v is not a level", o.Level)
	}
	rules := o.Rules
	if rules == nil {
		rules = Table()
	}
	if err := checkTable(rules); err != nil {
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
		l.Add(graph.Pos{File: c.File}, "nothing is left after the reduction at level %s: no part carries signal between the declared inputs and outputs (are the ends declared, and is the signal path on a rail by mistake?)", o.Level)
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
		p := dr.x.parts[a.Part.Ref]
		return Anchor{Part: p, Flip: a.Flip}, p != nil
	case a.Net != nil:
		n := dr.x.nets[a.Net.Name]
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
	var before *graph.Circuit
	if dr.o.Check != nil {
		before = dr.x.c.Clone()
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
	if dr.o.Check != nil {
		if err := dr.o.Check(before, dr.x.c, &st); err != nil {
			dr.x.c = before
			dr.x.rebuild()
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

// finish tidies what the netlist keeps about removed things (region lists),
// and fills the log's summary fields.
func finish(x *Ctx, log *Log) {
	c := x.c
	refsOf := map[string][]string{} // original ref -> refs of reduced parts standing for it
	for _, p := range c.Parts {
		for _, o := range p.Origins() {
			refsOf[o] = append(refsOf[o], p.Ref)
		}
	}
	for _, r := range c.Regions {
		seen := map[string]bool{}
		var parts []string
		for _, ref := range r.Parts {
			for _, now := range refsOf[ref] {
				if !seen[now] {
					seen[now] = true
					parts = append(parts, now)
				}
			}
		}
		sort.Strings(parts)
		r.Parts = parts
		var nets []string
		for _, n := range r.Nets {
			if c.Net(n) != nil {
				nets = append(nets, n)
			}
		}
		r.Nets = nets
		if r.Input != "" && c.Net(r.Input) == nil {
			r.Input = ""
		}
		if r.Output != "" && c.Net(r.Output) == nil {
			r.Output = ""
		}
	}
	// An end with nothing left on it (a focus cut it away) is no end of
	// this circuit; the netlist could not even name it.
	keepEnds := func(list []string) []string {
		var out []string
		for _, n := range list {
			if c.Net(n) != nil && len(x.conns[n]) > 0 {
				out = append(out, n)
			}
		}
		return out
	}
	c.Inputs, c.Outputs = keepEnds(c.Inputs), keepEnds(c.Outputs)
	for _, r := range c.Regions {
		if r.Input != "" && len(x.conns[r.Input]) == 0 {
			r.Input = ""
		}
		if r.Output != "" && len(x.conns[r.Output]) == 0 {
			r.Output = ""
		}
	}
	for _, n := range append([]*graph.Net(nil), c.Nets...) {
		x.pruneNet(n.Name)
	}
	c.Sort()
	for _, n := range x.orig.Nets {
		if n.Role.IsACGround() || x.grounded[n.Name] {
			log.ACGround = append(log.ACGround, n.Name)
		}
	}
	for n := range x.grounded {
		if x.orig.Net(n) == nil && !contains(log.ACGround, n) {
			log.ACGround = append(log.ACGround, n)
		}
	}
	sort.Strings(log.ACGround)
	log.After = countOf(c)
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
