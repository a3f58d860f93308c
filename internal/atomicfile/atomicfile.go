// Package atomicfile writes files so that a reader, a crash or an interrupt
// only ever finds the old file whole or the new one whole, and removes its
// temporary files when the process is told to stop. hatsieve's exports,
// 'hatsieve rank --out' and the screens' shortlist are written through it.
package atomicfile

import (
	"bufio"
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"syscall"
)

// ErrExists is returned by Write for a file that exists when overwriting
// was not allowed.
var ErrExists = errors.New("file exists; not overwritten")

// errNoAnon: the file system cannot make an unnamed temporary file.
var errNoAnon = errors.New("no unnamed temporary files here")

// Write writes a file so that the file at path is only ever the
// old one, whole, or the new one, whole. The data goes to a temporary file
// in the same folder, synced, which then takes the name: on Linux an
// unnamed file (O_TMPFILE), so that even a process killed mid-write leaves
// nothing behind; elsewhere, or where the file system cannot, a hidden
// ".NAME.tmp-*" file, removed on any error and by RemoveTemps (called on
// an interrupt). Without force an existing file is refused (ErrExists),
// also one that appears while the data is written; a missing folder is an
// error, never created. Errors name the path and say what went wrong in
// a few words (errors.Is still sees the cause). The path is written as
// given: callers show errors through their terminal sanitiser.
func Write(path string, force bool, write func(io.Writer) error) error {
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return fmt.Errorf("%s: folder %s does not exist", path, dir)
	case errors.Is(err, syscall.ENOTDIR):
		return fmt.Errorf("%s: a part of the path is a file, not a folder", path)
	case err != nil:
		return writeErr(path, err)
	case !st.IsDir():
		return fmt.Errorf("%s: %s is not a folder", path, dir)
	}
	mode := os.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		if fi.IsDir() {
			return fmt.Errorf("%s is a folder; give a file name (for example %s); nothing written", path, filepath.Join(path, "pairs.csv"))
		}
		if !fi.Mode().IsRegular() {
			return fmt.Errorf("%s is not a regular file (a pipe, socket or device); nothing written", path)
		}
		if !force {
			return fmt.Errorf("%s: %w", path, ErrExists)
		}
		mode = fi.Mode().Perm()
	}
	err = errNoAnon
	if useAnon {
		err = writeAnon(dir, path, force, mode, write)
	}
	if errors.Is(err, errNoAnon) {
		err = writeNamed(dir, path, force, mode, write)
	}
	if err != nil {
		return err
	}
	if d, derr := os.Open(dir); derr == nil {
		_ = d.Sync() // the new name, on disk
		d.Close()
	}
	return nil
}

// writeErr describes a failed write of path: the cause in a few words, and
// that the file at path is as it was.
func writeErr(path string, err error) error {
	cause := err
	var pe *fs.PathError
	var le *os.LinkError
	switch {
	case errors.As(err, &pe):
		cause = pe.Err
	case errors.As(err, &le):
		cause = le.Err
	}
	return fmt.Errorf("%s: %w (nothing written; any file of that name is as it was)", path, cause)
}

// fill writes the data into f through a buffer, then sets the mode and
// syncs, so that only a complete file is ever given the name.
func fill(f *os.File, mode os.FileMode, write func(io.Writer) error) error {
	bw := bufio.NewWriterSize(tempWriter(f), 64<<10)
	if err := write(bw); err != nil {
		return err
	}
	if err := bw.Flush(); err != nil {
		return err
	}
	if err := f.Chmod(mode); err != nil {
		return err
	}
	return f.Sync()
}

// useAnon is false in tests of the named temporary file.
var useAnon = true

// tempWriter is what fill writes through; tests put a failing writer here
// to stand for a full disk at the same place in the code.
var tempWriter = func(f *os.File) io.Writer { return f }

// writeAnon writes through an unnamed temporary file (errNoAnon where
// there is none to be had).
func writeAnon(dir, path string, force bool, mode os.FileMode, write func(io.Writer) error) error {
	f, err := openAnon(dir)
	if err != nil {
		if errors.Is(err, errNoAnon) {
			return err
		}
		return writeErr(path, err)
	}
	defer f.Close()
	if err := fill(f, mode, write); err != nil {
		return writeErr(path, err)
	}
	if !force {
		err := linkAnon(f, path)
		if errors.Is(err, fs.ErrExist) {
			return fmt.Errorf("%s: %w", path, ErrExists)
		}
		if err != nil && !errors.Is(err, errNoAnon) {
			return writeErr(path, err)
		}
		return err
	}
	// To replace a file, name the data first, then rename it over the old
	// file: the temporary name lives only between these two calls.
	tmp := tempName(dir, path)
	track(tmp)
	defer untrack(tmp)
	if err := linkAnon(f, tmp); err != nil {
		if errors.Is(err, errNoAnon) {
			return err
		}
		return writeErr(path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return writeErr(path, err)
	}
	return nil
}

// writeNamed writes through a hidden temporary file beside path.
func writeNamed(dir, path string, force bool, mode os.FileMode, write func(io.Writer) error) (err error) {
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return writeErr(path, err)
	}
	name := tmp.Name()
	track(name)
	defer untrack(name)
	defer func() {
		tmp.Close()
		if err != nil {
			os.Remove(name)
		}
	}()
	if err = fill(tmp, mode, write); err != nil {
		return writeErr(path, err)
	}
	if err = tmp.Close(); err != nil {
		return writeErr(path, err)
	}
	if force {
		if err = os.Rename(name, path); err != nil {
			return writeErr(path, err)
		}
		return nil
	}
	// Without force, a hard link refuses to replace a file that appeared
	// since the check; where links are not supported, rename.
	if lerr := os.Link(name, path); lerr == nil {
		os.Remove(name)
		return nil
	} else if _, serr := os.Lstat(path); serr == nil {
		err = fmt.Errorf("%s: %w", path, ErrExists)
		return err
	}
	if err = os.Rename(name, path); err != nil {
		return writeErr(path, err)
	}
	return nil
}

// tempName is a fresh hidden name beside path.
func tempName(dir, path string) string {
	var b [6]byte
	_, _ = rand.Read(b[:])
	return filepath.Join(dir, "."+filepath.Base(path)+".tmp-"+hex.EncodeToString(b[:]))
}
