package stages

import (
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"sync"

	"github.com/BurntSushi/toml"

	"pare/graph"
	"pare/rules"
)

//go:embed patterns/*.toml
var builtin embed.FS

// Pattern is one stage topology, loaded from a pattern file.
type Pattern struct {
	ID       string
	Title    string            // may hold {control}, {common}, {output}, {family}
	Titles   map[string]string // per family, where the trade names the stage differently
	Group    string            // oscillator, amplifier, mixer, tuned, detector, coupling, power
	Circuit  string            // "reduced" (default) or "full": power patterns look at the whole set
	Rank     int               // specificity among matches of equal size; higher wins
	Inner    bool              // may be recorded as a sub-stage of a larger stage
	Families []string
	// Context names a condition on the circuit as a whole: "fm" means the
	// stage only exists where FM is received (see fmReceived).
	Context string
	Nets    []PNet
	Parts   []PPart
	Figures []FigureSpec
	Guards  []Guard
	// Draw is the stage's drawing template (drawload.go): where each part
	// stands relative to the anchor, the part at column 0, row 0.
	Draw []Place
	Pos  graph.Pos // where the pattern's id was written

	drawPos []graph.Pos // where each Draw entry was written

	variants []*variant
}

// PNet is a pattern net: a variable bound to one net of the circuit.
type PNet struct {
	Name string
	// At says what the bound net must be: "signal" (default, not AC ground),
	// "ground" (AC ground), "any", and in full-circuit patterns "rail"
	// (a supply, bias or heater net, not chassis) and "bias" (a declared
	// bias net: an AGC line).
	At string
	// Outside constrains the bound net's other connections: "" no constraint,
	// "none" (only the pattern's parts touch it), "some" (something else
	// does), "signal" (the net is fed from elsewhere: a part outside the
	// match reaches another non-ground net, or a port, or the net is a
	// declared input or output), "source" (a part outside the match that is
	// not a resistor or capacitor touches it: a diode, winding, device or
	// port feeds it, not another RC section).
	Outside string
	Pos     graph.Pos
}

// PPart is a pattern part.
type PPart struct {
	Name   string
	Device string   // see deviceKinds
	Types  []string // allowed Part.Type values; empty = any
	// Optional: "" the part must be there; "open" it may be missing; "short"
	// it may be missing, and then its two nets are one net (a coupling
	// capacitor that a reduction has already shorted, say).
	Optional string
	Pins     []PPin     // terminal key (a role, a pin name, or "" for a two-terminal list) → pattern net
	Windings [][]string // transformer: per winding its end nets, or end, tap, end
	Min, Max float64    // bounds on the main value, SI units; 0 = none
	// Shared parts take part in the match but are not claimed by the stage:
	// an IF transformer is the load of one stage and the source of the next.
	Shared bool
	// DCBlock: the capacitor couples signal between two stages, a DC block
	// (world.blocksDC): no resistor or coil straight across it, neither
	// end held at AC ground by a far larger capacitor (a bypass).
	DCBlock bool
	Pos     graph.Pos
}

// PPin binds one terminal of a pattern part to a pattern net.
type PPin struct{ Key, Net string }

// FigureSpec asks for one figure calculation on a match.
type FigureSpec struct {
	Calc   string
	Prefix string              // prepended to every key with "_" (osc_f_min_hz)
	Args   map[string][]string // argument name → pattern part names (or a pattern net, or a word)
	Pos    graph.Pos
}

// Guard rejects a match whose figure lies outside [Min, Max]: the numbers
// separate, say, an AGC filter from an RC coupling of the same shape.
type Guard struct {
	Figure         string
	Min, Max       float64
	HasMin, HasMax bool
	Pos            graph.Pos
}

// Library is a set of loaded patterns, in id order.
type Library struct{ Patterns []*Pattern }

var (
	builtinOnce sync.Once
	builtinLib  *Library
	builtinErr  error
)

// Builtin returns the embedded pattern library, loaded once and shared (a
// Library is never changed after loading). It is checked by the tests, so
// an error here is a build mistake.
func Builtin() (*Library, error) {
	builtinOnce.Do(func() { builtinLib, builtinErr = ownLibrary(loadFS(builtin, "patterns", "patterns")) })
	return builtinLib, builtinErr
}

