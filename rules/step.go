package rules

import (
	"fmt"
	"strings"

	"pare/graph"
)

// Step is one firing of a rule: what it changed and why that is sound. Refs
// and Where name the parts concerned and where they were written, for the log
// line; Removed and Merged list original refs (flattened through earlier
// merges), so every part of the input can be traced to exactly one fate.
type Step struct {
	N        int         `json:"n"`
	Rule     string      `json:"rule"`
	Removed  []string    `json:"removed,omitempty"`      // original refs that left the circuit
	Merged   []string    `json:"merged,omitempty"`       // original refs combined into Result
	Result   string      `json:"result,omitempty"`       // ref of the part a merge produced
	Joined   []string    `json:"joined,omitempty"`       // nets made one (the kept name first)
	Grounded []string    `json:"grounded,omitempty"`     // nets found at AC ground and joined to ground
	Pins     []string    `json:"pins,omitempty"`         // terminals dropped from a part, as REF.PIN
	Added    []string    `json:"added,omitempty"`        // parts a step created (ports of a focus cut)
	Dropped  []string    `json:"dropped_nets,omitempty"` // nets that no longer connect anything after the step
	Why      string      `json:"why"`
	Refs     []string    `json:"refs,omitempty"` // the parts concerned, in the order of Where
	Where    []graph.Pos `json:"-"`
	Refused  string      `json:"refused,omitempty"`
}

// String prints one log line: number, rule, the parts concerned with their
// file:line, and the justification.
func (s Step) String() string {
	var b strings.Builder
	if s.N > 0 {
		fmt.Fprintf(&b, "%3d  %-16s ", s.N, s.Rule)
	} else {
		fmt.Fprintf(&b, "     %-16s ", s.Rule) // a near miss: not a step
	}
	for i, ref := range s.Refs {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(ref)
		if i < len(s.Where) && s.Where[i].IsValid() {
			b.WriteString(" (" + s.Where[i].Short() + ")")
		}
	}
	if len(s.Refs) > 0 {
		b.WriteString(": ")
	}
	b.WriteString(s.Why)
	if s.Refused != "" {
		b.WriteString(" [refused: " + s.Refused + "]")
	}
	return b.String()
}

// Count is the size of a circuit.
type Count struct{ Parts, Nets int }

func countOf(c *graph.Circuit) Count { return Count{Parts: len(c.Parts), Nets: len(c.Nets)} }

// Hit is how often one rule fired, in table order.
type Hit struct {
	Rule string `json:"rule"`
	N    int    `json:"n"`
}

// Log is the record of a reduction.
type Log struct {
	Level  Level
	Steps  []Step
	Before Count
	After  Count
	// ACGround lists the nets of the input that the reduced circuit treats as
	// AC ground, by role or because a rule found them there (sorted).
	ACGround []string
	// Gangs maps each gang name to the original refs of its sections: the
	// mechanical link is not drawn, but it is kept here for the notes.
	Gangs map[string][]string
	// Hits counts the firings per rule, in the order of the rule table; rules
	// that never fired are listed with 0.
	Hits []Hit
	// Declined lists, for the final circuit, candidates a numeric guard
	// turned down, with the numbers: the near misses a technician wants to
	// see ("C3 is not a bypass at 20 Hz"). Their N is 0.
	Declined []Step
}

// Applied counts the steps that changed the circuit (refused ones do not).
func (l *Log) Applied() int {
	n := 0
	for _, s := range l.Steps {
		if s.Refused == "" {
			n++
		}
	}
	return n
}
