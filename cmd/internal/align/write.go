package align

import (
	"fmt"
	"io"
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
	for _, l := range g.procedure() {
		fmt.Fprintf(&b, "%s\n", l)
	}
	b.WriteString("\nSignal injection, from the output back to the input (levels from the AC solver on the whole circuit):\n")
	for i, in := range g.Inject {
		fmt.Fprintf(&b, "  %d. %s\n", i+1, injectLine(in))
	}
	if g.InjectErr != "" {
		fmt.Fprintf(&b, "  no table: %s\n", g.InjectErr)
	}
	if len(g.Hints) > 0 {
		fmt.Fprintf(&b, "\nSymptoms %s:\n", practice)
		for _, h := range g.Hints {
			fmt.Fprintf(&b, "  %s %s: readings: %s; injection: %s\n", h.Stage, h.Fault, h.Readings, h.Inject)
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
	for _, l := range g.procedure() {
		if strings.HasPrefix(l, "  ") {
			fmt.Fprintf(&b, "   %s\n", esc.Markdown(strings.TrimSpace(l)))
			continue
		}
		fmt.Fprintf(&b, "%s\n\n", esc.Markdown(l))
	}
	b.WriteString("\n### Signal injection\n\nFrom the output back to the input; levels from the AC solver on the whole circuit as captured.\n\n")
	if len(g.Inject) > 0 {
		b.WriteString("| # | inject at | frequency | level | gives | stage gain |\n|---|---|---|---|---|---|\n")
		for i, in := range g.Inject {
			fmt.Fprintf(&b, "| %d | %s | %s | %s | %s | %s |\n", i+1, esc.MarkdownCell(in.Where+" on "+in.Net),
				hz(in.Freq)+freqNote(in), volts(in.Level), esc.MarkdownCell(in.RefWhat), esc.MarkdownCell(gainText(in)))
		}
	}
	if g.InjectErr != "" {
		fmt.Fprintf(&b, "No table: %s.\n", esc.Markdown(g.InjectErr))
	}
	if len(g.Hints) > 0 {
		fmt.Fprintf(&b, "\n### Symptoms %s\n\n| stage | fault | readings | injection table |\n|---|---|---|---|\n", practice)
		for _, h := range g.Hints {
			fmt.Fprintf(&b, "| %s | %s | %s | %s |\n", esc.MarkdownCell(h.Stage), esc.MarkdownCell(h.Fault), esc.MarkdownCell(h.Readings), esc.MarkdownCell(h.Inject))
		}
	}
	b.WriteString("\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// procedure is the procedure as lines: one per step, indented detail
// under it, then the repeats, the dial ends and the warnings.
func (g *Guide) procedure() []string {
	if g.Nothing != "" {
		return append([]string{cap1(g.Nothing)}, warnLines(g.Warnings)...)
	}
	var out []string
	if g.IF > 0 {
		kind := "AM"
		if g.FM {
			kind = "FM"
		}
		out = append(out, fmt.Sprintf("Procedure, in the trade's order %s: IF first, from the detector back to the mixer, at the set's IF %s (%s, %s); then the oscillator; then the aerial/RF circuit. Generator %s, output as low as gives a reading so the AGC does not flatten the peaks %s.",
			practice, hz(g.IF), g.IFFrom, kind, genWord(g.FM), practice))
	}
	phase := ""
	for _, s := range g.Steps {
		if s.Phase != phase && phase != "" {
			out = append(out, g.repeatFor(phase)...)
		}
		phase = s.Phase
		out = append(out, fmt.Sprintf("%d. %s, %s: %s at %s", s.N, s.Phase, s.What, genAt(s), hz(s.Freq)))
		out = append(out, "  watch "+s.Watch+" (frequency: "+s.From+")")
	}
	out = append(out, g.repeatFor(phase)...)
	for _, e := range g.Ends {
		out = append(out, fmt.Sprintf("Dial end, %s: the set tunes %s, oscillator at %s.", e.Where, hz(e.Sig), hz(e.Osc)))
	}
	return append(out, warnLines(g.Warnings)...)
}

func (g *Guide) repeatFor(phase string) []string {
	var out []string
	for _, r := range g.Repeat {
		if strings.Contains(r, phase) {
			out = append(out, "  "+r)
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
	if s.Phase == "IF" {
		return "generator into the mixer's signal input"
	}
	return "generator into the aerial"
}

func warnLines(ws []string) []string {
	var out []string
	for _, w := range ws {
		out = append(out, "Warning: "+w+".")
	}
	return out
}

func injectLine(in Injection) string {
	return fmt.Sprintf("%s on %s: %s %s at %s gives %s; stage gain %s",
		in.Where, in.Net, in.Band, hz(in.Freq)+freqNote(in), volts(in.Level), in.RefWhat, gainText(in))
}

func freqNote(in Injection) string {
	if in.Tuned {
		return fmt.Sprintf(" (set tuned to it, gang at %.0f %% of travel)", in.Gang*100)
	}
	return ""
}

func gainText(in Injection) string {
	s := fmt.Sprintf("×%s (%s) to %s", figure.Format(in.Gain, figure.Ratio, figure.Text), figure.Format(db(in.Gain), figure.Decibel, figure.Text), in.GainTo)
	if in.GainNote != "" {
		s += ", " + in.GainNote
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

func cap1(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}
