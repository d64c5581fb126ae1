// Package note writes the repair note: a Markdown page written next to the
// sheets by the main job. The writer works on plain data (Note and
// friends) rather than on the rules, ac and stages types directly, so it
// can be tested with hand-made inputs and does not change when those
// packages grow fields; FromResult fills that data from the pipeline's one
// result.
package note

import (
	"bytes"
	"fmt"
	"io"
	"strings"

	"pare/cmd/internal/align"
)

// Note is everything the repair note says, already turned into text where
// formatting depends on another package (stage figures, positions).
type Note struct {
	Title       string
	Source      string // netlist file name as the note shows it
	Version     string
	Level       string // reduction level name
	Symbols     string // "IEC 60617" or "IEEE 315"
	CircuitNote string // the netlist's own `note`
	Furniture   []string
	Warnings    []string // transcription warnings, already "file:line: text"
	Sheets      []Sheet

	Before, After PartCount
	Removed       []string // original refs the reduction took out
	Merged        []Merge  // reduced part -> the originals it stands for
	// Drawn is Merged as the reduced sheet draws it, for the hover: a
	// merged bias divider drawn as its halves pairs each half with itself
	// (pipeline.Result.ReducedDrawn). Nil: the sheet draws Merged.
	Drawn    []Merge
	ACGround []string
	Gangs    []Gang
	// The parts' own notes from the netlist: on the reduced sheet, and
	// removed by the reduction.
	PartNotes, RemovedNotes []PartNote

	Stages      []Stage
	StagesLimit string // set when the stage search stopped early, with why
	// OtherBands are the gang-tuned stages of each other position of the
	// wavechange switch, from that band's own run (otherBands).
	OtherBands []Band
	Steps      []Step
	NearMisses []Step // candidates a numeric guard turned down
	Verify     Verify
	Caution    Caution
	DC         DC // the voltage chart
	// Align is the alignment and signal-tracing guide (cmd/internal/align);
	// nil when the stages were not found.
	Align *align.Guide
	// AlignMarks say on which sheet each part the alignment turns is marked,
	// one line a part in step order ("T7, steps 1 and 2: the reduced sheet
	// 2 of 3 and the faded sheet 5 of 8").
	AlignMarks []string
}

type PartCount struct{ Parts, Nets int }

// Sheet is a drawing beside the note. View (ViewReduced, ViewFaded or
// empty) is the part it plays in the HTML note's hover.
type Sheet struct{ File, Alt, Caption, View string }

type Merge struct {
	Into string
	From []string
}

type Gang struct {
	Name  string
	Parts []string
}

type Stage struct {
	Name, Title, Topology, Family string
	Parts                         []string
	Figures                       string // one line, as `pare stages` prints it
	Flags                         []string
	Contains                      []string
	// Checks are the figures' formula cross-checks (figure.Checks), Notes
	// the stage's own (a name the solver did not bear out, and why).
	Checks, Notes []string
}

type Step struct {
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
	Where    []Place // the parts concerned and where they were written
}

// Place is a part and its netlist position ("file:line", or "" when
// pare made the part).
type Place struct{ Ref, At string }

// Verify is the outcome of the AC comparison of the original against the
// reduced circuit. Exactly one of Skipped, Err or Pairs describes it.
type Verify struct {
	Skipped string // why it was not run ("--no-verify"), empty when it ran
	Err     string // why it could not be completed
	OK      bool
	TolDB   float64
	TolDeg  float64
	Pairs   []Pair
	Notes   []string // what could not be compared, and why
	// Empty: no transfer and no tank impedance was compared, so nothing
	// was proven (never a pass).
	Empty bool
	Rails []string // declared outputs on a rail: nothing there is compared
}

type Pair struct {
	From, To, What string
	MaxDB, MaxDeg  float64
	AtHz           float64
	Setting        string // gang setting of the worst point
	Error          string // the reduced circuit could not be solved for this pair
	Bands          string // what it was swept over
}

// Label names the quantity compared, as the verify command prints it:
// "V(out)/V(in)" for a transfer, "Z(net)" for an impedance.
func (p Pair) Label() string {
	if p.What == "impedance" {
		return "Z(" + p.From + ")"
	}
	return "V(" + p.To + ")/V(" + p.From + ")"
}

