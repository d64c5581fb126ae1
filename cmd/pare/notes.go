package main

// The repair note: a Markdown page written next to the sheets by the main
// job. It is built from plain data (note and friends) rather than from the
// rules, ac and stages types directly, so the writer can be tested with
// hand-made inputs and does not change when those packages grow fields.

import (
	"bytes"
	"fmt"
	"io"
	"strings"
	"unicode"

	"pare/graph/value"
)

// note is everything the repair note says, already turned into text where
// formatting depends on another package (stage figures, positions).
type note struct {
	Title       string
	Source      string // netlist file name as the note shows it
	Version     string
	Level       string // reduction level name
	Symbols     string // "IEC 60617" or "IEEE 315"
	CircuitNote string // the netlist's own `note`
	Furniture   []string
	Warnings    []string // transcription warnings, already "file:line: text"
	Sheets      []noteSheet

	Before, After partCount
	Removed       []string    // original refs the reduction took out
	Merged        []noteMerge // reduced part -> the originals it stands for
	ACGround      []string
	Gangs         []noteGang

	Stages      []noteStage
	StagesLimit string // set when the stage search stopped early, with why
	Steps       []noteStep
	NearMisses  []noteStep // candidates a numeric guard turned down
	Verify      noteVerify
}

type partCount struct{ Parts, Nets int }

type noteSheet struct{ File, Alt, Caption string }

type noteMerge struct {
	Into string
	From []string
}

type noteGang struct {
	Name  string
	Parts []string
}

type noteStage struct {
	Name, Title, Topology, Family string
	Parts                         []string
	Figures                       string // one line, as `pare stages` prints it
	Flags                         []string
	Contains                      []string
}

type noteStep struct {
	N        int
	Rule     string
	Removed  []string
	Merged   []string
	Result   string
	Joined   []string
	Grounded []string
	Pins     []string // terminals dropped, as REF.PIN
	Added    []string
	Dropped  []string // nets left connecting nothing
	Why      string
	Refused  string
	Where    []notePlace // the parts concerned and where they were written
}

// notePlace is a part and its netlist position ("file:line", or "" when
// pare made the part).
type notePlace struct{ Ref, At string }

// noteVerify is the outcome of the AC comparison of the original against the
// reduced circuit. Exactly one of Skipped, Err or Pairs describes it.
type noteVerify struct {
	Skipped string // why it was not run ("--no-verify"), empty when it ran
	Err     string // why it could not be completed
	OK      bool
	TolDB   float64
	TolDeg  float64
	Pairs   []notePair
	Notes   []string // what could not be compared, and why
}

type notePair struct {
	From, To, What string
	MaxDB, MaxDeg  float64
	AtHz           float64
	Setting        string // gang setting of the worst point
	Error          string // the reduced circuit could not be solved for this pair
}

// label names the quantity compared, as the verify command prints it:
// "V(out)/V(in)" for a transfer, "Z(net)" for an impedance.
func (p notePair) label() string {
	if p.What == "impedance" {
		return "Z(" + p.From + ")"
	}
	return "V(" + p.To + ")/V(" + p.From + ")"
}

// within reports whether the pair is inside the tolerance.
func (p notePair) within(tolDB, tolDeg float64) bool {
	return p.Error == "" && p.MaxDB <= tolDB && p.MaxDeg <= tolDeg
}

// failed reports whether the note must say the verification failed.
func (v noteVerify) failed() bool { return v.Skipped == "" && (v.Err != "" || !v.OK) }

// cautionLines is the safety text of every repair note, in our own words
// (common practice, see the project's reference values §9). The last line is
// about the drawing itself: a reduced diagram is a small-signal picture.
var cautionLines = []string{
	"The HT in a valve set is typically 200–400 V DC, more in transmitters: treat it as lethal. Work one-handed, never when wet or standing on a conductive floor.",
	"Reservoir and filter capacitors stay charged long after switch-off. Discharge them through a resistor and confirm with a meter before you touch anything.",
	"AC/DC (live-chassis) sets can put mains on the chassis. Power them through an isolation transformer, and never clip an earthed scope ground to an unisolated chassis.",
	"Bring an old set up slowly (variac or a series lamp), and replace suspect mains-side capacitors and perished wiring first.",
	"Follow your local electrical codes and licensed practice; this note does not replace them.",
	"The reduced diagram is small-signal only: it leaves out DC conditions, heaters and supplies. Do not take voltages or safety decisions from it.",
}

// cautionHeading opens the caution block; tests look for it.
const cautionHeading = "Caution: mains-powered and valve equipment can kill."

// sheetCaution is the one line printed on every sheet of the main job (the
// renderer adds "small-signal only" to a reduced view). It sends the reader
// to the full caution in the note beside the sheets.
const sheetCaution = "Caution: mains and valve HT can kill; capacitors stay charged and the chassis may be live. Read the caution in notes.md before working on the set."

