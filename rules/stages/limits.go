package stages

import "fmt"

// MaxMatches bounds the matches one search holds, over all patterns. The
// built-in library finds a few hundred on the largest sets; a loose user
// pattern (four resistors on one net) found half a million on a 60-part
// star and held them all, 144 MB and 11 s, with no word. The step budget
// alone does not bound this: it counts steps, not what they keep. Only
// matches their pattern's guards pass are held (searcher.eval): a
// supply filter section tried on every element and every capacitor of a
// rail shared by a bank's channels, nearly all refused, held 20,000 at
// 5,020 parts and stopped the search with most of the bank's supplies
// not yet looked at.
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
