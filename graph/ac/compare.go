package ac

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"sort"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/device"
	"pare/graph/value"
)

// CompareOptions sets the tolerance and resolution of an equivalence check.
type CompareOptions struct {
	TolDB, TolDeg float64 // 0 means 0.5 dB and 5° (common practice for a redrawn circuit)
	Points        int     // log-spaced points per band before refinement; 0 means 100
	Options               // device settings; with VarSet false, gangs are checked at min, mid and max
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
}

// Worst returns the pair furthest outside (or nearest to) the tolerance.
func (r *Report) Worst() (Pair, bool) {
	best, bestScore := -1, -1.0
	for i, p := range r.Pairs {
		s := p.score(r.TolDB, r.TolDeg)
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
	if r.OK {
		return nil
	}
	w, _ := r.Worst()
	return &ToleranceError{Pair: w, TolDB: r.TolDB, TolDeg: r.TolDeg}
}

// quantity is one thing to compare: a transfer from→to, or an impedance at from.
type quantity struct {
	what     string
	from, to string // names in the original
	rFrom    string // names in the reduced circuit
	rTo      string
	bands    []value.Range
}

// Compare sweeps the original and the reduced circuit over their bands of
// interest and reports the worst deviation of each transfer (every declared
// input to every output, and each region's input to its output) and of the
// driving-point impedance at each input and port. Each band is swept at
// Points log-spaced frequencies, then refined around the peaks of each
// response and of the deviation, so a narrow resonance that moves or changes
// height is caught. Nets that the reduction joined away are compared under
// the name they took where that is known, else skipped with a note.
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
	rep := &Report{TolDB: o.TolDB, TolDeg: o.TolDeg, OK: true, Pairs: []Pair{}}
	qs := quantities(orig, reduced, rep)
	qs = withoutHeldPorts(orig, qs, o.Options, rep)
	if len(qs) == 0 {
		rep.Notes = append(rep.Notes, "the circuit declares no inputs, outputs or ports: nothing to compare")
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
	marks := append(landmarks(orig), landmarks(reduced)...)
	for _, q := range qs {
		worst := Pair{From: q.from, To: q.to, What: q.what}
		bestScore := -1.0
		skip := false
		for _, st := range settings {
			opt := o.Options
			opt.VarFrac, opt.VarSet = st.frac, true
			po, err := newProbe(orig, q.what, q.from, q.to, opt)
			var fe *FloatingError
			if err != nil && q.what == "impedance" && errors.As(err, &fe) && contains(fe.Nets, q.from) {
				// Nothing loads the net (an input into a grid alone): its
				// impedance is unbounded in the model and there is nothing to compare.
				skip = true
				break
			}
			if err != nil {
				return nil, fmt.Errorf("original circuit: %s: %w", worst.Label(), err)
			}
			pr, err := newProbe(reduced, q.what, q.rFrom, q.rTo, opt)
			if err != nil {
				worst.Error = "reduced circuit cannot be solved: " + err.Error()
				worst.Setting = st.label
				break
			}
			p, err := sweepPair(po, pr, q.bands, o.Points, o.TolDB, o.TolDeg, marks)
			if err != nil {
				if p.origFailed {
					return nil, fmt.Errorf("original circuit: %s: %w", worst.Label(), err)
				}
				worst.Error = "reduced circuit cannot be solved: " + err.Error()
				worst.Setting = st.label
				break
			}
			p.From, p.To, p.What, p.Setting = q.from, q.to, q.what, st.label
			if s := p.score(o.TolDB, o.TolDeg); s > bestScore {
				bestScore, worst = s, p.Pair
			}
		}
		if skip {
			rep.Notes = append(rep.Notes, fmt.Sprintf("%s is not compared: nothing in the small-signal model loads %s (an open input)", worst.Label(), q.from))
			continue
		}
		if !worst.Within(o.TolDB, o.TolDeg) {
			rep.OK = false
		}
		rep.Pairs = append(rep.Pairs, worst)
	}
	sort.Strings(rep.Notes)
	return rep, nil
}

// withoutHeldPorts drops the quantities at port nets the model holds at
// 0 V (portHeldNets: a group reached only through its ports) and says so:
// both circuits would show zero there, which compares nothing.
func withoutHeldPorts(orig *graph.Circuit, qs []quantity, o Options, rep *Report) []quantity {
	nl, err := elaborate(orig, o)
	if err != nil || len(nl.portHeld) == 0 {
		return qs // an elaboration error is reported by the probes with its context
	}
	rep.Notes = append(rep.Notes, fmt.Sprintf("Held at 0 V: net(s) %s, reached only through a port (the source or reference beyond it, undriven; state a termination to model it otherwise)",
		strings.Join(nl.portHeld, ", ")))
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

// landmarks are frequencies worth a sweep point of their own: the named
// frequencies of the circuit (its IF) and each crystal's series and parallel
// resonance, whose width (a few hertz at Q 50 000) slips between the points
// of any log grid.
func landmarks(c *graph.Circuit) []float64 {
	var out []float64
	names := make([]string, 0, len(c.Freqs))
	for n := range c.Freqs {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		if f := c.Freqs[n]; f > 0 {
			out = append(out, f)
		}
	}
	for _, p := range c.Parts {
		if p.Kind != graph.Crystal {
			continue
		}
		_, lm, cm, c0, err := device.Crystal(p)
		if err != nil {
			continue
		}
		fs := 1 / (2 * math.Pi * math.Sqrt(lm*cm))
		out = append(out, fs)
		if c0 > 0 {
			out = append(out, fs*math.Sqrt(1+cm/c0))
		}
	}
	return out
}

type setting struct {
	label string
	frac  float64
}

func hasVariable(c *graph.Circuit) bool {
	for _, p := range c.Parts {
		if p.Kind == graph.Capacitor && p.Type == graph.CapVariable {
			return true
		}
	}
	return false
}

// bandsOf lists the circuit's default band and every region's band.
func bandsOf(c *graph.Circuit) []value.Range {
	var out []value.Range
	out = addBand(out, c.Band)
	for _, r := range c.Regions {
		out = addBand(out, r.Band)
	}
	return out
}

// addBand appends a valid band that is not in the list yet.
func addBand(list []value.Range, b value.Range) []value.Range {
	if b.Min <= 0 || b.Max < b.Min {
		return list
	}
	for _, x := range list {
		if x == b {
			return list
		}
	}
	return append(list, b)
}

// netBands returns, for a net, the bands the signal on it lives in: the band
// of every region that holds the net (names it as input, output or in its
// nets, or has a part on it), and the default band when a part on it belongs
// to no region. Port parts do not count: a port is where the sheet was cut,
// and it carries whatever the net carries. A small-signal transfer keeps frequency, so a transfer is
// judged over its input's bands and an impedance over its net's: the IF
// input of a strip is not asked to behave at audio frequencies, where its
// bypass capacitors were never meant to bypass.
func netBands(c *graph.Circuit) func(net string) []value.Range {
	all := bandsOf(c)
	conns := c.Conns()
	return func(net string) []value.Range {
		var out []value.Range
		for _, r := range c.Regions {
			if r.Input == net || r.Output == net {
				out = addBand(out, r.Band)
			}
			for _, n := range r.Nets {
				if n == net {
					out = addBand(out, r.Band)
				}
			}
		}
		for _, cn := range conns[net] {
			if cn.Part.Kind != graph.Port {
				out = addBand(out, c.BandOf(cn.Part))
			}
		}
		if len(out) == 0 {
			return all
		}
		sort.Slice(out, func(i, j int) bool {
			if out[i].Min != out[j].Min {
				return out[i].Min < out[j].Min
			}
			return out[i].Max < out[j].Max
		})
		return out
	}
}

// quantities lists what to compare, mapping each net to its name in the
// reduced circuit and noting what cannot be mapped.
func quantities(orig, reduced *graph.Circuit, rep *Report) []quantity {
	bandsAt := netBands(orig)
	var qs []quantity
	seen := map[string]bool{}
	mapped := func(name string, alt func() string) (string, bool) {
		if reduced.Net(name) != nil {
			return name, true
		}
		if a := alt(); a != "" && reduced.Net(a) != nil {
			rep.Notes = append(rep.Notes, fmt.Sprintf("net %s is %s in the reduced circuit: compared there", name, a))
			return a, true
		}
		rep.Notes = append(rep.Notes, fmt.Sprintf("net %s of the original is gone from the reduced circuit: its pairs are not compared", name))
		return "", false
	}
	at := func(list []string, i int) func() string {
		return func() string {
			if len(list) == len(orig.Inputs) && list != nil && i < len(list) {
				return list[i]
			}
			return ""
		}
	}
	atOut := func(i int) func() string {
		return func() string {
			if len(reduced.Outputs) == len(orig.Outputs) && i < len(reduced.Outputs) {
				return reduced.Outputs[i]
			}
			return ""
		}
	}
	none := func() string { return "" }
	add := func(q quantity) {
		key := q.what + "\x00" + q.from + "\x00" + q.to
		if seen[key] || len(q.bands) == 0 {
			return
		}
		seen[key] = true
		qs = append(qs, q)
	}
	for i, in := range orig.Inputs {
		rin, ok := mapped(in, at(reduced.Inputs, i))
		if !ok {
			continue
		}
		for j, out := range orig.Outputs {
			if out == in {
				continue
			}
			rout, ok := mapped(out, atOut(j))
			if ok {
				add(quantity{what: "transfer", from: in, to: out, rFrom: rin, rTo: rout, bands: bandsAt(in)})
			}
		}
	}
	for _, r := range orig.Regions {
		if r.Input == "" || r.Output == "" || r.Input == r.Output || r.Band.Min <= 0 {
			continue
		}
		rr := reduced.Region(r.Name)
		rin, ok1 := mapped(r.Input, func() string {
			if rr != nil {
				return rr.Input
			}
			return ""
		})
		rout, ok2 := mapped(r.Output, func() string {
			if rr != nil {
				return rr.Output
			}
			return ""
		})
		if ok1 && ok2 {
			add(quantity{what: "transfer", from: r.Input, to: r.Output, rFrom: rin, rTo: rout, bands: []value.Range{r.Band}})
		}
	}
	// Impedance at each input and each port that is not a declared rail.
	var ports []string
	ports = append(ports, orig.Inputs...)
	for _, n := range orig.Nets {
		if n.Role == graph.PortN {
			ports = append(ports, n.Name)
		}
	}
	for _, p := range orig.Parts {
		if p.Kind == graph.Port {
			for _, pin := range p.Pins {
				ports = append(ports, pin.Net)
			}
		}
	}
	portSeen := map[string]bool{}
	for i, net := range ports {
		if portSeen[net] || !usable(net) || orig.RoleOf(net).IsACGround() {
			continue
		}
		portSeen[net] = true
		alt := none
		if i < len(orig.Inputs) {
			alt = at(reduced.Inputs, i)
		}
		if rn, ok := mapped(net, alt); ok {
			add(quantity{what: "impedance", from: net, rFrom: rn, bands: bandsAt(net)})
		}
	}
	sort.Strings(rep.Notes)
	rep.Notes = dedupeStrings(rep.Notes)
	return qs
}

func dedupeStrings(s []string) []string {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}

// probe evaluates one response of one circuit at any frequency.
type probe struct {
	s         *system
	node      int
	impedance bool
	zero      bool // the net is AC ground: the response is 0
}

func newProbe(c *graph.Circuit, what, from, to string, o Options) (*probe, error) {
	nl, err := elaborate(c, o)
	if err != nil {
		return nil, err
	}
	fromNode, err := nodeOf(c, nl, from)
	if err != nil {
		return nil, err
	}
	if what == "impedance" {
		if fromNode == 0 {
			return &probe{zero: true}, nil
		}
		s, err := newSystem(nl, -1, otherInputs(c, nl, fromNode)...)
		if err != nil {
			return nil, err
		}
		if s.unk[fromNode] < 0 {
			return nil, fmt.Errorf("net %s is not connected to any part the small-signal model sees", from)
		}
		return &probe{s: s, node: fromNode, impedance: true}, nil
	}
	if fromNode == 0 {
		return nil, fmt.Errorf("input %s is at AC ground: it cannot be driven", from)
	}
	toNode, err := nodeOf(c, nl, to)
	if err != nil {
		return nil, err
	}
	s, err := newSystem(nl, fromNode, otherInputs(c, nl, fromNode)...)
	if err != nil {
		return nil, err
	}
	if toNode != 0 && toNode != fromNode && s.unk[toNode] < 0 {
		return nil, fmt.Errorf("output %s is not connected to any part the small-signal model sees", to)
	}
	return &probe{s: s, node: toNode}, nil
}

func (p *probe) at(f float64) (complex128, error) {
	if p.zero {
		return 0, nil
	}
	if err := p.s.solveAt(f); err != nil {
		return 0, err
	}
	if p.impedance {
		for i := range p.s.b {
			p.s.b[i] = 0
		}
		p.s.b[p.s.unk[p.node]] = 1
	}
	if err := p.s.solveRHS(f); err != nil {
		return 0, err
	}
	return p.s.voltage(p.node), nil
}

type pairResult struct {
	Pair
	origFailed bool
}

// sweepPair runs the coarse sweep and the refinement for one quantity.
func sweepPair(po, pr *probe, bands []value.Range, points int, tolDB, tolDeg float64, marks []float64) (pairResult, error) {
	var freqs []float64
	for _, b := range bands {
		freqs = append(freqs, logSweep(b.Min, b.Max, points)...)
		// Resonances too narrow for any grid (a crystal's) are visited
		// directly, with a point either side for the refinement to work on.
		for _, f := range marks {
			if f >= b.Min && f <= b.Max {
				freqs = append(freqs, f*(1-1e-6), f, f*(1+1e-6))
			}
		}
	}
	freqs = sortUnique(freqs)
	ho := map[float64]complex128{}
	hr := map[float64]complex128{}
	eval := func(fs []float64) (bool, error) {
		for _, f := range fs {
			if _, done := ho[f]; done {
				continue
			}
			a, err := po.at(f)
			if err != nil {
				return true, err
			}
			b, err := pr.at(f)
			if err != nil {
				return false, err
			}
			ho[f], hr[f] = a, b
		}
		return false, nil
	}
	if origFailed, err := eval(freqs); err != nil {
		return pairResult{origFailed: origFailed}, err
	}
	// Refine around the peaks of each response and of the deviation.
	const rounds, maxPeaks, per = 5, 10, 4
	for round := 0; round < rounds; round++ {
		var add []float64
		mo := make([]float64, len(freqs))
		mr := make([]float64, len(freqs))
		for i, f := range freqs {
			mo[i], mr[i] = cmplx.Abs(ho[f]), cmplx.Abs(hr[f])
		}
		floor := floorOf(mo, mr)
		dd := make([]float64, len(freqs))
		dp := make([]float64, len(freqs))
		for i, f := range freqs {
			dd[i], dp[i] = deviationFloor(ho[f], hr[f], floor)
		}
		for _, m := range [][]float64{mo, mr, dd, dp} {
			for _, i := range peaks(m, maxPeaks) {
				if i > 0 {
					add = append(add, logSweepInner(freqs[i-1], freqs[i], per)...)
				}
				if i < len(freqs)-1 {
					add = append(add, logSweepInner(freqs[i], freqs[i+1], per)...)
				}
			}
		}
		if len(add) == 0 {
			break
		}
		if origFailed, err := eval(add); err != nil {
			return pairResult{origFailed: origFailed}, err
		}
		freqs = sortUnique(append(freqs, add...))
	}
	mo := make([]float64, len(freqs))
	mr := make([]float64, len(freqs))
	for i, f := range freqs {
		mo[i], mr[i] = cmplx.Abs(ho[f]), cmplx.Abs(hr[f])
	}
	floor := floorOf(mo, mr)
	var res pairResult
	best := -1.0
	for _, f := range freqs {
		d, p := deviationFloor(ho[f], hr[f], floor)
		res.MaxDB = math.Max(res.MaxDB, d)
		res.MaxDeg = math.Max(res.MaxDeg, p)
		// The frequency reported is where the larger of the two deviations,
		// each against its tolerance, peaks.
		if s := math.Max(d/tolDB, p/tolDeg); s > best {
			best, res.AtHz = s, f
		}
	}
	return res, nil
}

// floorOf is the level floorDB below the larger response's peak.
func floorOf(mo, mr []float64) float64 {
	peak := 0.0
	for i := range mo {
		peak = math.Max(peak, math.Max(mo[i], mr[i]))
	}
	f := peak * math.Pow(10, -floorDB/20)
	if f == 0 {
		f = math.SmallestNonzeroFloat64
	}
	return f
}

// deviationFloor is the dB and degree difference between two responses, with
// magnitudes measured against the floor so a null does not dominate.
func deviationFloor(a, b complex128, floor float64) (dB, deg float64) {
	ma, mb := cmplx.Abs(a), cmplx.Abs(b)
	if ma == 0 && mb == 0 {
		return 0, 0
	}
	dB = math.Abs(20 * math.Log10(math.Max(mb, floor)/math.Max(ma, floor)))
	if ma > floor && mb > floor {
		deg = phaseDiff(a, b)
	}
	return dB, deg
}

// phaseDiff is |arg b − arg a| in degrees, wrapped into 0..180. (Taking the
// phase of b/a instead leaves rounding noise when a == b.)
func phaseDiff(a, b complex128) float64 {
	d := math.Abs(cmplx.Phase(b) - cmplx.Phase(a))
	if d > math.Pi {
		d = 2*math.Pi - d
	}
	return d * 180 / math.Pi
}

// peaks returns the indices of the largest local maxima of m (ends count),
// at most n of them, largest first, ties by index.
func peaks(m []float64, n int) []int {
	var idx []int
	for i := range m {
		left := i == 0 || m[i] >= m[i-1]
		right := i == len(m)-1 || m[i] >= m[i+1]
		if left && right && m[i] > 0 {
			idx = append(idx, i)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return m[idx[a]] > m[idx[b]] })
	if len(idx) > n {
		idx = idx[:n]
	}
	return idx
}

// logSweep returns n log-spaced frequencies from lo to hi inclusive.
func logSweep(lo, hi float64, n int) []float64 {
	if n < 2 || hi <= lo {
		return []float64{lo}
	}
	out := make([]float64, n)
	r := math.Log(hi / lo)
	for i := range out {
		out[i] = lo * math.Exp(r*float64(i)/float64(n-1))
	}
	out[n-1] = hi
	return out
}

// logSweepInner returns n log-spaced frequencies strictly between lo and hi.
func logSweepInner(lo, hi float64, n int) []float64 {
	if hi <= lo {
		return nil
	}
	out := make([]float64, 0, n)
	r := math.Log(hi / lo)
	for i := 1; i <= n; i++ {
		f := lo * math.Exp(r*float64(i)/float64(n+1))
		if f > lo && f < hi {
			out = append(out, f)
		}
	}
	return out
}

func sortUnique(f []float64) []float64 {
	slices.Sort(f)
	return slices.Compact(f)
}

// BandsOf returns the bands of interest of the signal on a net (see
// netBands): the regions that hold it, or the default band. Sweeps use it to
// choose their span.
func BandsOf(c *graph.Circuit, net string) []value.Range { return netBands(c)(net) }

// FormatHz prints a frequency for a report: "818 kHz", "1.17 MHz".
func FormatHz(f float64) string { return value.Format(f, value.Hertz, value.Symbol) }
