package stages

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
)

// A self-oscillating mixer found by its loop. A pattern draws one way of
// coupling a converter's oscillator (a tap on the emitter, a link winding);
// a technician sees the class: a device with an oscillator loop, a signal
// input and an output tuned to the IF, whatever winding of the oscillator
// coil carries the feedback (a tap, a separate reaction winding in the
// collector or the oscillator anode, a link to the emitter: windings of one
// transformer are interchangeable where the physics is). The loop gain
// decides that it oscillates; the oscillator coil's windings, followed to
// the device's electrodes, name its topology; the tuned winding and its
// gang section give the tracking, as the mixer pattern's do.

// loopDrawnDB is how far below 0 dB a loop carried by a transformer may
// lie and still be a drawn oscillator that fails to start ("does not
// oscillate as drawn") rather than a stray path: 20 dB, more than any
// winding reversed or a tired valve takes off a working oscillator
// (judgement, common practice).
const loopDrawnDB = -20.0

// windingReach is how many parts (capacitors, windings of other
// transformers) a winding's end may pass through to reach an electrode: a
// grid or link capacitor, the IF transformer's primary in series with a
// reaction winding.
const windingReach = 2

// tankCaps gathers the capacitors that tune a winding between nets a and
// b: those reached from its ends through capacitors alone, never through
// AC ground (where every decoupling capacitor meets) nor into a net an
// active part touches (a grid capacitor leads to the grid, not round the
// tank). A padder in series at either end is taken with its gang section.
func tankCaps(w *world, a, b int) []*graph.Part {
	seen := map[int]bool{a: true, b: true}
	took := map[int]bool{}
	var caps []*graph.Part
	queue := []int{a, b}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		if n == groundNet {
			continue
		}
		for _, ci := range w.conns[n] {
			p := w.parts[ci]
			if p.Kind != graph.Capacitor || len(w.pins[ci]) != 2 || took[ci] {
				continue
			}
			m := w.pins[ci][0]
			if m == n {
				m = w.pins[ci][1]
			}
			if !seen[m] && m != groundNet && touchesActive(w, m) {
				continue
			}
			took[ci] = true
			caps = append(caps, p)
			if !seen[m] {
				seen[m] = true
				queue = append(queue, m)
			}
		}
	}
	return caps
}

func touchesActive(w *world, net int) bool {
	return slices.ContainsFunc(w.conns[net], func(ci int) bool { return w.parts[ci].IsActive() })
}

// reachRole follows a winding's end net through at most windingReach
// capacitors or windings of other parts (never through AC ground nor the
// transformer skip itself) to an electrode of device dev, and returns that
// electrode's role ("" when it reaches none).
func reachRole(w *world, dev, skip int, start int) graph.TermRole {
	frontier, seen := []int{start}, map[int]bool{start: true}
	for hop := 0; hop <= windingReach && len(frontier) > 0; hop++ {
		var next []int
		for _, n := range frontier {
			if n == groundNet {
				continue
			}
			if r := roleOn(w, dev, n); r != "" {
				return r
			}
			for _, ci := range w.conns[n] {
				if ci == skip || ci == dev {
					continue
				}
				for _, m := range passOn(w, ci, n) {
					if !seen[m] {
						seen[m] = true
						next = append(next, m)
					}
				}
			}
		}
		frontier = next
	}
	return ""
}

// roleOn is the role of device dev's terminal on net n, the control
// electrode first.
func roleOn(w *world, dev, n int) graph.TermRole {
	var found graph.TermRole
	for j, net := range w.pins[dev] {
		if net != n {
			continue
		}
		switch r := w.roles[dev][j]; r {
		case graph.RoleControl:
			return r
		case graph.RoleCommon, graph.RoleOutput, graph.RoleGrid:
			if found == "" || r == graph.RoleCommon {
				found = r
			}
		}
	}
	return found
}

// passOn gives the nets part ci leads to from net n: the other end of a
// capacitor, or of the winding of an inductor or transformer on n.
func passOn(w *world, ci, n int) []int {
	p := w.parts[ci]
	switch p.Kind {
	case graph.Capacitor, graph.Inductor:
		if len(w.pins[ci]) == 2 {
			if w.pins[ci][0] == n {
				return []int{w.pins[ci][1]}
			}
			return []int{w.pins[ci][0]}
		}
	case graph.Transformer:
		var out []int
		for _, cl := range w.coils[ci] {
			a, b := w.pinNet(ci, cl.pins[0]), w.pinNet(ci, cl.pins[len(cl.pins)-1])
			switch n {
			case a:
				out = append(out, b)
			case b:
				out = append(out, a)
			}
		}
		return out
	}
	return nil
}

