package stages

import (
	"errors"
	"fmt"
	"maps"
	"math"
	"slices"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/dc"
	"pare/graph/figure"
)

// Stage is one recognised stage.
type Stage struct {
	Name     string      `json:"name"`     // in signal order: "S1", "S2", …; sub-stages "S2.1", "S2.2"
	Topology string      `json:"topology"` // pattern id, e.g. "hartley-common-tap"
	Title    string      `json:"title"`    // e.g. "Hartley oscillator, cathode tap (valve)"
	Family   string      `json:"family"`   // "valve" | "bjt" | "fet" | "passive"
	Parts    []string    `json:"parts"`
	Figures  figure.List `json:"figures"` // in the order a person reads them; JSON: key → SI number, "f_min_hz", "gain", "tau_s", …
	Flags    []string    `json:"flags"`
	Contains []string    `json:"contains,omitempty"` // names of sub-stages
	// Supply marks a power-supply stage found on the full circuit: it comes
	// after every signal stage and is on no reduced sheet.
	Supply bool `json:"supply,omitempty"`
	// Notes state the assumptions behind figures ("capacitance linear in
	// rotation"), so a note that quotes a figure can quote its basis too.
	Notes []string `json:"notes,omitempty"`
	// Loop is the loop gain of an oscillator's or mixer's device across the
	// dial (loop.go), solved on the original circuit with every load.
	Loop []Loop `json:"loop,omitempty"`
	// Draw is where the stage's parts stand when drawn, relative to its
	// anchor (the first entry, at column 0, row 0), from its pattern's
	// [draw] template by circuit ref; empty without a template. Drawing
	// data, not a fact about the circuit: it is not in the JSON.
	Draw []Place `json:"-"`

	group    string
	nets     map[string]string // pattern net → circuit net
	figRanks []figRank         // beside Figures: each one's place in the one order (figorder.go)
	// unconfirmed says why a stage named by its shape is not borne out in
	// circuit (confirmTank); such a stage is dropped.
	unconfirmed string
}

// Options steer Find.
type Options struct {
	PatternDir string         // more patterns, added to (and overriding by id) the built-in library
	Full       *graph.Circuit // the original circuit, for the power-supply patterns; nil skips them
	Limit      int            // search steps across all patterns; 0 = DefaultLimit
	// ACGround names nets a reduction found to be at AC ground
	// (rules.Log.ACGround); nets whose role says so are folded anyway.
	ACGround []string
	// Library replaces the built-in library when set (tests, callers that
	// load patterns once).
	Library *Library
	// DC is the operating point of Full (graph/dc), for the figures taken
	// at the bias: an output valve's dissipation and power. nil leaves
	// them out.
	DC *dc.Point
}

// DefaultLimit is the default step budget: far above what the built-in
// library needs on a 5,000-part set, far below a hang.
const DefaultLimit = 20_000_000

