//go:build !linux

package outfile

import "errors"

// exchange is not offered by this system: WriteDir falls back to two renames.
func exchange(a, b string) error { return errors.ErrUnsupported }
