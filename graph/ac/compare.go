package ac

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"sync"

	"pare/graph"
	"pare/graph/value"
)

// CompareOptions sets the tolerance and resolution of an equivalence check.
type CompareOptions struct {
	TolDB, TolDeg float64 // 0 means 0.5 dB and 5° (common practice for a redrawn circuit)
	Points        int     // log-spaced points per band before refinement; 0 means 100
	Options               // device settings; with VarSet false, gangs are checked at min, mid and max
	// Memo, when set, lends the responses of earlier comparisons of the
	// same systems and keeps this one's for later (memo.go); the caller
	// settles it after each comparison.
	Memo *Memo `json:"-"`
	// AboveRounding, when set, refines the deviation only around its peaks
	// above the solver's rounding (roundingDB, roundingDeg): for the proof
	// of one step among many, where only the verdict counts (rounding.go).
	AboveRounding bool `json:"-"`
	// ReadPieces, when set, solves each response on the part of its block
	// the voltage read depends on (probe.go, pieceOf) and remembers it under
	// that part's digest, so a step that changes nothing a response reads
	// leaves its system, and its sweep, the same: for the proofs of the
	// steps of a reduction, each against the circuit before it.
	ReadPieces bool `json:"-"`
}

// Default tolerances: half a decibel and five degrees, well inside what a
// technician can see on a bench sweep (common practice, no source).
const (
	DefaultTolDB  = 0.5
	DefaultTolDeg = 5
)

// floorDB is how far below a pair's peak a response may fall before its
// deviation stops counting in full: deep in a null a tiny change of the null
// depth is a large ratio but nothing anyone measures. A magnitude below the
// floor counts as the floor, and the phase there is ignored.
const floorDB = 80

// Pair is the worst deviation found for one transfer or impedance.
type Pair struct {
	From    string  `json:"from"`
	To      string  `json:"to"`
	MaxDB   float64 `json:"max_db"`
	MaxDeg  float64 `json:"max_deg"`
	AtHz    float64 `json:"at_hz"`
	What    string  `json:"what"`              // "transfer" | "impedance"
	Setting string  `json:"setting,omitempty"` // gang setting of the worst point: "min", "mid", "max" or a fraction
	Error   string  `json:"error,omitempty"`   // the reduced circuit could not be solved for this pair
	// Bands is what the pair was swept over ("445 kHz–465 kHz"): the
	// regions its path works in (quantities.go, detpairs.go).
	Bands string `json:"bands,omitempty"`
}

// String prints the pair for a terminal.
func (p Pair) String() string {
	name := p.Label()
	if p.Error != "" {
		return fmt.Sprintf("%s: %s", name, p.Error)
	}
	s := fmt.Sprintf("%s: worst %s, %.2f° at %s", name, p.dbText(), p.MaxDeg, value.Format(p.AtHz, value.Hertz, value.Symbol))
	if p.Setting != "" {
		s += ", gang at " + p.Setting
	}
	return s
}

// dbText prints the magnitude deviation; at the floor it says what that means.
func (p Pair) dbText() string {
	if p.MaxDB >= floorDB-1e-9 {
		return fmt.Sprintf("%.0f dB or more (one response is %d dB below the peak: the signal is lost or appears from nowhere)", p.MaxDB, floorDB)
	}
	return fmt.Sprintf("%.3f dB", p.MaxDB)
}

// Label names the quantity: "V(out)/V(in)" or "Z(net)".
func (p Pair) Label() string {
	if p.What == "impedance" {
		return "Z(" + p.From + ")"
	}
	return "V(" + p.To + ")/V(" + p.From + ")"
}

// Report is the outcome of Compare.
type Report struct {
	Pairs  []Pair   `json:"pairs"`
	TolDB  float64  `json:"tolerance_db"`
	TolDeg float64  `json:"tolerance_deg"`
	OK     bool     `json:"ok"`
	Notes  []string `json:"notes,omitempty"` // what could not be compared, and why
	// Characteristic counts the transfers and tank impedances compared:
	// the quantities that say what the circuit does. With none of them the
	// proof is empty (an output impedance alone proves nothing about the
	// frequency-setting parts), and OK is false.
	Characteristic int `json:"characteristic"`
	// nearTies: pairs whose scores differ by no more than rounding count
	// as tied, and Worst names the first (CompareOptions.AboveRounding).
	nearTies bool
}

