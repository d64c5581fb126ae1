package graph

import (
	"runtime"

	"github.com/BurntSushi/toml"
)

// The TOML decoder reads a file on one core, and on a large netlist it is
// most of the load (a third of `pare sweep` on the 10,000-section ladder).
// A netlist is nearly all one long table of parts, each entry independent
// of the others, so decodeTOML cuts the text into pieces at line starts
// inside a table, decodes the pieces side by side, each under a copy of its
// table's header, and joins the maps. The result is the one-piece decode's
// or it is not used:
//   - any piece the decoder refuses, or any key two pieces both hold (below
//     the table a cut fell in: one of its entries; elsewhere: any top-level
//     key), sends the whole text to the decoder in one piece, so every
//     refusal is the decoder's own, with its message and position;
//   - a cut is made only where the text is at the start of a statement
//     outside strings, arrays and inline tables, inside a table opened by a
//     plain [name] header, so a piece reads its lines as the whole text
//     would. Were a cut misplaced inside a string or an array, the piece
//     before it would end with that string or array open and be refused.
//
// What the one-piece decoder checks across statements is that no key is
// defined twice and no table redefined; within a piece it checks that
// itself, and across pieces the join finds any key both hold: two entries
// of the cut table, or a table, array or value at the top level (a table
// named in two pieces is refused even where the decoder would accept it,
// [a.b] in one and [a.c] in another: then the text is decoded in one
// piece, only slower). TestSplitDecodeIsDecode compares the two on every
// netlist of the repository, cut at every statement.

// minPiece is the least text worth a piece of its own: below it the
// goroutine, the header's copy and the join cost more than they save.
const minPiece = 64 << 10

// decodeTOML decodes src as toml.Decode into a map[string]any would, in
// as many pieces as there are processors when the text is long enough.
func decodeTOML(src string) (map[string]any, error) {
	n := min(runtime.GOMAXPROCS(0), len(src)/minPiece)
	if n >= 2 {
		if raw, ok := decodePieces(splitTOML(src, n)); ok {
			return raw, nil
		}
	}
	var raw map[string]any
	_, err := toml.Decode(src, &raw)
	return raw, err
}

// piece is a stretch of a TOML text; table names the [table] the stretch
// starts inside ("" for the first piece, which starts at the top).
type piece struct {
	table, text string
}

// decodePieces decodes the pieces side by side and joins them; false when
// a piece is refused, two pieces hold the same key, a piece's last key is
// not in the table the next piece starts in, or there is only one piece.
func decodePieces(pieces []piece) (map[string]any, bool) {
	if len(pieces) < 2 {
		return nil, false
	}
	maps := make([]map[string]any, len(pieces))
	last := make([]toml.Key, len(pieces))
	errs := make([]error, len(pieces))
	done := make(chan struct{}, len(pieces))
	decode := func(i int) {
		defer func() {
			if recover() != nil {
				errs[i] = errPiece
			}
		}()
		text := pieces[i].text
		if i > 0 {
			text = "[" + pieces[i].table + "]\n" + text
		}
		md, err := toml.Decode(text, &maps[i])
		if keys := md.Keys(); len(keys) > 0 {
			last[i] = keys[len(keys)-1]
		}
		errs[i] = err
	}
	for i := 1; i < len(pieces); i++ {
		go func() {
			decode(i)
			done <- struct{}{}
		}()
	}
	decode(0)
	for range len(pieces) - 1 {
		<-done
	}
	for i, err := range errs {
		// The scanner's table checked against the decoder's reading: the
		// piece before a cut ends with a key of that table (or its header).
		if err != nil || i+1 < len(pieces) && (len(last[i]) == 0 || last[i][0] != pieces[i+1].table) {
			return nil, false
		}
	}
	raw := maps[0]
	for i := 1; i < len(pieces); i++ {
		if !joinPiece(raw, maps[i], pieces[i].table) {
			return nil, false
		}
	}
	return raw, true
}

// errPiece stands for a decoder that panicked on a piece: the text is then
// decoded in one piece, where a panic shows as it always did.
var errPiece = &pieceError{}

type pieceError struct{}

func (*pieceError) Error() string { return "piece not decoded" }

// joinPiece adds the keys of m, a piece that starts inside table, to raw;
// false at the first key both hold.
func joinPiece(raw, m map[string]any, table string) bool {
	for k, v := range m {
		have, held := raw[k]
		if !held && k != table {
			raw[k] = v
			continue
		}
		dst, ok1 := have.(map[string]any)
		src, ok2 := v.(map[string]any)
		if k != table || !held || !ok1 || !ok2 {
			return false
		}
		for name, entry := range src {
			if _, twice := dst[name]; twice {
				return false
			}
			dst[name] = entry
		}
	}
	return true
}
