//go:build linux

package atomicfile

import (
	"errors"
	"os"
	"strconv"

	"golang.org/x/sys/unix"
)

// openAnon opens an unnamed file in dir (O_TMPFILE): it has no name until
// linkAnon gives it one, so a process killed while writing it leaves
// nothing behind. errNoAnon means the file system cannot do it.
func openAnon(dir string) (*os.File, error) {
	fd, err := unix.Open(dir, unix.O_TMPFILE|unix.O_WRONLY|unix.O_CLOEXEC, 0o600)
	if err != nil {
		switch {
		case errors.Is(err, unix.EOPNOTSUPP), errors.Is(err, unix.EISDIR), errors.Is(err, unix.EINVAL):
			return nil, errNoAnon
		}
		return nil, &os.PathError{Op: "create", Path: dir, Err: err}
	}
	return os.NewFile(uintptr(fd), dir+string(os.PathSeparator)+"(unnamed)"), nil
}

// linkAnon gives the unnamed file f the name path; it fails with an error
// satisfying errors.Is(err, fs.ErrExist) when path exists, and with
// errNoAnon when the file cannot be named this way here.
func linkAnon(f *os.File, path string) error {
	fd := int(f.Fd())
	err := unix.Linkat(fd, "", unix.AT_FDCWD, path, unix.AT_EMPTY_PATH)
	if errors.Is(err, unix.EPERM) || errors.Is(err, unix.ENOENT) && path != "" {
		// AT_EMPTY_PATH needs a capability; the /proc link does not.
		err = unix.Linkat(unix.AT_FDCWD, "/proc/self/fd/"+strconv.Itoa(fd), unix.AT_FDCWD, path, unix.AT_SYMLINK_FOLLOW)
	}
	switch {
	case err == nil:
		return nil
	case errors.Is(err, unix.EEXIST):
		return &os.LinkError{Op: "link", Old: f.Name(), New: path, Err: os.ErrExist}
	case errors.Is(err, unix.ENOENT), errors.Is(err, unix.EPERM), errors.Is(err, unix.EOPNOTSUPP), errors.Is(err, unix.EXDEV):
		return errNoAnon
	}
	return &os.LinkError{Op: "link", Old: f.Name(), New: path, Err: err}
}
