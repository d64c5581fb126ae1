package render

import (
	"slices"

	"pare/render/geom"
)

// A supply filter the reduction keeps on a reduced sheet (a smoothing
// resistor into its capacitor and bleeder when a screen or an anode sits
// on the smoothed line, a decoupler whose line leaves by a port) is no
// stage of the signal path, but the flow cut rows by stretches in the
// order of the whole sheet's placement, which ranks parts by their
// distance from the input: review17 a05's smoothing filter, reached from
// the output pentode's screen, stood in the output stage's row between the
// loudspeaker and its output socket, wired into it, and read as a stage
// the signal passes. The trade draws the supply apart from the signal
// line, at the end of the sheet as the source of its rails (common
// practice): on a reduced sheet each supply frame's stretch goes after
// every signal stretch, on rows no signal stretch shares, so the nets it
// shares with the signal stages leave the signal's rows by off-row
// connectors labelled with the line, the rail marks a technician reads.
// The three places that choose rows keep to it (mixes): the first split
// (splitRows), a row taking the next one's stretches (layoutRows) and the
// page-balance search (search.row).

// apartLast moves the supply filters' stretches (block.apart) after all
// the others, each kind in its own order, and says whether any moved.
func apartLast(bs []block) ([]block, bool) {
	var signal, apart []block
	moved := false
	for _, b := range bs {
		if b.apart {
			apart = append(apart, b)
			continue
		}
		moved = moved || len(apart) > 0
		signal = append(signal, b)
	}
	return append(signal, apart...), moved
}

// mixes says whether a run of stretches holds a supply filter's stretch
// beside a signal stretch: such a run is never one row.
func mixes(bs []block) bool {
	for i := 1; i < len(bs); i++ {
		if bs[i].apart != bs[i-1].apart {
			return true
		}
	}
	return false
}

// atMargin is where a supply filter's row whose bounds are b stands at the
// right margin of a page whose rows stand at rows, when it does not go
// under them: level with a row's top, from the last row up, its right edge
// on the page's, clear of every row by channelGap across and rowGap up and
// down, above the footer (avail). A short supply row beside the last
// signal row at the page's edge keeps the sheet on one page, where a page
// of its own would hold two or three parts; the gap and the off-row
// connectors on both sides (no wire runs between) keep it apart from the
// signal line.
func atMargin(rows []geom.Rect, b geom.Rect, cw, avail float64) (geom.Rect, bool) {
	for k := len(rows) - 1; k >= 0; k-- {
		at := geom.R(cw-b.W(), rows[k].Y0, cw, rows[k].Y0+b.H())
		if at.Y1 > avail {
			continue
		}
		clear := geom.Rect{X0: at.X0 - channelGap, Y0: at.Y0 - rowGap, X1: at.X1, Y1: at.Y1 + rowGap}
		if !slices.ContainsFunc(rows, clear.Overlaps) {
			return at, true
		}
	}
	return geom.Rect{}, false
}