// oscillatorWords names an oscillator's topology from its feedback
// transformer ref: the tuned winding by the electrode it feeds
// ("tuned-{control}"), the others by theirs ("reaction winding" in the
// output or oscillator-anode circuit, "link winding to the {common}").
// The words keep the title's placeholders for expandTitle.
func oscillatorWords(w *world, dev *graph.Part, ref string) string {
	ci := slices.IndexFunc(w.parts, func(p *graph.Part) bool { return p.Ref == ref })
	di, ok := w.index[dev]
	if ci < 0 || !ok {
		return ""
	}
	oc, _, tuned := loopTank(w, ref)
	var tank string
	var others []string
	for _, cl := range w.coils[ci] {
		a, b := w.pinNet(ci, cl.pins[0]), w.pinNet(ci, cl.pins[len(cl.pins)-1])
		role := reachRole(w, di, ci, a)
		if role == "" {
			role = reachRole(w, di, ci, b)
		}
		if tuned && oc.holds(a, b) {
			// A tank of two windings in series (a long-wave extension)
			// takes its word from the one that reaches an electrode.
			if word := windingWord(role, true); tank == "" || word != "tuned-coil" {
				tank = word
			}
		} else if word := windingWord(role, false); word != "" && !slices.Contains(others, word) {
			others = append(others, word)
		}
	}
	if tank == "" {
		tank = "oscillator"
	} else {
		tank += " oscillator"
	}
	if len(others) == 0 {
		return tank
	}
	return tank + " with " + strings.Join(others, " and ")
}

// windingWord is one winding's part in the oscillator.
func windingWord(role graph.TermRole, tank bool) string {
	if tank {
		switch role {
		case graph.RoleControl:
			return "tuned-{control}"
		case graph.RoleOutput, graph.RoleGrid:
			return "tuned-{output}"
		case graph.RoleCommon:
			return "tuned-{common}"
		}
		return "tuned-coil"
	}
	switch role {
	case graph.RoleOutput, graph.RoleGrid:
		return "reaction winding"
	case graph.RoleCommon:
		return "link winding to the {common}"
	case graph.RoleControl:
		return "{control} winding"
	}
	return ""
}

// loopTracking gives a loop-found mixer the tracking figures of the mixer
// pattern (tracking.go): the tuned winding of its feedback transformer and
// its gang section against the signal tank on the other section, in
// circuit and by the formula.
func loopTracking(w *world, st *Stage, dev, through string, ifHz float64) {
	oc, caps, ok := loopTank(w, through)
	if !ok || !(ifHz > 0) {
		return
	}
	scratch := &Stage{}
	// no match to cut a piece round: the piece the feedback transformer
	// stands in, cut only at AC ground (exact), or the whole circuit
	x := &figCtx{w: w, st: scratch, solve: true, oscDev: dev}
	if i := x.partIndex(w.c.Part(through)); i >= 0 {
		x.cut, _ = w.piece([]int{i}, -1, len(w.parts))
	}
	x.tracking(&tankModel{w: w, l: oc.l, a: oc.a, b: oc.b, caps: caps}, oc, ifHz)
	for _, f := range scratch.Figures {
		st.Figures.Put(f)
	}
	st.Flags = append(st.Flags, scratch.Flags...)
	st.Notes = append(st.Notes, scratch.Notes...)
}

// mixerTitle is a loop-found mixer's title: its oscillator's topology from
// the feedback transformer's windings, and the transformer.
func mixerTitle(w *world, dev *graph.Part, through, family string) string {
	if through == "" {
		return expandTitle("Self-oscillating mixer, oscillator feedback through an RC network ({family})", family)
	}
	words := oscillatorWords(w, dev, through)
	if words == "" {
		return expandTitle("Self-oscillating mixer, oscillator feedback through "+through+" ({family})", family)
	}
	return expandTitle("Self-oscillating mixer, "+words+" on "+through+" ({family})", family)
}

