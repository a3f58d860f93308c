package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestWriteFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.csv")
	write := func(s string) func(io.Writer) error {
		return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
	}
	if err := Write(path, false, write("one")); err != nil {
		t.Fatal(err)
	}
	if err := Write(path, false, write("two")); !errors.Is(err, ErrExists) {
		t.Errorf("overwrite without force: %v", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "one" {
		t.Errorf("refused write changed the file to %q", b)
	}
	boom := errors.New("disk on fire")
	if err := Write(path, true, func(w io.Writer) error { io.WriteString(w, "partial"); return boom }); err == nil || !strings.Contains(err.Error(), "disk on fire") {
		t.Errorf("failed write: %v", err)
	}
	if b, _ := os.ReadFile(path); string(b) != "one" {
		t.Errorf("a failed write left %q", b)
	}
	if err := Write(path, true, write("three")); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(path); string(b) != "three" {
		t.Errorf("forced write left %q", b)
	}
	if err := Write(filepath.Join(dir, "nope", "x.csv"), true, write("x")); err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Errorf("missing folder: %v", err)
	}
	// A folder as the target is named a folder, with a file name to give.
	if err := Write(dir, true, write("x")); err == nil || !strings.Contains(err.Error(), "is a folder; give a file name") {
		t.Errorf("wrote over a folder, or said %v", err)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("left behind: %v", entries)
	}
}
