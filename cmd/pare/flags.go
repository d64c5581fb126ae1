package main

import (
	"flag"
	"fmt"
	"math"
	"strconv"
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
