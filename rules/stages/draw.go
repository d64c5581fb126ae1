package stages

// drawPlaces turns a pattern's drawing template into the stage's: each
// [draw] entry whose part the match bound, by circuit ref, the anchor
// first. A stage whose anchor is not bound (it always is: checkDraw asks
// for a part the stage always has) gets no template, and a shared part
// (never in a template) is skipped, so the drawing never places a part
// the stage does not hold.
func drawPlaces(w *world, m *match) []Place {
	p := m.v.p
	anchor := p.Anchor()
	if anchor == "" {
		return nil
	}
	ref := map[string]string{}
	for i, vp := range m.v.parts {
		if !vp.pp.Shared {
			ref[vp.pp.Name] = w.parts[m.parts[i]].Ref
		}
	}
	if ref[anchor] == "" {
		return nil
	}
	out := []Place{{Part: ref[anchor]}}
	for _, pl := range p.Draw {
		r, ok := ref[pl.Part]
		if !ok || pl.Part == anchor {
			continue
		}
		pl.Part = r
		out = append(out, pl)
	}
	return out
}
