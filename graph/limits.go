package graph

import (
	"fmt"
	"io"
	"io/fs"
	"os"
)

// Limits on what pare reads. No netlist of a radio, an amplifier or a
// whole television comes near them (the largest bundled example has 26
// parts); they exist so that a careless or hostile file gets a positioned
// message at once instead of minutes of work and gigabytes of memory.
const (
	// MaxFileSize bounds a netlist or pattern file: 8 MiB is some
	// 100,000 part lines.
	MaxFileSize = 8 << 20
	// MaxDepth bounds how deeply arrays and inline tables nest. A netlist
	// needs 4 (parts.T1.windings.p.l); the key scanner's work grows with the
	// square of the depth.
	MaxDepth = 16
	// MaxParts bounds the parts of one netlist.
	MaxParts = 20000
	// MaxTerminalsPerNet bounds the pins on one signal net. A merge of
	// parts across the same two nets is a step per pair of parts, each
	// read from the quieter net and proven, so a signal net with many
	// terminals costs the square of them: 2,500 capacitors on one signal
	// net took seconds and nearly a gigabyte to reduce. No real signal net
	// has more than a few dozen terminals.
	MaxTerminalsPerNet = 5000
	// MaxTerminalsPerACGroundNet bounds the pins on a net at AC ground
	// (chassis, a supply rail, a heater or bias line). Every stage of a set
	// returns to them, so they grow with the set (10,000 parts put some
	// 5,100 terminals on the chassis); the rules and the stage matcher
	// read such a net only from its other end (the quieter net of a part,
	// an electrode's own net), never pair its terminals, so they are
	// bounded as the parts are: a terminal per part.
	MaxTerminalsPerACGroundNet = MaxParts
)

// ReadFile reads a netlist or pattern file, refusing what is not a regular
// file (a device such as /dev/zero, a named pipe, a folder: each would hang
// or fill memory) and files above MaxFileSize. Links are followed.
func ReadFile(path string) ([]byte, error) {
	// Stat before opening: opening a named pipe blocks until someone
	// writes to it, which is the hang this guards against.
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if err := regularInput(path, st); err != nil {
		return nil, err
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	if st, err = f.Stat(); err != nil {
		return nil, err
	}
	if err := regularInput(path, st); err != nil {
		return nil, err
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxFileSize+1))
	if err != nil {
		return nil, err
	}
	if len(data) > MaxFileSize {
		return nil, &InputError{Path: path, Msg: fmt.Sprintf("is larger than %d MiB: not a netlist pare reads", MaxFileSize>>20)}
	}
	return data, nil
}

func regularInput(path string, st fs.FileInfo) error {
	m := st.Mode()
	switch {
	case m.IsRegular():
		if st.Size() > MaxFileSize {
			return &InputError{Path: path, Msg: fmt.Sprintf("is larger than %d MiB: not a netlist pare reads", MaxFileSize>>20)}
		}
		return nil
	case m.IsDir():
		return &InputError{Path: path, Msg: "is a folder, not a file"}
	case m&fs.ModeNamedPipe != 0:
		return &InputError{Path: path, Msg: "is a named pipe: pare reads regular files only"}
	case m&fs.ModeDevice != 0 || m&fs.ModeCharDevice != 0:
		return &InputError{Path: path, Msg: "is a device: pare reads regular files only"}
	}
	return &InputError{Path: path, Msg: "is not a regular file: pare reads regular files only"}
}

// InputError is a file pare refuses to read as a whole (wrong kind of file,
// too large). Its message starts with the path, like the system's.
type InputError struct {
	Path string
	Msg  string
}

func (e *InputError) Error() string { return e.Path + " " + e.Msg }

// CheckTOML scans TOML text before it is decoded and refuses nesting deeper
// than MaxDepth, with the position of the first bracket too deep. The
// decoder and the key scanner both recurse per level; without this a
// 200 KB file of brackets took 48 s and 15 GB.
func CheckTOML(file string, data []byte) error {
	if len(data) > MaxFileSize {
		var l ErrorList
		l.Add(Pos{File: file, Line: 1, Col: 1}, "the file is larger than %d MiB: not a netlist pare reads", MaxFileSize>>20)
		return l
	}
	d := depthScanner{data: data, line: 1, col: 1}
	if at, ok := d.tooDeep(); ok {
		var l ErrorList
		l.Add(Pos{File: file, Line: at.Line, Col: at.Col}, "arrays and tables nest deeper than %d levels here: no netlist needs that", MaxDepth)
		return l
	}
	return nil
}

