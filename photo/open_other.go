//go:build !unix

package photo

// openNonBlocking is 0 where the system has no non-blocking open; the file
// type is judged before opening there too.
const openNonBlocking = 0
