package note

import (
	"bytes"
	"fmt"
	"strings"

	"pare/graph/value"
)

// The sections of the HTML note, one function per section of the Markdown
// note (markdown's writeX is hX here), in the same order and with the same
// words, so a reader finds the same note in either file.
// TestHTMLSaysWhatMarkdownSays holds the two to the same text.

// hCaution puts the caution before anything technical, as the Markdown
// note does.
func hCaution(b *bytes.Buffer, c Caution) {
	fmt.Fprintf(b, "<div class=\"n-caution\" role=\"note\">\n<p><b>%s</b></p>\n", h(c.Heading))
	hList(b, c.Lines)
	if c.Basis != "" {
		fmt.Fprintf(b, "<p><i>%s</i></p>\n", h(c.Basis))
	}
	b.WriteString("</div>\n")
}

// hVerdict says whether the reduced drawing was proven, in writeVerdict's
// words.
func hVerdict(b *bytes.Buffer, n *Note) {
	v := n.Verify
	var bold, rest string
	switch {
	case v.Skipped != "":
		bold = "Verification was not run"
		rest = fmt.Sprintf(" (%s): the reduced sheet has not been checked against the original by AC analysis.", h(v.Skipped))
	case v.Empty && v.Err == "":
		bold = "Verification proved nothing"
		rest = ": nothing comparable, no transfer and no tank impedance could be compared, so the reduced sheet is unproven. Declare an input and an output (or a region with both) and run again; until then use the faded sheet."
	case v.Err != "":
		bold = "Verification FAILED"
		rest = ": the AC comparison could not be completed, so the reduced sheet is unproven. Use the faded sheet, not the reduced one, until this is resolved (see Verification below)."
	case v.Unproven():
		bold = "Not verified"
		rest = ": a declared output is on a rail, where nothing can be compared (see Verification below), so the reduced sheet is unproven. Use the faded sheet, not the reduced one, for anything that matters."
	case v.Failed():
		bold = "Verification FAILED"
		rest = ": the reduced circuit does not match the original within tolerance. Use the faded sheet, not the reduced one, until this is resolved (see Verification below)."
	default:
		bold = "Verification passed"
		rest = fmt.Sprintf(": the reduced circuit matches the original within %s dB and %s° at every port pair checked.", Num(v.TolDB), Num(v.TolDeg))
	}
	fmt.Fprintf(b, "<p class=\"n-verdict\"><b>%s</b>%s</p>\n", bold, rest)
}

// hFindings lists the flagged figures right under the verdict.
func hFindings(b *bytes.Buffer, n *Note) {
	var lines []string
	for _, s := range n.Stages {
		for _, f := range s.Flags {
			lines = append(lines, fmt.Sprintf("<li><b>%s</b> %s: %s</li>", h(s.Name), h(s.Title), h(f)))
		}
	}
	for _, w := range n.DC.Warnings {
		lines = append(lines, fmt.Sprintf("<li><b>%s</b>: %s</li>", h(dcFinding), h(w)))
	}
	if len(lines) == 0 {
		return
	}
	b.WriteString("<p><b>Figures to check</b> " + h(findingsLead(n)) + ":</p>\n<ul>\n")
	b.WriteString(strings.Join(lines, "\n"))
	b.WriteString("\n</ul>\n")
}

func hStages(b *bytes.Buffer, n *Note) {
	b.WriteString("<h2>Stages</h2>\n")
	if n.StagesLimit != "" {
		fmt.Fprintf(b, "<p>The stage search stopped early (%s); the list below may be incomplete.</p>\n", h(n.StagesLimit))
	}
	if len(n.Stages) == 0 {
		b.WriteString("<p>No stage was recognised in the reduced circuit.</p>\n")
		return
	}
	hStageTable(b, n.Stages)
}

// hStageTable writes stages as the HTML note's table of them, with their
// figures' checks under it.
func hStageTable(b *bytes.Buffer, sts []Stage) {
	b.WriteString("<table>\n<tr><th>stage</th><th>what</th><th>family</th><th>parts</th><th>figures</th><th>flags</th></tr>\n")
	for _, s := range sts {
		what := h(s.Title)
		if s.Topology != "" {
			what += " (" + hCode(s.Topology) + ")"
		}
		if len(s.Contains) > 0 {
			what += "; contains " + h(strings.Join(s.Contains, ", "))
		}
		fmt.Fprintf(b, "<tr><td>%s</td><td>%s</td><td>%s</td><td>%s</td><td>%s</td><td>%s</td></tr>\n", h(s.Name), what,
			h(s.Family), hCodeList(s.Parts), orDash(h(s.Figures)), orDash(h(strings.Join(s.Flags, ", "))))
	}
	b.WriteString("</table>\n")
	var lines []string
	for _, s := range sts {
		for _, c := range append(append([]string(nil), s.Checks...), s.Notes...) {
			lines = append(lines, fmt.Sprintf("<li><b>%s</b> %s</li>", h(s.Name), h(c)))
		}
	}
	if len(lines) > 0 {
		b.WriteString("<p>The figures are the AC solver's, on each stage as it sits in the reduced circuit; the handbook formula is their cross-check:</p>\n<ul>\n")
		b.WriteString(strings.Join(lines, "\n"))
		b.WriteString("\n</ul>\n")
	}
}