// Find recognises the stages of a reduced circuit. Stages come in signal
// order (breadth-first from the circuit's inputs), each followed by its
// sub-stages; power-supply stages found on o.Full come last. When the search
// budget runs out the stages found so far are returned with an error that
// wraps ErrSearchLimit.
func Find(reduced *graph.Circuit, o Options) ([]Stage, error) {
	if reduced == nil {
		return nil, errors.New("stages: no circuit to recognise")
	}
	full := withAGCLines(o.Full, reduced)
	reduced = withDetectorLoads(reduced, o.Full)
	lib := o.Library
	if lib == nil {
		var err error
		if lib, err = Builtin(); err != nil {
			return nil, fmt.Errorf("built-in patterns: %w", err)
		}
	}
	if o.PatternDir != "" {
		user, err := LoadDir(o.PatternDir)
		if err != nil {
			return nil, err
		}
		lib = lib.Merge(user)
	}
	limit := o.Limit
	if limit <= 0 {
		limit = DefaultLimit
	}
	acg := map[string]bool{}
	for _, n := range o.ACGround {
		acg[n] = true
	}
	budget := &limit
	var orig *world
	if o.Full != nil {
		orig = newWorldJoined(full, false, acg, switchJoins(full))
		orig.op = o.DC
	}
	loopCircuit := o.Full
	if loopCircuit == nil {
		loopCircuit = reduced
	}
	defer prefetchLoops(reduced, loopCircuit)()
	order := signalOrder(reduced)
	signal, errSig := recognise(reduced, lib, false, acg, orig, nil, budget)
	var power []*found
	var errPow error
	if o.Full != nil && errSig == nil {
		power, errPow = recognise(full, lib, true, nil, nil, o.DC, budget)
	}
	held := heldOnOriginal(power)
	signal = withoutSupplied(signal, power, reduced)
	kept := supplyParts(power, reduced)
	folded := foldShunts(reduced, acg, signal, order, mergeSets(held, kept))
	loops := ac.NewLoops(loopCircuit) // elaborated once per setting for every device
	byLoop, gone := loopStages(reduced, loops, acg, signal, orig)
	signal = append(slices.DeleteFunc(signal, func(f *found) bool { return gone[f] }), byLoop...)
	devs := deviceStages(reduced, acg, signal, held)
	for _, f := range devs {
		for _, ref := range f.Parts {
			if isDevice(reduced.Part(ref)) {
				f.Flags = append(f.Flags, turnedFlags(loops, loops.Circuit(), ref)...)
			}
		}
	}
	signal = append(signal, devs...)
	refold(reduced, signal, folded)
	signal = nestStoppers(reduced, signal)
	leakPlaces(reduced, signal)
	naming := namingOrder(reduced)
	inSignalOrder(signal, naming)
	nameRoles(signal, reduced)
	cutOffFlags(signal, reduced, o.DC)
	saturationFlags(signal, o.DC)
	var out []Stage
	n := 0
	prefix := namePrefix(reduced, o.Full, len(signal)+len(power))
	name := func(s *Stage) {
		n++
		s.Name = fmt.Sprintf("%s%d", prefix, n)
	}
	// Stages found on the original circuit that are not supplies (the AGC
	// filter, whose line the reduction grounds) take their place in signal
	// order by the parts they keep on the reduced circuit (R16 hangs on the
	// detector's load), so the sheet draws them beside the stage they hang
	// on; one with no part left follows the signal stages.
	onOriginal := map[*found]bool{}
	all := append([]*found(nil), signal...)
	for _, top := range power {
		if top.group != "power" {
			onOriginal[top] = true
			all = append(all, top)
		}
	}
	inSignalOrder(all, naming)
	for _, top := range all {
		name(top.Stage)
		if onOriginal[top] {
			top.Notes = append(top.Notes, originalNoteFor(top.Parts, reduced))
		}
		out = appendTree(out, top)
	}
	for _, top := range power {
		if top.group == "power" {
			name(top.Stage)
			markSupply(top, reduced)
			out = appendTree(out, top)
		}
	}
	addLoops(loops, out)
	loopCapacitors(loops, out)
	dropContradicted(out)
	return out, errors.Join(errSig, errPow)
}

// inSignalOrder sorts stages by their nearest part's distance from the inputs,
// then by their first part, so the numbering follows the signal.
func inSignalOrder(stages []*found, order order) {
	sort.SliceStable(stages, func(i, j int) bool {
		a, b := order.of(stages[i].Parts), order.of(stages[j].Parts)
		if a != b {
			return a < b
		}
		return stages[i].Parts[0] < stages[j].Parts[0]
	})
}

// heldOnOriginal are the parts of the stages found on the original circuit
// that are not supplies (the AGC filter).
func heldOnOriginal(power []*found) map[string]bool {
	held := map[string]bool{}
	for _, f := range power {
		if f.group != "power" {
			for r := range f.set {
				held[r] = true
			}
		}
	}
	return held
}