// within reports whether the pair is inside the tolerance.
func (p Pair) within(tolDB, tolDeg float64) bool {
	return p.Error == "" && p.MaxDB <= tolDB && p.MaxDeg <= tolDeg
}

// Failed reports whether the note must say the verification failed.
func (v Verify) Failed() bool { return v.Skipped == "" && (v.Err != "" || !v.OK || v.Unproven()) }

// Unproven reports a comparison that ran but cannot stand for the
// declared outputs: one of them is on a rail, where nothing is compared.
// Never a pass. (An empty comparison is Empty.)
func (v Verify) Unproven() bool {
	return v.Skipped == "" && v.Err == "" && len(v.Rails) > 0
}

// Caution is the note's safety block, as graph/safety words it for the set:
// a bold heading, one item per line, and what the choice rests on.
type Caution struct {
	Heading string
	Lines   []string
	Basis   string
}

// legendIntro opens the note's legend: the one place the whole list is
// (a page's title block lists only the lines about what it draws, and
// says how many more when they do not fit).
const legendIntro = "The set's bands, regions, tuning ranges and switch positions, whole: each page of a sheet cut onto paper lists those about what it draws."

// Write writes the repair note. Output depends only on n, so the same
// run gives the same bytes.
func Write(w io.Writer, n *Note) error {
	var b bytes.Buffer
	title := n.Title
	if title == "" {
		title = n.Source
	}
	fmt.Fprintf(&b, "# Repair note: %s\n\n", mdText(title))
	fmt.Fprintf(&b, "Made by pare %s from `%s` at reduction level **%s**, symbols %s.\n\n",
		n.Version, mdCode(n.Source), mdText(n.Level), mdText(n.Symbols))

	writeCaution(&b, n.Caution)

	if n.CircuitNote != "" {
		fmt.Fprintf(&b, "%s\n\n", mdText(n.CircuitNote))
	}
	if len(n.Furniture) > 0 {
		b.WriteString("## Legend\n\n" + legendIntro + "\n\n")
		for _, f := range n.Furniture {
			fmt.Fprintf(&b, "- %s\n", mdText(f))
		}
		b.WriteString("\n")
	}

	writeVerdict(&b, n)
	writeFindings(&b, n)
	writeSheets(&b, n)
	writeStages(&b, n)
	writeOtherBands(&b, n)
	writeDC(&b, n)
	if n.Align != nil {
		if err := align.WriteMarkdown(&b, n.Align); err != nil {
			return err
		}
	}
	writeParts(&b, n)
	writePartNotes(&b, n)
	writeSteps(&b, n)
	writeVerify(&b, n)
	writeWarnings(&b, n)
	_, err := w.Write(b.Bytes())
	return err
}

// writeCaution puts the caution before anything technical: a reader who
// stops early has read it.
func writeCaution(b *bytes.Buffer, c Caution) {
	fmt.Fprintf(b, "> **%s**\n>\n", mdText(c.Heading))
	for _, l := range c.Lines {
		fmt.Fprintf(b, "> - %s\n", mdText(l))
	}
	if c.Basis != "" {
		fmt.Fprintf(b, ">\n> *%s*\n", mdText(c.Basis))
	}
	b.WriteString("\n")
}

// writeVerdict puts the one thing a reader must not miss at the top: whether
// the reduced drawing was proven to behave like the original.
func writeVerdict(b *bytes.Buffer, n *Note) {
	v := n.Verify
	switch {
	case v.Skipped != "":
		fmt.Fprintf(b, "**Verification was not run** (%s): the reduced sheet has not been checked against the original by AC analysis.\n\n", mdText(v.Skipped))
	case v.Empty && v.Err == "":
		b.WriteString("**Verification proved nothing**: nothing comparable, no transfer and no tank impedance could be compared, so the reduced sheet is unproven. Declare an input and an output (or a region with both) and run again; until then use the faded sheet.\n\n")
	case v.Err != "":
		b.WriteString("**Verification FAILED**: the AC comparison could not be completed, so the reduced sheet is unproven. Use the faded sheet, not the reduced one, until this is resolved (see Verification below).\n\n")
	case v.Unproven():
		b.WriteString("**Not verified**: a declared output is on a rail, where nothing can be compared (see Verification below), so the reduced sheet is unproven. Use the faded sheet, not the reduced one, for anything that matters.\n\n")
	case v.Failed():
		b.WriteString("**Verification FAILED**: the reduced circuit does not match the original within tolerance. Use the faded sheet, not the reduced one, until this is resolved (see Verification below).\n\n")
	default:
		fmt.Fprintf(b, "**Verification passed**: the reduced circuit matches the original within %s dB and %s° at every port pair checked.\n\n",
			Num(v.TolDB), Num(v.TolDeg))
	}
}

