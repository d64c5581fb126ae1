// Package graph holds pare's circuit model: parts with named terminals on
// named nets, the frequencies of interest, and where every piece was written
// in its netlist file. It loads and writes the TOML netlist format
// (docs/netlist.md), checks it for transcription mistakes, and offers a
// part–net graph view built on gonum for algorithms. One editing API
// (edit.go, join.go) keeps one connection index (index.go) current; the
// graph algorithms every later package shares (distance from the inputs,
// connected components, the disjoint sets) are in algo.go. It never knows
// how a circuit is reduced or drawn.
package graph

import (
	"pare/graph/value"
)

// Kind is a part's broad class. The names are the ones used in JSON output
// and messages; the netlist chooses a kind by the part's value key (r, c, l…).
type Kind string

// Part kinds.
const (
	Resistor    Kind = "resistor"
	Capacitor   Kind = "capacitor"
	Inductor    Kind = "inductor"
	Transformer Kind = "transformer" // coupled windings, IF transformers, output transformers
	Valve       Kind = "valve"
	BJT         Kind = "bjt"
	FET         Kind = "fet"
	Diode       Kind = "diode"
	Crystal     Kind = "crystal"
	Loudspeaker Kind = "loudspeaker" // a moving-coil speaker: its value is its rated impedance
	Pot         Kind = "pot"
	Switch      Kind = "switch"
	Port        Kind = "port"
	Generic     Kind = "part" // anything else on a diagram: lamp, fuse, meter, plug
)

// Capacitor types (Part.Type for Kind Capacitor).
const (
	CapFixed        = "fixed"
	CapElectrolytic = "electrolytic"
	CapVariable     = "variable" // a tuning gang section: Value is min..max
	CapTrimmer      = "trimmer"  // preset: Value is min..max, Set is where it is set
)

// Inductor types (Part.Type for Kind Inductor).
const (
	IndPlain = "plain"
	IndChoke = "choke" // RF choke: meant to be open at signal frequency
)

// Pot types (Part.Type for Kind Pot): a control the user turns, or a preset
// set on the bench and left (a bias or quiescent-current adjustment, a hum
// balance). Empty: not said; pare treats the pot as a control and hedges
// where the wiring suggests a preset.
const (
	PotControl = "control"
	PotPreset  = "preset"
)

// Active device active types (Part.Type) are listed in terminals.go.

// Role says what a net is for. Most nets are signal nets; the others carry
// supply or reference potentials that are AC ground for the small signal.
type Role string

// Net roles.
const (
	Signal Role = "signal"
	Ground Role = "ground" // chassis / 0 V
	Supply Role = "supply" // HT, B+, Vcc: Net.Volts holds the DC voltage
	Heater Role = "heater" // heater chain or heater winding
	Bias   Role = "bias"   // a fixed bias supply (negative grid bias, AGC reference)
	PortN  Role = "port"   // a connection to the rest of the set, cut away from this sheet
)

// IsACGround reports whether a net of this role sits at AC ground by
// declaration: rails and heater supplies are assumed stiff (well decoupled)
// for the signal, which is the assumption every hand reduction makes.
func (r Role) IsACGround() bool {
	return r == Ground || r == Supply || r == Heater || r == Bias
}

// Circuit is a netlist: parts, nets and the frequencies the circuit works at.
// Parts and Nets are kept sorted (by Ref and Name) so that every walk over a
// circuit is deterministic.
type Circuit struct {
	File    string             `json:"-"`
	Title   string             `json:"title,omitempty"`
	Note    string             `json:"note,omitempty"`
	Band    value.Range        `json:"band"`            // default band of interest, Hz
	Freqs   map[string]float64 `json:"freqs,omitempty"` // named frequencies, e.g. "if": 470e3
	Regions []*Region          `json:"regions,omitempty"`
	Inputs  []string           `json:"inputs,omitempty"`  // signal input nets
	Outputs []string           `json:"outputs,omitempty"` // signal output nets
	Nets    []*Net             `json:"nets"`
	Parts   []*Part            `json:"parts"`
	// Rails are the rail nets (supply, bias, heater) a reduction joined into
	// another net, with their role, volts and label, sorted by name: the
	// pins that returned to them name them in Pin.Rail, so that a drawing
	// labels such a return with its rail, never as chassis (rails.go).
	Rails []*Net `json:"rails,omitempty"`

	// DetectorLoads holds, per detector diode section ("REF.PIN" of the
	// anode), the DC load its rectified current returns through in the
	// circuit as written (graph/ac.KeepDetectorLoads). A reduction that
	// grounds a filter line for the signal does not change the wiring DC
	// flows through, so the reduced circuit's detectors keep these loads.
	// Never written to a netlist; shared (read only) by clones.
	DetectorLoads map[string]float64 `json:"-"`

	// Comments written above top-level keys, kept so `pare fmt` does not throw
	// away what the user typed. Keyed by key path ("title", "parts.R1", ...).
	Comments map[string]Comment `json:"-"`

	// ix is the connection index (index.go), built on first use and kept
	// current by the editing API (edit.go).
	ix *Index
	// jr is the journal recording the edits, if one runs (journal.go).
	jr *Journal
	// rx is the region index of the circuit this one was cut from, when it
	// shares that circuit's regions (UseRegionIndex); nil: none.
	rx *RegionIndex
}

// Comment holds the comment lines above a key and the comment after it on its line.
type Comment struct {
	Above []string // without the leading '#'
	After string
	// Blank: a blank line parted the entry from the one before it in its
	// table, a grouping the user made that fmt keeps.
	Blank bool
}

