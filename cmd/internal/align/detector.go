package align

import (
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// detectorStage is the detector: the stage a detector pattern found, else
// a diode fed from a tuned signal winding, found by its wiring
// (stages.Detectors), as a stage of its own named after the diode and
// holding the parts on its load net. An AM set whose detector no pattern
// matched (a double-diode-triode's diodes loaded to its cathode) still has
// one: the IF is watched at its DC or the AGC line, and the rows after it
// inject audio. nil when there is neither.
func detectorStage(c *graph.Circuit, sts []stages.Stage) *stages.Stage {
	for i := range sts {
		t := sts[i].Topology
		if strings.Contains(t, "detector") || strings.Contains(t, "discriminator") {
			return &sts[i]
		}
	}
	ds := stages.Detectors(c)
	if len(ds) == 0 {
		return nil
	}
	s := &stages.Stage{Name: ds[0].Ref, Topology: "diode-detector", Parts: []string{ds[0].Ref}}
	for _, p := range c.Parts {
		if p.Kind != graph.Resistor && p.Kind != graph.Capacitor && p.Kind != graph.Pot {
			continue
		}
		for _, pin := range p.Pins {
			if pin.Net == ds[0].Load {
				s.Parts = append(s.Parts, p.Ref)
				break
			}
		}
	}
	return s
}

// detSides is the detector as it is wired. An AM diode detector has two
// sides whatever way round its diode is drawn: the feed, where the carrier
// comes in (the end of the IF winding the diode hangs on), and the load,
// where the rectified DC and the audio appear (its reservoir capacitor and
// resistor). The load is the diode's other terminal, or, where that is at
// AC ground, the winding's other end (the valve arrangement: the load in
// the winding's cold end). Its DC goes positive with a carrier when the
// current the diode passes flows into it (the load on the cathode, or the
// cathode on the winding of a cold-end load), negative otherwise (common
// practice: the diode conducts anode to cathode on the carrier's peaks).
type detSides struct {
	stage      *stages.Stage
	diode      string // the diode (or valve diode) ref; "" for an FM detector's transformer
	anode      string // the pin of its anode on this path ("a", "a1")
	feed, load string
	// sign is +1 when the load goes positive with a carrier, −1 negative.
	sign int
	// direct says the load is on the diode's own terminal (not in the
	// winding's cold end): only then can the DC solver hold the carrier's
	// peak at the feed without holding the load too (detdc.go).
	direct bool
	// dc is what the DC solver showed (detdc.go); nil when not tried.
	dc *detDC
}

// detectorSides finds the detector's sides from its wiring; nil when there
// is no detector or its sides cannot be told.
func detectorSides(c *graph.Circuit, sts []stages.Stage) *detSides {
	det := detectorStage(c, sts)
	if det == nil {
		return nil
	}
	if d := fmSides(c, det); d != nil {
		return d
	}
	var first *graph.Part
	for _, ref := range det.Parts {
		p := c.Part(ref)
		if p == nil || !(p.Kind == graph.Diode || p.Kind == graph.Valve && !p.IsActive()) {
			continue
		}
		if first == nil {
			first = p
		}
		for _, a := range anodePins(p) {
			if d := junctionSides(c, det, p, a); d != nil {
				return d
			}
		}
	}
	return plainSides(c, det, first)
}

// plainSides is the detector's load where its wiring tells no feed from
// load (a diode on no winding with load parts on both sides), or where it
// has no diode (a grid-leak detector: the valve's grid circuit is its
// load): the diode's cathode unless that is at AC ground, else a net of
// the stage's other parts that is neither AC ground nor the anode. Its
// sign is the diode's (0 for no diode); the carrier's side is left
// unnamed, so the IF rows keep the plain output reference.
func plainSides(c *graph.Circuit, det *stages.Stage, diode *graph.Part) *detSides {
	d := &detSides{stage: det}
	anode := ""
	if diode != nil {
		d.diode, d.anode = diode.Ref, anodePins(diode)[0]
		anode = diode.NetOf(d.anode)
		if k := diode.NetOf("k"); k != "" && !c.RoleOf(k).IsACGround() {
			d.load, d.sign = k, 1
			return d
		}
	}
	for _, ref := range det.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind == graph.Valve || p.Kind == graph.Diode {
			continue
		}
		for _, n := range netsOf(p) {
			if n != anode && !c.RoleOf(n).IsACGround() {
				d.load = n
				if diode != nil {
					d.sign = -1
				}
				return d
			}
		}
	}
	return nil
}

// fmSides is an FM detector's: its audio leaves by the secondary's centre
// tap (the load); its sign is the one the symptom wording has always taken
// (the first diode's cathode on that tap: positive).
func fmSides(c *graph.Circuit, det *stages.Stage) *detSides {
	for _, ref := range det.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Transformer {
			continue
		}
		st := p.NetOf("st")
		if st == "" || c.RoleOf(st).IsACGround() {
			continue
		}
		d := &detSides{stage: det, load: st, sign: -1}
		for _, r := range det.Parts {
			if q := c.Part(r); q != nil && (q.Kind == graph.Diode || q.Kind == graph.Valve && !q.IsActive()) {
				d.diode, d.anode = q.Ref, anodePins(q)[0]
				d.feed = q.NetOf(d.anode)
				if q.NetOf("k") == st {
					d.sign = 1
				}
				break
			}
		}
		return d
	}
	return nil
}

