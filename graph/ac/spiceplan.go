package ac

import (
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// spiceDeck is what a deck is written from, every option resolved and
// checked before the first line goes out, so a bad option never leaves half
// a deck behind.
type spiceDeck struct {
	nl       *netlist
	inNode   int
	held     []int // the other inputs, held at 0 V as pare solves it
	outNodes []int
	band     value.Range
	ppd      int
	data     string
	inferred string // why the driven net was chosen, when no input was declared
}

// planDeck elaborates the circuit and resolves the options. The checks run
// in a fixed order (input, outputs, band, data file, solvability) so the
// first error reported for a given circuit does not change.
func planDeck(c *graph.Circuit, o SpiceOptions) (*spiceDeck, error) {
	nl, err := elaborate(c, o.Options)
	if err != nil {
		return nil, err
	}
	d := &spiceDeck{nl: nl}
	in, err := d.input(c, o.Input)
	if err != nil {
		return nil, err
	}
	if err := d.outputs(c, in, o.Outputs); err != nil {
		return nil, err
	}
	if err := d.sweep(c, o); err != nil {
		return nil, err
	}
	// Check the system is solvable before handing it on: a floating node
	// would only earn a warning in the simulator.
	d.held = otherInputs(c, nl, d.inNode)
	if _, err := newSystem(nl, d.inNode, d.held...); err != nil {
		return nil, err
	}
	return d, nil
}

// input resolves the driven net ("" takes the circuit's first input) and
// returns its name, which outputs falls back on.
func (d *spiceDeck) input(c *graph.Circuit, in string) (string, error) {
	if in == "" && len(c.Inputs) > 0 {
		in = c.Inputs[0]
	} else if in == "" {
		// No input declared: drive the oscillator's or the first active
		// part's control (graph.InferredInput), and say so in the deck.
		net, p, why := graph.InferredInput(c)
		if net == "" {
			return "", fmt.Errorf("%s declares no inputs and has no active part to drive: name the net to drive", circuitName(c))
		}
		in, d.inferred = net, fmt.Sprintf("%s (%s's control, %s: no input declared)", net, p.Ref, why)
	}
	n, err := nodeOf(c, d.nl, in)
	if err != nil {
		return "", err
	}
	if n == 0 {
		return "", fmt.Errorf("input %s is at AC ground: it cannot be driven", in)
	}
	d.inNode = n
	return in, nil
}

// outputs resolves the recorded nets: the options', else the circuit's,
// else the input alone, so a deck always records something.
func (d *spiceDeck) outputs(c *graph.Circuit, in string, outs []string) error {
	if outs == nil {
		outs = c.Outputs
	}
	if len(outs) == 0 && d.inferred != "" {
		if far := graph.FarthestNet(c, in); far != "" {
			outs = []string{far} // the end of the chain from the inferred input
		}
	}
	if len(outs) == 0 {
		outs = []string{in}
	}
	d.outNodes = make([]int, len(outs))
	for i, out := range outs {
		n, err := nodeOf(c, d.nl, out)
		if err != nil {
			return err
		}
		if n == 0 {
			return fmt.Errorf("output %s is at AC ground: there is nothing to record", out)
		}
		d.outNodes[i] = n
	}
	return nil
}

// sweep resolves the band, the density and the data file, filling the
// defaults SpiceOptions documents.
func (d *spiceDeck) sweep(c *graph.Circuit, o SpiceOptions) error {
	d.band = o.Band
	if d.band.Max <= 0 {
		d.band = c.FullBand()
	}
	if d.band.Min <= 0 || d.band.Max < d.band.Min {
		return fmt.Errorf("no band to sweep: give %s a band", circuitName(c))
	}
	d.ppd = o.PointsPerDecade
	if d.ppd <= 0 {
		d.ppd = 50
	}
	d.data = o.DataFile
	if d.data == "" {
		d.data = "pare-ac.dat"
	}
	// The name goes unquoted into the wrdata line, where a space or a
	// semicolon would end it.
	if strings.ContainsAny(d.data, " \t\n;") {
		return fmt.Errorf("data file name %q: no spaces or semicolons", d.data)
	}
	return nil
}
