package device

// Physical constants, SI 2019 exact values.
const (
	boltzmann = 1.380649e-23    // J/K
	charge    = 1.602176634e-19 // C
	// RoomKelvin is the temperature at which bias currents are turned into
	// transconductances and diode resistances.
	RoomKelvin = 300.0
)

// VT is the thermal voltage kT/q at 300 K, 25.8520 mV (SI 2019 exact
// constants; docs/references.md §5).
const VT = boltzmann * RoomKelvin / charge

// Default is one documented default of a small-signal model: used when a
// part does not give the parameter itself.
type Default struct {
	Class  string  `json:"class"` // "triode", "tetrode, pentode", "bjt", ...
	Param  string  `json:"param"` // the netlist key, e.g. "gm"
	Value  float64 `json:"value"` // SI units
	Unit   string  `json:"unit"`
	Source string  `json:"source"`
}

// Defaults lists every default the models use, in a fixed order, for
// documentation and help. Values are typical of the parts found in domestic
// receivers of the valve and early transistor eras. None is from a data
// sheet: a part whose figures matter should carry its own.
var Defaults = []Default{
	{"triode", "gm", 2e-3, "S", "typical small-signal triode, from memory"},
	{"triode", "ra", 20e3, "Ω", "typical small-signal triode (µ 40), from memory"},
	{"tetrode, pentode", "gm", 2e-3, "S", "typical RF/IF pentode, from memory"},
	{"tetrode, pentode", "ra", 1e6, "Ω", "typical RF/IF pentode, from memory"},
	{"hexode, heptode, octode", "gm", 0.5e-3, "S", "typical frequency-changer conversion conductance, from memory"},
	{"hexode, heptode, octode", "ra", 1e6, "Ω", "typical frequency changer, from memory"},
	{"heptode, octode", "gmo", 3e-3, "S", "g1 to oscillator anode (g2) transconductance of a pentagrid converter's inner triode at its working bias, typical, from memory, rough"},
	{"valve", "screen", 4, "", "a further grid drawing current looks like screen/gm: screen current about a quarter of the cathode current, from memory, rough"},
	{"valve diode", "rd", 1e3, "Ω", "conducting signal diode, typical, from memory"},
	{"bjt", "beta", 100, "", "typical small-signal transistor, from memory"},
	{"bjt", "ic", 1e-3, "A", "typical small-signal bias, from memory"},
	{"bjt", "va", 100, "V", "Early voltage for ro = VA/Ic, typical, from memory"},
	{"fet", "gm", 4e-3, "S", "typical small-signal JFET, from memory"},
	{"fet", "rd", 50e3, "Ω", "typical small-signal JFET, from memory"},
	{"detector", "rin/rl", 0.5, "", "a peak detector's input resistance is half its DC load: common practice, derived from the power balance (efficiency 1)"},
	{"diode", "id", 1e-3, "A", "conducting at 1 mA: rd = VT/Id = 25.85 Ω (Shockley, ideality 1)"},
	{"zener", "rz", 10, "Ω", "dynamic resistance of a small (0.4 to 0.5 W) zener of 6 to 10 V at a few milliamps, 5 to 15 Ω, from memory; a zener below about 5 V is far softer: give its rz"},
	{"crystal", "c0", 5e-12, "F", "typical HC-6 holder capacitance, from memory"},
	{"crystal", "cm", 20e-15, "F", "c0/cm = 250, typical, from memory"},
	{"crystal", "q", 50e3, "", "typical quartz unit, from memory"},
}

// def is the default of one class's parameter. The table is fixed, so a
// missing entry is a programming error found by the tests, never by input.
func def(class, param string) float64 {
	for _, d := range Defaults {
		if d.Class == class && d.Param == param {
			return d.Value
		}
	}
	panic("device: no default " + class + "." + param)
}

// DefaultValue is the value of one class's default, for a model outside this
// package that must rest on the same figure (the DC law's Early voltage).
func DefaultValue(class, param string) float64 { return def(class, param) }

// DefaultSource is where that default comes from, for the law's origins.
func DefaultSource(class, param string) string {
	for _, d := range Defaults {
		if d.Class == class && d.Param == param {
			return d.Source
		}
	}
	panic("device: no default " + class + "." + param)
}
