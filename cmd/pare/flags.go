package main

import (
	"flag"
	"fmt"
	"math"
	"strconv"
	"strings"

	"pare/cmd/internal/pipeline"
)

// finite is a float flag that refuses NaN and the infinities when it is
// parsed: "--ratio NaN" passed every `x <= 0 || x >= 1` check after it and
// changed the result. Every float flag of every command is one.
type finite struct{ p *float64 }

func (f finite) String() string {
	if f.p == nil {
		return ""
	}
	return strconv.FormatFloat(*f.p, 'g', -1, 64)
}

func (f finite) Set(s string) error {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return fmt.Errorf("%q is not a number", s)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%q is not a finite number", s)
	}
	*f.p = v
	return nil
}

// finiteVar defines a float flag that takes finite numbers only.
func finiteVar(fs *flag.FlagSet, p *float64, name string, def float64, usage string) {
	*p = def
	fs.Var(finite{p}, name, usage)
}

// switchFlag collects --switch NAME=POSITION settings; it may be given
// more than once (one per switch).
type switchFlag struct{ p *[]pipeline.SwitchSetting }

func (f switchFlag) String() string {
	if f.p == nil {
		return ""
	}
	var s []string
	for _, x := range *f.p {
		s = append(s, fmt.Sprintf("%s=%d", x.Name, x.Position))
	}
	return strings.Join(s, ",")
}

func (f switchFlag) Set(s string) error {
	x, err := pipeline.ParseSwitchSetting(s)
	if err != nil {
		return err
	}
	*f.p = append(*f.p, x)
	return nil
}

// switchFlagOn gives every command that reads a circuit the --switch
// option; fmt writes the netlist as it stands and takes none.
func switchFlagOn(fs *flag.FlagSet, c *command, p *[]pipeline.SwitchSetting) {
	if c.name == "fmt" {
		return
	}
	fs.Var(switchFlag{p}, "switch", "turn a switch for this run, NAME=POSITION (S1=2 turns S1, or every section S1a, S1b, …, to position 2); repeatable")
}
