package pipeline

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// bandRun is one other band's run: started beside the drawing by
// startBands, or on demand by BandRun; done closes when it has finished.
type bandRun struct {
	done chan struct{}
	c    *graph.Circuit
	sts  []stages.Stage
	err  error
}

// bandKey names a switch setting the same way whatever the map's order.
func bandKey(positions map[string]int) string {
	keys := make([]string, 0, len(positions))
	for r, p := range positions {
		keys = append(keys, fmt.Sprintf("%s=%d", r, p))
	}
	slices.Sort(keys)
	return strings.Join(keys, ",")
}

// startBands starts, once the stages are known, the runs of the other
// bands Options.BandSets names, each on its own goroutine: on a whole set
// with a wavechange switch another band's reduction and stages cost about
// as much as the drawing and the note, which then run beside it. Each run
// loads the netlist afresh and shares nothing with r but its options, so
// its result is the one BandRun would compute on demand.
func (r *Result) startBands(o Options) error {
	if o.BandSets == nil {
		return nil
	}
	r.bands = map[string]*bandRun{}
	for _, set := range o.BandSets(r.Circuit, r.Stages) {
		b := &bandRun{done: make(chan struct{})}
		r.bands[bandKey(set)] = b
		go func(set map[string]int) {
			defer close(b.done)
			b.c, b.sts, b.err = r.runBand(set)
		}(set)
	}
	return nil
}

// BandRun reruns the pipeline that made r up to its stages with the
// switches turned to the positions given, every other option the same:
// another band of a wavechange switch, recognised as this one was. A run
// startBands began is waited for instead of repeated.
func (r *Result) BandRun(positions map[string]int) (*graph.Circuit, []stages.Stage, error) {
	if b, ok := r.bands[bandKey(positions)]; ok {
		<-b.done
		return b.c, b.sts, b.err
	}
	return r.runBand(positions)
}

// runBand is one band's run. Its reduction is proven once as a whole (the
// comparison verify makes) instead of step by step: the rules are those
// the first run proved step by step, and one whole comparison costs a
// fraction of a proof per step (on a whole set, most of the main job).
// Only if the whole comparison fails is the band reduced again with every
// step proven, so an unsound step is refused as in any other run.
func (r *Result) runBand(positions map[string]int) (*graph.Circuit, []stages.Stage, error) {
	o := r.opts
	o.Positions, o.Until, o.Views, o.BandSets = positions, PhaseStages, nil, nil
	if o.Path == "" {
		return nil, nil, fmt.Errorf("no netlist file to run again")
	}
	o.StepCheck, o.Verify = NoStepCheck, true
	b, err := Run(o)
	if err == nil && (b.CompareErr != nil || b.Report == nil || b.Report.Broken()) {
		o.StepCheck, o.Verify = r.opts.StepCheck, false
		b, err = Run(o)
	}
	if err != nil {
		return nil, nil, err
	}
	return b.Circuit, b.Stages, nil
}