// dcFinding heads a DC chart warning among the figures to check.
const dcFinding = "DC operating point"

// findingsLead says where the figures to check come from: the stage table
// alone, or the DC voltage chart too when it warns.
func findingsLead(n *Note) string {
	if len(n.DC.Warnings) > 0 {
		return "(flagged by pare from the part values; each is also in the stage table or under the DC voltage chart)"
	}
	return "(flagged by pare from the part values; each is also in the stage table)"
}

// writeFindings lists, right under the verdict, the figures pare found
// questionable (an oscillator that misses the band, an IF can tuned off the
// IF, poor tracking): what a repairer wants to see before any table.
func writeFindings(b *bytes.Buffer, n *Note) {
	var lines []string
	for _, s := range n.Stages {
		for _, f := range s.Flags {
			lines = append(lines, fmt.Sprintf("- **%s** %s: %s", mdText(s.Name), mdText(s.Title), mdText(f)))
		}
	}
	for _, w := range n.DC.Warnings {
		lines = append(lines, fmt.Sprintf("- **%s**: %s", dcFinding, mdText(w)))
	}
	if len(lines) == 0 {
		return
	}
	b.WriteString("**Figures to check** " + findingsLead(n) + ":\n\n")
	b.WriteString(strings.Join(lines, "\n"))
	b.WriteString("\n\n")
}

func writeSheets(b *bytes.Buffer, n *Note) {
	if len(n.Sheets) == 0 {
		return
	}
	b.WriteString("## Sheets\n\n")
	if len(n.AlignMarks) > 0 {
		b.WriteString(alignMarksIntro + "\n\n")
		for _, l := range n.AlignMarks {
			fmt.Fprintf(b, "- %s\n", mdText(l))
		}
		b.WriteString("\n")
	}
	for _, s := range n.Sheets {
		fmt.Fprintf(b, "![%s](%s)\n\n", mdText(s.Alt), s.File)
		if s.Caption != "" {
			fmt.Fprintf(b, "*%s*\n\n", mdText(s.Caption))
		}
	}
}

func writeStages(b *bytes.Buffer, n *Note) {
	b.WriteString("## Stages\n\n")
	if n.StagesLimit != "" {
		fmt.Fprintf(b, "The stage search stopped early (%s); the list below may be incomplete.\n\n", mdText(n.StagesLimit))
	}
	if len(n.Stages) == 0 {
		b.WriteString("No stage was recognised in the reduced circuit.\n\n")
		return
	}
	writeStageTable(b, n.Stages)
	b.WriteString("\n")
	writeChecks(b, n.Stages)
}

// writeStageTable writes stages as the note's table of them.
func writeStageTable(b *bytes.Buffer, sts []Stage) {
	b.WriteString("| stage | what | family | parts | figures | flags |\n")
	b.WriteString("|---|---|---|---|---|---|\n")
	for _, s := range sts {
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
}

// writeChecks lists under the stage table how its figures were checked:
// each is the solver's on the stage as it sits in the reduced circuit,
// with the handbook formula beside it and why they part where they do,
// and each name the solver did not bear out.
func writeChecks(b *bytes.Buffer, sts []Stage) {
	var lines []string
	for _, s := range sts {
		for _, c := range append(append([]string(nil), s.Checks...), s.Notes...) {
			lines = append(lines, fmt.Sprintf("- **%s** %s", mdText(s.Name), mdText(c)))
		}
	}
	if len(lines) == 0 {
		return
	}
	b.WriteString("The figures are the AC solver's, on each stage as it sits in the reduced circuit; the handbook formula is their cross-check:\n\n")
	b.WriteString(strings.Join(lines, "\n"))
	b.WriteString("\n\n")
}

func writeParts(b *bytes.Buffer, n *Note) {
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