// Region is a part of the set that works in its own band: the IF strip around
// the IF, the audio stages over 20 Hz–20 kHz. A part belongs to the region that
// names it, or else to a region that names one of its nets.
type Region struct {
	Name   string      `json:"name"`
	Band   value.Range `json:"band"`
	Parts  []string    `json:"parts,omitempty"`
	Nets   []string    `json:"nets,omitempty"`
	Input  string      `json:"input,omitempty"`
	Output string      `json:"output,omitempty"`
	Pos    Pos         `json:"-"`
}

// Net is a node of the circuit. Nets come into being by being named in a pin
// list; a [nets] entry only adds a role, a voltage or a label.
type Net struct {
	Name  string  `json:"name"`
	Role  Role    `json:"role"`
	Volts float64 `json:"volts,omitempty"` // DC voltage of a supply or bias net
	// VoltsGiven says the netlist wrote volts, so a line declared at
	// 0 V (an AGC line at rest) is held there, not taken as undeclared.
	VoltsGiven bool   `json:"-"`
	Label      string `json:"label,omitempty"` // text for the drawing, e.g. "HT +250 V"
	// Fed is, for a decoupled line a reduction made a rail of its own
	// (MarkDecoupled), the rail that feeds it through a resistor or choke;
	// its DC voltage is its own, lower by the drop, which only the DC
	// solution knows.
	Fed string `json:"fed,omitempty"`
	Pos Pos    `json:"-"` // where it was declared or first used
	// Declared is set for a net written in [nets], so that the writer keeps
	// an entry the user wrote even when it only restates the default.
	Declared bool `json:"-"`
}

// Pin is one terminal of a part and the net it is on.
type Pin struct {
	Name string `json:"name"`
	Net  string `json:"net"`
	// Rail is the rail net this terminal returned to before a reduction
	// joined that rail into another net (AC ground, mostly); empty when the
	// terminal never sat on a rail that went. Set only by JoinNets.
	Rail string `json:"rail,omitempty"`
	Pos  Pos    `json:"-"`
}

// Winding is one coil of an inductor or transformer, between two of the part's
// pins. A tapped coil is two windings meeting at the tap pin.
type Winding struct {
	Name string  `json:"name"`
	L    float64 `json:"l"`
	From string  `json:"from"` // pin names
	To   string  `json:"to"`
	Q    float64 `json:"q,omitempty"` // unloaded Q, 0 = lossless
	// QAt is the frequency Q is referred to: the part's q_at, else the
	// resonance of the tank the coil tunes (Circuit.ReferQ); 0 refers it
	// to the centre of the part's band. Derived, so not written.
	QAt float64 `json:"-"`
	// Rdc is this winding's own DC resistance (graph/dc), 0 when the part's
	// rdc (or the default) applies. A centre-tapped winding's halves have
	// one each: the resistance from the tap to that end.
	Rdc float64 `json:"rdc,omitempty"`
}

// Coupling is the coupling factor k between two windings (M = k·√(La·Lb)).
type Coupling struct {
	A string  `json:"a"`
	B string  `json:"b"`
	K float64 `json:"k"`
}

// Part is one component. Value holds the main value in SI units: ohms,
// farads, henries, or a crystal's series frequency; a variable or trimmer
// capacitor has a span, everything else Min == Max.
type Part struct {
	Ref  string `json:"ref"`
	Kind Kind   `json:"kind"`
	Type string `json:"type,omitempty"` // sub-type: "trimmer", "triode", "npn", "njfet", ...
	// Designation is the type a valve, transistor or FET is marked with,
	// free text as the user writes it (`type = "XV12"`): shown beside the
	// ref on sheets, never interpreted.
	Designation string      `json:"designation,omitempty"`
	Value       value.Range `json:"value"`
	// Set is a trimmer's setting (farads), a pot's wiper fraction (0..1) or a
	// switch's selected position (1-based). 0 means unset.
	Set      float64            `json:"set,omitempty"`
	Pins     []Pin              `json:"pins"`
	Windings []Winding          `json:"windings,omitempty"`
	Coupling []Coupling         `json:"coupling,omitempty"`
	Closes   [][][2]string      `json:"closes,omitempty"` // switch: per position, the pin pairs closed
	Tol      value.Tolerance    `json:"tol"`
	Rating   float64            `json:"rating,omitempty"` // voltage rating
	Gang     string             `json:"gang,omitempty"`   // ganged tuning group
	Envelope string             `json:"envelope,omitempty"`
	Keep     bool               `json:"keep,omitempty"`
	Note     string             `json:"note,omitempty"`
	Label    string             `json:"label,omitempty"` // port text ("from RF stage") or generic part description
	Params   map[string]float64 `json:"params,omitempty"`
	// Adjust names the cores a repairer can turn: CoreWhole for one core
	// that tunes the whole coil or transformer, else the transformer's
	// windings that each have their own (sorted). Empty: nothing adjustable
	// was captured.
	Adjust []string `json:"adjust,omitempty"`
	// From names the original parts this part stands for after a reduction
	// (sorted). Empty means the part stands for itself.
	From []string `json:"from,omitempty"`
	Pos  Pos      `json:"-"`
	// bareValue is where a capacitor's value was written as a bare number,
	// no unit and no prefix (c = 0.05): Check asks whether µF was meant.
	bareValue Pos
}

// Part returns the part with the given ref, or nil.
func (c *Circuit) Part(ref string) *Part { return c.index().parts[ref] }

// Net returns the net with the given name, or nil.
func (c *Circuit) Net(name string) *Net { return c.index().nets[name] }

// RoleOf returns the role of a net; unknown nets are signal nets.
func (c *Circuit) RoleOf(name string) Role {
	if n := c.Net(name); n != nil {
		return n.Role
	}
	return Signal
}

// HasVolts says whether the net declares its DC volts: any but 0 V, or 0 V
// written as such.
func (n *Net) HasVolts() bool { return n.Volts != 0 || n.VoltsGiven }
