package outfile

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path"
	"path/filepath"
	"strconv"
	"strings"
)

// File is one result written into a folder by WriteDir.
type File struct {
	Name string // a plain file name, no folder part
	Data []byte
}

// WriteDir makes dir hold exactly files, replacing what was there in one
// step: the files are written and synced into a hidden staging folder beside
// dir, which is then swapped with dir. A failure, a full disk or a kill at
// any moment leaves either the previous folder or the new one, each whole,
// and never a temporary file inside it. A staging folder left by a killed
// run is removed by the next run for the same folder.
//
// Because the whole folder is replaced, an existing dir may hold only files
// of the same names (a previous result): a folder with anything else in it
// is refused rather than emptied. protect lists files that must survive
// (the input netlist).
func WriteDir(dir string, files []File, protect ...string) error {
	return WriteDirLike(dir, files, nil, protect...)
}

// WriteDirLike is WriteDir where the folder may also hold files matching
// the patterns like (path.Match syntax; "reduced-*.svg"): results whose
// number varies from run to run, such as one sheet per page.
func WriteDirLike(dir string, files []File, like []string, protect ...string) error {
	names := make([]string, len(files))
	for i, f := range files {
		names[i] = f.Name
	}
	names = append(names, like...)
	target, exists, mode, err := dirTarget(dir, names, protect)
	if err != nil {
		return err
	}
	parent, base := filepath.Dir(target), filepath.Base(target)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return err
	}
	sweep(parent, base)
	staging, err := os.MkdirTemp(parent, tempPrefix(base, "staging", os.Getpid()))
	if err != nil {
		return err
	}
	if err := fill(staging, files, mode); err != nil {
		os.RemoveAll(staging)
		return err
	}
	if !exists {
		if err := os.Rename(staging, target); err != nil {
			os.RemoveAll(staging)
			return err
		}
		return syncDir(parent)
	}
	if err := swap(staging, target, parent, base); err != nil {
		os.RemoveAll(staging)
		return err
	}
	return syncDir(parent)
}

// CheckDir tells, before any work is done, whether WriteDir would accept dir
// for result files of these names; a name holding '*' is a pattern
// (WriteDirLike).
func CheckDir(dir string, names []string, protect ...string) error {
	_, _, _, err := dirTarget(dir, names, protect)
	return err
}

// dirTarget checks dir and returns the folder really written (a link's
// target), whether it exists and the mode the new folder gets.
func dirTarget(dir string, names []string, protect []string) (string, bool, fs.FileMode, error) {
	for _, n := range names {
		if n == "" || n != filepath.Base(n) || n == "." || n == ".." {
			return "", false, 0, fmt.Errorf("internal error: result file name %q is not a plain name", n)
		}
	}
	if dir == "" {
		return "", false, 0, refuse("no output folder given")
	}
	target, err := resolve(dir)
	if err != nil {
		return "", false, 0, err
	}
	target, err = filepath.Abs(target)
	if err != nil {
		return "", false, 0, err
	}
	if filepath.Dir(target) == target {
		return "", false, 0, refuse("%s is the root of the file system: give a folder of its own for the results", dir)
	}
	st, err := os.Stat(target)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return target, false, 0o755, nil
	case err != nil:
		return "", false, 0, err
	case !st.IsDir():
		return "", false, 0, refuse("output %s exists and is not a folder", dir)
	}
	if err := onlyResults(dir, target, names, protect); err != nil {
		return "", false, 0, err
	}
	return target, true, st.Mode().Perm(), nil
}

// onlyResults refuses a folder that holds anything but files of the result
// names (and the temporary files older versions of pare could leave), since
// the swap would throw it away.
func onlyResults(dir, target string, names []string, protect []string) error {
	entries, err := os.ReadDir(target)
	if err != nil {
		return err
	}
	known := map[string]bool{}
	for _, n := range names {
		known[n] = true
	}
	var foreign []string
	for _, e := range entries {
		name := e.Name()
		if (known[name] || matchesAny(names, name)) && e.Type().IsRegular() {
			info, err := e.Info()
			if err != nil {
				return err
			}
			if err := notProtected(filepath.Join(dir, name), info, protect); err != nil {
				return err
			}
			continue
		}
		if e.Type().IsRegular() && oldTemp(name, known) {
			continue
		}
		foreign = append(foreign, name)
	}
	if len(foreign) == 0 {
		return nil
	}
	shown := foreign
	if len(shown) > 3 {
		shown = append(shown[:3:3], fmt.Sprintf("and %d more", len(foreign)-3))
	}
	return refuse("output folder %s holds %s, which pare did not write: pare replaces the whole folder, so give a new folder or one it wrote before",
		dir, strings.Join(shown, ", "))
}

