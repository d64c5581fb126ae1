package value

import (
	"fmt"
	"strings"
)

// Range is a min..max span: a variable capacitor 12p..420p, a tuning band
// 530k..1700k. A single value has Min == Max.
type Range struct{ Min, Max float64 }

// IsSpan reports whether the range covers more than one value.
func (r Range) IsSpan() bool { return r.Min != r.Max }

// Mid is the arithmetic midpoint. For a tuning capacitor or a band the
// geometric mean is sometimes the better "centre", but arithmetic keeps Mid
// consistent with At(0.5), which is what a half-turned control gives.
func (r Range) Mid() float64 { return r.Min + (r.Max-r.Min)/2 }

// At returns the value a fraction frac of the way from Min to Max, linearly.
// frac outside 0..1 extrapolates; clamping is left to the caller.
func (r Range) At(frac float64) float64 { return r.Min + frac*(r.Max-r.Min) }

// ParseRange reads "12p..420p" (spaces around ".." allowed) or a single
// value. Each side carries its own prefix, so "1..10k" is 1 to 10000: a
// shared trailing unit would be ambiguous with a plain lower bound. Values
// must be non-negative and Min must not exceed Max.
func ParseRange(s string, want Unit) (Range, error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return Range{}, &inputError{kind: ErrSyntax, what: "range"}
	}
	lo, hi, found := strings.Cut(t, "..")
	if !found {
		lo, hi, found = strings.Cut(t, "\u2026") // an ellipsis typed by an editor
	}
	if !found {
		v, err := Parse(t, want)
		if err != nil {
			return Range{}, fmt.Errorf("range %q: %w", t, err)
		}
		if v < 0 {
			return Range{}, rangeError(t, fmt.Sprintf("negative value %q", t))
		}
		return Range{v, v}, nil
	}
	lo, hi = strings.TrimSpace(lo), strings.TrimSpace(hi)
	switch {
	case lo == "":
		return Range{}, rangeError(t, `nothing before ".."`)
	case hi == "":
		return Range{}, rangeError(t, `nothing after ".."`)
	case strings.HasPrefix(hi, ".") || strings.Contains(hi, "..") || strings.Contains(hi, "\u2026"):
		return Range{}, rangeError(t, `write exactly one ".." between two values`)
	}
	min, err := Parse(lo, want)
	if err != nil {
		return Range{}, fmt.Errorf("range %q: %w", t, err)
	}
	max, err := Parse(hi, want)
	if err != nil {
		return Range{}, fmt.Errorf("range %q: %w", t, err)
	}
	switch {
	case min < 0:
		return Range{}, rangeError(t, fmt.Sprintf("negative value %q", lo))
	case max < 0:
		return Range{}, rangeError(t, fmt.Sprintf("negative value %q", hi))
	case min > max:
		return Range{}, rangeError(t, fmt.Sprintf("%s is above %s; write the smaller value first", lo, hi))
	}
	return Range{min, max}, nil
}

func rangeError(t, msg string) error {
	kind := ErrSyntax
	if !strings.Contains(msg, `".."`) {
		kind = ErrOutOfRange
	}
	return &inputError{kind: kind, what: "range", text: t, msg: msg}
}

// FormatRange writes "12–420 pF" (Symbol, sharing the suffix when both ends
// have the same one) or "12p..420p" (Code, which ParseRange reads back). A
// single value is written as by Format.
func FormatRange(r Range, u Unit, s Style) string {
	if !r.IsSpan() {
		return Format(r.Min, u, s)
	}
	if s == Code {
		return Format(r.Min, u, Code) + ".." + Format(r.Max, u, Code)
	}
	loNum, loSuf := formatParts(r.Min, u, s, DefaultDigits)
	hiNum, hiSuf := formatParts(r.Max, u, s, DefaultDigits)
	// "0–10 kΩ" reads better than "0 Ω–10 kΩ", and zero needs no prefix.
	if loSuf == hiSuf || r.Min == 0 {
		return join(loNum+"\u2013"+hiNum, hiSuf, u, s)
	}
	return join(loNum, loSuf, u, s) + "\u2013" + join(hiNum, hiSuf, u, s)
}
