package photo

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
)

// MaxFileBytes is the largest file taken as a photo: 64 MiB, above the
// largest JPEGs cameras write (a 200-megapixel photo at top quality is about
// half of it), and small enough that no file held in memory for decoding can
// exhaust it.
const MaxFileBytes = 64 << 20

// errTooLarge is the reason a file over MaxFileBytes is not used.
var errTooLarge = fmt.Errorf("file larger than %d MiB", MaxFileBytes>>20)

// openPhoto opens a file to be read as a photo. Its type and size are judged
// before it is opened, so a named pipe, a device or a socket is never opened
// and cannot block or stream without end; the open is non-blocking where the
// system has it, and the opened file is checked again, in case the name
// changed in between.
func openPhoto(path string) (*os.File, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, fmt.Errorf("cannot be read: %w", err)
	}
	if err := regularPhoto(fi); err != nil {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_RDONLY|openNonBlocking, 0)
	if err != nil {
		return nil, fmt.Errorf("cannot be read: %w", err)
	}
	opened, err := f.Stat()
	if err == nil && !os.SameFile(fi, opened) {
		err = errors.New("file changed while it was opened")
	}
	if err == nil {
		err = regularPhoto(opened)
	}
	if err != nil {
		f.Close()
		return nil, err
	}
	return f, nil
}

// regularPhoto says why a file is not read as a photo by its type and size,
// or nil.
func regularPhoto(fi fs.FileInfo) error {
	m := fi.Mode()
	switch {
	case m.IsRegular():
		if fi.Size() > MaxFileBytes {
			return errTooLarge
		}
		return nil
	case m.IsDir():
		return errors.New("not a regular file (folder)")
	case m&fs.ModeNamedPipe != 0:
		return errors.New("not a regular file (named pipe)")
	case m&fs.ModeSocket != 0:
		return errors.New("not a regular file (socket)")
	case m&fs.ModeDevice != 0:
		return errors.New("not a regular file (device)")
	}
	return errors.New("not a regular file")
}

// readPhoto reads a whole photo file into memory for decoding, at most
// MaxFileBytes of it.
func readPhoto(path string) ([]byte, error) {
	f, err := openPhoto(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	var b bytes.Buffer
	if fi, err := f.Stat(); err == nil {
		b.Grow(int(fi.Size()) + bytes.MinRead)
	}
	if _, err := b.ReadFrom(io.LimitReader(f, MaxFileBytes+1)); err != nil {
		return nil, fmt.Errorf("cannot be read: %w", err)
	}
	if b.Len() > MaxFileBytes {
		return nil, errTooLarge
	}
	return b.Bytes(), nil
}
