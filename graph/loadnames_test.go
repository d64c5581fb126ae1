package graph

import (
	"math/rand/v2"
	"regexp"
	"strings"
	"testing"
)

// TestNameChecksAreTheExpressions: each hand-written spelling check answers
// as the regular expression it replaced (kept here as its definition) on
// hand-picked strings and on random strings over the characters that matter.
func TestNameChecksAreTheExpressions(t *testing.T) {
	checks := []struct {
		name string
		re   *regexp.Regexp
		f    func(string) bool
	}{
		{"ref", regexp.MustCompile(`^[A-Za-z]+[0-9]+[A-Za-z]?$`), isRefDesignator},
		{"net", regexp.MustCompile(`^[A-Za-z0-9_+\-.]+$`), isNetName},
		{"bare", regexp.MustCompile(`^\s*[0-9]*\.?[0-9]+([eE][-+]?[0-9]+)?\s*$`), isBareNumber},
		{"dash", regexp.MustCompile("^\\s*[0-9][0-9.]*\\s*[A-Za-z\u00b5\u03a9]*\\s*[-\u2013]\\s*[0-9]"), looksDashRange},
	}
	picked := []string{"", "R", "1", "R1", "R12", "V1a", "V1ab", "VR1a2", "r1", "R1_", "µ1", "gnd", "n+1", "a b",
		"HT-1.2", "a\n", "5", "5.", ".5", "0.05", " 0.05 ", "1e3", "1E+3", "1.5e-03", "1.5e", "e3", "1..2", "10n",
		"\t7\f", "\v7", "1e3\n", "--", "+", "530k-1700k", " 530 k - 1700k", "530k\u20131700k", "1\u00b5-2\u00b5", "5\u03a9 -1",
		"5\u03bc-1", "5\u2126-1", "5k..7k", "-5", "5-", "5 - x", "1.2.3kHz-4", "5\u00b5\u00b5-9"}
	// Random strings of characters (and bytes of them) that the checks
	// decide on, and some they must refuse.
	alphabet := []string{"a", "Z", "0", "9", ".", "e", "E", "+", "-", "_", " ", "\t", "\n", "\f", "\v", "\r",
		"\u00b5", "\u03bc", "\u03a9", "\u2126", "\u2013", "\xc2", "\xb5"}
	r := rand.New(rand.NewPCG(13, 7))
	for i := 0; i < 40000; i++ {
		var b strings.Builder
		for k := r.IntN(8); k > 0; k-- {
			b.WriteString(alphabet[r.IntN(len(alphabet))])
		}
		picked = append(picked, b.String())
	}
	for _, c := range checks {
		for _, s := range picked {
			if got, want := c.f(s), c.re.MatchString(s); got != want {
				t.Errorf("%s(%q) = %v, the expression says %v", c.name, s, got, want)
			}
		}
	}
}