// anodePins are a diode's anode pin names ("a"; a valve's "a1", "a2").
func anodePins(p *graph.Part) []string {
	var out []string
	for _, a := range []string{"a", "a1", "a2"} {
		if p.NetOf(a) != "" {
			out = append(out, a)
		}
	}
	return out
}

// junctionSides reads one anode–cathode path of diode p: the side on a
// winding is the feed; the other side is the load unless it is at AC
// ground. A path on no winding (a diode fed through a capacitor) has its
// feed where the stage's load parts are not. nil where neither side can
// be told (both or neither on a winding and on the stage's load parts).
func junctionSides(c *graph.Circuit, det *stages.Stage, p *graph.Part, anode string) *detSides {
	a, k := p.NetOf(anode), p.NetOf("k")
	if a == "" || k == "" || a == k {
		return nil
	}
	ground := func(n string) bool { return acGrounded(c, n) }
	feedIsA, ok := false, false
	switch wa, wk := onWinding(c, a) && !ground(a), onWinding(c, k) && !ground(k); {
	case wa != wk:
		feedIsA, ok = wa, true
	default:
		la, lk := onLoadPart(c, det, p, a), onLoadPart(c, det, p, k)
		if la != lk {
			feedIsA, ok = lk, true
		}
	}
	if !ok {
		return nil
	}
	d := &detSides{stage: det, diode: p.Ref, anode: anode, feed: a, load: k, sign: 1, direct: true}
	if !feedIsA {
		d.feed, d.load, d.sign = k, a, -1
	}
	if ground(d.load) {
		// The diode's far side is at AC ground: the load is in the
		// winding's cold end, and the rectified current flows round the
		// other way through it.
		d.load, d.sign, d.direct = windingFarEnd(c, d.feed), -d.sign, false
		if d.load == "" || ground(d.load) {
			return nil
		}
	}
	return d
}

// bypassMin is the least capacitance to chassis that holds a net at AC
// ground for a detector (common practice, no source): a cathode's or an
// AGC line's electrolytic bypass is microfarads, a detector's reservoir
// a few hundred picofarads to some tens of nanofarads.
const bypassMin = 1e-6

// acGrounded says whether net is at AC ground by its role or by a bypass
// of at least bypassMin to a net that is (a valve's bypassed cathode, where
// a double-diode-triode's diode returns).
func acGrounded(c *graph.Circuit, net string) bool {
	if c.RoleOf(net).IsACGround() {
		return true
	}
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != graph.Capacitor || p.Value.Max < bypassMin {
			continue
		}
		for _, n := range netsOf(p) {
			if n != net && c.RoleOf(n).IsACGround() {
				return true
			}
		}
	}
	return false
}

// onWinding says whether a transformer's or a coil's winding ends on net.
func onWinding(c *graph.Circuit, net string) bool {
	for _, cn := range c.ConnsOf(net) {
		if cn.Part.Kind == graph.Transformer || cn.Part.Kind == graph.Inductor {
			return true
		}
	}
	return false
}

// onLoadPart says whether one of the detector stage's resistors,
// capacitors or pots has a pin on net, other than one joining the diode's
// own two terminals (a tuning capacitor across it).
func onLoadPart(c *graph.Circuit, det *stages.Stage, diode *graph.Part, net string) bool {
	for _, ref := range det.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Resistor && p.Kind != graph.Capacitor && p.Kind != graph.Pot {
			continue
		}
		nets := netsOf(p)
		if slices.Contains(nets, net) && !slices.ContainsFunc(nets, func(n string) bool { return n != net && hasNet(diode, n) }) {
			return true
		}
	}
	return false
}

// windingFarEnd is the other end of the winding that ends on net, followed
// through a tap to the winding's far end; "" where there is none.
func windingFarEnd(c *graph.Circuit, net string) string {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != graph.Transformer && p.Kind != graph.Inductor {
			continue
		}
		if len(p.Windings) == 0 {
			for _, n := range netsOf(p) {
				if n != net {
					return n
				}
			}
			continue
		}
		pin, seen := cn.Pin, map[string]bool{}
		for !seen[pin] {
			seen[pin] = true
			next := ""
			for _, w := range p.Windings {
				switch {
				case w.From == pin && !seen[w.To]:
					next = w.To
				case w.To == pin && !seen[w.From]:
					next = w.From
				}
				if next != "" {
					break
				}
			}
			if next == "" {
				break
			}
			pin = next
		}
		if far := p.NetOf(pin); far != "" && far != net {
			return far
		}
	}
	return ""
}
