package ac

import (
	"fmt"

	"pare/graph"
)

// withoutRails drops the quantities whose end is a net the circuit declares
// to be AC ground (a supply rail, a heater or bias line; ground itself is
// refused at load): both circuits show zero there, so the pair would
// "pass" with nothing compared. A note says so, and a comparison left with
// no pair is not a pass (Report.Pairs is empty; callers say "not verified").
func withoutRails(orig *graph.Circuit, qs []quantity, rep *Report) []quantity {
	out := qs[:0]
	for _, q := range qs {
		rail := ""
		for _, n := range []string{q.from, q.to} {
			if n != "" && orig.RoleOf(n).IsACGround() {
				rail = n
				break
			}
		}
		if rail != "" {
			label := Pair{From: q.from, To: q.to, What: q.what}.Label()
			rep.Notes = append(rep.Notes, fmt.Sprintf("%s is not compared: %s is a %s net, AC ground for the signal, where both circuits show nothing",
				label, rail, orig.RoleOf(rail)))
			continue
		}
		out = append(out, q)
	}
	return out
}