// hDC writes the voltage chart under the live-set caution.
func hDC(b *bytes.Buffer, n *Note) {
	d := n.DC
	if d.Err == "" && len(d.Rows) == 0 {
		return
	}
	b.WriteString("<h2>DC voltage chart</h2>\n")
	if d.Err != "" {
		fmt.Fprintf(b, "<p>The DC operating point was not found: %s</p>\n", h(d.Err))
		return
	}
	b.WriteString("<p><b>" + chartLead + "</b>: " + chartApplies)
	for _, l := range d.Caution {
		fmt.Fprintf(b, " %s", h(l))
	}
	fmt.Fprintf(b, "</p>\n<p>Computed for the whole circuit as captured (<code>pare dc</code>); the last column is what a %s reads.</p>\n", h(d.Meter))
	b.WriteString("<table>\n<tr><th>part</th><th>electrode</th><th>net</th><th>DC</th><th>meter reads</th></tr>\n")
	for _, r := range d.Rows {
		fmt.Fprintf(b, "<tr><td>%s</td><td>%s</td><td>%s</td><td class=\"n-num\">%s</td><td class=\"n-num\">%s</td></tr>\n",
			h(r.Part), h(r.Electrode), hCode(r.Net), h(r.Volts), h(r.Reads))
	}
	b.WriteString("</table>\n")
	hList(b, append(append([]string(nil), d.Oscillators...), d.Notes...))
}

func hParts(b *bytes.Buffer, n *Note) {
	b.WriteString("<h2>Parts before → after</h2>\n<table>\n<tr><th></th><th>parts</th><th>nets</th></tr>\n")
	fmt.Fprintf(b, "<tr><td>original</td><td class=\"n-num\">%d</td><td class=\"n-num\">%d</td></tr>\n", n.Before.Parts, n.Before.Nets)
	fmt.Fprintf(b, "<tr><td>reduced</td><td class=\"n-num\">%d</td><td class=\"n-num\">%d</td></tr>\n</table>\n", n.After.Parts, n.After.Nets)
	if len(n.Removed) > 0 {
		fmt.Fprintf(b, "<p>Removed (drawn faded on the faded sheet): %s.</p>\n", hCodeList(n.Removed))
	}
	if len(n.Merged) > 0 {
		b.WriteString("<p>Merged:</p>\n<ul>\n")
		for _, m := range n.Merged {
			fmt.Fprintf(b, "<li>%s stands for %s</li>\n", hCode(m.Into), hCodeList(m.From))
		}
		b.WriteString("</ul>\n")
	}
	if len(n.ACGround) > 0 {
		fmt.Fprintf(b, "<p>At AC ground for the small signal: %s.</p>\n", hCodeList(n.ACGround))
	}
	for _, g := range n.Gangs {
		fmt.Fprintf(b, "<p>Gang %s: %s.</p>\n", hCode(g.Name), hCodeList(g.Parts))
	}
}

func hPartNotes(b *bytes.Buffer, n *Note) {
	if len(n.PartNotes) == 0 && len(n.RemovedNotes) == 0 {
		return
	}
	b.WriteString("<h2>Notes on parts</h2>\n")
	for _, g := range []struct {
		head  string
		notes []PartNote
	}{
		{"On the reduced sheet:", n.PartNotes},
		{"Removed by the reduction (on the faded sheet):", n.RemovedNotes},
	} {
		if len(g.notes) == 0 {
			continue
		}
		fmt.Fprintf(b, "<p>%s</p>\n<ul>\n", g.head)
		for _, p := range g.notes {
			fmt.Fprintf(b, "<li>%s", hCode(p.Ref))
			if p.Into != "" {
				fmt.Fprintf(b, " (in %s)", hCode(p.Into))
			}
			if p.At != "" {
				fmt.Fprintf(b, ", %s", h(p.At))
			}
			fmt.Fprintf(b, ": %s</li>\n", h(p.Text))
		}
		b.WriteString("</ul>\n")
	}
}

func hSteps(b *bytes.Buffer, n *Note) {
	b.WriteString("<h2>Reduction log</h2>\n")
	if len(n.Steps) == 0 {
		b.WriteString("<p>No step applied: the circuit was already as small as this level makes it.</p>\n")
		return
	}
	refused := 0
	for _, s := range n.Steps {
		if s.Refused != "" {
			refused++
		}
	}
	fmt.Fprintf(b, "<p>%d step(s): %d applied, %d refused by the AC check. Each line names the rule, what it did, why, and where the parts are in the netlist.</p>\n",
		len(n.Steps), len(n.Steps)-refused, refused)
	hStepList(b, n.Steps)
	if len(n.NearMisses) > 0 {
		b.WriteString("<p>Near misses: candidates a numeric guard turned down, so the parts stay in the reduced circuit.</p>\n")
		hStepList(b, n.NearMisses)
	}
}

