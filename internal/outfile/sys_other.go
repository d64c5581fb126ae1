//go:build !unix

package outfile

import (
	"io/fs"
	"os"
)

func canWrite(string) bool { return true }

type owner struct{}

func ownerOf(fs.FileInfo) owner { return owner{} }

func (owner) apply(*os.File) {}

// alive cannot be told here: a staging folder is left for the user.
func alive(int) bool { return true }