// selfOscillating makes a mixer stage the patterns took for one fed by a
// separate oscillator (a heptode's oscillator grid and anode look like an
// injector grid to them) a self-oscillating mixer when its device has an
// oscillator loop of its own carried by a transformer: oscillating, within
// loopDrawnDB of it, or oscillating with the loop turned over (a winding
// connected the wrong way round as captured); the last two are flagged
// "does not oscillate as drawn". A device with no such loop stays an
// injected mixer.
func selfOscillating(w *world, lp *ac.Loops, acg map[string]bool, p *graph.Part, f *found, tops []*found, claimed map[string]*found, gone map[*found]bool) {
	if !p.IsActive() || hasLoop(f.Stage, p.Ref) {
		return
	}
	l, err := loopOf(lp, p.Ref)
	if err != nil {
		return
	}
	if _, _, _, best, ok := l.Range(); ok && best < 0 && sharedLoop(lp, w.c, p.Ref, l) {
		// Short of starting where another device's loop runs: the
		// separate oscillator's tank seen through the mixer it injects
		// into (its link or injection capacitor), so the mixer stays an
		// injected one and the tracking is that oscillator's.
		return
	}
	lc := lp.Circuit()
	through, turned := "", Loop{}
	if _, _, _, best, ok := l.Range(); ok && best >= loopDrawnDB {
		through = feedbackThrough(lc, p.Ref, l)
	} else if t, err := loopTurned(lp, p.Ref, true); err == nil {
		if _, _, _, best, ok := t.Range(); ok && best >= 0 {
			through, turned = carrier(lc, p.Ref, t, true), t
		}
	}
	if through == "" {
		return
	}
	st := f.Stage
	st.Topology, st.group = loopMixerTopology, "mixer"
	st.Loop = append(st.Loop, l)
	st.Title = mixerTitle(w, p, through, st.Family)
	// The oscillator's parts: from the control grid and the electrodes the
	// feedback transformer's windings reach, not from the signal grid.
	var tnets map[string]bool
	if t := w.c.Part(through); t != nil {
		tnets = map[string]bool{}
		for _, pin := range t.Pins {
			tnets[pin.Net] = true
		}
	}
	from := func(pin graph.Pin) bool {
		return graph.RoleOfPin(p.Kind, pin.Name) == graph.RoleControl || tnets[pin.Net]
	}
	tank := tankOn(tops, through, f)
	if tank != nil {
		gone[tank] = true // its parts are the oscillator's, gathered below
	}
	for _, r := range append(loopPartsFrom(w.c, acg, p, through, claimed, gone, from, nil), tankParts(tank)...) {
		if !f.set[r] {
			f.set[r] = true
			claimed[r] = f
			st.Parts = append(st.Parts, r)
		}
	}
	slices.Sort(st.Parts)
	st.Draw = loopDraw(w, st, p, through)
	if _, _, _, best, ok := l.Range(); ok && best >= 0 {
		var ts *Stage
		if tank != nil {
			ts = tank.Stage
		}
		mixerFigures(w.c, st, l, nil, ts) // a loop that runs: where it runs
	} else if fif := w.c.Freqs["if"]; fif > 0 {
		st.Figures.Put(ifFigure(fif))
	}
	loopTracking(w, st, p.Ref, through, w.c.Freqs["if"])
	st.Flags = append(st.Flags, loopFlags(lc, st, l)...)
	if fMin, fMax, _, best, ok := turned.Range(); ok {
		st.Flags = append(st.Flags, fmt.Sprintf("a winding of %s connected the wrong way round as captured: with its ends swapped the loop would give %+.1f dB at best, %s–%s (%s)",
			through, best, hzText(fMin), hzText(fMax), p.Ref))
	}
	slices.Sort(st.Flags)
}

// drawnConverter tells whether a device whose loop falls short of 0 dB
// (within loopDrawnDB) is drawn as a self-oscillating converter all the
// same: its output tuned to the IF, the loop carried by a transformer with
// a winding tuned by the gang. It is then named, and flagged "does not
// oscillate as drawn", rather than left out as no oscillator.
func drawnConverter(w *world, lc *graph.Circuit, dev *graph.Part, l Loop, tops []*found) bool {
	if _, _, _, best, ok := l.Range(); !ok || best < loopDrawnDB || ifOutput(w, dev, tops) == nil {
		return false
	}
	through := feedbackThrough(lc, dev.Ref, l)
	if through == "" {
		return false
	}
	_, _, tuned := loopTank(w, through)
	return tuned
}

// tankOn is the top-level tuned stage other than f that a pattern found
// on the oscillator's feedback transformer ref (a winding with only its
// trimmer across it). That winding is the oscillator's tank, whose padder
// and gang section the mixer holds too, so a "Single-tuned transformer" on
// part of it would claim a resonance the set never has: the mixer takes
// its parts, and its own figures solve the whole tank across the dial.
func tankOn(tops []*found, ref string, f *found) *found {
	for _, t := range tops {
		if t != f && t.group == "tuned" && t.set[ref] {
			return t
		}
	}
	return nil
}

func tankParts(t *found) []string {
	if t == nil {
		return nil
	}
	return t.Parts
}
