package align

import (
	"pare/graph"
	"pare/rules/stages"
)

// biasDevices are the active devices that hold a pair's halves apart
// rather than carry the signal: a Vbe multiplier (a transistor across the
// gap between a complementary pair's bases, rules/stages
// complementary-pair-vbe*) has its output electrode on one half's control
// net and its common electrode on the other's. Its capacitor holds the two
// bases together for the signal, so its own base is no point the signal
// passes: the trade injects on the pair's bases and on the driver, never
// on the multiplier, and a row there would quote the divider's loss as a
// stage gain. half is halves' map: a device is judged within its stage.
func biasDevices(c *graph.Circuit, sts []stages.Stage, half map[string]string) map[string]bool {
	out := map[string]bool{}
	for _, s := range sts {
		controls := map[string]bool{}
		for _, ref := range s.Parts {
			if p := c.Part(ref); p != nil && p.IsActive() && half[ref] == s.Name {
				controls[p.NetOf(p.PinWithRole(graph.RoleControl))] = true
			}
		}
		if len(controls) < 2 {
			continue
		}
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || !p.IsActive() || half[ref] != "" {
				continue
			}
			o, k := p.NetOf(p.PinWithRole(graph.RoleOutput)), p.NetOf(p.PinWithRole(graph.RoleCommon))
			if o != k && controls[o] && controls[k] {
				out[ref] = true
			}
		}
	}
	return out
}
