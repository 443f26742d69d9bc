package presets

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
)

// ErrNotRegularFile is wrapped by the error of Load for a user preset path
// that is a directory, a named pipe (FIFO), a device or a socket: such a
// path is refused without reading it, so a FIFO never hangs the tool.
var ErrNotRegularFile = errors.New("not a regular file")

// ErrTooLarge is wrapped by the error of Load and LoadUser for a preset
// file over the size cap (1 MiB). Such a file is refused whole, never cut.
var ErrTooLarge = errors.New("file too large")

// Load returns the catalogue the tool runs with, for the screen and the
// command line alike: the built-in catalogue with the user preset file at
// path laid over it. An empty path means UserFile(); when that is empty
// too (no user configuration directory), Load returns Builtin() and nil.
//
// Load is the package's one place that touches the file system: it stats
// the path, opens it and reads it. It prints nothing.
//
//   - No file at path: Builtin() and nil (a user file is optional).
//   - A directory, named pipe, device or socket: Builtin() and an error
//     wrapping ErrNotRegularFile. The path is stat'ed before it is opened,
//     and opened without blocking, so a FIFO never hangs the tool.
//   - A file over 1 MiB: Builtin() and an error wrapping ErrTooLarge.
//   - A file that cannot be read, or does not parse: Builtin() and the
//     error (a *ParseError naming the line and the field when it parses
//     badly), so the caller can report it and carry on.
//
// The error is always non-nil when the user file was not used, and names
// the file.
func Load(path string) (*Catalogue, error) {
	if path == "" {
		path = UserFile()
	}
	b := Builtin()
	if path == "" {
		return b, nil
	}
	u, err := readUserFile(path)
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return b, nil
		}
		return b, err
	}
	return b.Merge(u), nil
}

// readUserFile opens, checks and decodes the preset file at path.
func readUserFile(path string) (*Catalogue, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if err := checkFileInfo(path, fi); err != nil {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_RDONLY|openNonBlock, 0)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	// The path may have changed between Stat and Open: check what was
	// opened.
	if fi, err = f.Stat(); err != nil {
		return nil, err
	}
	if err := checkFileInfo(path, fi); err != nil {
		return nil, err
	}
	return LoadUser(f, path)
}

// checkFileInfo refuses anything but a regular file within the size cap.
func checkFileInfo(path string, fi fs.FileInfo) error {
	m := fi.Mode()
	if !m.IsRegular() {
		return &ParseError{File: path, Err: fmt.Errorf("%w: it is %s; not read", ErrNotRegularFile, fileKind(m))}
	}
	if fi.Size() > maxUserFile {
		return &ParseError{File: path, Err: tooLarge(fi.Size())}
	}
	return nil
}

func tooLarge(size int64) error {
	if size < 0 {
		return fmt.Errorf("%w: more than the %d-byte limit; not read", ErrTooLarge, maxUserFile)
	}
	return fmt.Errorf("%w: %d bytes, more than the %d-byte limit; not read", ErrTooLarge, size, maxUserFile)
}

// fileKind names a non-regular file mode in words.
func fileKind(m fs.FileMode) string {
	switch {
	case m.IsDir():
		return "a directory"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeCharDevice != 0:
		return "a character device"
	case m&fs.ModeDevice != 0:
		return "a device"
	}
	return "a special file"
}
