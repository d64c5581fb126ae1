package outfile

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

func read(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// Every way an output file can be something other than a plain file the
// user may replace is refused, and nothing on disk changes (red-team items
// 1, 2, 5 and 6: pare replaced /dev/full, a FIFO, the input, a link, a
// read-only file).
func TestWriteFileRefuses(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "fifo")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	input := filepath.Join(dir, "in.toml")
	os.WriteFile(input, []byte("input"), 0o644)
	hard := filepath.Join(dir, "hard.toml")
	if err := os.Link(input, hard); err != nil {
		t.Fatal(err)
	}
	ro := filepath.Join(dir, "ro.toml")
	os.WriteFile(ro, []byte("read-only"), 0o444)
	dangling := filepath.Join(dir, "dangling")
	os.Symlink(filepath.Join(dir, "nowhere"), dangling)
	linkToInput := filepath.Join(dir, "link-in")
	os.Symlink("in.toml", linkToInput)
	for _, c := range []struct{ name, path, want string }{
		{"FIFO", fifo, "not a regular file (a named pipe)"},
		{"character device", os.DevNull, "not a regular file (a character device)"},
		{"folder", dir, "is a folder"},
		{"the input", input, "is the input"},
		{"a hard link to the input", hard, "is the input"},
		{"a symlink to the input", linkToInput, "is the input"},
		{"read-only file", ro, "is read-only (mode 0444)"},
		{"dangling link", dangling, "which does not exist"},
		{"missing folder", filepath.Join(dir, "no", "x.svg"), "folder " + filepath.Join(dir, "no") + " does not exist"},
	} {
		err := WriteFile(c.path, []byte("new"), input)
		if err == nil || !errors.Is(err, ErrRefused) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want a refusal saying %q", c.name, err, c.want)
		}
	}
	if got := read(t, input); got != "input" {
		t.Errorf("input changed to %q", got)
	}
	if got := read(t, ro); got != "read-only" {
		t.Errorf("read-only file changed to %q", got)
	}
	if st, err := os.Lstat(fifo); err != nil || st.Mode()&os.ModeNamedPipe == 0 {
		t.Errorf("the FIFO was replaced: %v %v", st.Mode(), err)
	}
	if _, err := os.Lstat(filepath.Join(dir, "nowhere")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a dangling link's target was created")
	}
	left, _ := filepath.Glob(filepath.Join(dir, ".*tmp*"))
	if len(left) > 0 {
		t.Errorf("temporary files left: %v", left)
	}
}

// A link is followed: the target gets the new text and the link stays a
// link (item 5). A replaced file keeps its mode.
func TestWriteFileFollowsLinkKeepsMode(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "net.toml")
	os.WriteFile(target, []byte("old"), 0o600)
	link := filepath.Join(dir, "link.toml")
	os.Symlink("net.toml", link)
	if err := WriteFile(link, []byte("new")); err != nil {
		t.Fatal(err)
	}
	if st, err := os.Lstat(link); err != nil || st.Mode()&os.ModeSymlink == 0 {
		t.Fatalf("the link was replaced by a file")
	}
	if got := read(t, target); got != "new" {
		t.Errorf("target holds %q", got)
	}
	if st, _ := os.Stat(target); st.Mode().Perm() != 0o600 {
		t.Errorf("mode %v, want 0600 kept", st.Mode().Perm())
	}
	fresh := filepath.Join(dir, "fresh.svg")
	if err := WriteFile(fresh, []byte("x")); err != nil {
		t.Fatal(err)
	}
	if st, _ := os.Stat(fresh); st.Mode().Perm() != 0o644 {
		t.Errorf("new file mode %v, want 0644", st.Mode().Perm())
	}
}

var pack = []File{{"reduced.toml", []byte("r2")}, {"reduced.svg", []byte("s2")}, {"notes.md", []byte("n2")}}

func oldPack(t *testing.T) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "set.pare")
	if err := WriteDir(dir, []File{{"reduced.toml", []byte("r1")}, {"reduced.svg", []byte("s1")}, {"notes.md", []byte("n1")}}); err != nil {
		t.Fatal(err)
	}
	return dir
}

func checkPack(t *testing.T, dir, gen string) {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	if len(entries) != 3 {
		var names []string
		for _, e := range entries {
			names = append(names, e.Name())
		}
		t.Errorf("folder holds %v, want the three result files only", names)
	}
	for _, f := range []string{"reduced.toml", "reduced.svg", "notes.md"} {
		if got := read(t, filepath.Join(dir, f)); got[1:] != gen {
			t.Errorf("%s is %q, want generation %s: the folder is mixed", f, got, gen)
		}
	}
	if left := Leftovers(dir); len(left) > 0 {
		t.Errorf("temporary folders left: %v", left)
	}
}

