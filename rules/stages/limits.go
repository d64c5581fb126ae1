package stages

import "fmt"

// MaxMatches bounds the matches one search holds, over all patterns. The
// built-in library finds a few hundred on the largest sets; a loose user
// pattern (four resistors on one net) found half a million on a 60-part
// star and held them all, 144 MB and 11 s, with no word. The step budget
// alone does not bound this: it counts steps, not what they keep.
const MaxMatches = 20_000

// tooMany stops the search once MaxMatches are held, with the limit's
// error so that the stages found so far are still reported.
func (s *searcher) tooMany(v *variant) error {
	if len(s.found) <= MaxMatches {
		return nil
	}
	return fmt.Errorf("%w: pattern %s matched more than %d times, the most pare keeps: make the pattern tighter (name fewer interchangeable parts, or fix nets with at = \"ground\" or outside = \"none\")",
		ErrSearchLimit, v.p.ID, MaxMatches)
}
