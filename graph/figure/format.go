package figure

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"pare/graph/value"
)

// Medium is where a figure is written for a person. JSON, the third
// medium, takes the numbers at full precision (List.MarshalJSON).
type Medium int

const (
	// Text is notes, tables, flags and messages: as many digits as the
	// unit's row in units gives (four for frequencies, C and L).
	Text Medium = iota
	// Sheet is a drawing: three significant digits, as a part's marking
	// carries, and a range that shares its unit ("1–2.06 MHz").
	Sheet
)

// secondsPlain is where time constants start to read best in plain seconds
// ("0.1 s", "2.2 s"); shorter ones take a prefix ("4.7 ms").
const secondsPlain = 0.1

// Format writes one number of unit u for medium m: "1.47 MHz", "4.7 ms",
// "0.1 s", "-16.5", "35.8 dB".
func Format(v float64, u Unit, m Medium) string {
	switch {
	case u == Decibel:
		return fmt.Sprintf("%.1f dB", v)
	case u == Degree:
		// whole degrees: a margin read off a sweep is no finer
		// (common practice)
		return fmt.Sprintf("%.0f°", v)
	case u == Ratio || !u.known():
		return Plain(v)
	case u == Second && math.Abs(v) >= secondsPlain:
		return Plain(v) + " s"
	case u == Hertz && v != 0 && math.Abs(v) < 1:
		// "723 mHz" reads as megahertz on a service sheet (a reviewer
		// took a feedback loop's low-frequency pole for one): below a
		// hertz, plain decimals
		return Plain(v) + " Hz"
	}
	return value.FormatPrec(v, units[u].si, value.Symbol, digits(u, m))
}

func digits(u Unit, m Medium) int {
	if m == Sheet {
		return value.DefaultDigits
	}
	return units[u].digits
}

// Plain writes a plain number with three significant digits, or more where
// the integer part needs them ("-597", "1234", "0.00953").
func Plain(v float64) string {
	if v == 0 {
		return "0"
	}
	a := math.Abs(v)
	switch {
	case a >= 1000:
		return fmt.Sprintf("%.0f", v)
	case a >= 0.001:
		d := max(2-int(math.Floor(math.Log10(a))), 0)
		return trimZeros(fmt.Sprintf("%.*f", d, v))
	}
	return fmt.Sprintf("%.3g", v)
}

func trimZeros(s string) string {
	if !strings.Contains(s, ".") {
		return s
	}
	s = strings.TrimRight(s, "0")
	return strings.TrimSuffix(s, ".")
}

// Text writes a figure's value without its label: "1.47 MHz",
// "527.4 kHz–1.6 MHz", "620.9 kHz, 905.6 kHz and 1.486 MHz",
// "-7.708 kHz at 1.6 MHz".
func (f Figure) Text(m Medium) string {
	var s string
	switch {
	case f.Range != nil:
		s = f.rangeText(m)
	case f.Points != nil:
		s = Points(f.Points, f.Unit, m)
	default:
		s = Format(f.Value, f.Unit, m)
	}
	if f.At != nil {
		s += " at " + f.At.Text(m)
	}
	return s
}

// rangeText writes a range end to end; on a sheet the two ends share their
// prefixed unit where they can, as the sheet's tuning lines do.
func (f Figure) rangeText(m Medium) string { return FormatRange(*f.Range, f.Unit, m) }

// FormatRange writes a range of unit u for medium m: a sheet's ends share
// their prefixed unit where they can ("1–2.06 MHz", and one value where
// the range is one). Sheets write bands and regions with it.
func FormatRange(r value.Range, u Unit, m Medium) string {
	if m == Sheet && u.known() && units[u].si != value.None && u != Second && !(u == Hertz && math.Min(math.Abs(r.Min), math.Abs(r.Max)) < 1) {
		return value.FormatRange(r, units[u].si, value.Symbol)
	}
	return Format(r.Min, u, m) + "\u2013" + Format(r.Max, u, m)
}

// Item is the figure as a person reads it in a list: its label, then its
// value ("osc f 1.004 MHz–2.063 MHz"). A formula cross-check is read
// apart (CheckLine), so the list of what to measure stays short.
func (f Figure) Item(m Medium) string {
	return f.label() + " " + f.Text(m)
}

func (f Figure) label() string {
	if f.Label != "" {
		return f.Label
	}
	return strings.ReplaceAll(f.Name, "_", " ")
}

// CheckLine is a figure's formula cross-check as a person reads it: the
// figure, where the solver gave it, the formula's value and how far off,
// and why where they part by more than CheckAgreement ("gain -58.3 in
// circuit; formula A = −µ·RL/(ra+RL) gives -61.5, 5.5 % off: …"). Empty
// for a figure without one.
func (f Figure) CheckLine(m Medium) string {
	c := f.Check
	if c == nil {
		return ""
	}
	s := f.Item(m) + " in circuit; formula " + c.Origin.Name + " gives " + c.Text(m)
	if !f.CheckDiffers() {
		return s + ", within " + Plain(100*CheckAgreement) + " %"
	}
	if n, m := len(f.Points), len(c.Points); n != m {
		s += ", " + strconv.Itoa(m) + " against " + strconv.Itoa(n) + " in circuit"
	} else {
		s += ", " + Plain(100*f.checkOff()) + " % off"
	}
	if f.Why != "" {
		s += ": " + f.Why
	}
	return s
}

