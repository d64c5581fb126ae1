package render

import (
	svg "github.com/ajstarks/svgo/float"

	"pare/internal/esc"
)

// textSafe is the canvas every sheet is drawn on: the svgo writer with its
// text elements passed through esc.SVG, so that no title, label or note
// from a netlist reaches the sheet with a control or bidi character (an RTL
// override reversed the text after it). svgo escapes & < > in text itself;
// attributes built from names go through attr, a whitelist.
type textSafe struct{ *svg.SVG }

func (c textSafe) Text(x, y float64, t string, s ...string) { c.SVG.Text(x, y, esc.SVG(t), s...) }

func (c textSafe) Title(t string) { c.SVG.Title(esc.SVG(t)) }

func (c textSafe) Desc(t string) { c.SVG.Desc(esc.SVG(t)) }