// ownLibrary marks a failure to load pare's own patterns as an internal
// error (exit 3): it is a build mistake, never the user's netlist, which
// a positioned complaint would have blamed.
func ownLibrary(lib *Library, err error) (*Library, error) {
	if err != nil {
		return nil, fmt.Errorf("%w: a built-in stage pattern does not load: %v", rules.ErrInternal, err)
	}
	return lib, nil
}

// LoadDir reads every *.toml file in dir as a pattern file.
func LoadDir(dir string) (*Library, error) {
	st, err := os.Stat(dir)
	if err != nil {
		return nil, fmt.Errorf("pattern directory: %w", err)
	}
	if !st.IsDir() {
		return nil, fmt.Errorf("pattern directory %s is not a directory", dir)
	}
	return loadFS(os.DirFS(dir), ".", dir)
}

// readPatternFile reads one file of a pattern folder: the built-in ones
// from the embedded files, a user's through graph.ReadFile, which refuses a
// device, a pipe or a folder named x.toml (reported at the file, so that
// every other file is still checked).
func readPatternFile(fsys fs.FS, name, shown string) ([]byte, error) {
	if _, embedded := fsys.(embed.FS); embedded {
		return fs.ReadFile(fsys, name)
	}
	data, err := graph.ReadFile(filepath.Join(shown, filepath.Base(name)))
	if err != nil {
		var l graph.ErrorList
		l.Add(graph.Pos{File: filepath.Join(shown, filepath.Base(name)), Line: 1, Col: 1}, "%v", err)
		return nil, l
	}
	return data, nil
}

func loadFS(fsys fs.FS, root, shown string) (*Library, error) {
	names, err := fs.Glob(fsys, filepath.ToSlash(filepath.Join(root, "*.toml")))
	if err != nil {
		return nil, err
	}
	sort.Strings(names)
	lib := &Library{}
	var errs graph.ErrorList
	for _, n := range names {
		file := filepath.Join(shown, filepath.Base(n))
		data, err := readPatternFile(fsys, n, shown)
		if err == nil {
			var p *Pattern
			if p, err = ParsePattern(file, data); err == nil {
				lib.Patterns = append(lib.Patterns, p)
				continue
			}
		}
		var l graph.ErrorList
		if !errors.As(err, &l) {
			return nil, err
		}
		errs = append(errs, l...)
	}
	errs = append(errs, lib.checkIDs()...)
	if len(errs) > 0 {
		errs.Sort()
		return nil, errs
	}
	lib.sort()
	return lib, nil
}

func (lib *Library) sort() {
	sort.Slice(lib.Patterns, func(i, j int) bool { return lib.Patterns[i].ID < lib.Patterns[j].ID })
}

func (lib *Library) checkIDs() graph.ErrorList {
	var errs graph.ErrorList
	seen := map[string]*Pattern{}
	for _, p := range lib.Patterns {
		if q, dup := seen[p.ID]; dup {
			errs.Add(p.Pos, "pattern id %q is used twice (also at %s)", p.ID, q.Pos)
			continue
		}
		seen[p.ID] = p
	}
	return errs
}

// Merge returns a library with other's patterns added; a pattern in other
// with the id of one in lib replaces it, so users can refine a built-in one.
func (lib *Library) Merge(other *Library) *Library {
	byID := map[string]*Pattern{}
	for _, p := range lib.Patterns {
		byID[p.ID] = p
	}
	for _, p := range other.Patterns {
		byID[p.ID] = p
	}
	out := &Library{}
	for _, p := range byID {
		out.Patterns = append(out.Patterns, p)
	}
	out.sort()
	return out
}

// Pattern returns the pattern with the given id, or nil.
func (lib *Library) Pattern(id string) *Pattern {
	for _, p := range lib.Patterns {
		if p.ID == id {
			return p
		}
	}
	return nil
}

// ParsePattern reads one pattern file; file names it in messages. Every
// problem is reported as file:line:col in a graph.ErrorList.
func ParsePattern(file string, data []byte) (*Pattern, error) {
	if err := graph.CheckTOML(file, data); err != nil {
		return nil, err
	}
	var raw map[string]any
	if _, err := toml.Decode(string(data), &raw); err != nil {
		return nil, graph.DecodeError(file, data, err)
	}
	ld := &patLoader{at: graph.IndexKeys(file, string(data)), file: file, p: &Pattern{Inner: false}}
	ld.pattern(raw)
	if err := ld.errs.Err(); err != nil {
		ld.errs.Sort()
		return nil, ld.errs
	}
	return ld.p, nil
}
