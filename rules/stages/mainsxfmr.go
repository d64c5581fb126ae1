package stages

import (
	"fmt"

	"pare/graph"
)

// A mains transformer is never a tuned stage. Its windings have capacitors
// across them (a class-X capacitor on the primary, a buffer capacitor on
// the HT winding) and it resonates with them in the audio band, so by its
// shape it matches a double-tuned transformer; with the DC point missing,
// the HT rail is not AC ground and review19 a05's T1 stayed on the reduced
// sheet, named "Double-tuned transformer" (562.7 Hz and 807.4 Hz).

// powerRegionMax is the highest band top of a region that works at the
// mains frequency and its harmonics (a "supply" region of 50..300 Hz):
// below the audio band's middle, 1 kHz (common practice, no source).
const powerRegionMax = 1e3

// mainsTransformer says why transformer part ci is a mains or power
// transformer, "" when nothing says so: it declares the rectifier winding's
// volts (vac) or the mains frequency (hz), a net or port on it speaks of
// the mains (onMains), a winding of it feeds a power rectifier, or its
// region works at the mains frequency.
func (x *figCtx) mainsTransformer(ci int) string {
	p := x.w.parts[ci]
	if p.Kind != graph.Transformer {
		return ""
	}
	if _, ok := p.Param("hz"); ok {
		return "it declares the mains frequency"
	}
	if onMains(x.w.c, p) {
		return "it is on the mains or declares its rectifier winding's volts"
	}
	for _, id := range x.w.pins[ci] {
		if id == groundNet {
			continue
		}
		for _, cj := range x.w.conns[id] {
			if cj != ci && x.isPowerRectifier(cj) {
				return fmt.Sprintf("it feeds the rectifier %s", x.w.parts[cj].Ref)
			}
		}
	}
	if r := x.w.c.RegionOf(p); r != nil && r.Band.Max > 0 && r.Band.Max <= powerRegionMax {
		return fmt.Sprintf("its region %s works at %s", r.Name, hzText(r.Band.Max))
	}
	return ""
}

// notMainsTuned drops a tuned stage on a mains transformer (keepSolved
// leaves its parts to the stages that hold them) and says true.
func (x *figCtx) notMainsTuned(ci int) bool {
	why := x.mainsTransformer(ci)
	if why == "" {
		return false
	}
	x.st.unconfirmed = fmt.Sprintf("%s is a mains transformer (%s): the capacitors across its windings tune nothing", x.w.parts[ci].Ref, why)
	return true
}