// writeNote writes the repair note. Output depends only on n, so the same
// run gives the same bytes.
func writeNote(w io.Writer, n *note) error {
	var b bytes.Buffer
	title := n.Title
	if title == "" {
		title = n.Source
	}
	fmt.Fprintf(&b, "# Repair note: %s\n\n", mdText(title))
	fmt.Fprintf(&b, "Made by pare %s from `%s` at reduction level **%s**, symbols %s.\n\n",
		n.Version, mdCode(n.Source), mdText(n.Level), mdText(n.Symbols))

	fmt.Fprintf(&b, "> **%s**\n>\n", cautionHeading)
	for _, l := range cautionLines {
		fmt.Fprintf(&b, "> - %s\n", l)
	}
	b.WriteString("\n")

	if n.CircuitNote != "" {
		fmt.Fprintf(&b, "%s\n\n", mdText(n.CircuitNote))
	}
	if len(n.Furniture) > 0 {
		for _, f := range n.Furniture {
			fmt.Fprintf(&b, "- %s\n", mdText(f))
		}
		b.WriteString("\n")
	}

	writeVerdict(&b, n)
	writeFindings(&b, n)
	writeSheets(&b, n)
	writeStages(&b, n)
	writeParts(&b, n)
	writeSteps(&b, n)
	writeVerify(&b, n)
	writeWarnings(&b, n)
	_, err := w.Write(b.Bytes())
	return err
}

// writeVerdict puts the one thing a reader must not miss at the top: whether
// the reduced drawing was proven to behave like the original.
func writeVerdict(b *bytes.Buffer, n *note) {
	v := n.Verify
	switch {
	case v.Skipped != "":
		fmt.Fprintf(b, "**Verification was not run** (%s): the reduced sheet has not been checked against the original by AC analysis.\n\n", mdText(v.Skipped))
	case v.Err != "":
		b.WriteString("**Verification FAILED**: the AC comparison could not be completed, so the reduced sheet is unproven. Use the faded sheet, not the reduced one, until this is resolved (see Verification below).\n\n")
	case v.failed():
		b.WriteString("**Verification FAILED**: the reduced circuit does not match the original within tolerance. Use the faded sheet, not the reduced one, until this is resolved (see Verification below).\n\n")
	default:
		fmt.Fprintf(b, "**Verification passed**: the reduced circuit matches the original within %s dB and %s° at every port pair checked.\n\n",
			num(v.TolDB), num(v.TolDeg))
	}
}

// writeFindings lists, right under the verdict, the figures pare found
// questionable (an oscillator that misses the band, an IF can tuned off the
// IF, poor tracking): what a repairer wants to see before any table.
func writeFindings(b *bytes.Buffer, n *note) {
	var lines []string
	for _, s := range n.Stages {
		for _, f := range s.Flags {
			lines = append(lines, fmt.Sprintf("- **%s** %s: %s", mdText(s.Name), mdText(s.Title), mdText(f)))
		}
	}
	if len(lines) == 0 {
		return
	}
	b.WriteString("**Figures to check** (flagged by pare from the part values; each is also in the stage table):\n\n")
	b.WriteString(strings.Join(lines, "\n"))
	b.WriteString("\n\n")
}

func writeSheets(b *bytes.Buffer, n *note) {
	if len(n.Sheets) == 0 {
		return
	}
	b.WriteString("## Sheets\n\n")
	for _, s := range n.Sheets {
		fmt.Fprintf(b, "![%s](%s)\n\n", mdText(s.Alt), s.File)
		if s.Caption != "" {
			fmt.Fprintf(b, "*%s*\n\n", mdText(s.Caption))
		}
	}
}

func writeStages(b *bytes.Buffer, n *note) {
	b.WriteString("## Stages\n\n")
	if n.StagesLimit != "" {
		fmt.Fprintf(b, "The stage search stopped early (%s); the list below may be incomplete.\n\n", mdText(n.StagesLimit))
	}
	if len(n.Stages) == 0 {
		b.WriteString("No stage was recognised in the reduced circuit.\n\n")
		return
	}
	b.WriteString("| stage | what | family | parts | figures | flags |\n")
	b.WriteString("|---|---|---|---|---|---|\n")
	for _, s := range n.Stages {
		what := mdCell(s.Title)
		if s.Topology != "" {
			what += " (`" + mdCode(s.Topology) + "`)"
		}
		if len(s.Contains) > 0 {
			what += "; contains " + strings.Join(s.Contains, ", ")
		}
		flags := make([]string, len(s.Flags))
		for i, f := range s.Flags {
			flags[i] = mdCell(f)
		}
		fmt.Fprintf(b, "| %s | %s | %s | %s | %s | %s |\n", mdCell(s.Name), what, mdCell(s.Family),
			codeList(s.Parts), orDash(mdCell(s.Figures)), orDash(strings.Join(flags, ", ")))
	}
	b.WriteString("\n")
}

