package main

import (
	"flag"
	"fmt"
	"io"

	"pare/cmd/internal/align"
	"pare/cmd/internal/pipeline"
	"pare/rules"
)

type alignOpts struct{}

func init() {
	register(&command{
		name:    "align",
		args:    "FILE",
		summary: "the alignment procedure and signal-injection table of a superhet, from its circuit",
		detail: `Prints, under the caution for work on a live set, the alignment procedure in
the trade's order (common practice): the IF transformers from the detector
back to the mixer at the set's IF, each core or trimmer by its reference and
what to watch; then the oscillator (trimmer at the high tracking point, padder
or core at the low one, repeated until both hold) and the aerial/RF circuit at
the same points; the dial ends the oscillator and signal ranges should reach;
and warnings where the circuit cannot track or a core or trimmer is missing
from the capture. Every frequency is one of pare's own stage figures (pare
stages): the IF, the tracking points, the oscillator and signal ranges.

Then the signal-injection table, from the output back to the input: at each
stage's control electrode (and the detector's load) the frequency (400 Hz
audio, the IF, or RF in band with the set tuned to it) and the generator level
that gives the stated reference output (50 mW into the loudspeaker, the
trade's standard output; where the output is a volume control or the detector
load, the audio a detector gives from its usual carrier; else 1 V at the
output), the IF rows' carrier at the detector kept within what a detector
handles in use, solved by the AC solver on the whole circuit as captured, with
the gain each stage should show. The detector's load and the carrier's side
are read from its wiring, whichever way round the diode is, and its DC with a
carrier from the DC solver. Last, what common faults
of each kind of stage look like in the readings and in the table.

Cores are captured with adjust = "core" or adjust = ["p", "s"] on a coil or
transformer (docs/netlist.md); a circuit with nothing adjustable is told so.`,
		bind: typed(func(*flag.FlagSet, *alignOpts) {}, runAlign),
	})
}

func runAlign(e *env, _ *alignOpts, args []string) int {
	if len(args) != 1 {
		fmt.Fprintln(e.stderr, "pare align: give exactly one netlist file")
		return exitBad
	}
	path := args[0]
	g, err := alignGuide(path, e.switches...)
	if loadFailed(e, path, err) {
		return exitBad
	} else if err != nil {
		return reportErr(e, "pare align", path, err)
	}
	if err := writeOutput(e, "-", func(w io.Writer) error { return align.WriteText(w, g) }); err != nil {
		fmt.Fprintf(e.stderr, "pare align: %v\n", err)
		return exitBad
	}
	return exitOK
}

// alignGuide runs the pipeline exactly as the main job reduces and
// recognises (every step proven against the one before it, so a refused
// step leaves the same reduced circuit), so `pare align` and the note's
// Alignment section come from the same stages. Only the final comparison
// and the sheets are left out: the guide reads neither.
func alignGuide(path string, switches ...pipeline.SwitchSetting) (*align.Guide, error) {
	po := jobOptions(path, jobConfig{level: rules.LevelSignal})
	po.Switches = switches
	po.Until, po.Verify, po.Views = pipeline.PhaseStages, false, nil
	po.Loaded = loaded
	res, err := pipeline.Run(po)
	if err != nil {
		return nil, err
	}
	g := align.Build(res.Title, res.Circuit, res.Stages, res.Caution)
	g.AddBands(res.Circuit, res.Stages, res.BandRun)
	g.AddPresets(res.Circuit, res.DC, res.Stages)
	return g, nil
}