// Empty reports a comparison that compared no transfer and no tank: not a
// pass, however small the deviations of what it did compare.
func (r *Report) Empty() bool { return r.Characteristic == 0 }

// Broken reports whether a compared pair is outside the tolerance (or could
// not be solved): what refuses a rewrite step. An empty comparison breaks
// nothing; only the final verdict calls it unproven.
func (r *Report) Broken() bool {
	w, ok := r.Worst()
	return ok && !w.Within(r.TolDB, r.TolDeg)
}

// NothingComparable is the text for an empty comparison.
const NothingComparable = "nothing comparable: no transfer and no tank impedance could be compared (declare an input and an output, or a region with both)"

// Worst returns the pair furthest outside (or nearest to) the tolerance.
func (r *Report) Worst() (Pair, bool) {
	best, bestScore := -1, -1.0
	for i, p := range r.Pairs {
		s := p.score(r.TolDB, r.TolDeg)
		if r.nearTies && best >= 0 && s <= bestScore*(1+roundingRel) {
			// Pairs a step moves alike (a response and one a fixed stage
			// after it derives from it) deviate alike: which of them
			// rounding puts first follows how the systems were solved
			// (ReadPieces), so the first in order is named.
			continue
		}
		if s > bestScore {
			best, bestScore = i, s
		}
	}
	if best < 0 {
		return Pair{}, false
	}
	return r.Pairs[best], true
}

func (p Pair) score(tolDB, tolDeg float64) float64 {
	if p.Error != "" {
		return math.Inf(1)
	}
	return math.Max(p.MaxDB/tolDB, p.MaxDeg/tolDeg)
}

// Within reports whether the pair is inside the tolerance.
func (p Pair) Within(tolDB, tolDeg float64) bool {
	return p.Error == "" && p.MaxDB <= tolDB && p.MaxDeg <= tolDeg
}

// ToleranceError is what Check returns when a circuit strays outside the
// tolerance: the worst pair and the tolerance it broke.
type ToleranceError struct {
	Pair          Pair
	TolDB, TolDeg float64
}

func (e *ToleranceError) Error() string {
	if e.Pair.Error != "" {
		return e.Pair.String()
	}
	return fmt.Sprintf("%s changes by %s, %.2f° at %s (tolerance %g dB, %g°)", e.Pair.Label(), e.Pair.dbText(), e.Pair.MaxDeg,
		value.Format(e.Pair.AtHz, value.Hertz, value.Symbol), e.TolDB, e.TolDeg)
}

// Check compares after with before and returns nil when every pair stays
// within tolerance, a *ToleranceError naming the worst pair when one does
// not, or the error that kept the comparison from running. The rules engine
// calls it after each tentative rewrite to refuse a step that changes the
// signal behaviour.
func (o CompareOptions) Check(before, after *graph.Circuit) error {
	r, err := Compare(before, after, o)
	if err != nil {
		return err
	}
	if !r.Broken() {
		return nil // an empty comparison refuses no step (Broken)
	}
	w, _ := r.Worst()
	return &ToleranceError{Pair: w, TolDB: r.TolDB, TolDeg: r.TolDeg}
}

