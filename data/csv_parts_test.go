package data

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// loadInParts loads src as one CSV file cut into at most parts parts of at
// least min bytes (parts 1: in one piece).
func loadInParts(src []byte, parts, min int) (*Library, string) {
	defer func(p, m int) { csvMaxParts, csvPartMin = p, m }(csvMaxParts, csvPartMin)
	csvMaxParts, csvPartMin = parts, min
	lib, err := Load(File{Name: "p.csv", Data: src})
	if err != nil {
		return lib, err.Error()
	}
	return lib, ""
}

// sameInParts fails t unless src loads to the same library and the same
// problems whether read in one piece or in parts.
func sameInParts(t *testing.T, name string, src []byte) {
	t.Helper()
	oneLib, oneErr := loadInParts(src, 1, 1)
	for _, split := range []struct{ parts, min int }{{2, 1}, {3, 64}, {7, 1}} {
		lib, err := loadInParts(src, split.parts, split.min)
		if err != oneErr {
			t.Errorf("%s in %d parts: problems differ:\none piece: %s\nin parts: %s", name, split.parts, oneErr, err)
		}
		if !sameLibraries(lib, oneLib) {
			t.Errorf("%s in %d parts: libraries differ", name, split.parts)
		}
	}
}

// A file read in parts gives the couples and the problems of reading it
// in one piece: duplicate ids within a part and across parts, rows with
// too few cells, bad numbers, couples with no route, and more problems
// than are shown (the count of those not shown included).
func TestCSVPartsSameAsOnePiece(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,bdfe,pka,e_anion,roles\n")
	for i := range 400 {
		switch {
		case i%37 == 5:
			fmt.Fprintf(&b, "c%03d,not-a-number,,,donor\n", i)
		case i%53 == 7:
			fmt.Fprintf(&b, "c%03d,70\n", i) // too few cells
		case i%41 == 9:
			fmt.Fprintf(&b, "c%03d,,20,,acceptor\n", i) // no route
		case i%29 == 3:
			fmt.Fprintf(&b, "c%03d,71,,,both\n", i/7) // a duplicate of an earlier id
		case i%61 == 0:
			b.WriteString("\n") // an empty line
		default:
			fmt.Fprintf(&b, "c%03d,%d.5,,,donor;acceptor\n", i, 60+i%30)
		}
	}
	bad := b.String()
	sameInParts(t, "bad", []byte(bad))
	if _, err := loadInParts([]byte(bad), 7, 1); !strings.Contains(err, "more problems not shown") {
		t.Fatalf("want more than %d problems, got:\n%s", MaxIssuesPerFile, err)
	}

	// Fewer problems than the cap, one of them a duplicate across parts.
	var few strings.Builder
	few.WriteString("id,bdfe\n")
	for i := range 300 {
		id := i
		if i == 250 {
			id = 3
		}
		fmt.Fprintf(&few, "k%03d,%d\n", id, 50+i%40)
	}
	fewText := strings.Replace(few.String(), "k100,", "k100,abc", 1)
	sameInParts(t, "few", []byte(fewText))
	_, err := loadInParts([]byte(fewText), 3, 64)
	for _, want := range []string{`p.csv:102: bdfe: "abc70" is not a number`, `p.csv:252: id: duplicate id "k003": also at p.csv:5`} {
		if !strings.Contains(err, want) {
			t.Errorf("want %q in:\n%s", want, err)
		}
	}

	good := synthLibrary(3000, true)
	sameInParts(t, "good", good)
	lib, _ := loadInParts(good, 5, 1)
	if len(lib.Couples) != 3000 || lib.Couples[2999].Pos.Line != 3001 {
		t.Fatalf("%d couples, the last at line %d", len(lib.Couples), lib.Couples[len(lib.Couples)-1].Pos.Line)
	}
}

// csvParts cuts after a line end, and the parts make the whole text.
func TestCSVPartsCutAtLines(t *testing.T) {
	defer func(p, m int) { csvMaxParts, csvPartMin = p, m }(csvMaxParts, csvPartMin)
	csvPartMin = 1
	for _, text := range []string{"", "a", "a\n", "a\nb", "a\nb\n", "aaaa\nb\ncc\n\n\nd\r\ne", strings.Repeat("x,y\n", 100)} {
		for n := 1; n <= 8; n++ {
			csvMaxParts = n
			parts := csvParts([]byte(text))
			if len(parts) > n {
				t.Fatalf("%q: %d parts, at most %d wanted", text, len(parts), n)
			}
			if got := bytes.Join(parts, nil); string(got) != text {
				t.Fatalf("%q in %d parts: joined %q", text, n, got)
			}
			for _, p := range parts[:len(parts)-1] {
				if len(p) == 0 || p[len(p)-1] != '\n' {
					t.Fatalf("%q in %d parts: part %q does not end a line", text, n, p)
				}
			}
		}
	}
}

// LoadFiles lets the couples of a CSV file keep views of the bytes it read
// (they go nowhere else), Load copies what it keeps: the same library
// either way, with a copy of the text saved.
func TestLoadFilesKeepsViews(t *testing.T) {
	src := synthLibrary(20000, true)
	p := filepath.Join(t.TempDir(), "views.csv")
	if err := os.WriteFile(p, src, 0o600); err != nil {
		t.Fatal(err)
	}
	allocated := func(f func() (*Library, error)) (*Library, uint64) {
		var before, after runtime.MemStats
		runtime.ReadMemStats(&before)
		lib, err := f()
		runtime.ReadMemStats(&after)
		if err != nil {
			t.Fatal(err)
		}
		return lib, after.TotalAlloc - before.TotalAlloc
	}
	viewed, viewBytes := allocated(func() (*Library, error) { return LoadFiles(p) })
	copied, copyBytes := allocated(func() (*Library, error) { return Load(File{Name: p, Data: src}) })
	if !sameLibraries(viewed, copied) {
		t.Fatal("LoadFiles and Load give different libraries")
	}
	// LoadFiles also allocates the buffer it reads the file into.
	if saved := int64(copyBytes) - (int64(viewBytes) - int64(len(src))); saved < 300<<10 {
		t.Errorf("LoadFiles allocated %d bytes besides the file's %d, Load %d: want the ids and names (some 600 kB) not copied", viewBytes-uint64(len(src)), len(src), copyBytes)
	}
}