// SupplyNote goes with every supply stage (a smoothing filter, a
// rectifier), found on the full circuit: the reduction removes its parts,
// so a reader who looks for it on the reduced sheet knows why it is not
// there.
const SupplyNote = "supply stage found on the full circuit; its parts are not on the reduced sheet"

// originalNote goes with a signal-side stage found on the original
// circuit: the reduction grounds its net for the signal, so its parts are
// not on the reduced sheet either.
const originalNote = "found on the original circuit: the reduction puts its line at AC ground for the signal, so its parts are not on the reduced sheet"

// originalNoteFor is originalNote, or where some of the stage's parts do
// stay on the reduced sheet (the AGC filter's resistor, from the detector
// to the grounded line), the note that says which.
func originalNoteFor(parts []string, reduced *graph.Circuit) string {
	var kept []string
	for _, r := range parts {
		if reduced.Part(r) != nil {
			kept = append(kept, r)
		}
	}
	if len(kept) == 0 {
		return originalNote
	}
	return "found on the original circuit: the reduction puts its line at AC ground for the signal, so of its parts only " +
		strings.Join(kept, ", ") + map[bool]string{true: " stays", false: " stay"}[len(kept) == 1] + " on the reduced sheet"
}

// markSupply marks a stage found on the full circuit, and its sub-stages,
// as a supply stage.
func markSupply(f *found, reduced *graph.Circuit) {
	f.Supply = true
	f.Notes = append(f.Notes, supplyNoteFor(f.Parts, reduced))
	for _, c := range f.subs {
		markSupply(c, reduced)
	}
}

// namePrefix is "S" for stage names (S1, S2.1), or "ST" when a part of the
// circuit is itself called S1, S2… (IEC 60617 letter code S for a switch):
// a frame "S1" drawn round switch S1 would say two things at once. Sub-stage
// names are checked too, so S2.1 never clashes with a ref either.
func namePrefix(reduced, full *graph.Circuit, stages int) string {
	refs := map[string]bool{}
	for _, c := range []*graph.Circuit{reduced, full} {
		if c == nil {
			continue
		}
		for _, p := range c.Parts {
			refs[p.Ref] = true
		}
	}
	for r := range refs {
		if stageLike(r) {
			return "ST"
		}
	}
	return "S"
}

// stageLike tells whether a ref reads like a stage name: S, then digits,
// optionally dotted ("S1", "S2.1").
func stageLike(ref string) bool {
	rest, ok := strings.CutPrefix(ref, "S")
	if !ok || rest == "" {
		return false
	}
	for _, f := range strings.Split(rest, ".") {
		if f == "" || strings.Trim(f, "0123456789") != "" {
			return false
		}
	}
	return true
}