// Compare sweeps the original and the reduced circuit over their bands of
// interest and reports the worst deviation of each transfer (every declared
// input to every output, and each region's input to its output) and of the
// driving-point impedance at each input and port. Each band is swept at
// Points log-spaced frequencies, then refined around the peaks of each
// response and of the deviation, so a narrow resonance that moves or changes
// height is caught. Nets that the reduction joined away are compared under
// the name they took where that is known, else skipped with a note. A
// transfer that no net other than AC ground joins to its input in either
// circuit is zero in both by structure: it is counted in a note, not swept.
func Compare(orig, reduced *graph.Circuit, o CompareOptions) (*Report, error) {
	if o.TolDB <= 0 {
		o.TolDB = DefaultTolDB
	}
	if o.TolDeg <= 0 {
		o.TolDeg = DefaultTolDeg
	}
	if o.Points <= 0 {
		o.Points = 100
	}
	rep := &Report{TolDB: o.TolDB, TolDeg: o.TolDeg, OK: true, Pairs: []Pair{}, nearTies: o.AboveRounding}
	reduced = withDetectorLoads(orig, reduced)
	qs := quantities(orig, reduced, rep)
	dc := [2]*dcShare{{}, {}}
	qs = withoutHeldPorts(orig, qs, o.Options, rep, dc[0])
	qs = withoutRails(orig, qs, rep)
	if len(qs) == 0 {
		rep.Notes = append(rep.Notes, "the circuit declares no inputs, outputs or ports: nothing to compare")
		rep.OK = false
		return rep, nil
	}
	settings := []setting{{label: ""}}
	if hasVariable(orig) || hasVariable(reduced) {
		if o.VarSet {
			settings = []setting{{label: strconv.FormatFloat(o.VarFrac, 'g', 4, 64), frac: o.VarFrac}}
		} else {
			settings = []setting{{"min", 0}, {"mid", 0.5}, {"max", 1}}
		}
	}
	cp := &comparer{o: o, settings: settings, marks: append(landmarks(orig), landmarks(reduced)...),
		circuits: [2]*graph.Circuit{orig, reduced}, dc: dc, models: map[modelKey]*modelOrErr{}, swept: map[sweepKey]pairResult{},
		flying: map[sweepKey]chan struct{}{}}
	cp.plan = planKey(o, cp.marks)
	var silent []string
	for i, r := range cp.runQuantities(qs) {
		q, worst, out, err := qs[i], r.worst, r.out, r.err
		switch {
		case err != nil:
			return nil, err
		case out == outOpen:
			rep.Notes = append(rep.Notes, fmt.Sprintf("%s is not compared: nothing in the small-signal model loads %s (an open input)", worst.Label(), q.from))
			continue
		case out == outSilent:
			silent = append(silent, worst.Label())
			continue
		}
		worst.Bands = bandsText(q.bands)
		if !worst.Within(o.TolDB, o.TolDeg) {
			rep.OK = false
		}
		if q.what == "transfer" || q.tank {
			rep.Characteristic++
		}
		rep.Pairs = append(rep.Pairs, worst)
	}
	o.Memo.keepSweeps(cp.swept) // every quantity ran: their sweeps are the loop's
	if len(silent) > 0 {
		rep.Notes = append(rep.Notes, silentNote(silent))
	}
	if rep.Empty() {
		rep.OK = false
		rep.Notes = append(rep.Notes, NothingComparable)
	}
	sort.Strings(rep.Notes)
	return rep, nil
}

// silentNote counts the transfers left out because no net that is not AC
// ground leads from the input to the output in either circuit: both are
// zero by the circuits' structure, at every frequency and setting.
func silentNote(labels []string) string {
	const show = 4
	list := strings.Join(labels[:min(show, len(labels))], ", ")
	if len(labels) > show {
		list += fmt.Sprintf(" and %d more", len(labels)-show)
	}
	return fmt.Sprintf("%d transfer(s) not compared: no net other than AC ground or a held input joins the input to the output in either circuit, so both are zero (%s)", len(labels), list)
}

// outcome says what became of one quantity.
type outcome int

const (
	outCompared outcome = iota
	outOpen             // an impedance at a net nothing loads
	outSilent           // a transfer zero by structure in both circuits
)

type modelKey struct{ circuit, setting int }

type modelOrErr struct {
	m   *model
	err error
}

// comparer holds what every quantity of one comparison shares: the gang
// settings, the landmark frequencies and each circuit elaborated once per
// setting.
type comparer struct {
	o        CompareOptions
	settings []setting
	marks    []float64
	circuits [2]*graph.Circuit
	dc       [2]*dcShare // each circuit's DC view, the same at every setting
	models   map[modelKey]*modelOrErr
	mu       sync.Mutex // swept and flying, when quantities run side by side
	swept    map[sweepKey]pairResult
	flying   map[sweepKey]chan struct{} // sweeps under way, closed when done (claim)
	plan     string                     // planKey of the options and marks
}

// probe builds the probe of a quantity in circuit ci (0 original, 1 reduced)
// at setting si, with the memo's responses of its system.
func (cp *comparer) probe(ci, si int, what, from, to string) (*probe, error) {
	p, err := cp.newProbe(ci, si, what, from, to)
	if err == nil && cp.o.Memo != nil {
		cp.o.Memo.attach(ci, p)
	}
	return p, err
}