// hStepList writes steps as a numbered list (a step's number is its value)
// or, for near misses, which have none, as bullets.
func hStepList(b *bytes.Buffer, steps []Step) {
	tag := "ul"
	if len(steps) > 0 && steps[0].N > 0 {
		tag = "ol"
	}
	fmt.Fprintf(b, "<%s>\n", tag)
	for _, s := range steps {
		if s.N > 0 {
			fmt.Fprintf(b, "<li value=\"%d\">%s</li>\n", s.N, stepHTML(s))
		} else {
			fmt.Fprintf(b, "<li>%s</li>\n", stepHTML(s))
		}
	}
	fmt.Fprintf(b, "</%s>\n", tag)
}

// stepHTML is stepLine's sentence with HTML markup.
func stepHTML(s Step) string {
	var what []string
	if len(s.Merged) > 0 {
		m := "merged " + hCodeList(s.Merged)
		if s.Result != "" {
			m += " into " + hCode(s.Result)
		}
		what = append(what, m)
	} else if s.Result != "" {
		what = append(what, "made "+hCode(s.Result))
	}
	for _, x := range []struct {
		verb  string
		items []string
	}{{"removed", s.Removed}, {"joined", s.Joined}, {"grounded", s.Grounded}, {"dropped terminals", s.Pins},
		{"added", s.Added}, {"dropped nets", s.Dropped}} {
		if len(x.items) > 0 {
			what = append(what, x.verb+" "+hCodeList(x.items))
		}
	}
	var l strings.Builder
	fmt.Fprintf(&l, "<b>%s</b>", h(s.Rule))
	if s.Refused != "" {
		l.WriteString(" REFUSED")
	}
	l.WriteString(": ")
	if len(what) > 0 {
		l.WriteString(strings.Join(what, "; ") + ". ")
	}
	l.WriteString(h(s.Why))
	if s.Refused != "" && !strings.HasSuffix(s.Why, ".") {
		l.WriteString(".")
	}
	if s.Refused != "" {
		fmt.Fprintf(&l, " Not applied: %s.", h(strings.TrimSuffix(s.Refused, ".")))
	}
	if len(s.Where) > 0 {
		places := make([]string, len(s.Where))
		for i, w := range s.Where {
			places[i] = hCode(w.Ref)
			if w.At != "" {
				places[i] += " at " + hCode(w.At)
			}
		}
		fmt.Fprintf(&l, " (%s)", strings.Join(places, ", "))
	}
	return l.String()
}

func hVerify(b *bytes.Buffer, n *Note) {
	v := n.Verify
	b.WriteString("<h2>Verification</h2>\n")
	switch {
	case v.Skipped != "":
		fmt.Fprintf(b, "<p>Not run (%s).</p>\n", h(v.Skipped))
		return
	case v.Err != "":
		fmt.Fprintf(b, "<p><b>Failed</b>: the comparison could not be completed: %s.</p>\n", h(strings.TrimSuffix(v.Err, ".")))
		return
	}
	verdict := "<b>Passed</b>"
	switch {
	case v.Empty:
		verdict = "<b>Nothing comparable</b> (no transfer and no tank impedance; not a pass)"
	case v.Unproven():
		verdict = "<b>Not verified</b>"
	case !v.OK:
		verdict = "<b>Failed</b>"
	}
	fmt.Fprintf(b, "<p>%s against a tolerance of %s dB and %s°: %s</p>\n", verdict, Num(v.TolDB), Num(v.TolDeg), verifyMethod)
	if len(v.Pairs) == 0 {
		b.WriteString("<p>No port pair was compared.</p>\n")
	} else {
		b.WriteString("<table>\n<tr><th>quantity</th><th>what</th><th>over</th><th>worst dB</th><th>worst °</th><th>at</th><th>gang</th><th>result</th></tr>\n")
		for _, p := range v.Pairs {
			res := "ok"
			switch {
			case p.Error != "":
				res = "<b>not solved</b>: " + h(p.Error)
			case !p.within(v.TolDB, v.TolDeg):
				res = "<b>out of tolerance</b>"
			}
			dB, deg, at := Num(p.MaxDB), Num(p.MaxDeg), value.Format(p.AtHz, value.Hertz, value.Symbol)
			if p.Error != "" {
				dB, deg, at = "–", "–", "–"
			}
			fmt.Fprintf(b, "<tr><td>%s</td><td>%s</td><td>%s</td><td class=\"n-num\">%s</td><td class=\"n-num\">%s</td><td class=\"n-num\">%s</td><td>%s</td><td>%s</td></tr>\n",
				hCode(p.Label()), h(p.What), orDash(h(p.Bands)), dB, deg, h(at), orDash(h(p.Setting)), res)
		}
		b.WriteString("</table>\n")
	}
	hList(b, v.Notes)
}

func hWarnings(b *bytes.Buffer, n *Note) {
	if len(n.Warnings) == 0 {
		return
	}
	b.WriteString("<h2>Netlist warnings</h2>\n<p>Likely transcription mistakes found while loading; check them against the paper diagram.</p>\n")
	hList(b, n.Warnings)
}