// matchesAny says whether name matches one of the patterns among names.
func matchesAny(names []string, name string) bool {
	for _, n := range names {
		if ok, _ := path.Match(n, name); ok && strings.Contains(n, "*") {
			return true
		}
	}
	return false
}

// oldTemp recognises ".notes.md.tmp123", a temporary file that a version of
// pare writing file by file could leave behind when killed.
func oldTemp(name string, known map[string]bool) bool {
	rest, ok := strings.CutPrefix(name, ".")
	if !ok {
		return false
	}
	i := strings.LastIndex(rest, ".tmp")
	return i > 0 && known[rest[:i]]
}

// beforeWrite lets a test make the write of one file fail, as a full disk or
// a permission problem would.
var beforeWrite = func(name string) error { return nil }

// fill writes every file into the staging folder and syncs it.
func fill(staging string, files []File, mode fs.FileMode) error {
	for _, f := range files {
		if err := beforeWrite(f.Name); err != nil {
			return err
		}
		if err := writeSynced(filepath.Join(staging, f.Name), f.Data); err != nil {
			return err
		}
	}
	if err := os.Chmod(staging, mode); err != nil {
		return err
	}
	return syncDir(staging)
}

func writeSynced(path string, data []byte) error {
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		return err
	}
	if _, err := f.Write(data); err != nil {
		f.Close()
		return err
	}
	if err := f.Sync(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// exchangeNames is exchange, replaceable in tests of the fallback.
var exchangeNames = exchange

// swap puts the staging folder in target's place and removes the previous
// folder. Where the system cannot exchange two names in one step, the old
// folder is first renamed aside; a kill between the two renames is mended
// by the next run's sweep, which puts it back.
func swap(staging, target, parent, base string) error {
	if err := exchangeNames(staging, target); err == nil {
		os.RemoveAll(staging) // now the previous folder
		return nil
	}
	old, err := os.MkdirTemp(parent, tempPrefix(base, "old", os.Getpid()))
	if err != nil {
		return err
	}
	if err := os.Remove(old); err != nil { // only the unique name is wanted
		return err
	}
	if err := os.Rename(target, old); err != nil {
		return err
	}
	if err := os.Rename(staging, target); err != nil {
		if rerr := os.Rename(old, target); rerr != nil {
			return fmt.Errorf("%w; the previous results are in %s", err, old)
		}
		return err
	}
	os.RemoveAll(old)
	return nil
}

// tempPrefix names pare's temporary folders beside a result folder:
// ".NAME.pare-staging-PID-" plus a random tail. The process id lets a later
// run tell a dead run's leftovers from a running one's.
func tempPrefix(base, what string, pid int) string {
	return "." + base + ".pare-" + what + "-" + strconv.Itoa(pid) + "-"
}

// sweep removes what killed runs left beside the folder base in parent: a
// staging folder is dropped; a previous folder renamed aside is put back
// when the result folder is missing, else dropped.
func sweep(parent, base string) {
	entries, err := os.ReadDir(parent)
	if err != nil {
		return
	}
	target := filepath.Join(parent, base)
	for _, e := range entries {
		what, pid, ok := parseTemp(e.Name(), base)
		if !ok || !e.IsDir() || pid == os.Getpid() || alive(pid) {
			continue
		}
		path := filepath.Join(parent, e.Name())
		if what == "old" {
			if _, err := os.Lstat(target); errors.Is(err, fs.ErrNotExist) {
				os.Rename(path, target)
				continue
			}
		}
		os.RemoveAll(path)
	}
}

func parseTemp(name, base string) (what string, pid int, ok bool) {
	rest, found := strings.CutPrefix(name, "."+base+".pare-")
	if !found {
		return "", 0, false
	}
	what, rest, found = strings.Cut(rest, "-")
	if !found || (what != "staging" && what != "old") {
		return "", 0, false
	}
	num, _, found := strings.Cut(rest, "-")
	if !found {
		return "", 0, false
	}
	pid, err := strconv.Atoi(num)
	if err != nil || pid <= 0 {
		return "", 0, false
	}
	return what, pid, true
}

// Leftovers lists the temporary folders that runs left beside result folder
// dir, for tests and for a caller that wants to report them.
func Leftovers(dir string) []string {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return nil
	}
	parent, base := filepath.Dir(abs), filepath.Base(abs)
	entries, _ := os.ReadDir(parent)
	var out []string
	for _, e := range entries {
		if _, _, ok := parseTemp(e.Name(), base); ok {
			out = append(out, e.Name())
		}
	}
	return out
}
