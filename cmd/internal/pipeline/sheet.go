package pipeline

import (
	"math"
	"pare/cmd/internal/align"
	"strings"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/figure"
	"pare/internal/par"
	"pare/render"
)

// Sheet is one drawn view: what was drawn and the SVG it gave, one per
// page (SVG is the first), and the paper it was cut onto (nil: one sheet
// as wide as the drawing).
type Sheet struct {
	View  render.View
	Sheet *render.Sheet
	SVG   []byte
	Pages [][]byte
	Paper *render.Paper
	// TextMM is the height on paper of each page's smallest text
	// (render.MinTextMM, less on a page holding a stage too big for the
	// paper); nil for one sheet as wide as its drawing.
	TextMM []float64
}

// SheetFor returns the drawn sheet of a view, or nil if it was not asked for.
func (r *Result) SheetFor(v render.View) *Sheet {
	for i := range r.Sheets {
		if r.Sheets[i].View == v {
			return &r.Sheets[i]
		}
	}
	return nil
}

// drawSheets lays out and draws each view asked for. The views share
// nothing they write (each is assembled and laid out afresh from the
// result, which they only read), so they are drawn side by side on the
// processors free (par.Do) and kept in the order asked, the first
// failure in that order reported: the sheets are the same whatever ran
// first.
func (r *Result) drawSheets(o Options) error {
	for _, c := range []*graph.Circuit{r.Circuit, r.Reduced} {
		if c != nil {
			c.Index() // built on first use, which is not safe side by side
		}
	}
	sheets := make([]Sheet, len(o.Views))
	errs := make([]error, len(o.Views))
	par.Do(len(o.Views), func(i int) {
		sheets[i], errs[i] = drawView(r.Sheet(o.Views[i]), o)
	})
	for i, v := range o.Views {
		if errs[i] != nil {
			return &Error{Phase: PhaseSheets, View: v, Err: errs[i]}
		}
		r.Sheets = append(r.Sheets, sheets[i])
	}
	return nil
}

// drawView draws one view: on o.Page when one is asked for; with o.Fit,
// as one sheet when it is small enough (FitWidths), else on Fit's pages (a
// whole set's sheet is one very long row, which no printer takes and no
// screen shows at a readable size); else as one sheet.
func drawView(s *render.Sheet, o Options) (Sheet, error) {
	sh := Sheet{View: s.View, Sheet: s, Paper: o.Page}
	cfg := render.Config{Style: o.Style, Page: o.Page}
	var pages [][]byte
	var mm []float64
	var err error
	if o.Page == nil && o.Fit != nil {
		var paged bool
		if pages, mm, paged, err = cfg.FprintFitPages(s, o.Fit, FitWidths); paged {
			cfg.Page, sh.Paper = o.Fit, o.Fit
		}
	} else {
		pages, mm, err = cfg.FprintPagesText(s)
	}
	if err != nil {
		return sh, err
	}
	sh.SVG, sh.Pages = pages[0], pages
	if cfg.Page != nil {
		sh.TextMM = mm
	}
	return sh, nil
}

// Sheet fills the sheet of a view from the result: the one place a sheet is
// assembled. The reduced view shows the reduced circuit; the full and faded
// views the original, the faded one with the removed parts faded and the
// merged ones marked. Stage frames hold the parts each stage stands for on
// the circuit drawn.
func (r *Result) Sheet(v render.View) *render.Sheet {
	c, reduced := r.Circuit, r.Reduced
	items := furniture(c, r.Stages, r.Level)
	s := &render.Sheet{
		Title: r.Title, View: v, Caution: r.Caution.Sheet(v == render.Reduced),
		Furniture: furnitureText(items),
	}
	switch v {
	case render.Reduced:
		frames := stageFrames(r.Stages, reduced, nil)
		drawn, split := r.withDividersApart(r.withSupplyReturns(reduced), frames)
		s.Circuit = withoutIdleWindings(r.withLineVolts(drawn))
		s.Frames = tankFrames(framesApart(frames, split, drawn), s.Circuit)
		_, merged := FadedAndMerged(c, reduced)
		s.Ties, s.TieLabels = r.staticTies(c, reduced)
		s.Presets = presets(c, merged)
	case render.Full, render.Faded:
		// one sheet for both: render lays the full view out with the
		// faded parts known and draws it plain, so the faded view is the
		// same layout greyed where the reduction took parts away
		c = r.withDerivedRails(c, stageFrames(r.Stages, reduced, c))
		s.Circuit = c
		s.Frames = tankFrames(stageFrames(r.Stages, reduced, c), c)
		s.Faded, s.Merged = FadedAndMerged(c, reduced)
		s.FadedPins = droppedPins(c, reduced)
		s.Quiet = quietNets(c, r.Log)
		s.Circuit = withHeaterJunctions(supplyRailsWired(c, s.Frames, s.Faded))
		s.PinVolts = r.electrodeVolts()
		s.Ties = cathodeStraps(c)
	}
	s.Marks = r.alignMarks(v)
	s.Legend = legend(items, s.Circuit, reduced, v == render.Reduced)
	if len(s.PinVolts) > 0 {
		s.Furniture = append(s.Furniture, PinLegend)
		s.Legend = append(s.Legend, render.Legend{Text: PinLegend})
	}
	return s
}