// A write that fails on its last file leaves the previous folder whole and
// no temporary folder (item 3).
func TestWriteDirFailureKeepsOld(t *testing.T) {
	dir := oldPack(t)
	beforeWrite = func(name string) error {
		if name == "notes.md" {
			return syscall.ENOSPC
		}
		return nil
	}
	defer func() { beforeWrite = func(string) error { return nil } }()
	if err := WriteDir(dir, pack); !errors.Is(err, syscall.ENOSPC) {
		t.Fatalf("got %v, want the disk-full error", err)
	}
	checkPack(t, dir, "1")
	beforeWrite = func(string) error { return nil }
	if err := WriteDir(dir, pack); err != nil {
		t.Fatal(err)
	}
	checkPack(t, dir, "2")
}

// A folder holding files pare did not write is refused, not emptied; a link
// to a folder is followed; the root is never swapped.
func TestWriteDirRefuses(t *testing.T) {
	dir := oldPack(t)
	os.WriteFile(filepath.Join(dir, "photo.jpg"), []byte("mine"), 0o644)
	if err := WriteDir(dir, pack); !errors.Is(err, ErrRefused) || !strings.Contains(err.Error(), "photo.jpg") {
		t.Errorf("got %v, want a refusal naming photo.jpg", err)
	}
	if read(t, filepath.Join(dir, "photo.jpg")) != "mine" {
		t.Error("the user's file was touched")
	}
	if err := WriteDir("/", pack); !errors.Is(err, ErrRefused) {
		t.Errorf("root: got %v", err)
	}
	link := filepath.Join(t.TempDir(), "dangling")
	os.Symlink("/nonexistent/pack", link)
	if err := WriteDir(link, pack); !errors.Is(err, ErrRefused) || !strings.Contains(err.Error(), "does not exist") {
		t.Errorf("dangling link: got %v", err)
	}
	good := oldPack(t)
	viaLink := filepath.Join(t.TempDir(), "link")
	os.Symlink(good, viaLink)
	if err := WriteDir(viaLink, pack); err != nil {
		t.Fatal(err)
	}
	if st, _ := os.Lstat(viaLink); st.Mode()&os.ModeSymlink == 0 {
		t.Error("the link to the folder was replaced")
	}
	checkPack(t, good, "2")
	// The input inside a previous pack under a result name is protected.
	in := filepath.Join(oldPack(t), "reduced.toml")
	if err := WriteDir(filepath.Dir(in), pack, in); !errors.Is(err, ErrRefused) {
		t.Errorf("input in the folder: got %v", err)
	}
}

// What a killed run leaves beside the folder is swept by the next run: a
// staging folder goes, a previous folder renamed aside comes back when the
// result folder is missing.
func TestWriteDirSweeps(t *testing.T) {
	cmd := exec.Command("true")
	if err := cmd.Run(); err != nil {
		t.Skip("no 'true' command to get a dead process id")
	}
	dead := cmd.Process.Pid
	dir := oldPack(t)
	parent, base := filepath.Dir(dir), filepath.Base(dir)
	stale := filepath.Join(parent, tempPrefix(base, "staging", dead)+"x")
	os.Mkdir(stale, 0o700)
	os.WriteFile(filepath.Join(stale, "notes.md"), []byte("half"), 0o644)
	if err := WriteDir(dir, pack); err != nil {
		t.Fatal(err)
	}
	checkPack(t, dir, "2")
	// Killed between the two renames of the fallback swap.
	aside := filepath.Join(parent, tempPrefix(base, "old", dead)+"y")
	if err := os.Rename(dir, aside); err != nil {
		t.Fatal(err)
	}
	sweep(parent, base)
	checkPack(t, dir, "2")
}

// Where the system cannot exchange two folders in one step, the two-rename
// fallback still ends with the new folder whole and nothing left beside it.
func TestWriteDirFallbackSwap(t *testing.T) {
	exchangeNames = func(a, b string) error { return errors.ErrUnsupported }
	defer func() { exchangeNames = exchange }()
	dir := oldPack(t)
	if err := WriteDir(dir, pack); err != nil {
		t.Fatal(err)
	}
	checkPack(t, dir, "2")
}
