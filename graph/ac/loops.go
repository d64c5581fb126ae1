package ac

import "pare/graph"

// Loops finds the loops of many parts of one circuit, which must not change
// while it is in use: the circuit is elaborated once for all of them (a
// set's diode detectors make elaboration cost a DC solve each), each other
// gang setting made from that elaboration with the capacitors' values at
// it (atSetting, as Responses does: a tracking walk asks some 60 settings
// of one mixer's loop), and each part's loop is solved on its own blocks
// of the matrix.
type Loops struct {
	c   *graph.Circuit
	nls map[[2]float64]nlOrErr
	dc  dcShare
	// base is the first setting elaborated; the others are made from it.
	base *model
}

type nlOrErr struct {
	m   *model // the netlist indexed once for every device's block
	err error
}

// NewLoops prepares the loop searches of circuit c.
func NewLoops(c *graph.Circuit) *Loops { return &Loops{c: c, nls: map[[2]float64]nlOrErr{}} }

// Circuit is the circuit the loops are solved in.
func (l *Loops) Circuit() *graph.Circuit { return l.c }

// system is ref's loop system at setting o; settings with terminations are
// elaborated afresh.
func (l *Loops) system(ref string, o Options) (*loopSystem, error) {
	if o.Terminate != nil {
		return newLoopSystem(l.c, ref, o)
	}
	set := 0.0
	if o.VarSet {
		set = 1
	}
	k := [2]float64{set, o.VarFrac}
	e, ok := l.nls[k]
	if !ok {
		if l.base != nil {
			e.m = l.base.atSetting(o)
		}
		if e.m == nil {
			e.m, e.err = newModel(l.c, o, &l.dc)
		}
		if l.base == nil && e.err == nil && capsStamped(l.c, o) {
			l.base = e.m
		}
		l.nls[k] = e
	}
	if e.err != nil {
		return nil, e.err
	}
	return loopSystemIn(l.c, e.m, ref)
}

// Pole is the package's Pole of part ref.
func (l *Loops) Pole(ref string, f float64, o Options) (complex128, error) {
	ls, err := l.system(ref, o)
	if err != nil {
		return 0, err
	}
	var p complex128
	e := cachedLoop(ls.key(LoopOptions{}, 1, f), func(e *loopEntry) bool {
		e.pole, err = ls.pole(f, 1)
		return err == nil
	})
	if err != nil {
		return p, err
	}
	return e.pole, nil
}
