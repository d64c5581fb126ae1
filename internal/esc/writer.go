package esc

import (
	"io"
	"unicode/utf8"
)

// TerminalWriter passes everything written to it through Terminal before it
// reaches w, so that no title, label or message a command prints can drive
// the terminal. A character split across two writes is held back until it
// is complete; Flush writes out what is held at the end.
type TerminalWriter struct {
	w       io.Writer
	pending []byte
}

// NewTerminalWriter wraps w.
func NewTerminalWriter(w io.Writer) *TerminalWriter { return &TerminalWriter{w: w} }

// Write escapes p and writes it; it reports len(p) written when w took all
// of the escaped text.
func (t *TerminalWriter) Write(p []byte) (int, error) {
	buf := append(t.pending, p...)
	t.pending = nil
	cut := len(buf)
	// Hold back an incomplete UTF-8 sequence at the end (at most 3 bytes).
	for i := len(buf) - 1; i >= 0 && i >= len(buf)-3; i-- {
		if utf8.RuneStart(buf[i]) {
			if !utf8.FullRune(buf[i:]) {
				cut = i
			}
			break
		}
	}
	t.pending = append([]byte(nil), buf[cut:]...)
	if _, err := io.WriteString(t.w, Terminal(string(buf[:cut]))); err != nil {
		return 0, err
	}
	return len(p), nil
}

// Flush writes out a held incomplete sequence (as escapes: it never got
// completed).
func (t *TerminalWriter) Flush() error {
	if len(t.pending) == 0 {
		return nil
	}
	_, err := io.WriteString(t.w, Terminal(string(t.pending)))
	t.pending = nil
	return err
}
