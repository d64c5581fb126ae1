package graph

import (
	"math"
	"sort"

	"pare/graph/value"
)

// Sort restores the sorted order of Parts and Nets after direct edits to the
// slices (the loader's appends, a test's surgery) and drops the connection
// index, which the next lookup builds afresh: the one place besides Clone
// where it is rebuilt.
func (c *Circuit) Sort() {
	sort.Slice(c.Parts, func(i, j int) bool { return c.Parts[i].Ref < c.Parts[j].Ref })
	sort.Slice(c.Nets, func(i, j int) bool { return c.Nets[i].Name < c.Nets[j].Name })
	sort.Slice(c.Regions, func(i, j int) bool { return c.Regions[i].Name < c.Regions[j].Name })
	c.ix = nil
}

// Clone returns a deep copy that shares nothing with c, for reductions that
// must leave the loaded circuit as it was.
func (c *Circuit) Clone() *Circuit { return c.CloneSharing(nil) }

// CloneSharing is Clone with only the parts own says yes to copied (all
// of them for a nil own): the others are c's own parts, shared, for a
// reader that changes no part but those (ac.Alone, which sets the other
// devices' parameters, once per oscillator: copying every part of a set
// for each grew with the square of a bank).
func (c *Circuit) CloneSharing(own func(*Part) bool) *Circuit {
	d := *c
	d.ix, d.jr, d.rx = nil, nil, nil // the clone builds its own indexes on first use, and records nothing
	d.Freqs = make(map[string]float64, len(c.Freqs))
	for k, v := range c.Freqs {
		d.Freqs[k] = v
	}
	d.Inputs = append([]string(nil), c.Inputs...)
	d.Outputs = append([]string(nil), c.Outputs...)
	d.Regions = make([]*Region, len(c.Regions))
	for i, r := range c.Regions {
		rr := *r
		rr.Parts = append([]string(nil), r.Parts...)
		rr.Nets = append([]string(nil), r.Nets...)
		d.Regions[i] = &rr
	}
	d.Nets = make([]*Net, len(c.Nets))
	for i, n := range c.Nets {
		nn := *n
		d.Nets[i] = &nn
	}
	d.Rails = make([]*Net, len(c.Rails))
	for i, n := range c.Rails {
		nn := *n
		d.Rails[i] = &nn
	}
	d.Parts = make([]*Part, len(c.Parts))
	for i, p := range c.Parts {
		if own == nil || own(p) {
			d.Parts[i] = p.Clone()
		} else {
			d.Parts[i] = p
		}
	}
	if c.Comments != nil {
		d.Comments = make(map[string]Comment, len(c.Comments))
		for k, v := range c.Comments {
			d.Comments[k] = v
		}
	}
	return &d
}

// RegionOf returns the region a part works in, or nil for the default band.
// A region that names the part wins; otherwise the first region (by name) that
// names one of its nets.
func (c *Circuit) RegionOf(p *Part) *Region {
	for _, r := range c.Regions {
		for _, ref := range r.Parts {
			if ref == p.Ref {
				return r
			}
			for _, o := range p.From {
				if o == ref {
					return r
				}
			}
		}
	}
	for _, r := range c.Regions {
		for _, n := range r.Nets {
			for _, pin := range p.Pins {
				if pin.Net == n {
					return r
				}
			}
		}
	}
	return nil
}

// BandOf returns the band of interest for a part: its region's band, or the
// circuit's default band.
func (c *Circuit) BandOf(p *Part) value.Range {
	if r := c.RegionOf(p); r != nil {
		return r.Band
	}
	return c.Band
}

// BandCentre is the geometric centre of the band a part works in (its
// region's, else the default band, else the span of all bands; 1 kHz when
// no band is declared): the frequency at which a coil's q is its Q, so the
// solver's winding loss (graph/ac) and the reduction's judgements (rules)
// take the same series resistance.
func (c *Circuit) BandCentre(p *Part) float64 { return c.centreOf(c.BandOf(p)) }

// centreOf is BandCentre of a part whose band is b.
func (c *Circuit) centreOf(b value.Range) float64 {
	if b.Min <= 0 || b.Max <= 0 {
		b = c.FullBand()
	}
	if b.Min <= 0 || b.Max <= 0 {
		return 1e3
	}
	return math.Sqrt(b.Min * b.Max)
}

// Region returns the region with the given name, or nil.
func (c *Circuit) Region(name string) *Region {
	for _, r := range c.Regions {
		if r.Name == name {
			return r
		}
	}
	return nil
}

