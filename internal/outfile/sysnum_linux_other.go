//go:build linux && !amd64 && !arm64

package outfile

// sysRenameat2 is unknown on this architecture: -1 makes the call fail
// with ENOSYS, and WriteDir falls back to two renames.
const sysRenameat2 = ^uintptr(0)

// atFDCWD is AT_FDCWD (linux/fcntl.h).
var atFDCWD = -100
