package outfile

// sysRenameat2 is renameat2's call number on linux/amd64
// (arch/x86/entry/syscalls/syscall_64.tbl); the syscall package lacks it here.
const sysRenameat2 = 316

// atFDCWD is AT_FDCWD (linux/fcntl.h): paths relative to the working folder.
var atFDCWD = -100
