//go:build linux

package atomicfile

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"os/signal"
	"path/filepath"
	"slices"
	"strings"
	"syscall"
	"testing"
	"time"
)

const childEnv = "HATSIEVE_DATA_WRITE_CHILD"

// TestMain turns the test binary into a writer child when asked (see
// TestInterruptedWrite).
func TestMain(m *testing.M) {
	if spec := os.Getenv(childEnv); spec != "" {
		writeChild(spec)
		return
	}
	os.Exit(m.Run())
}

// writeChild replaces PATH with a long write that stops half-way and waits
// to be killed. "named:" first uses a named temporary file. On SIGINT or
// SIGTERM it does what the command does: remove the temporary files, then
// exit 130.
func writeChild(spec string) {
	if rest, ok := strings.CutPrefix(spec, "named:"); ok {
		useAnon, spec = false, rest
	}
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, syscall.SIGINT, syscall.SIGTERM)
	go func() {
		<-sig
		RemoveTemps()
		os.Exit(130)
	}()
	err := Write(spec, true, func(w io.Writer) error {
		w.Write(bytes.Repeat([]byte("new,row\r\n"), 100_000))
		if err := w.(*bufio.Writer).Flush(); err != nil {
			return err
		}
		fmt.Println("WRITING")
		select {} // killed here, mid-write
	})
	fmt.Println("ERROR", err)
	os.Exit(3)
}

const oldContent = "donor,acceptor\r\nold,file\r\n"

// folderWithOld makes a folder holding out.csv with oldContent.
func folderWithOld(t *testing.T, dir string) string {
	t.Helper()
	path := filepath.Join(dir, "out.csv")
	if err := os.WriteFile(path, []byte(oldContent), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// checkUntouched asserts that path still holds oldContent and that the
// folder holds nothing else.
func checkUntouched(t *testing.T, path string) {
	t.Helper()
	if b, err := os.ReadFile(path); err != nil || string(b) != oldContent {
		t.Errorf("old file now %q (%v)", b, err)
	}
	names := dirNames(t, filepath.Dir(path))
	if !slices.Equal(names, []string{filepath.Base(path)}) {
		t.Errorf("folder holds %v", names)
	}
}

func dirNames(t *testing.T, dir string) []string {
	t.Helper()
	es, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var out []string
	for _, e := range es {
		out = append(out, e.Name())
	}
	return out
}

// bothModes runs f with the unnamed temporary file (where the system has
// it) and with a named one.
func bothModes(t *testing.T, f func(t *testing.T)) {
	for _, anon := range []bool{true, false} {
		t.Run(map[bool]string{true: "unnamed temp", false: "named temp"}[anon], func(t *testing.T) {
			defer func(old bool) { useAnon = old }(useAnon)
			useAnon = anon
			f(t)
		})
	}
}

func writeBig(w io.Writer) error {
	for range 4096 {
		if _, err := w.Write(bytes.Repeat([]byte("a,b,c\r\n"), 64)); err != nil {
			return err
		}
	}
	return nil
}

// checkWriteErr asserts a refused write is one line naming the path and
// saying nothing was written.
func checkWriteErr(t *testing.T, err error, path string, cause ...string) {
	t.Helper()
	if err == nil {
		t.Fatal("the write succeeded")
	}
	msg := err.Error()
	if strings.Contains(msg, "\n") || !strings.Contains(msg, path) || !strings.Contains(msg, "nothing written") {
		t.Errorf("message %q", msg)
	}
	for _, c := range cause {
		if !strings.Contains(msg, c) {
			t.Errorf("message %q does not say %q", msg, c)
		}
	}
}

// mountTmpfs mounts a small tmpfs on dir, or says why it cannot (not root,
// or no right to mount here); it is unmounted when the test ends.
func mountTmpfs(t *testing.T, dir, opts string, flags uintptr) error {
	t.Helper()
	if os.Geteuid() != 0 {
		return errors.New("not root")
	}
	if err := syscall.Mount("tmpfs", dir, "tmpfs", flags, opts); err != nil {
		return err
	}
	t.Cleanup(func() { syscall.Unmount(dir, syscall.MNT_DETACH) })
	return nil
}

// An export into a folder that refuses new files fails with one clear line,
// leaves the old file whole and no temporary file. chmod does not stop
// root, so each way is tried where it works: a read-only mount (root, where
// mounting is allowed), a folder without write permission (not root), and
// /proc, which refuses new files to everyone.
func TestExportIntoReadOnlyFolder(t *testing.T) {
	bothModes(t, func(t *testing.T) {
		t.Run("read-only mount", func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "ro")
			os.Mkdir(dir, 0o755)
			if err := mountTmpfs(t, dir, "size=64k", 0); err != nil {
				t.Skipf("this check needs root and the right to mount a tmpfs (%v); the /proc and permission checks stand in", err)
			}
			path := folderWithOld(t, dir)
			if err := syscall.Mount("tmpfs", dir, "tmpfs", syscall.MS_REMOUNT|syscall.MS_RDONLY, "size=64k"); err != nil {
				t.Skipf("cannot remount read-only: %v", err)
			}
			err := Write(path, true, writeBig)
			checkWriteErr(t, err, path, "read-only file system")
			if !errors.Is(err, syscall.EROFS) {
				t.Errorf("errors.Is(EROFS) false for %v", err)
			}
			checkUntouched(t, path)
		})
		t.Run("no write permission", func(t *testing.T) {
			if os.Geteuid() == 0 {
				t.Skip("root writes through any permission; the read-only mount and /proc checks stand in")
			}
			dir := t.TempDir()
			path := folderWithOld(t, dir)
			os.Chmod(dir, 0o555)
			defer os.Chmod(dir, 0o755)
			checkWriteErr(t, Write(path, true, writeBig), path, "permission denied")
			checkUntouched(t, path)
		})
		t.Run("proc", func(t *testing.T) {
			if _, err := os.Stat("/proc/self"); err != nil {
				t.Skip("no /proc here")
			}
			path := "/proc/hatsieve-export-test.csv"
			checkWriteErr(t, Write(path, false, writeBig), path)
			if _, err := os.Lstat(path); err == nil {
				t.Errorf("%s was made", path)
			}
		})
		t.Run("path through a file", func(t *testing.T) {
			dir := t.TempDir()
			path := folderWithOld(t, dir)
			err := Write(filepath.Join(path, "x.csv"), true, writeBig)
			if err == nil || !strings.Contains(err.Error(), "out.csv is not a folder") {
				t.Errorf("got %v", err)
			}
			checkUntouched(t, path)
		})
	})
}