func writeParts(b *bytes.Buffer, n *note) {
	b.WriteString("## Parts before → after\n\n")
	b.WriteString("| | parts | nets |\n|---|---|---|\n")
	fmt.Fprintf(b, "| original | %d | %d |\n", n.Before.Parts, n.Before.Nets)
	fmt.Fprintf(b, "| reduced | %d | %d |\n\n", n.After.Parts, n.After.Nets)
	if len(n.Removed) > 0 {
		fmt.Fprintf(b, "Removed (drawn faded on the faded sheet): %s.\n\n", codeList(n.Removed))
	}
	if len(n.Merged) > 0 {
		b.WriteString("Merged:\n\n")
		for _, m := range n.Merged {
			fmt.Fprintf(b, "- `%s` stands for %s\n", mdCode(m.Into), codeList(m.From))
		}
		b.WriteString("\n")
	}
	if len(n.ACGround) > 0 {
		fmt.Fprintf(b, "At AC ground for the small signal: %s.\n\n", codeList(n.ACGround))
	}
	for _, g := range n.Gangs {
		fmt.Fprintf(b, "Gang `%s`: %s.\n\n", mdCode(g.Name), codeList(g.Parts))
	}
}

func writeSteps(b *bytes.Buffer, n *note) {
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
func stepLine(s noteStep) string {
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

func writeVerify(b *bytes.Buffer, n *note) {
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
	if !v.OK {
		verdict = "**Failed**"
	}
	fmt.Fprintf(b, "%s against a tolerance of %s dB and %s°: the original and the reduced circuit were swept by small-signal AC analysis over each pair's band, and the worst deviation is listed.\n\n",
		verdict, num(v.TolDB), num(v.TolDeg))
	if len(v.Pairs) == 0 {
		b.WriteString("No port pair was compared.\n\n")
	} else {
		b.WriteString("| quantity | what | worst dB | worst ° | at | gang | result |\n")
		b.WriteString("|---|---|---|---|---|---|---|\n")
		for _, p := range v.Pairs {
			res := "ok"
			switch {
			case p.Error != "":
				res = "**not solved**: " + mdCell(p.Error)
			case !p.within(v.TolDB, v.TolDeg):
				res = "**out of tolerance**"
			}
			dB, deg, at := num(p.MaxDB), num(p.MaxDeg), value.Format(p.AtHz, value.Hertz, value.Symbol)
			if p.Error != "" {
				dB, deg, at = "–", "–", "–"
			}
			fmt.Fprintf(b, "| `%s` | %s | %s | %s | %s | %s | %s |\n", mdCode(p.label()), mdCell(p.What),
				dB, deg, at, orDash(mdCell(p.Setting)), res)
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

func writeWarnings(b *bytes.Buffer, n *note) {
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

// num prints a deviation or tolerance with at most three decimals and no
// trailing zeros: "0.5", "0.012", "5".
func num(v float64) string {
	s := fmt.Sprintf("%.3f", v)
	s = strings.TrimRight(s, "0")
	s = strings.TrimSuffix(s, ".")
	if s == "-0" {
		s = "0"
	}
	return s
}

func orDash(s string) string {
	if s == "" {
		return "–"
	}
	return s
}

// codeList writes refs or net names as code spans, so underscores in names
// like osc_g are never read as emphasis.
func codeList(items []string) string {
	out := make([]string, len(items))
	for i, s := range items {
		out[i] = "`" + mdCode(s) + "`"
	}
	return strings.Join(out, ", ")
}

// mdCode keeps a code span intact: a backtick inside would end it.
func mdCode(s string) string { return strings.ReplaceAll(s, "`", "'") }

// mdText escapes the characters that would turn free text (a rule's
// justification, a title) into markup: emphasis, links, HTML, headings.
// An underscore inside a word (rf_tank) starts no emphasis in CommonMark, so
// it is left alone and the raw note stays readable.
func mdText(s string) string {
	var b strings.Builder
	rs := []rune(s)
	for i, r := range rs {
		switch r {
		case '\\', '*', '`', '[', ']', '#':
			b.WriteRune('\\')
			b.WriteRune(r)
		case '_':
			if i > 0 && i+1 < len(rs) && isWordRune(rs[i-1]) && isWordRune(rs[i+1]) {
				b.WriteRune(r)
			} else {
				b.WriteString(`\_`)
			}
		case '<', '>':
			// A backslash escape keeps the raw note readable ("|Xc| \> 0.1·|Z|")
			// and, unlike a bare '<', never opens an HTML tag.
			b.WriteRune('\\')
			b.WriteRune(r)
		case '\n', '\r':
			b.WriteRune(' ')
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

func isWordRune(r rune) bool { return unicode.IsLetter(r) || unicode.IsDigit(r) }

// mdCell is mdText for a table cell, where a bar would start a new column.
func mdCell(s string) string { return strings.ReplaceAll(mdText(s), "|", `\|`) }

// figureLabel turns a figure key into the words a note prints before it:
// "f_min_hz" -> "f min", "q_loaded" -> "q loaded". The unit is dropped
// because FigureText prints it with the number.
func figureLabel(key string) string {
	for _, suffix := range []string{"_hz", "_ohm", "_s", "_f", "_h", "_v", "_a", "_db", "_deg"} {
		if strings.HasSuffix(key, suffix) && len(key) > len(suffix) {
			key = strings.TrimSuffix(key, suffix)
			break
		}
	}
	return strings.ReplaceAll(key, "_", " ")
}
