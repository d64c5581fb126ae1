// Command gen writes a synthetic netlist for the benchmarks in bench/: a
// receiver bank of about -parts parts (internal/synth.Bank), -copies renamed
// copies of a netlist, or an RC ladder of -ladder sections.
package main

import (
	"flag"
	"fmt"
	"os"

	"pare/internal/synth"
)

func main() {
	parts := flag.Int("parts", 1000, "receiver bank of about this many parts")
	seed := flag.Uint64("seed", 1, "seed of the bank")
	ladder := flag.Int("ladder", 0, "write an RC ladder of this many sections instead")
	copies := flag.Int("copies", 0, "write this many renamed copies of -of instead")
	of := flag.String("of", "", "netlist to copy (with -copies)")
	flag.Parse()
	var out []byte
	var err error
	switch {
	case *ladder > 0:
		out, err = synth.Ladder(*ladder)
	case *copies > 0:
		var src []byte
		if src, err = os.ReadFile(*of); err == nil {
			out, err = synth.Copies(src, *copies)
		}
	default:
		out, err = synth.Bank(*parts, *seed)
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "gen:", err)
		os.Exit(2)
	}
	os.Stdout.Write(out)
}
