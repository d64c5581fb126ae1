package rules

import (
	"fmt"
)

// table is THE list of rules, in the order the driver tries them on every
// sweep. Exact rewrites (merges, pruning) come first at each level so the
// numeric rules judge the simplest circuit; every rule runs again on the
// next sweep until nothing changes. Reading this table tells you everything
// a reduction may do.
var table = [...]*Rule{
	&groundMerge,     // tidy:   one ground net
	&switchSet,       // tidy:   switches at their set position
	&railGround,      // signal: rails, heater and bias supplies are AC ground
	&staticElectrode, // signal: screens, suppressors, shields, heaters leave the device
	&prune,           // tidy:   dangling and shorted-out parts, lone ports
	&dcFeed,          // signal: parts with every terminal at AC ground
	&noSignal,        // signal: groups that meet the signal only at AC ground
	&supplyLine,      // signal: lines fed from a supply and held by their own capacitor
	&parallel,        // tidy:   parallel R, C, L
	&series,          // tidy:   series R, C, L through an otherwise empty net
	&bypass,          // signal: bypass and decoupling capacitors ground their net
	&rfChoke,         // signal: RF chokes open
	&couplingShort,   // ideal:  coupling capacitors become wires
	&chokeOpen,       // ideal:  chokes open when they at least match what they shunt
}

// Table returns a copy of the built-in rules in order, to run as they are or
// to build a custom table for Options.Rules.
func Table() []Rule {
	out := make([]Rule, len(table))
	for i, r := range table {
		out[i] = *r
	}
	return out
}

// checkTable refuses tables a reduction cannot run: a rule without a name,
// match or apply, two rules of one name, an unknown level, or an anchor
// that is both a net and the whole circuit. Like the compiler's pass-order
// checks, it catches a broken table before it can do harm.
func checkTable(rules []Rule) error {
	seen := map[string]bool{}
	for i, r := range rules {
		switch {
		case r.Name == "":
			return fmt.Errorf("reduce: rule %d has no name", i)
		case seen[r.Name]:
			return fmt.Errorf("reduce: rule %q appears twice in the table", r.Name)
		case r.Match == nil || r.Apply == nil:
			return fmt.Errorf("reduce: rule %q needs both Match and Apply", r.Name)
		case r.Level < LevelTidy || r.Level > LevelIdeal:
			return fmt.Errorf("reduce: rule %q has an unknown level %d", r.Name, r.Level)
		case r.Nets && r.Whole:
			return fmt.Errorf("reduce: rule %q is anchored both on nets and on the whole circuit", r.Name)
		case r.Name == "focus":
			return fmt.Errorf("reduce: rule name %q is reserved for the focus cut", r.Name)
		}
		seen[r.Name] = true
	}
	return nil
}
