// The spelling checks the loader makes on every part, pin and value, written
// out by hand: as regular expressions they were a twentieth of loading a
// large file. loadnames_test.go holds each to the expression it replaces.

package graph

import "strings"

func isLetter(c byte) bool { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') }
func isDigit(c byte) bool  { return c >= '0' && c <= '9' }

// digitsFrom is the index after the run of digits that starts at i.
func digitsFrom(s string, i int) int {
	for i < len(s) && isDigit(s[i]) {
		i++
	}
	return i
}

// isRefDesignator: letters, then a number, then at most one letter (R12,
// C3, V1a); the expression ^[A-Za-z]+[0-9]+[A-Za-z]?$.
func isRefDesignator(s string) bool {
	i := 0
	for i < len(s) && isLetter(s[i]) {
		i++
	}
	j := digitsFrom(s, i)
	if i == 0 || j == i {
		return false
	}
	if j < len(s) && isLetter(s[j]) {
		j++
	}
	return j == len(s)
}

// isNetName: letters, digits and _ + - . only, at least one; the expression
// ^[A-Za-z0-9_+\-.]+$.
func isNetName(s string) bool {
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !isLetter(c) && !isDigit(c) && c != '_' && c != '+' && c != '-' && c != '.' {
			return false
		}
	}
	return true
}

// isBareNumber: digits alone, no unit and no prefix, with white space
// around; the expression ^\s*[0-9]*\.?[0-9]+([eE][-+]?[0-9]+)?\s*$.
func isBareNumber(s string) bool {
	s = strings.Trim(s, "\t\n\f\r ") // \s in Go's expressions
	i := digitsFrom(s, 0)
	if i < len(s) && s[i] == '.' {
		j := digitsFrom(s, i+1)
		if j == i+1 {
			return false
		}
		i = j
	} else if i == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		k := i + 1
		if k < len(s) && (s[k] == '+' || s[k] == '-') {
			k++
		}
		j := digitsFrom(s, k)
		if j == k {
			return false
		}
		i = j
	}
	return i == len(s)
}

// skipWhite is the index after the white space (\s in Go's expressions)
// that starts at i.
func skipWhite(s string, i int) int {
	for i < len(s) && (s[i] == ' ' || s[i] == '\t' || s[i] == '\n' || s[i] == '\f' || s[i] == '\r') {
		i++
	}
	return i
}

// looksDashRange: a value, maybe a unit, then a dash and a digit: a span
// written with a dash ("530k-1700k"), a slip for ".."; the expression
// ^\s*[0-9][0-9.]*\s*[A-Za-z\u00b5\u03a9]*\s*[-\u2013]\s*[0-9], asked of every
// capacitor's value.
func looksDashRange(s string) bool {
	i := skipWhite(s, 0)
	if i >= len(s) || !isDigit(s[i]) {
		return false
	}
	for i++; i < len(s) && (isDigit(s[i]) || s[i] == '.'); i++ {
	}
	i = skipWhite(s, i)
	for i < len(s) {
		switch {
		case isLetter(s[i]):
			i++
		case strings.HasPrefix(s[i:], "\u00b5"), strings.HasPrefix(s[i:], "\u03a9"):
			i += 2
		default:
			goto dash
		}
	}
dash:
	i = skipWhite(s, i)
	switch {
	case i < len(s) && s[i] == '-':
		i++
	case strings.HasPrefix(s[i:], "\u2013"):
		i += len("\u2013")
	default:
		return false
	}
	i = skipWhite(s, i)
	return i < len(s) && isDigit(s[i])
}
