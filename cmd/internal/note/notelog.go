package note

// The note's record of the work: the reduction log, step by step, and the
// proof that the reduced circuit keeps the signal behaviour, with the
// warnings the pipeline raised.

import (
	"bytes"
	"fmt"
	"strings"

	"pare/graph/value"
)

func writeSteps(b *bytes.Buffer, n *Note) {
	b.WriteString("## Reduction log\n\n")
	if len(n.Steps) == 0 {
		b.WriteString("No step applied: the circuit was already as small as this level makes it.\n\n")
		return
	}
	refused := 0
	for _, s := range n.Steps {
		if s.Refused != "" {
			refused++
		}
	}
	fmt.Fprintf(b, "%d step(s): %d applied, %d refused by the AC check. Each line names the rule, what it did, why, and where the parts are in the netlist.\n\n",
		len(n.Steps), len(n.Steps)-refused, refused)
	for _, s := range n.Steps {
		b.WriteString(stepLine(s))
		b.WriteString("\n")
	}
	b.WriteString("\n")
	if len(n.NearMisses) > 0 {
		b.WriteString("Near misses: candidates a numeric guard turned down, so the parts stay in the reduced circuit.\n\n")
		for _, s := range n.NearMisses {
			b.WriteString(stepLine(s))
			b.WriteString("\n")
		}
		b.WriteString("\n")
	}
}

// stepLine is one log line: "N. **rule**: what; why (file:line)".
func stepLine(s Step) string {
	var what []string
	if len(s.Merged) > 0 {
		m := "merged " + codeList(s.Merged)
		if s.Result != "" {
			m += " into `" + mdCode(s.Result) + "`"
		}
		what = append(what, m)
	} else if s.Result != "" {
		what = append(what, "made `"+mdCode(s.Result)+"`")
	}
	if len(s.Removed) > 0 {
		what = append(what, "removed "+codeList(s.Removed))
	}
	if len(s.Joined) > 0 {
		what = append(what, "joined "+codeList(s.Joined))
	}
	if len(s.Grounded) > 0 {
		what = append(what, "grounded "+codeList(s.Grounded))
	}
	if len(s.Pins) > 0 {
		what = append(what, "dropped terminals "+codeList(s.Pins))
	}
	if len(s.Added) > 0 {
		what = append(what, "added "+codeList(s.Added))
	}
	if len(s.Dropped) > 0 {
		what = append(what, "dropped nets "+codeList(s.Dropped))
	}
	var l strings.Builder
	if s.N > 0 {
		fmt.Fprintf(&l, "%d. ", s.N)
	} else {
		l.WriteString("- ")
	}
	fmt.Fprintf(&l, "**%s**", mdText(s.Rule))
	if s.Refused != "" {
		l.WriteString(" REFUSED")
	}
	l.WriteString(": ")
	if len(what) > 0 {
		l.WriteString(strings.Join(what, "; "))
		l.WriteString(". ")
	}
	l.WriteString(mdText(s.Why))
	if s.Refused != "" && !strings.HasSuffix(s.Why, ".") {
		l.WriteString(".")
	}
	if s.Refused != "" {
		fmt.Fprintf(&l, " Not applied: %s.", mdText(strings.TrimSuffix(s.Refused, ".")))
	}
	if len(s.Where) > 0 {
		places := make([]string, len(s.Where))
		for i, w := range s.Where {
			places[i] = "`" + mdCode(w.Ref) + "`"
			if w.At != "" {
				places[i] += " at `" + mdCode(w.At) + "`"
			}
		}
		fmt.Fprintf(&l, " (%s)", strings.Join(places, ", "))
	}
	return l.String()
}

// verifyMethod says how the comparison was made, in both notes.
const verifyMethod = "the original and the reduced circuit were swept by small-signal AC analysis over each pair's bands (the regions its path works in), and the worst deviation is listed; what was not compared is said below the table."

func writeVerify(b *bytes.Buffer, n *Note) {
	v := n.Verify
	b.WriteString("## Verification\n\n")
	switch {
	case v.Skipped != "":
		fmt.Fprintf(b, "Not run (%s).\n\n", mdText(v.Skipped))
		return
	case v.Err != "":
		fmt.Fprintf(b, "**Failed**: the comparison could not be completed: %s.\n\n", mdText(strings.TrimSuffix(v.Err, ".")))
		return
	}
	verdict := "**Passed**"
	switch {
	case v.Empty:
		verdict = "**Nothing comparable** (no transfer and no tank impedance; not a pass)"
	case v.Unproven():
		verdict = "**Not verified**"
	case !v.OK:
		verdict = "**Failed**"
	}
	fmt.Fprintf(b, "%s against a tolerance of %s dB and %s°: %s\n\n", verdict, Num(v.TolDB), Num(v.TolDeg), verifyMethod)
	if len(v.Pairs) == 0 {
		b.WriteString("No port pair was compared.\n\n")
	} else {
		b.WriteString("| quantity | what | over | worst dB | worst ° | at | gang | result |\n")
		b.WriteString("|---|---|---|---|---|---|---|---|\n")
		for _, p := range v.Pairs {
			res := "ok"
			switch {
			case p.Error != "":
				res = "**not solved**: " + mdCell(p.Error)
			case !p.within(v.TolDB, v.TolDeg):
				res = "**out of tolerance**"
			}
			dB, deg, at := Num(p.MaxDB), Num(p.MaxDeg), value.Format(p.AtHz, value.Hertz, value.Symbol)
			if p.Error != "" {
				dB, deg, at = "–", "–", "–"
			}
			fmt.Fprintf(b, "| `%s` | %s | %s | %s | %s | %s | %s | %s |\n", mdCode(p.Label()), mdCell(p.What),
				orDash(mdCell(p.Bands)), dB, deg, at, orDash(mdCell(p.Setting)), res)
		}
		b.WriteString("\n")
	}
	for _, x := range v.Notes {
		fmt.Fprintf(b, "- %s\n", mdText(x))
	}
	if len(v.Notes) > 0 {
		b.WriteString("\n")
	}
}

func writeWarnings(b *bytes.Buffer, n *Note) {
	if len(n.Warnings) == 0 {
		return
	}
	b.WriteString("## Netlist warnings\n\n")
	b.WriteString("Likely transcription mistakes found while loading; check them against the paper diagram.\n\n")
	for _, w := range n.Warnings {
		fmt.Fprintf(b, "- %s\n", mdText(w))
	}
	b.WriteString("\n")
}
