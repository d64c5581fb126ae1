package outfile

import "golang.org/x/sys/unix"

// exchange swaps two paths in one step (renameat2 with RENAME_EXCHANGE):
// at every instant each name holds one whole folder.
func exchange(a, b string) error {
	return unix.Renameat2(unix.AT_FDCWD, a, unix.AT_FDCWD, b, unix.RENAME_EXCHANGE)
}
