// Package outfile is the one place where pare puts results on disk. Every
// output goes through it so that the same promises hold for every command:
//
//   - only regular files are written: a device node, a pipe, a socket or a
//     folder given as an output file is refused, never replaced;
//   - a symbolic link is followed to the file it names (the link stays a
//     link); a link to nothing is refused;
//   - a file the user marked read-only is refused, and so is the input the
//     command reads (Protect);
//   - a file is written beside its target, synced to disk, renamed over it
//     and the folder synced, so a crash leaves the old file or the new one;
//   - a whole folder of results is written into a staging folder and swapped
//     with the old one in one step (WriteDir), so a failure or a kill at any
//     moment leaves the previous results whole.
package outfile

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"syscall"
)

// ErrRefused marks an output that pare will not write to (a device, a link
// to nothing, a read-only file, the input itself): a usage error, exit 2.
var ErrRefused = errors.New("output refused")

type refusal struct{ msg string }

func (r *refusal) Error() string { return r.msg }
func (r *refusal) Unwrap() error { return ErrRefused }

func refuse(format string, args ...any) error {
	return &refusal{msg: fmt.Sprintf(format, args...)}
}

// Target checks that path may be written as a regular file and returns the
// path the bytes will really go to (a link's target). Nothing is written.
// protect lists files that must not be overwritten, such as the input.
func Target(path string, protect ...string) (string, error) {
	if path == "" {
		return "", refuse("no output file given")
	}
	target, err := resolve(path)
	if err != nil {
		return "", err
	}
	st, err := os.Stat(target)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return target, parentFolder(path, target)
	case err != nil:
		return "", err
	case st.IsDir():
		return "", refuse("%s is a folder: give a file name to write", path)
	case !st.Mode().IsRegular():
		return "", refuse("%s is not a regular file (%s): pare writes regular files only", path, kindOf(st.Mode()))
	}
	if err := writable(path, target, st); err != nil {
		return "", err
	}
	if err := notProtected(path, st, protect); err != nil {
		return "", err
	}
	return target, nil
}

// resolve follows a chain of symbolic links to the file it ends in. A link
// to nothing is refused: writing would either replace the link or create a
// file somewhere the user did not name on the command line.
func resolve(path string) (string, error) {
	lst, err := os.Lstat(path)
	if err != nil || lst.Mode()&fs.ModeSymlink == 0 {
		return path, nil // a missing path is created; other errors show up when writing
	}
	target, err := filepath.EvalSymlinks(path)
	if err != nil {
		dest, _ := os.Readlink(path)
		return "", refuse("%s is a link to %s, which does not exist: give the file itself, or a new name", path, dest)
	}
	return target, nil
}

func parentFolder(path, target string) error {
	dir := filepath.Dir(target)
	st, err := os.Stat(dir)
	if err != nil {
		return refuse("cannot write %s: folder %s does not exist", path, dir)
	}
	if !st.IsDir() {
		return refuse("cannot write %s: %s is not a folder", path, dir)
	}
	return nil
}

// writable refuses a file whose owner took the write permission away: pare
// does not override that, even when running as root (where the system would
// let it). The access check catches files of other users.
func writable(path, target string, st fs.FileInfo) error {
	if st.Mode().Perm()&0o200 == 0 {
		return refuse("%s is read-only (mode %04o): make it writable first if it is to be replaced", path, st.Mode().Perm())
	}
	if !canWrite(target) {
		return refuse("%s is not writable by you", path)
	}
	return nil
}

func notProtected(path string, st fs.FileInfo, protect []string) error {
	for _, p := range protect {
		if p == "" {
			continue
		}
		if pst, err := os.Stat(p); err == nil && os.SameFile(pst, st) {
			if p == path {
				return refuse("%s is the input: writing there would overwrite it; choose another output", path)
			}
			return refuse("%s is the input %s under another name: writing there would overwrite it; choose another output", path, p)
		}
	}
	return nil
}

func kindOf(m fs.FileMode) string {
	switch {
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeCharDevice != 0:
		return "a character device"
	case m&fs.ModeDevice != 0:
		return "a block device"
	}
	return "not a plain file"
}

// WriteFile writes data to path as Target allows: through a temporary file
// beside the target, synced, renamed over it, the folder synced. A file that
// is replaced keeps its permissions (and, where pare may, its owner).
func WriteFile(path string, data []byte, protect ...string) error {
	target, err := Target(path, protect...)
	if err != nil {
		return err
	}
	mode, owner := fs.FileMode(0o644), ownerOf(nil)
	if st, err := os.Stat(target); err == nil {
		mode, owner = st.Mode().Perm(), ownerOf(st)
	}
	dir := filepath.Dir(target)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(target)+".tmp*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	fail := func(err error) error {
		tmp.Close()
		os.Remove(name)
		return err
	}
	if _, err := tmp.Write(data); err != nil {
		return fail(err)
	}
	if err := tmp.Chmod(mode); err != nil {
		return fail(err)
	}
	owner.apply(tmp)
	// Sync before the rename: otherwise a power cut can leave the new name
	// pointing at a file whose blocks never reached the disk.
	if err := tmp.Sync(); err != nil {
		return fail(err)
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Rename(name, target); err != nil {
		os.Remove(name)
		return err
	}
	return syncDir(dir)
}

// syncDir makes a rename in dir durable.
func syncDir(dir string) error {
	d, err := os.Open(dir)
	if err != nil {
		return err
	}
	defer d.Close()
	// Some file systems cannot sync a folder and say so; the rename stands.
	if err := d.Sync(); err != nil && !errors.Is(err, errors.ErrUnsupported) && !errors.Is(err, syscall.EINVAL) {
		return err
	}
	return nil
}
