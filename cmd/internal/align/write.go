package align

import (
	"fmt"
	"io"
	"slices"
	"strings"

	"pare/graph/figure"
	"pare/internal/esc"
)

// practice marks what the trade does by habit rather than what pare
// computed.
const practice = "(common practice)"

// WriteText writes the guide for a terminal: `pare align`.
func WriteText(w io.Writer, g *Guide) error {
	var b strings.Builder
	fmt.Fprintf(&b, "%s: alignment and signal tracing\n\n", g.Title)
	for _, l := range g.Caution {
		fmt.Fprintf(&b, "! %s\n", l)
	}
	b.WriteString("\n")
	intro, items, closing := g.procedure()
	if intro != "" {
		fmt.Fprintf(&b, "%s\n", intro)
	}
	for _, it := range items {
		fmt.Fprintf(&b, "%d. %s\n   %s\n", it.n, it.text, it.how)
		for _, r := range it.repeatsAfter {
			fmt.Fprintf(&b, "   %s\n", r)
		}
	}
	for _, l := range closing {
		fmt.Fprintf(&b, "%s\n", l)
	}
	writePresetsText(&b, g)
	fmt.Fprintf(&b, "\nSignal injection, from the output back to the input (levels from the AC solver on the whole circuit; %s):\n", g.injectNote())
	for i, in := range g.Inject {
		fmt.Fprintf(&b, "  %d. %s\n", i+1, injectLine(in))
	}
	if g.InjectErr != "" {
		fmt.Fprintf(&b, "  no table: %s\n", g.InjectErr)
	}
	if len(g.Hints) > 0 {
		fmt.Fprintf(&b, "\nSymptoms %s:\n", practice)
		for _, h := range g.Hints {
			fmt.Fprintf(&b, "  %s %s: readings: %s; injection: %s\n", strings.Join(h.Stages, ", "), h.Fault, h.Readings, h.Inject)
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteMarkdown writes the guide as the repair note's "Alignment" section.
func WriteMarkdown(w io.Writer, g *Guide) error {
	var b strings.Builder
	b.WriteString("## Alignment\n\n")
	for _, l := range g.Caution {
		fmt.Fprintf(&b, "> %s\n", esc.Markdown(l))
	}
	b.WriteString("\n")
	intro, items, closing := g.procedure()
	if intro != "" {
		fmt.Fprintf(&b, "%s\n\n", esc.Markdown(intro))
	}
	for _, it := range items {
		fmt.Fprintf(&b, "%d. %s  \n   %s\n", it.n, esc.Markdown(it.text), esc.Markdown(it.how))
		for _, r := range it.repeatsAfter {
			fmt.Fprintf(&b, "   **%s**\n", esc.Markdown(r))
		}
	}
	if len(items) > 0 {
		b.WriteString("\n")
	}
	for _, l := range closing {
		fmt.Fprintf(&b, "- %s\n", esc.Markdown(l))
	}
	writePresetsMarkdown(&b, g)
	fmt.Fprintf(&b, "\n### Signal injection\n\nFrom the output back to the input; levels from the AC solver on the whole circuit as captured; %s.\n\n", esc.Markdown(g.injectNote()))
	if len(g.Inject) > 0 {
		b.WriteString("| # | inject at | frequency | level | gives | stage gain |\n|---|---|---|---|---|---|\n")
		for i, in := range g.Inject {
			fmt.Fprintf(&b, "| %d | %s | %s | %s | %s | %s |\n", i+1, cellCode(in.Where)+" on "+cellCode(in.Net),
				hz(in.Freq)+freqNote(in), levelCell(in), esc.MarkdownCell(in.RefWhat), esc.MarkdownCell(gainCell(in)))
		}
	}
	if g.InjectErr != "" {
		fmt.Fprintf(&b, "No table: %s.\n", esc.Markdown(g.InjectErr))
	}
	if len(g.Hints) > 0 {
		fmt.Fprintf(&b, "\n### Symptoms %s\n\n| stage | fault | readings | injection table |\n|---|---|---|---|\n", practice)
		for _, h := range g.Hints {
			fmt.Fprintf(&b, "| %s | %s | %s | %s |\n", esc.MarkdownCell(strings.Join(h.Stages, ", ")), esc.MarkdownCell(h.Fault), esc.MarkdownCell(h.Readings), esc.MarkdownCell(h.Inject))
		}
	}
	b.WriteString("\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// item is one numbered step as it is printed: the action, then how to
// do it, then any repeat that closes its phase.
type item struct {
	n            int
	text, how    string
	repeatsAfter []string
}

// procedure is the procedure in print order: an opening paragraph, the
// numbered steps, and the closing lines (dial ends, warnings).
func (g *Guide) procedure() (intro string, items []item, closing []string) {
	if g.Nothing != "" {
		if g.TrackNote != "" {
			closing = append(closing, cap1(g.TrackNote)+".")
		}
		closing = append(closing, g.leftOutLines()...)
		return cap1(g.Nothing), nil, append(closing, warnLines(g.Warnings)...)
	}
	if g.IF > 0 {
		kind, flat := "AM", "the AGC"
		if g.FM {
			kind, flat = "FM", "the limiter"
		}
		order := "IF first, from the detector back to the mixer"
		if slices.ContainsFunc(g.Steps, func(s Step) bool { return s.Phase != "IF" }) {
			order += "; then the oscillator; then the aerial/RF circuit"
		}
		intro = fmt.Sprintf("Procedure, in the trade's order %s: %s. The IF is %s (%s, %s); generator %s, output as low as gives a reading so %s does not flatten the peaks %s.",
			practice, order, hz(g.IF), g.IFFrom, kind, genWord(g.FM), flat, practice)
	}
	for i, s := range g.Steps {
		phase := s.Phase
		if s.Band != "" {
			phase = cap1(s.Band) + ", " + s.Phase
		}
		it := item{n: s.N, text: fmt.Sprintf("%s, %s, %s: turn the %s.", phase, hz(s.Freq), genAt(s), s.What),
			how: "How: " + s.Watch + " (frequency: " + s.From + ")."}
		if i+1 == len(g.Steps) || g.Steps[i+1].Phase != s.Phase || g.Steps[i+1].Band != s.Band {
			it.repeatsAfter = g.repeatFor(s.Phase, s.Band)
		}
		items = append(items, it)
	}
	if g.TrackNote != "" {
		closing = append(closing, cap1(g.TrackNote)+".")
	}
	closing = append(closing, g.leftOutLines()...)
	for _, e := range g.Ends {
		closing = append(closing, fmt.Sprintf("Dial end, %s: the set tunes %s, oscillator at %s.", e.Where, hz(e.Sig), hz(e.Osc)))
	}
	return intro, items, append(closing, warnLines(g.Warnings)...)
}

// leftOutLines are the LeftOut entries as closing lines.
func (g *Guide) leftOutLines() []string {
	var out []string
	for _, l := range g.LeftOut {
		out = append(out, cap1(l)+".")
	}
	return out
}

// repeatFor are the repeat lines of a phase in a band ("" the set as
// captured): a band's own lines start with its label.
func (g *Guide) repeatFor(phase, band string) []string {
	var out []string
	for _, r := range g.Repeat {
		rest, inBand := strings.CutPrefix(r, band+": ")
		if band == "" {
			rest, inBand = r, !strings.HasPrefix(r, "band ")
		}
		if inBand && strings.Contains(rest, phase) {
			out = append(out, cap1(r)+".")
		}
	}
	return out
}

func genWord(fm bool) string {
	if fm {
		return "unmodulated or FM at 400 Hz"
	}
	return "modulated 30 % at 400 Hz"
}

func genAt(s Step) string {
	if s.Counter != "" {
		return "no generator, a frequency counter on " + s.Counter
	}
	return "generator into " + s.Into
}

func warnLines(ws []string) []string {
	var out []string
	for _, w := range ws {
		out = append(out, "Warning: "+w+".")
	}
	return out
}

func injectLine(in Injection) string {
	if in.Why != "" {
		return fmt.Sprintf("%s on %s: %s %s: %s", in.Where, in.Net, in.Band, hz(in.Freq)+freqNote(in), in.Why)
	}
	if in.BelowFloor {
		return fmt.Sprintf("%s on %s: %s %s: stage gain %s", in.Where, in.Net, in.Band, hz(in.Freq)+freqNote(in), gainText(in))
	}
	return fmt.Sprintf("%s on %s: %s %s at %s gives %s; stage gain %s",
		in.Where, in.Net, in.Band, hz(in.Freq)+freqNote(in), volts(in.Level), in.RefWhat, gainText(in))
}

// levelCell and gainCell are a table row's level and gain, or for a row
// pare gives no numbers for, a dash and why.
func levelCell(in Injection) string {
	if in.Why != "" || in.BelowFloor {
		return "—"
	}
	return volts(in.Level)
}

func gainCell(in Injection) string {
	if in.Why != "" {
		return in.Why
	}
	return gainText(in)
}

// sourceNote says what the levels assume of the generator: the solver
// drives each point from an ideal source, so the aerial row is the level
// on the aerial terminal itself, not the generator's setting behind a
// dummy aerial.
const sourceNote = "each level is the voltage on the point itself, driven by a generator of zero source impedance (an ideal source in the solver); through a dummy aerial or a coupling capacitor the generator must be set higher, and the aerial circuit tunes a little lower"

// injectNote is sourceNote, and for a set with an AGC line what the linear
// model leaves out: the AGC would cut the gain of the controlled stages
// as the signal grows, so the table holds for an AGC line held at its
// no-signal voltage (common practice: clamp it to a bias supply or bridge
// it to chassis through a few volts' battery).
func (g *Guide) injectNote() string {
	if g.AGC == "" {
		return sourceNote
	}
	return sourceNote + fmt.Sprintf("; the model is linear and ignores the AGC: hold the AGC line (%s) at its no-signal voltage while injecting (common practice), or the levels before the detector come out higher", g.AGC)
}

func freqNote(in Injection) string {
	switch {
	case in.Tuned && in.DialTank == "":
		return fmt.Sprintf(" (set tuned to it: gang %.0f %% of the way from fully open to fully meshed)", in.Gang*100)
	case in.Tuned:
		return fmt.Sprintf(" (set tuned to it: gang %.0f %% of the way from fully open to fully meshed, where %s resonates at it)", in.Gang*100, in.DialTank)
	case in.DialTank != "":
		return fmt.Sprintf(" (%s does not reach it as captured: solved with the gang at mid-travel)", in.DialTank)
	}
	return ""
}

func gainText(in Injection) string {
	s := fmt.Sprintf("×%s (%s) to %s", figure.Format(in.Gain, figure.Ratio, figure.Text), figure.Format(db(in.Gain), figure.Decibel, figure.Text), in.GainTo)
	if in.GainNote != "" {
		s += ", " + in.GainNote
	}
	if in.Caveat != "" {
		s += "; " + in.Caveat
	}
	return s
}

func volts(v float64) string {
	switch {
	case v >= 1:
		return fmt.Sprintf("%.3g V", v)
	case v >= 1e-3:
		return fmt.Sprintf("%.3g mV", v*1e3)
	}
	return fmt.Sprintf("%.3g µV", v*1e6)
}

// cellCode puts netlist text (a port's label) in a code span inside a
// table cell: nothing in it is markup, and its bar cannot split the cell.
func cellCode(s string) string {
	return "`" + strings.ReplaceAll(esc.MarkdownCode(s), "|", `\|`) + "`"
}

func cap1(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