// PinLegend is the sheet legend's line for the pin figures: they are the
// operating point itself, not what a meter shows (a 20 kΩ/V meter reads
// a grid behind its leak far lower: pare dc --meter 20k/V gives that), and
// with the oscillators stopped (docs/dc.md).
const PinLegend = "Pin figures: DC volts to chassis, ideal meter, oscillators stopped"

// AlignReaches are the alignment's reach searches on the circuit as
// captured, shared by every guide made of it in this run (nil when the
// result was not made by Run: each guide searches afresh).
func (r *Result) AlignReaches() *align.Reaches { return r.reaches }

// alignMarks are the alignment steps at each part drawn on the view
// (cmd/internal/align numbers them on the circuit as captured); on the
// reduced view a part merged into another is marked on the one it went
// into.
func (r *Result) alignMarks(v render.View) map[string]string {
	if r.Stages == nil {
		return nil
	}
	if v != render.Reduced {
		// the original shows every band's trimmers: their marks too, from
		// the other bands' runs (a band's own parts are switched out of the
		// reduced circuit and not on the reduced view)
		return r.reaches.Marks(r.Circuit, r.Stages, r.BandRun)
	}
	marks := r.reaches.Marks(r.Circuit, r.Stages, nil)
	if len(marks) == 0 {
		return marks
	}
	_, merged := FadedAndMerged(r.Circuit, r.Reduced)
	out := map[string]string{}
	for _, p := range r.Circuit.Parts { // circuit order: a merged pair's marks join in order
		m, ok := marks[p.Ref]
		if !ok {
			continue
		}
		to := p.Ref
		if t, ok := merged[p.Ref]; ok {
			// a trimmer or padder merged into its gang section: the mark
			// names it, "align 5 (TC2)", so the step still says what to turn
			to, m = t, m+" ("+p.Ref+")"
		}
		if r.Reduced.Part(to) == nil {
			continue // removed by the reduction: nothing to mark on this view
		}
		if prev := out[to]; prev != "" {
			m = prev + ", " + strings.TrimPrefix(m, "align ")
		}
		out[to] = m
	}
	return out
}

// FadedAndMerged compares the original with the reduced circuit through the
// reduced parts' origins: an original part no reduced part stands for was
// removed (faded); one that a reduced part of another ref stands for was
// merged into it.
func FadedAndMerged(orig, reduced *graph.Circuit) (map[string]bool, map[string]string) {
	kept := map[string]bool{}
	merged := map[string]string{}
	for _, rp := range reduced.Parts {
		for _, o := range rp.Origins() {
			kept[o] = true
			if o != rp.Ref {
				merged[o] = rp.Ref
			}
		}
	}
	faded := map[string]bool{}
	for _, p := range orig.Parts {
		if !kept[p.Ref] {
			faded[p.Ref] = true
		}
	}
	return faded, merged
}