// newProbe is probe without the memo.
func (cp *comparer) newProbe(ci, si int, what, from, to string) (*probe, error) {
	k := modelKey{ci, si}
	me := cp.models[k]
	if me == nil {
		opt := cp.o.Options
		opt.VarFrac, opt.VarSet = cp.settings[si].frac, true
		m, err := newModel(cp.circuits[ci], opt, cp.dc[ci])
		me = &modelOrErr{m, err}
		cp.models[k] = me
	}
	if me.err != nil {
		return nil, me.err
	}
	return newProbeOpt(me.m, what, from, to, cp.o.ReadPieces)
}

// quantity sweeps one quantity at every setting and returns its worst pair;
// get gives it the probes (comparer.probe, or ones built ahead).
func (cp *comparer) quantity(q quantity, get func(ci, si int, what, from, to string) (*probe, error)) (Pair, outcome, error) {
	o := cp.o
	worst := Pair{From: q.from, To: q.to, What: q.what}
	bestScore := -1.0
	silent := 0
	for si, st := range cp.settings {
		po, err := get(0, si, q.what, q.from, q.to)
		var fe *FloatingError
		if err != nil && q.what == "impedance" && errors.As(err, &fe) && contains(fe.Nets, q.from) {
			// Nothing loads the net (an input into a grid alone): its
			// impedance is unbounded in the model and there is nothing to compare.
			return worst, outOpen, nil
		}
		if err != nil {
			return worst, outCompared, fmt.Errorf("original circuit: %s: %w", worst.Label(), err)
		}
		pr, err := get(1, si, q.what, q.rFrom, q.rTo)
		if err != nil {
			worst.Error = "reduced circuit cannot be solved: " + err.Error()
			worst.Setting = st.label
			return worst, outCompared, nil
		}
		if po.silent && pr.silent {
			silent++
			continue
		}
		p, err := cp.sweep(po, pr, q.bands)
		po.release()
		pr.release()
		if err != nil {
			if p.origFailed {
				return worst, outCompared, fmt.Errorf("original circuit: %s: %w", worst.Label(), err)
			}
			worst.Error = "reduced circuit cannot be solved: " + err.Error()
			worst.Setting = st.label
			return worst, outCompared, nil
		}
		p.From, p.To, p.What, p.Setting = q.from, q.to, q.what, st.label
		if s := p.score(o.TolDB, o.TolDeg); s > bestScore {
			bestScore, worst = s, p.Pair
		}
	}
	if silent == len(cp.settings) {
		return worst, outSilent, nil
	}
	return worst, outCompared, nil
}

// withoutHeldPorts drops the quantities at port nets the model holds at
// 0 V (portHeldNets: a group reached only through its ports) and says so:
// both circuits would show zero there, which compares nothing.
func withoutHeldPorts(orig *graph.Circuit, qs []quantity, o Options, rep *Report, dc *dcShare) []quantity {
	nl, err := elaborateShared(orig, o, dc)
	if err != nil || len(nl.portHeld) == 0 {
		return qs // an elaboration error is reported by the probes with its context
	}
	via := "a port"
	if len(nl.heldVia) > 0 { // an inlet, a fuse: parts the model leaves open
		via = "a port or " + strings.Join(nl.heldVia, ", ") + ", which the model leaves open"
	}
	rep.Notes = append(rep.Notes, fmt.Sprintf("Held at 0 V: net(s) %s, reached only through %s (the source or reference beyond it, undriven; state a termination to model it otherwise)",
		strings.Join(nl.portHeld, ", "), via))
	out := qs[:0]
	for _, q := range qs {
		held := q.from
		if !contains(nl.portHeld, held) {
			held = q.to
		}
		if contains(nl.portHeld, held) {
			label := Pair{From: q.from, To: q.to, What: q.what}.Label()
			rep.Notes = append(rep.Notes, fmt.Sprintf("%s is not compared: %s is held at 0 V", label, held))
			continue
		}
		out = append(out, q)
	}
	sort.Strings(rep.Notes)
	return out
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
