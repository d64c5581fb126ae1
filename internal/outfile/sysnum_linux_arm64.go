package outfile

import "syscall"

// sysRenameat2 is renameat2's call number on linux/arm64.
const sysRenameat2 = syscall.SYS_RENAMEAT2

// atFDCWD is AT_FDCWD (linux/fcntl.h): paths relative to the working folder.
var atFDCWD = -100
