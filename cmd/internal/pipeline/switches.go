package pipeline

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"pare/graph"
)

// SwitchSetting chooses one switch's position for a run (`--switch S1=2`)
// without editing the netlist: a wavechange switch is drawn on one band,
// and the other band is the same set with every wafer turned.
type SwitchSetting struct {
	Name     string // a switch's ref, or the common ref of its sections
	Position int    // 1-based
}

// ParseSwitchSetting reads "NAME=POSITION".
func ParseSwitchSetting(s string) (SwitchSetting, error) {
	name, pos, ok := strings.Cut(s, "=")
	name = strings.TrimSpace(name)
	if !ok || name == "" {
		return SwitchSetting{}, fmt.Errorf("%q: write the switch and its position as NAME=POSITION, e.g. S1=2", s)
	}
	n, err := strconv.Atoi(strings.TrimSpace(pos))
	if err != nil || n < 1 {
		return SwitchSetting{}, fmt.Errorf("%q: the position must be a whole number from 1 up", s)
	}
	return SwitchSetting{Name: name, Position: n}, nil
}

// sectionsOf returns the switches a setting turns: the switch whose ref
// is the name, else its sections, the switches whose refs are the name
// followed by one lower-case letter (S1a, S1b, … of a wafer switch S1:
// the trade's way of naming the wafers of one spindle).
func sectionsOf(c *graph.Circuit, name string) []*graph.Part {
	if p := c.Part(name); p != nil && p.Kind == graph.Switch {
		return []*graph.Part{p}
	}
	var out []*graph.Part
	for _, p := range c.Parts {
		if p.Kind != graph.Switch || len(p.Ref) != len(name)+1 || !strings.HasPrefix(p.Ref, name) {
			continue
		}
		if l := p.Ref[len(name)]; l >= 'a' && l <= 'z' {
			out = append(out, p)
		}
	}
	return out
}

// applySwitches turns the chosen switches before anything reads the
// circuit, so the DC point, the reduction, the proof, the stages and the
// sheets all see the set on that position. Every setting is checked
// against the netlist; an unknown switch or a position a section does not
// have is bad input.
func applySwitches(c *graph.Circuit, path string, set []SwitchSetting) error {
	for _, s := range set {
		parts := sectionsOf(c, s.Name)
		if len(parts) == 0 {
			return fmt.Errorf("%s: --switch %s=%d: no switch %s in the netlist (its switches: %s)",
				path, s.Name, s.Position, s.Name, switchNames(c))
		}
		for _, p := range parts {
			if n := len(p.Closes); s.Position > n {
				return fmt.Errorf("%s: --switch %s=%d: %s has %d position(s)", path, s.Name, s.Position, p.Ref, n)
			}
		}
		for _, p := range parts {
			p.Set = float64(s.Position)
		}
	}
	return nil
}

func switchNames(c *graph.Circuit) string {
	var refs []string
	for _, p := range c.Parts {
		if p.Kind == graph.Switch {
			refs = append(refs, p.Ref)
		}
	}
	if len(refs) == 0 {
		return "none"
	}
	sort.Strings(refs)
	return strings.Join(refs, ", ")
}
