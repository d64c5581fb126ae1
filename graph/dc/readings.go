package dc

import (
	"errors"
	"fmt"
	"os"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"pare/graph"
	"pare/graph/value"
)

// Readings are measured DC voltages from the bench, in a small TOML file
// (docs/dc.md):
//
//	meter = "20k/V"        # the default meter for every reading
//	tolerance = "10%"      # how far a reading may stray from the chart
//	oscillators = "running" # or "stopped" (tanks shorted out); default running
//	[readings]
//	pre_a = 120            # a net, in volts
//	"V3.k" = { volts = "2.1", meter = "20k/V@10" }   # a part's pin
type Readings struct {
	File      string
	Meter     Meter
	Tolerance float64 // fraction
	// Stopped says the oscillators were stopped for the readings (each
	// tank shorted out). The default is running: a set switched on on the
	// bench has its oscillators running, and a reading taken so is what a
	// technician has unless they stop them on purpose.
	Stopped bool
	List    []Reading
}

// Reading is one measurement.
type Reading struct {
	Key   string    `json:"key"` // as written: a net or REF.PIN
	Net   string    `json:"net"`
	Volts float64   `json:"volts"`
	Meter Meter     `json:"meter"`
	Pos   graph.Pos `json:"-"`
}

// defaultTolerance is how far a reading may differ from the chart before it
// is flagged: ±10 %, the usual allowance on service-sheet voltage charts
// (common practice).
const defaultTolerance = 0.10

// LoadReadings reads and checks a readings file against circuit c.
func LoadReadings(path string, c *graph.Circuit) (*Readings, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return ParseReadings(path, data, c)
}

// ParseReadings parses readings text; every problem is reported with its
// file:line:col, all of them at once.
func ParseReadings(path string, data []byte, c *graph.Circuit) (*Readings, error) {
	var raw map[string]any
	if _, err := toml.Decode(string(data), &raw); err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, graph.ErrorList{{Pos: graph.Pos{File: path, Line: pe.Position.Line, Col: pe.Position.Col}, Msg: pe.Message}}
		}
		return nil, graph.ErrorList{{Pos: graph.Pos{File: path, Line: 1, Col: 1}, Msg: err.Error()}}
	}
	ix := graph.IndexKeys(path, string(data))
	rd := &Readings{File: path, Tolerance: defaultTolerance}
	var errs graph.ErrorList
	bad := func(key, format string, args ...any) { errs.Add(ix.Value(key), format, args...) }
	for _, k := range sortedKeys(raw) {
		switch k {
		case "meter":
			s, _ := raw[k].(string)
			mt, err := ParseMeter(s)
			if err != nil {
				bad(k, "%v", err)
			}
			rd.Meter = mt
		case "tolerance":
			s, _ := raw[k].(string)
			t, err := value.ParseTolerance(s)
			if err != nil || !(t.Plus > 0) {
				bad(k, "tolerance must be a percentage such as \"10%%\"")
			}
			rd.Tolerance = t.Plus
		case "oscillators":
			switch raw[k] {
			case "running":
			case "stopped":
				rd.Stopped = true
			default:
				bad(k, "oscillators must be \"running\" (the default: the set switched on) or \"stopped\" (each tank shorted out)")
			}
		case "readings":
		default:
			errs.Add(ix.Key(k), "unknown key %q; expected meter, tolerance, oscillators or [readings]", k)
		}
	}
	table, ok := raw["readings"].(map[string]any)
	if !ok {
		errs.Add(ix.Key("readings"), "no [readings] table: list each reading as NET = VOLTS")
	}
	for _, k := range sortedKeys(table) {
		if r, ok := rd.reading(k, table[k], c, ix, &errs); ok {
			rd.List = append(rd.List, r)
		}
	}
	errs.Sort()
	if err := errs.Err(); err != nil {
		return nil, err
	}
	return rd, nil
}

func (rd *Readings) reading(k string, x any, c *graph.Circuit, ix *graph.KeyPositions, errs *graph.ErrorList) (Reading, bool) {
	path := "readings." + k // the key index joins dotted and quoted keys alike
	r := Reading{Key: k, Meter: rd.Meter, Pos: ix.Key(path)}
	net, err := netOfKey(k, c)
	if err != nil {
		errs.Add(r.Pos, "%v", err)
		return r, false
	}
	r.Net = net
	var vx any = x
	if m, ok := x.(map[string]any); ok {
		vx = m["volts"]
		for _, mk := range sortedKeys(m) {
			switch mk {
			case "volts":
			case "meter":
				s, _ := m[mk].(string)
				mt, err := ParseMeter(s)
				if err != nil {
					errs.Add(ix.Value(path+"."+mk), "%v", err)
				}
				r.Meter = mt
			default:
				errs.Add(ix.Key(path+"."+mk), "unknown key %q in a reading; expected volts or meter", mk)
			}
		}
	}
	switch v := vx.(type) {
	case int64:
		r.Volts = float64(v)
	case float64:
		r.Volts = v
	case string:
		f, err := value.Parse(v, value.Volt)
		if err != nil {
			errs.Add(ix.Value(path), "reading %s: %v", k, err)
			return r, false
		}
		r.Volts = f
	default:
		errs.Add(ix.Value(path), "reading %s: give the volts as a number, e.g. %s = 120", k, k)
		return r, false
	}
	return r, true
}

// netOfKey resolves a net name or REF.PIN.
func netOfKey(k string, c *graph.Circuit) (string, error) {
	if c.Net(k) != nil {
		return k, nil
	}
	if ref, pin, ok := strings.Cut(k, "."); ok {
		p := c.Part(ref)
		if p == nil {
			return "", fmt.Errorf("no part %s in the circuit", ref)
		}
		if n := p.NetOf(pin); n != "" {
			return n, nil
		}
		return "", fmt.Errorf("part %s has no pin %q", ref, pin)
	}
	var names []string
	for _, n := range c.Nets {
		names = append(names, n.Name)
	}
	if s := graph.Suggest(k, names); s != "" {
		return "", fmt.Errorf("no net %q in the circuit (did you mean %q?)", k, s)
	}
	return "", fmt.Errorf("no net %q in the circuit: give a net name or REF.PIN such as V1.a", k)
}

func sortedKeys(m map[string]any) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
