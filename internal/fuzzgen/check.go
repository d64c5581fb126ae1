package fuzzgen

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"

	"pare/internal/esc"
)

// Inert reports an error when text meant for a sink still holds a control
// or bidi character or invalid UTF-8 (newlines and tabs are allowed).
func Inert(name, text string) error {
	if esc.Terminal(text) != text {
		return fmt.Errorf("%s holds a raw control or bidi character or invalid UTF-8", name)
	}
	return nil
}

// WellFormedXML reports an error when an SVG does not parse as XML.
func WellFormedXML(name string, data []byte) error {
	d := xml.NewDecoder(bytes.NewReader(data))
	for {
		_, err := d.Token()
		if errors.Is(err, io.EOF) {
			return nil
		}
		if err != nil {
			return fmt.Errorf("%s is not well-formed XML: %v", name, err)
		}
	}
}