// depthScanner follows brackets and braces outside strings and comments.
type depthScanner struct {
	data      []byte
	i         int
	line, col int
}

func (d *depthScanner) advance() byte {
	c := d.data[d.i]
	if c == '\n' {
		d.line, d.col = d.line+1, 1
	} else if c < 0x80 || c >= 0xC0 { // count characters, not UTF-8 bytes
		d.col++
	}
	d.i++
	return c
}

func (d *depthScanner) tooDeep() (Pos, bool) {
	depth := 0
	for d.i < len(d.data) {
		at := Pos{Line: d.line, Col: d.col}
		switch c := d.advance(); c {
		case '[', '{':
			depth++
			if depth > MaxDepth {
				return at, true
			}
		case ']', '}':
			depth = max(0, depth-1)
		case '#':
			for d.i < len(d.data) && d.data[d.i] != '\n' {
				d.advance()
			}
		case '"', '\'':
			d.skipString(c)
		}
	}
	return Pos{}, false
}

// skipString steps over a basic or literal string, one line or three
// quotes long; an unclosed one ends at the end of the text (the decoder
// reports it).
func (d *depthScanner) skipString(q byte) {
	triple := d.i+1 < len(d.data) && d.data[d.i] == q && d.data[d.i+1] == q
	if triple {
		d.advance()
		d.advance()
	}
	for d.i < len(d.data) {
		c := d.advance()
		switch {
		case c == '\\' && q == '"' && d.i < len(d.data):
			d.advance()
		case c == q && !triple:
			return
		case c == q && triple && d.i+1 < len(d.data) && d.data[d.i] == q && d.data[d.i+1] == q:
			d.advance()
			d.advance()
			return
		case c == '\n' && !triple:
			return
		}
	}
}

// checkCounts refuses a netlist with more parts than MaxParts or a net with
// more terminals than its limit (MaxTerminalsPerNet for a signal net,
// MaxTerminalsPerACGroundNet for one at AC ground), at the first entry past
// the limit.
func (ld *loader) checkCounts() {
	c := ld.c
	if len(c.Parts) <= MaxParts && !ld.netTooLarge() {
		return
	}
	// Count in source order, so that "the first entry past the limit" is
	// the one a reader finds by scrolling down, not the one that happens
	// to come first in the order of reference designators.
	byPos := inSourceOrder(c.Parts, func(p *Part) (Pos, string) { return p.Pos, p.Ref })
	if len(c.Parts) > MaxParts {
		ld.errs.Add(byPos[MaxParts].Pos, "more than %d parts: pare reads netlists of up to %d parts", MaxParts, MaxParts)
	}
	count := map[string]int{}
	for _, p := range byPos {
		for _, pin := range p.Pins {
			count[pin.Net]++
			if count[pin.Net] <= MaxTerminalsPerNet {
				continue
			}
			switch ground := c.RoleOf(pin.Net).IsACGround(); {
			case !ground && count[pin.Net] == MaxTerminalsPerNet+1:
				ld.errs.Add(pin.Pos, "net %s has more than %d terminals: pare reads signal nets of up to %d (a net at AC ground, chassis or a rail, may have %d)",
					pin.Net, MaxTerminalsPerNet, MaxTerminalsPerNet, MaxTerminalsPerACGroundNet)
			case ground && count[pin.Net] == MaxTerminalsPerACGroundNet+1:
				ld.errs.Add(pin.Pos, "net %s has more than %d terminals: pare reads nets at AC ground of up to %d", pin.Net, MaxTerminalsPerACGroundNet, MaxTerminalsPerACGroundNet)
			}
		}
	}
}

// netTooLarge tells whether some net has more terminals than checkCounts
// allows it: the counts in any order, so that a netlist within its limits,
// nearly every one, is not put in source order only to find nothing.
func (ld *loader) netTooLarge() bool {
	count := make(map[string]int, len(ld.c.Nets))
	for _, p := range ld.c.Parts {
		for _, pin := range p.Pins {
			count[pin.Net]++
		}
	}
	for net, n := range count {
		if n > MaxTerminalsPerNet && (n > MaxTerminalsPerACGroundNet || !ld.c.RoleOf(net).IsACGround()) {
			return true
		}
	}
	return false
}