// failAfter stands for a disk that fills: writes fail with ENOSPC once n
// bytes have gone through.
type failAfter struct {
	w io.Writer
	n int
}

func (f *failAfter) Write(p []byte) (int, error) {
	if len(p) > f.n {
		k, _ := f.w.Write(p[:f.n])
		f.n = 0
		return k, &os.PathError{Op: "write", Path: "disk", Err: syscall.ENOSPC}
	}
	f.n -= len(p)
	return f.w.Write(p)
}

// A full disk fails the export with one clear line; the old file stays
// whole and no temporary file is left. On a real 64 kB tmpfs where it can
// be mounted, and always through a writer that fails like a full disk at
// the place the file is written.
func TestExportOnFullDisk(t *testing.T) {
	bothModes(t, func(t *testing.T) {
		t.Run("tmpfs", func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "small")
			os.Mkdir(dir, 0o755)
			if err := mountTmpfs(t, dir, "size=64k", 0); err != nil {
				t.Skipf("this check needs root and the right to mount a tmpfs (%v); the failing writer stands in", err)
			}
			path := folderWithOld(t, dir)
			err := Write(path, true, writeBig) // 1.8 MB
			checkWriteErr(t, err, path, "no space left on device")
			checkUntouched(t, path)
			// Once the data fits, the same folder takes it.
			if err := Write(path, true, func(w io.Writer) error { _, err := io.WriteString(w, "new\r\n"); return err }); err != nil {
				t.Fatal(err)
			}
		})
		t.Run("failing writer", func(t *testing.T) {
			defer func(old func(*os.File) io.Writer) { tempWriter = old }(tempWriter)
			tempWriter = func(f *os.File) io.Writer { return &failAfter{w: f, n: 100_000} }
			for _, force := range []bool{true, false} {
				dir := t.TempDir()
				path := folderWithOld(t, dir)
				target := path
				if !force {
					target = filepath.Join(dir, "new.csv")
				}
				err := Write(target, force, writeBig)
				checkWriteErr(t, err, target, "no space left on device")
				if !errors.Is(err, syscall.ENOSPC) {
					t.Errorf("errors.Is(ENOSPC) false for %v", err)
				}
				checkUntouched(t, path)
			}
		})
	})
}

