package rules

import (
	"fmt"

	"pare/graph"
)

// mergedNote is the note a parallel merge's result carries. Members that
// say the same thing (two halves of one anode load) keep it; members whose
// notes say different jobs (a screen feed, a smoothing resistor, a bleeder
// all from the HT line to AC ground) get a neutral description, since one
// member's note would tell the reader the whole bundle does that member's
// job (review 17's b05: seven resistors from ht kept R3's "heptode screen
// feed, about 90 V"). A member with no note says nothing against the other.
// A gang section with a trimmer or fixed capacitor across it stays the
// tuned section (the merge only shifts its range), so it keeps its note.
func (x *Ctx) mergedNote(r, s, o *graph.Part) string {
	if s.Note == o.Note || s.Note == "" || o.Note == "" || capClass(r) == 3 {
		return r.Note
	}
	a, b := Ends(r, false)
	return fmt.Sprintf("%d %s from %s to %s in parallel", len(r.From), plural(r.Kind), x.endName(a), x.endName(b))
}

// endName names a merged part's end for its note: a net at AC ground is
// "AC ground", whatever its name, since that is all the merge relied on.
func (x *Ctx) endName(net string) string {
	if x.IsACGround(net) {
		return "AC ground"
	}
	return net
}

func plural(k graph.Kind) string {
	switch k {
	case graph.Capacitor:
		return "capacitors"
	case graph.Inductor:
		return "coils"
	}
	return "resistors"
}
