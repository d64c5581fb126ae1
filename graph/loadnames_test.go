package graph

import (
	"math/rand/v2"
	"regexp"
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
	}
	picked := []string{"", "R", "1", "R1", "R12", "V1a", "V1ab", "VR1a2", "r1", "R1_", "µ1", "gnd", "n+1", "a b",
		"HT-1.2", "a\n", "5", "5.", ".5", "0.05", " 0.05 ", "1e3", "1E+3", "1.5e-03", "1.5e", "e3", "1..2", "10n",
		"\t7\f", "\v7", "1e3\n", "--", "+"}
	alphabet := []byte("aZ09.eE+-_ \t\n\f\v\rµ")
	r := rand.New(rand.NewPCG(13, 7))
	for i := 0; i < 20000; i++ {
		b := make([]byte, r.IntN(7))
		for k := range b {
			b[k] = alphabet[r.IntN(len(alphabet))]
		}
		picked = append(picked, string(b))
	}
	for _, c := range checks {
		for _, s := range picked {
			if got, want := c.f(s), c.re.MatchString(s); got != want {
				t.Errorf("%s(%q) = %v, the expression says %v", c.name, s, got, want)
			}
		}
	}
}