// checkOff is the largest relative difference of the cross-check from the
// figure, over a range's two ends.
func (f Figure) checkOff() float64 {
	c := f.Check
	off := func(a, b float64) float64 { return math.Abs(b-a) / math.Abs(a) }
	switch {
	case f.Points != nil || c.Points != nil:
		worst := 0.0 // over the pairs both have; CheckLine says when the counts part
		for i := 0; i < len(f.Points) && i < len(c.Points); i++ {
			worst = math.Max(worst, off(f.Points[i], c.Points[i]))
		}
		return worst
	case f.Range != nil && c.Range != nil:
		return math.Max(off(f.Range.Min, c.Range.Min), off(f.Range.Max, c.Range.Max))
	case f.Range == nil && c.Range == nil:
		return off(f.Value, c.Value)
	case f.Range != nil:
		return math.Max(off(f.Range.Min, c.Value), off(f.Range.Max, c.Value))
	}
	return math.Max(off(f.Value, c.Range.Min), off(f.Value, c.Range.Max))
}

// Checks lists the cross-check lines of a stage's figures, in the list's
// order, working values left out.
func Checks(l List, m Medium) []string {
	var out []string
	for _, f := range l {
		if line := f.CheckLine(m); line != "" && !f.Working {
			out = append(out, line)
		}
	}
	return out
}

// Items lists a stage's figures as a person reads them, in the list's
// order: working values left out, the members of a group joined into one
// item ("suggested 3-point design: padder 366.6 pF, coil 130.8 µH, …") at
// the place of the first.
func Items(l List, m Medium) []string {
	var out []string
	done := map[string]bool{}
	for i, f := range l {
		switch {
		case f.Working:
		case f.Group == "":
			item := f.Item(m) + f.formulaMark()
			if at := f.solvedAtHz(); at != "" && at != nextSolvedAtHz(l[i+1:]) {
				item += " at " + at // once for a run of gains at one frequency
			}
			out = append(out, item)
		case !done[f.Group]:
			done[f.Group] = true
			var members []string
			for _, g := range l[i:] {
				if g.Group == f.Group && !g.Working {
					members = append(members, g.Item(m))
				}
			}
			out = append(out, f.Group+": "+strings.Join(members, ", "))
		}
	}
	return out
}

// solvedAtHz is the frequency a solved gain (a ratio or decibels) was
// taken at, as the solver's origin gives it ("563.7 kHz, gang at mid
// travel" gives "563.7 kHz"); "" for any other figure, and for one that
// says its own frequency (a gain at each end of the band). A gain without its
// frequency is read as the one a reader expects (an IF stage's at the IF)
// when the solver took it elsewhere (its load's peak): say where.
func (f Figure) solvedAtHz() string {
	if f.Origin.Source != Solver || (f.Unit != Ratio && f.Unit != Decibel) || f.Range != nil || f.Points != nil || f.At != nil {
		return ""
	}
	head, _, _ := strings.Cut(f.Origin.At, ",")
	if head = strings.TrimSpace(head); !strings.HasSuffix(head, "Hz") {
		return ""
	}
	return head
}

// nextSolvedAtHz is the frequency of the next figure a line prints, if it
// is a solved gain: a run of gains at one frequency names it once, last.
func nextSolvedAtHz(rest List) string {
	for _, g := range rest {
		if g.Working {
			continue
		}
		if g.Group != "" {
			return ""
		}
		return g.solvedAtHz()
	}
	return ""
}

// FormulaMark follows, in a list of figures, a figure of a kind the
// solver gives in circuit (a frequency or corner, a gain, an impedance
// into or out of a stage) that comes from its formula alone: "f c 3.18 kHz
// (formula)", so it is not read as the solver's. docs/patterns.md says so.
const FormulaMark = " (formula)"

// formulaMark is FormulaMark for a formula-only figure of a solver kind.
func (f Figure) formulaMark() string {
	if f.Origin.Source != Formula || f.Origin.Name == "" {
		return ""
	}
	switch {
	case f.Unit == Hertz, f.Unit == Ratio && strings.HasSuffix(f.Name, "gain"),
		f.Unit == Ohm && (strings.HasSuffix(f.Name, "r_out") || strings.HasSuffix(f.Name, "z_in") || strings.HasSuffix(f.Name, "z_out")):
		return FormulaMark
	}
	return ""
}

// Line is Items on one line, comma separated: the figures column of a
// table and a note.
func Line(l List, m Medium) string { return strings.Join(Items(l, m), ", ") }

// Points writes like values as prose: "600 kHz, 1.1 MHz and 1.6 MHz".
func Points(vs []float64, u Unit, m Medium) string {
	items := make([]string, len(vs))
	for i, v := range vs {
		items[i] = Format(v, u, m)
	}
	return AndList(items)
}

// AndList joins items as prose: "a", "a and b", "a, b and c".
func AndList(items []string) string {
	if len(items) < 2 {
		return strings.Join(items, "")
	}
	return strings.Join(items[:len(items)-1], ", ") + " and " + items[len(items)-1]
}