// foldShunts gives each resistor that no stage claims and that runs from a
// signal net to AC ground (a grid leak, an anode or speaker load, a return)
// to the stage it loads: the first stage in signal order with a part on its
// signal net, that is the one feeding the net. A lone resistor is no stage of
// its own; one next to no stage stays unmatched, and one a stage found on
// the original circuit holds (held: the AGC filter's resistor, which runs
// from the detector to the line the reduction grounds) stays that stage's.
func foldShunts(c *graph.Circuit, acg map[string]bool, tops []*found, ord order, held map[string]bool) (folded map[string]bool) {
	folded = map[string]bool{}
	ground := func(net string) bool { return acg[net] || c.RoleOf(net).IsACGround() }
	claimed := maps.Clone(held)
	for _, f := range tops {
		for r := range f.set {
			claimed[r] = true
		}
	}
	// which top-level stages touch each net, in signal order
	touching := map[string][]*found{}
	for _, f := range tops {
		for _, ref := range f.Parts {
			p := c.Part(ref)
			if p == nil {
				continue
			}
			for _, pin := range p.Pins {
				l := touching[pin.Net]
				if len(l) == 0 || l[len(l)-1] != f {
					touching[pin.Net] = append(l, f)
				}
			}
		}
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Resistor || claimed[p.Ref] || len(p.Pins) != 2 {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		if ground(a) == ground(b) {
			continue
		}
		if ground(a) {
			a = b
		}
		var best *found
		for _, f := range touching[a] {
			if best == nil || ord.of(f.Parts) < ord.of(best.Parts) ||
				ord.of(f.Parts) == ord.of(best.Parts) && f.Parts[0] < best.Parts[0] {
				best = f
			}
		}
		if best == nil {
			continue
		}
		best.Parts = append(best.Parts, p.Ref)
		sort.Strings(best.Parts)
		best.set[p.Ref] = true
		claimed[p.Ref] = true
		folded[p.Ref] = true
	}
	return folded
}

// appendTree adds a stage and, depth first, its sub-stages named after it.
func appendTree(out []Stage, s *found) []Stage {
	subs := s.subs
	s.Contains = nil
	for i, c := range subs {
		c.Name = fmt.Sprintf("%s.%d", s.Name, i+1)
		s.Contains = append(s.Contains, c.Name)
	}
	noteIFTuning(s)
	out = append(out, s.public())
	for _, c := range subs {
		out = appendTree(out, c)
	}
	return out
}

func (s *Stage) public() Stage {
	t := *s
	if t.Flags == nil {
		t.Flags = []string{}
	}
	return t
}

// found is a stage under construction, with its sub-stages.
type found struct {
	*Stage
	m    *match
	subs []*found
	set  map[string]bool
}

// recognise matches the library's patterns of one kind (full: the power
// supply's, on the original circuit, whose operating point is op) on c.
func recognise(c *graph.Circuit, lib *Library, full bool, acg map[string]bool, orig *world, op *dc.Point, budget *int) ([]*found, error) {
	w := newWorld(c, full, acg)
	w.orig = orig
	w.op = op
	s := &searcher{w: w, limit: *budget, partUsed: make([]bool, len(w.parts)), netOwner: make([]int, len(w.names)), seen: map[string]bool{}}
	for i := range s.netOwner {
		s.netOwner[i] = -1
	}
	s.eval = func(m *match) *found {
		st := evaluate(w, m, false)
		if st == nil {
			return nil
		}
		set := map[string]bool{}
		for _, r := range st.Parts {
			set[r] = true
		}
		return &found{Stage: st, m: m, set: set}
	}
	var runErr error
	for _, p := range lib.Patterns {
		if (p.Circuit == "full") != full {
			continue
		}
		for _, v := range p.variants {
			if err := s.run(v); err != nil {
				runErr = err
				break
			}
		}
		if runErr != nil {
			break
		}
	}
	*budget -= s.steps
	cands := s.cands
	// The overlap rule: larger first, then the more specific pattern, then
	// pattern id and refs, so the outcome never depends on search order.
	sort.SliceStable(cands, func(i, j int) bool {
		a, b := cands[i], cands[j]
		if len(a.Parts) != len(b.Parts) {
			return len(a.Parts) > len(b.Parts)
		}
		if a.m.v.p.Rank != b.m.v.p.Rank {
			return a.m.v.p.Rank > b.m.v.p.Rank
		}
		if a.Topology != b.Topology {
			return a.Topology < b.Topology
		}
		return strings.Join(a.Parts, ",") < strings.Join(b.Parts, ",")
	})
	var tops []*found
	claimedBy := map[string]*found{} // part ref → the top-level stage holding it
	for _, f := range cands {
		var holder *found
		straddles := false
		for r := range f.set {
			if t := claimedBy[r]; t != nil {
				if holder != nil && holder != t {
					straddles = true
				}
				holder = t
			}
		}
		switch {
		case straddles:
		case holder == nil:
			tops = append(tops, f)
			for r := range f.set {
				claimedBy[r] = f
			}
		default:
			place(&holder.subs, f, holder)
		}
	}
	sortTree(tops)
	tops = solveFigures(w, tops)
	return tops, runErr
}

// place puts a candidate that overlaps stage parent inside it when it lies
// wholly inside and its pattern may nest (and is of another group: a tank
// in an oscillator, not a tank in a tank), then recursively among parent's
// sub-stages the same way; a candidate that straddles is dropped. The
// top level is handled by recognise with an index.
func place(level *[]*found, f *found, parent *found) {
	if inside, _ := relation(f.set, parent.set); !inside || !f.m.v.p.Inner || f.group == parent.group || len(f.set) == len(parent.set) {
		return
	}
	if sharesCoil(f, parent) && parent.group == "oscillator" {
		// an oscillator's figures already give its tank's resonance with
		// every capacitor of the tank counted; a tank stage inside it would
		// repeat f on part of them (a Colpitts' gang without the divider)
		return
	}
	for _, t := range *level {
		if _, overlap := relation(f.set, t.set); overlap {
			place(&t.subs, f, t)
			return
		}
	}
	*level = append(*level, f)
}

// sortTree orders each level of sub-stages by first part ref, so names do
// not depend on the order patterns were tried.
func sortTree(level []*found) {
	sort.SliceStable(level, func(i, j int) bool { return level[i].Parts[0] < level[j].Parts[0] })
	for _, f := range level {
		sortTree(f.subs)
	}
}

func relation(a, b map[string]bool) (inside, overlap bool) {
	inside = true
	for r := range a {
		if b[r] {
			overlap = true
		} else {
			inside = false
		}
	}
	return inside && overlap, overlap
}

// evaluate turns a match into a stage: family, title, figures, flags; nil
// when a guard rejects it or the pattern does not serve the family matched.
// With solve, the figures are the solver's in circuit, the formulas
// beside them; without, the formulas' alone.
func evaluate(w *world, m *match, solve bool) *Stage { return evaluateOn(w, m, solve, nil) }

// evaluateOn is evaluate with the figures solved on cut, a piece of a large
// set (piece.go); nil solves them as solverCircuit chooses.
func evaluateOn(w *world, m *match, solve bool, cut *graph.Circuit) *Stage {
	p := m.v.p
	st := &Stage{Topology: p.ID, group: p.Group, nets: map[string]string{}}
	for i, vp := range m.v.parts {
		if !vp.pp.Shared {
			st.Parts = append(st.Parts, w.parts[m.parts[i]].Ref)
			for _, o := range alongside(w, m, i) {
				st.Parts = append(st.Parts, o.Ref)
			}
		}
	}
	sort.Strings(st.Parts)
	st.Draw = drawPlaces(w, m)
	for vi, vn := range m.v.nets {
		if m.nets[vi] < 0 {
			continue // only absent optional parts touched it
		}
		for _, n := range vn.names {
			st.nets[n] = w.names[m.nets[vi]]
		}
	}
	var active *graph.Part
	for i, vp := range m.v.parts {
		part := w.parts[m.parts[i]]
		if active == nil && (isActiveDevice(vp.pp.Device) || part.Kind == graph.Valve) {
			active = part
		}
	}
	st.Family = familyOf(m, w)
	if len(p.Families) > 0 && !contains(p.Families, st.Family) {
		return nil
	}
	if !contextHolds(p, w, st) {
		return nil
	}
	title := p.Title
	if t, ok := p.Titles[st.Family]; ok {
		title = t
	}
	st.Title = expandTitle(title, st.Family)
	x := &figCtx{w: w, m: m, st: st, solve: solve, cut: cut}
	for _, f := range p.Figures {
		x.spec = f
		calcs[f.Calc].fn(x)
	}
	for _, g := range p.Guards {
		v, ok := st.Figures.Lookup(g.Figure)
		if !ok || math.IsNaN(v) || g.HasMin && v < g.Min || g.HasMax && v > g.Max {
			return nil
		}
	}
	if p.Group == "power" {
		st.Parts = append(st.Parts, x.surgeResistors()...)
		sort.Strings(st.Parts)
	}
	sortFigures(st)
	sort.Strings(st.Flags)
	return st
}

// fmMinHz is where FM reception shows in a circuit's frequencies: the
// usual FM IF is 10.7 MHz and the broadcast band 88–108 MHz, while AM sets
// stop near 30 MHz with a 450–470 kHz IF (from memory). A band or IF of
// 10 MHz or more says the set handles FM.
const fmMinHz = 10e6

// fmReceived tells whether a circuit receives FM: its band, a region's band
// or its declared IF reaches fmMinHz. A network that only makes sense after
// an FM detector (de-emphasis) is not looked for anywhere else; the
// detector itself need not be in the file (an audio board of an FM set).
func fmReceived(c *graph.Circuit) bool {
	return c.FullBand().Max >= fmMinHz || c.Freqs["if"] >= fmMinHz
}

// audioTopHz is the highest top of a band still taken as audio: 20 kHz for
// the ear, with room for a stereo multiplex signal (53 kHz, from memory).
const audioTopHz = 100e3

// inAudioBand tells whether every part lies in an audio band (its region's
// band, or the circuit's): de-emphasis works on the detector's audio
// output, not in the RF or IF stages of the same set.
func inAudioBand(c *graph.Circuit, refs []string) bool {
	for _, r := range refs {
		p := c.Part(r)
		if p == nil {
			return false
		}
		if b := c.BandOf(p); b.Max <= 0 || b.Max > audioTopHz {
			return false
		}
	}
	return len(refs) > 0
}

// familyOf is the kind of the first amplifying device in the match, a
// valve diode counting as valve; a stage of passive parts and semiconductor
// diodes only is "passive".
func familyOf(m *match, w *world) string {
	fam := ""
	for _, ci := range m.parts {
		p := w.parts[ci]
		switch p.Kind {
		case graph.Valve:
			return "valve"
		case graph.BJT:
			if fam == "" {
				fam = "bjt"
			}
		case graph.FET:
			if fam == "" {
				fam = "fet"
			}
		}
	}
	if fam == "" {
		return "passive"
	}
	return fam
}

var electrodeWords = map[string]map[string]string{
	"valve":   {"{control}": "grid", "{common}": "cathode", "{output}": "anode", "{family}": "valve"},
	"bjt":     {"{control}": "base", "{common}": "emitter", "{output}": "collector", "{family}": "BJT"},
	"fet":     {"{control}": "gate", "{common}": "source", "{output}": "drain", "{family}": "FET"},
	"passive": {"{control}": "control", "{common}": "common", "{output}": "output", "{family}": "passive"},
}

func expandTitle(t, family string) string {
	if family == "passive" {
		// "(passive)" tells a reader nothing; drop the parenthesis.
		t = strings.ReplaceAll(t, " ({family})", "")
	}
	words := electrodeWords[family]
	for _, k := range sortedKeys(words) {
		t = strings.ReplaceAll(t, k, words[k])
	}
	return t
}

// Unmatched lists the parts of the circuit that no stage claims, sorted,
// leaving out ports (they are the sheet's connections, not stages).
func Unmatched(c *graph.Circuit, stages []Stage) []string {
	claimed := map[string]bool{}
	for _, s := range stages {
		for _, r := range s.Parts {
			claimed[r] = true
		}
	}
	var out []string
	for _, p := range c.Parts {
		if !claimed[p.Ref] && p.Kind != graph.Port {
			out = append(out, p.Ref)
		}
	}
	return out
}

// sharesCoil reports whether two stages' figures are calculated on the
// same coil (the circuit part each pattern's `coil` argument binds; both
// stages come from one search, so one numbering of parts).
func sharesCoil(a, b *found) bool {
	ca := figureCoils(a)
	for i := range figureCoils(b) {
		if ca[i] {
			return true
		}
	}
	return false
}

func figureCoils(f *found) map[int]bool {
	out := map[int]bool{}
	for _, spec := range f.m.v.p.Figures {
		for _, name := range spec.Args["coil"] {
			for i, vp := range f.m.v.parts {
				if vp.pp.Name == name && f.m.parts[i] >= 0 {
					out[f.m.parts[i]] = true
				}
			}
		}
	}
	return out
}