// FullBand is the span from the lowest to the highest frequency of interest
// over the default band and all regions.
func (c *Circuit) FullBand() value.Range {
	b := c.Band
	for _, r := range c.Regions {
		if b.Max == 0 || (r.Band.Min > 0 && r.Band.Min < b.Min) {
			if b.Max == 0 {
				b = r.Band
				continue
			}
			b.Min = r.Band.Min
		}
		if r.Band.Max > b.Max {
			b.Max = r.Band.Max
		}
	}
	return b
}

// RegionIndex answers RegionOf and BandOf for many parts of one circuit
// at once: a whole set has a region per channel, and each RegionOf walks
// every region's lists, so a lookup per net or part made a comparison
// quadratic in the set. It is a snapshot of the regions' lists: take it
// after the last edit of the regions and before the lookups.
type RegionIndex struct {
	c     *Circuit
	byRef map[string]int // a part ref or origin: the first region naming it
	byNet map[string]int // a net: the first region naming it
	full  value.Range    // c.FullBand(), which walks every region
}

// UseRegionIndex has c answer RegionIndex with x, the index of a circuit
// whose regions and band c shares (the same slice of regions: a piece of
// it, or a copy with a part changed), so that each of many such circuits
// does not take the snapshot of every region again. An index of other
// regions is not taken. Neither circuit may edit its regions after.
func (c *Circuit) UseRegionIndex(x *RegionIndex) {
	if x != nil && x.sameRegions(c) {
		c.rx = x
	}
}

// ShareRegionIndex has c answer RegionIndex with the index from answers
// with, when UseRegionIndex gave it one and c shares its regions: a copy
// of a piece keeps the piece's index without taking a snapshot.
func (c *Circuit) ShareRegionIndex(from *Circuit) { c.UseRegionIndex(from.rx) }

// sameRegions says whether c has the regions and band x was taken of: the
// same slice (a piece shares it) and the same default band, so every answer
// of x (RegionOf, BandOf, BandCentre) is the one c's own snapshot gives.
func (x *RegionIndex) sameRegions(c *Circuit) bool {
	if c.Band != x.c.Band || len(c.Regions) != len(x.c.Regions) {
		return false
	}
	return len(c.Regions) == 0 || &c.Regions[0] == &x.c.Regions[0]
}

// RegionIndex takes the snapshot of c's regions, or hands back the one
// UseRegionIndex gave c.
func (c *Circuit) RegionIndex() *RegionIndex {
	if c.rx != nil && c.rx.sameRegions(c) {
		return c.rx
	}
	x := &RegionIndex{c: c, byRef: map[string]int{}, byNet: map[string]int{}, full: c.FullBand()}
	for i, r := range c.Regions {
		for _, ref := range r.Parts {
			if _, ok := x.byRef[ref]; !ok {
				x.byRef[ref] = i
			}
		}
		for _, n := range r.Nets {
			if _, ok := x.byNet[n]; !ok {
				x.byNet[n] = i
			}
		}
	}
	return x
}

// RegionOf is Circuit.RegionOf: the first region naming the part or one
// of its origins, else the first naming one of its nets, else nil.
func (x *RegionIndex) RegionOf(p *Part) *Region {
	best := -1
	pick := func(i int, ok bool) {
		if ok && (best < 0 || i < best) {
			best = i
		}
	}
	i, ok := x.byRef[p.Ref]
	pick(i, ok)
	for _, o := range p.From {
		i, ok := x.byRef[o]
		pick(i, ok)
	}
	if best < 0 {
		for _, pin := range p.Pins {
			i, ok := x.byNet[pin.Net]
			pick(i, ok)
		}
	}
	if best < 0 {
		return nil
	}
	return x.c.Regions[best]
}

// BandOf is Circuit.BandOf through the index.
func (x *RegionIndex) BandOf(p *Part) value.Range {
	if r := x.RegionOf(p); r != nil {
		return r.Band
	}
	return x.c.Band
}

// BandCentre is Circuit.BandCentre through the index.
func (x *RegionIndex) BandCentre(p *Part) float64 {
	b := x.BandOf(p)
	if b.Min <= 0 || b.Max <= 0 {
		b = x.full // what centreOf takes, without walking the regions per part
	}
	return x.c.centreOf(b)
}

// Joined follows Circuit.JoinNets(keep, gone), which renames gone to keep
// in every region's nets: keep is then named first by whichever region
// named either first. It keeps the index current across a join without
// reading the regions again.
func (x *RegionIndex) Joined(keep, gone string) {
	g, ok := x.byNet[gone]
	if !ok {
		return
	}
	delete(x.byNet, gone)
	if k, ok := x.byNet[keep]; !ok || g < k {
		x.byNet[keep] = g
	}
}