// droppedPins are, per part the reduction kept under its own ref, the pins
// its reduced form no longer uses: gone (a valve's heaters, its shield) or
// left on the not-connected net (a screen or suppressor made static).
func droppedPins(orig, reduced *graph.Circuit) map[string]map[string]bool {
	out := map[string]map[string]bool{}
	for _, p := range orig.Parts {
		rp := reduced.Part(p.Ref)
		if rp == nil {
			continue
		}
		on := map[string]string{}
		for _, pn := range rp.Pins {
			on[pn.Name] = pn.Net
		}
		for _, pn := range p.Pins {
			if n, ok := on[pn.Name]; (!ok || n == graph.NotConnected) && pn.Net != graph.NotConnected {
				if out[p.Ref] == nil {
					out[p.Ref] = map[string]bool{}
				}
				out[p.Ref][pn.Name] = true
			}
		}
	}
	return out
}

// electrodeVolts gives each active part's electrode voltages for the full
// and faded sheets, the trade's small figures beside each pin of the valve
// or transistor ("229" at the anode, in volts). A grid strapped to the cathode (a
// suppressor) is not repeated, nor a second pin on a net already marked,
// nor a pin on chassis or a rail.
// Nil when the operating point was not found: the sheet is then drawn
// without figures.
func (r *Result) electrodeVolts() map[string]map[string]string {
	if r.DC == nil {
		return nil
	}
	out := map[string]map[string]string{}
	running := r.oscillatingValves()
	for _, p := range r.DC.Circuit.Parts {
		if !p.IsActive() {
			continue
		}
		pins := map[string]string{}
		seen := map[string]bool{}
		common := p.NetOf(p.PinWithRole(graph.RoleCommon))
		for _, pin := range p.Pins {
			role := graph.RoleOfPin(p.Kind, pin.Name)
			strapped := pin.Net == common && role != graph.RoleCommon
			// A pin on chassis or a rail needs no figure: the rail symbol
			// at it says its voltage.
			railed := r.DC.Circuit.RoleOf(pin.Net).IsACGround()
			// A running valve oscillator's grid charges its grid capacitor
			// to a negative bias the DC solve, which sees it stopped, gives
			// as 0 V: the figure would mislead, so the grid carries none.
			stopped := running[p.Ref] && role == graph.RoleControl
			if role == graph.RoleHeater || role == graph.RoleShield || strapped || railed || stopped || seen[pin.Net] {
				continue
			}
			seen[pin.Net] = true
			v, _ := r.DC.Volts(pin.Net)
			pins[pin.Name] = shortVolts(v)
		}
		if len(pins) > 0 {
			out[p.Ref] = pins
		}
	}
	r.supplyVolts(out)
	return out
}

// oscillatingValves are the valves whose loop (stages.Loop) reaches 0 dB
// somewhere on the dial: the oscillators that run.
func (r *Result) oscillatingValves() map[string]bool {
	out := map[string]bool{}
	for _, s := range r.Stages {
		for _, l := range s.Loop {
			_, _, _, mMax, ok := l.Range()
			if p := r.Circuit.Part(l.Device); ok && mMax >= 0 && p != nil && p.Kind == graph.Valve {
				out[l.Device] = true
			}
		}
	}
	return out
}

// supplyVolts adds the supply test points' figures (the estimated
// reservoir, the HT after the choke, each decoupled line: dc.Chart's
// supplies) at the pin of each one's smoothing or decoupling capacitor on
// that net; a declared rail's tag says its voltage already.
func (r *Result) supplyVolts(out map[string]map[string]string) {
	ch, err := r.DC.Chart(dc.Meter{})
	if err != nil {
		return
	}
	at := func(capRef, net string, v float64) {
		p := r.DC.Circuit.Part(capRef)
		if p == nil {
			return
		}
		for _, pin := range p.Pins {
			if pin.Net == net {
				if out[capRef] == nil {
					out[capRef] = map[string]string{}
				}
				out[capRef][pin.Name] = shortVolts(v)
			}
		}
	}
	for _, rl := range ch.Rails {
		if e := rl.Estimate; e != nil && !r.DC.Circuit.RoleOf(rl.Net).IsACGround() {
			if cp := dc.GroundCap(r.DC.Circuit, rl.Net); cp != "" {
				at(cp, rl.Net, rl.Volts)
			}
		}
	}
	for _, sp := range ch.Supplies {
		at(sp.Cap, sp.Net, sp.Volts)
	}
}

// shortVolts is a voltage in three figures (more only where the integer
// part needs them, never an exponent), as charts print them, through the
// one formatter of sheet figures.
func shortVolts(v float64) string {
	if math.Abs(v) < 5e-3 {
		return "0"
	}
	return figure.Plain(v)
}
