package data

import (
	"bytes"
	"errors"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
	"unicode/utf8"
)

// A large file is read in two halves at once: the bytes are those of
// reading it in order, for sizes about the threshold and odd sizes.
func TestReadHalvesSameBytes(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	dir := t.TempDir()
	for _, n := range []int{1<<20 - 1, 1 << 20, 1<<20 + 1, 3<<20 + 7} {
		want := make([]byte, n)
		for i := range want {
			want[i] = byte(rng.IntN(256))
		}
		p := filepath.Join(dir, "big.csv")
		if err := os.WriteFile(p, want, 0o600); err != nil {
			t.Fatal(err)
		}
		got, msg := readLibraryFile(p, MaxFileBytes)
		if msg != "" || !bytes.Equal(got, want) {
			t.Fatalf("%d bytes: read %d bytes (%q), not the file", n, len(got), msg)
		}
	}
}

// A file that gives less than its size when read by halves (it shrank
// meanwhile) is read again in order, and one that goes on past its size
// (it grew) is read to its end.
func TestReadHalvesFileChanged(t *testing.T) {
	text := bytes.Repeat([]byte("0123456789abcdef"), 1<<17) // 2 MB
	for _, c := range []struct {
		name     string
		r        *changingFile
		size     int64
		wantSize int
	}{
		{"shrank", &changingFile{data: text[:len(text)-100]}, int64(len(text)), len(text) - 100},
		{"grew", &changingFile{data: append(bytes.Clone(text), "tail"...)}, int64(len(text)), len(text) + 4},
		{"same", &changingFile{data: text}, int64(len(text)), len(text)},
	} {
		got, err := readAtMost(c.r, c.size, MaxFileBytes)
		if err != nil || len(got) != c.wantSize || !bytes.Equal(got, c.r.data) {
			t.Errorf("%s: %d bytes (%v), want the %d of the file", c.name, len(got), err, c.wantSize)
		}
	}
}

// changingFile is a file read by ReadAt, Seek and Read, whose ReadAt may
// fall short of what is asked, as a file cut meanwhile does.
type changingFile struct {
	data []byte
	off  int64
}

func (f *changingFile) ReadAt(p []byte, off int64) (int, error) {
	if off >= int64(len(f.data)) {
		return 0, io.EOF
	}
	n := copy(p, f.data[off:])
	if n < len(p) {
		return n, io.EOF
	}
	return n, nil
}

func (f *changingFile) Seek(off int64, whence int) (int64, error) {
	if whence != io.SeekStart {
		return 0, errors.New("only from the start")
	}
	f.off = off
	return off, nil
}

func (f *changingFile) Read(p []byte) (int, error) {
	if f.off >= int64(len(f.data)) {
		return 0, io.EOF
	}
	n := copy(p, f.data[f.off:])
	f.off += int64(n)
	return n, nil
}

// validUTF8 checks a large text in two halves and says what utf8.Valid
// says, whatever byte is spoiled about the cut.
func TestValidUTF8Halves(t *testing.T) {
	base := bytes.Repeat([]byte("N–H 66,5 ± 0,5 kcal/mol; "), (1<<21)/28)
	if !validUTF8(base) || !utf8.Valid(base) {
		t.Fatal("the base text should be valid")
	}
	mid := len(base) / 2
	for at := mid - 6; at <= mid+6; at++ {
		for _, b := range []byte{0x80, 0xbf, 0xc3, 0xe2, 0xff, 'x'} {
			spoiled := bytes.Clone(base)
			spoiled[at] = b
			if got, want := validUTF8(spoiled), utf8.Valid(spoiled); got != want {
				t.Fatalf("byte 0x%02x at %d (cut near %d): %v, utf8.Valid says %v", b, at, mid, got, want)
			}
		}
	}
	// A text that ends in the middle of a character.
	if cut := base[:len(base)-2]; validUTF8(cut) != utf8.Valid(cut) {
		t.Fatal("a cut character")
	}
}
