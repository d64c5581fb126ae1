//go:build unix

package outfile

import (
	"io/fs"
	"os"
	"syscall"
)

// canWrite asks the system whether this process may write the file.
func canWrite(path string) bool { return syscall.Access(path, 0x2) == nil } // W_OK, unistd.h

// owner is the user and group of a file being replaced.
type owner struct {
	uid, gid int
	known    bool
}

func ownerOf(st fs.FileInfo) owner {
	if st == nil {
		return owner{}
	}
	if s, ok := st.Sys().(*syscall.Stat_t); ok {
		return owner{uid: int(s.Uid), gid: int(s.Gid), known: true}
	}
	return owner{}
}

// apply gives the new file the old file's owner, so that `sudo pare fmt`
// does not hand a user's netlist to root. Only root may do this; for anyone
// else the file was theirs already and the call is skipped.
func (o owner) apply(f *os.File) {
	if o.known && os.Geteuid() == 0 {
		_ = f.Chown(o.uid, o.gid) // best effort: the content is what matters
	}
}

// alive reports whether a process with this id still runs, so that a
// staging folder of a running pare is never swept away.
func alive(pid int) bool {
	err := syscall.Kill(pid, 0)
	return err == nil || err == syscall.EPERM
}