// A process stopped in the middle of an export leaves the old file whole.
// Killed outright (SIGKILL), the unnamed temporary file dies with it; asked
// to stop (SIGINT, SIGTERM), it removes its named temporary file first.
// The child is this test binary, writing half of its data, then waiting.
func TestInterruptedWrite(t *testing.T) {
	for _, tc := range []struct {
		name  string
		named bool
		sig   syscall.Signal
	}{
		{"unnamed temp, SIGKILL", false, syscall.SIGKILL},
		{"unnamed temp, SIGINT", false, syscall.SIGINT},
		{"named temp, SIGINT", true, syscall.SIGINT},
		{"named temp, SIGTERM", true, syscall.SIGTERM},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			path := folderWithOld(t, dir)
			spec := path
			if tc.named {
				spec = "named:" + path
			}
			cmd := exec.Command(os.Args[0], "-test.run=^$")
			cmd.Env = append(os.Environ(), childEnv+"="+spec)
			out, err := cmd.StdoutPipe()
			if err != nil {
				t.Fatal(err)
			}
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			defer cmd.Process.Kill()
			line := make(chan string, 1)
			go func() {
				s, _ := bufio.NewReader(out).ReadString('\n')
				line <- s
			}()
			select {
			case s := <-line:
				if s != "WRITING\n" {
					t.Fatalf("child said %q", s)
				}
			case <-time.After(30 * time.Second):
				t.Fatal("child never started writing")
			}
			// Mid-write: the data is in a temporary file, named or not.
			if tc.named {
				if n := dirNames(t, dir); len(n) != 2 {
					t.Fatalf("mid-write the folder holds %v, want the old file and a temporary one", n)
				}
			} else if !holdsFileIn(cmd.Process.Pid, dir) {
				t.Fatal("mid-write the child holds no file open in the folder")
			}
			checkOld := func() {
				if b, _ := os.ReadFile(path); string(b) != oldContent {
					t.Errorf("mid-write the old file reads %q", b)
				}
			}
			checkOld()
			cmd.Process.Signal(tc.sig)
			err = cmd.Wait()
			var ee *exec.ExitError
			if !errors.As(err, &ee) {
				t.Fatalf("child ended with %v", err)
			}
			if tc.sig != syscall.SIGKILL && ee.ExitCode() != 130 {
				t.Errorf("child exit %v, want 130", err)
			}
			checkUntouched(t, path)
		})
	}
}

// holdsFileIn reports whether process pid has a file in dir open.
func holdsFileIn(pid int, dir string) bool {
	fds, err := os.ReadDir(fmt.Sprintf("/proc/%d/fd", pid))
	if err != nil {
		return false
	}
	for _, fd := range fds {
		l, err := os.Readlink(fmt.Sprintf("/proc/%d/fd/%s", pid, fd.Name()))
		if err == nil && strings.HasPrefix(l, dir+"/") {
			return true
		}
	}
	return false
}

// The tests above would pass vacuously if every write went through the
// named file: on Linux, the unnamed one is used where the system has it.
func TestUnnamedTempUsedWhereAvailable(t *testing.T) {
	dir := t.TempDir()
	f, err := openAnon(dir)
	if errors.Is(err, errNoAnon) {
		t.Skipf("no O_TMPFILE on %s: the named temporary file is used", dir)
	}
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if n := dirNames(t, dir); len(n) != 0 {
		t.Errorf("an unnamed file shows as %v", n)
	}
	path := filepath.Join(dir, "x.csv")
	if err := linkAnon(f, path); err != nil {
		t.Fatal(err)
	}
	if err := linkAnon(f, path); !errors.Is(err, os.ErrExist) {
		t.Errorf("linking over an existing file: %v", err)
	}
}
