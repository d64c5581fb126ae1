package dc

import (
	"fmt"
	"math"
	"strings"

	"pare/graph/value"
)

// Meter is the voltmeter a reading is taken with. An analogue meter is
// described by its sensitivity (ohms per volt) and loads a node by
// sensitivity × range; an electronic meter by its fixed input resistance.
// Zero for both is an ideal meter. Loading matters on high-resistance feeds
// (a grid behind its leak, a screen behind its dropper): common practice.
type Meter struct {
	OhmsPerVolt float64 `json:"ohms_per_volt,omitempty"`
	Range       float64 `json:"range,omitempty"` // full scale, V; 0 = the lowest standard range above the reading
	Ohms        float64 `json:"ohms,omitempty"`  // fixed input resistance
}

// Ranges are the full-scale DC ranges of a typical analogue multimeter
// (common practice), used when a reading names no range.
var Ranges = []float64{2.5, 10, 50, 250, 1000}

// ParseMeter reads "ideal", "20k/V" (analogue, automatic range), "20k/V@250"
// (analogue on its 250 V range) or "10M" (electronic, fixed input resistance).
func ParseMeter(s string) (Meter, error) {
	s = strings.TrimSpace(s)
	if s == "" || s == "ideal" {
		return Meter{}, nil
	}
	if i := strings.Index(s, "/V"); i > 0 {
		opv, err := value.Parse(s[:i], value.Ohm)
		if err != nil || !(opv > 0) {
			return Meter{}, fmt.Errorf("meter %q: sensitivity must be ohms per volt such as 20k/V", s)
		}
		m := Meter{OhmsPerVolt: opv}
		if rest := s[i+2:]; rest != "" {
			if !strings.HasPrefix(rest, "@") {
				return Meter{}, fmt.Errorf("meter %q: write the range after @, e.g. 20k/V@250", s)
			}
			r, err := value.Parse(rest[1:], value.Volt)
			if err != nil || !(r > 0) {
				return Meter{}, fmt.Errorf("meter %q: range must be a positive voltage", s)
			}
			m.Range = r
		}
		return m, nil
	}
	ohms, err := value.Parse(s, value.Ohm)
	if err != nil || !(ohms > 0) {
		return Meter{}, fmt.Errorf("meter %q: give ideal, a sensitivity such as 20k/V (optionally @RANGE) or an input resistance such as 10M", s)
	}
	return Meter{Ohms: ohms}, nil
}

// String describes the meter for charts and notes.
func (m Meter) String() string {
	switch {
	case m.Ohms > 0:
		return "electronic meter, " + value.Format(m.Ohms, value.Ohm, value.Symbol) + " input"
	case m.OhmsPerVolt > 0 && m.Range > 0:
		return fmt.Sprintf("%s/V meter on its %s range", value.Format(m.OhmsPerVolt, value.Ohm, value.Symbol), value.Format(m.Range, value.Volt, value.Symbol))
	case m.OhmsPerVolt > 0:
		return fmt.Sprintf("%s/V meter on the lowest range above each reading (%s V)",
			value.Format(m.OhmsPerVolt, value.Ohm, value.Symbol), rangesText())
	}
	return "ideal meter (no loading)"
}

// Short is the meter in the readings file's own notation.
func (m Meter) Short() string {
	switch {
	case m.Ohms > 0:
		return value.Format(m.Ohms, value.Ohm, value.Code)
	case m.OhmsPerVolt > 0 && m.Range > 0:
		return value.Format(m.OhmsPerVolt, value.Ohm, value.Code) + "/V@" + fmt.Sprint(m.Range)
	case m.OhmsPerVolt > 0:
		return value.Format(m.OhmsPerVolt, value.Ohm, value.Code) + "/V"
	}
	return "ideal"
}

func rangesText() string {
	var s []string
	for _, r := range Ranges {
		s = append(s, fmt.Sprint(r))
	}
	return strings.Join(s, ", ")
}

// IsIdeal reports whether the meter draws no current.
func (m Meter) IsIdeal() bool { return m.Ohms <= 0 && m.OhmsPerVolt <= 0 }

// Resistance is the meter's resistance when it reads about v volts.
func (m Meter) Resistance(v float64) float64 {
	switch {
	case m.Ohms > 0:
		return m.Ohms
	case m.OhmsPerVolt <= 0:
		return math.Inf(1)
	case m.Range > 0:
		return m.OhmsPerVolt * m.Range
	}
	r := Ranges[len(Ranges)-1]
	for _, x := range Ranges {
		if math.Abs(v) <= x {
			r = x
			break
		}
	}
	return m.OhmsPerVolt * r
}

// Reading is what the meter shows on net (to chassis): the operating point
// re-solved with the meter's resistance in place, warm-started from p.
func (p *Point) Reading(net string, mt Meter) (float64, error) {
	v, ok := p.Volts(net)
	if !ok {
		return 0, fmt.Errorf("no net %q", net)
	}
	if p.sys == nil {
		s, err := newSystem(p.m, nil)
		if err != nil {
			return 0, err
		}
		p.sys = s
	}
	return p.sys.reading(p.v, p.m.netTerm[net], v, mt)
}

// reading solves s with meter mt from node t to chassis, warm-started.
func (s *system) reading(start []float64, t term, unloaded float64, mt Meter) (float64, error) {
	if t < 0 || mt.IsIdeal() {
		return unloaded, nil
	}
	s.meterAt, s.meterG = t, 1/mt.Resistance(unloaded)
	defer func() { s.meterAt, s.meterG = -1, 0 }()
	v, _, _, err := s.solve(start)
	if err != nil {
		return 0, err
	}
	return v[t], nil
}
