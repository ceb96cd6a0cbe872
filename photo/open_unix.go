//go:build unix

package photo

import "syscall"

// openNonBlocking makes opening a named pipe return at once instead of
// waiting for a writer; regular files read as usual.
const openNonBlocking = syscall.O_NONBLOCK
