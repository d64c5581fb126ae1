package stages

import (
	"errors"
	"fmt"
	"maps"
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
	kept := supplyParts(power, reduced, o.Full)
	// Only a device no pattern names takes its parts to a decoupled line as
	// its own: folding shunts by the same returns also left review13 b02's
	// decoupler and bias resistor in no stage and reflowed six review
	// sheets (alongPartCeiling, wireBoxCeiling, pages up), so signal order
	// still folds those.
	returns := withSupplyLines(reduced, acg, kept)
	folded := foldShunts(reduced, acg, signal, order, mergeSets(held, kept))
	loops := ac.NewLoops(loopCircuit) // elaborated once per setting for every device
	byLoop, gone := loopStages(reduced, loops, acg, signal, orig)
	signal = append(slices.DeleteFunc(signal, func(f *found) bool { return gone[f] }), byLoop...)
	devs := deviceStages(reduced, returns, signal, held)
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
	addLoops(loops, out, reduced, acg)
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
