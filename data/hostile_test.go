package data

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
	"time"
	"unicode/utf8"
)

// hostileText holds what a file from anywhere may carry: a clear-screen
// sequence, an OSC 52 clipboard write, a bell, a carriage return, a
// right-to-left override, a one-byte CSI (C1), a DEL and a line separator.
const hostileText = "x\x1b[2J\x1b]52;c;aGk=\x07y\r\u202e\u009b31m\x7f\u2028z"

// rawControl reports the first character of s a terminal would act on:
// a C0 or C1 control, DEL, a bidirectional control, a line or paragraph
// separator, or a byte that is not UTF-8. keep lists the controls allowed.
func rawControl(s, keep string) (rune, bool) {
	for i, r := range s {
		if r == utf8.RuneError {
			if _, n := utf8.DecodeRuneInString(s[i:]); n <= 1 {
				return rune(s[i]), true
			}
		}
		if strings.ContainsRune(keep, r) {
			continue
		}
		if r < 0x20 || (r >= 0x7f && r < 0xa0) || r == 0x2028 || r == 0x2029 ||
			r == 0x061c || r == 0x200e || r == 0x200f || (r >= 0x202a && r <= 0x202e) || (r >= 0x2066 && r <= 0x2069) {
			return r, true
		}
	}
	return 0, false
}

func TestPrintable(t *testing.T) {
	for in, want := range map[string]string{
		"plain":                    "plain",
		"TEMPO–H ΔG° ± 0.5 (MeCN)": "TEMPO–H ΔG° ± 0.5 (MeCN)",
		"👩‍🔬 ok":                   "👩‍🔬 ok", // a joiner is not a control
		"\x1b[2J":                  `\x1b[2J`,
		"\x1b]52;c;aGk=\x07":       `\x1b]52;c;aGk=\x07`,
		"a\rb\nc\td":               `a\rb\nc\td`,
		"\u202eevil":               `\u202eevil`,
		"\u2066x\u2069":            `\u2066x\u2069`,
		"\u009b2J":                 `\x9b2J`,
		"del\x7f":                  `del\x7f`,
		"bad\xff\xfe":              `bad\xff\xfe`,
		"sep\u2028":                `sep\u2028`,
		"":                         "",
	} {
		got := Printable(in)
		if got != want {
			t.Errorf("Printable(%q) = %q, want %q", in, got, want)
		}
		if r, bad := rawControl(got, ""); bad {
			t.Errorf("Printable(%q) keeps %U", in, r)
		}
	}
}

func FuzzPrintable(f *testing.F) {
	f.Add(hostileText)
	f.Add("TEMPO–H")
	f.Add("\xff\xc3")
	f.Fuzz(func(t *testing.T, s string) {
		p := Printable(s)
		if r, bad := rawControl(p, ""); bad {
			t.Fatalf("Printable(%q) = %q keeps %U", s, p, r)
		}
		if !utf8.ValidString(p) {
			t.Fatalf("Printable(%q) = %q is not UTF-8", s, p)
		}
		if _, bad := rawControl(s, ""); !bad && p != s {
			t.Fatalf("clean %q changed to %q", s, p)
		}
		if Printable(p) != p {
			t.Fatalf("not stable: %q then %q", p, Printable(p))
		}
	})
}

// A library may hold any text: it loads as written (exports keep it), and
// every problem message about it is printable.
func TestHostileTextLoadsAsWritten(t *testing.T) {
	q := func(s string) string { return fmt.Sprintf("%q", s) } // a YAML double-quoted string
	yaml := "format: hatsieve/1\ntitle: " + q("T"+hostileText) + "\ncouples:\n" +
		"  - {id: " + q("d\u202eX") + ", name: " + q("N"+hostileText) + ", roles: donor, bdfe: 70, source: " + q("S"+hostileText) +
		", note: " + q("n"+hostileText) + ", tags: [" + q("t"+hostileText) + "]}\n" +
		"  - {id: acc, name: a, roles: acceptor, bdfe: 80}\n"
	lib, err := Load(File{"h.yaml", []byte(yaml)})
	if err != nil {
		t.Fatal(err)
	}
	c := lib.Couples[0]
	if c.Name != "N"+hostileText || c.Source != "S"+hostileText || c.Note != "n"+hostileText ||
		c.Tags[0] != "t"+hostileText || lib.Titles[0] != "T"+hostileText || c.ID != "d\u202eX" {
		t.Errorf("text changed on loading: %+v %q", c, lib.Titles)
	}
	// The same text in places that are errors: every message printable.
	bad := "format: hatsieve/1\ncouples:\n  - {id: " + q("a\x1b[2Jb") + ", bdfe: 70}\n  - {id: b, bdfe: " + q(hostileText) +
		"}\n  - {id: c, roles: " + q(hostileText) + ", bdfe: 70}\n  - {id: d, bdfe: 70, " + q("k"+hostileText) + ": 1}\n"
	_, err = Load(File{"f\x1b]0;title\x07.yaml", []byte(bad)})
	var is Issues
	if !errors.As(err, &is) || len(is) < 4 {
		t.Fatalf("want four problems, got %v", err)
	}
	for _, x := range is {
		if r, raw := rawControl(x.String(), ""); raw {
			t.Errorf("message keeps %U: %q", r, x.String())
		}
	}
	csvIn := "id,name,bdfe,roles\n\"a\x1b[2J\",n,70,donor\nb,\"" + hostileText + "\",x,acceptor\n"
	_, err = Load(File{"h.csv", []byte(csvIn)})
	if !errors.As(err, &is) || len(is) == 0 {
		t.Fatalf("want problems, got %v", err)
	}
	for _, x := range is {
		if r, raw := rawControl(x.String(), ""); raw {
			t.Errorf("message keeps %U: %q", r, x.String())
		}
	}
}

// issueText loads files and returns the one-line problems, failing if it
// loaded.
func issueText(t *testing.T, files ...File) string {
	t.Helper()
	lib, err := Load(files...)
	if err == nil {
		t.Fatalf("loaded %d couples; want a problem", len(lib.Couples))
	}
	return err.Error()
}

func wantIn(t *testing.T, got string, parts ...string) {
	t.Helper()
	for _, p := range parts {
		if !strings.Contains(got, p) {
			t.Errorf("%q does not say %q", got, p)
		}
	}
}

// A 1 GB file is refused by its size before a byte is read (a sparse file:
// it costs no disk). The memory the attempt allocates stays small.
func TestHugeFileRefusedBySize(t *testing.T) {
	path := filepath.Join(t.TempDir(), "huge.csv")
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(1 << 30); err != nil {
		t.Fatal(err)
	}
	f.Close()
	var before, after runtime.MemStats
	runtime.ReadMemStats(&before)
	_, err = LoadFiles(path)
	runtime.ReadMemStats(&after)
	if err == nil {
		t.Fatal("a 1 GB file loaded")
	}
	wantIn(t, err.Error(), path, "1.0 GB", "at most 64.0 MB")
	if n := strings.Count(err.Error(), "\n"); n != 0 {
		t.Errorf("%d lines: %q", n+1, err)
	}
	if grew := after.TotalAlloc - before.TotalAlloc; grew > 1<<20 {
		t.Errorf("refusing the file allocated %d bytes", grew)
	}
	// Just under the cap still reads (and then fails as an empty library:
	// a sparse file is all zero bytes).
	if err := os.Truncate(path, MaxFileBytes); err != nil {
		t.Fatal(err)
	}
	_, err = LoadFiles(path)
	wantIn(t, fmt.Sprint(err), "binary file")
}

// The files loaded together may hold at most MaxFileBytes: the file that
// goes past it is refused before it is read.
func TestFilesTogetherCapped(t *testing.T) {
	dir := t.TempDir()
	var paths []string
	for _, n := range []string{"a.csv", "b.csv", "c.csv"} {
		p := filepath.Join(dir, n)
		f, err := os.Create(p)
		if err != nil {
			t.Fatal(err)
		}
		f.Truncate(MaxFileBytes / 3) // sparse
		f.Close()
		paths = append(paths, p)
	}
	paths = append(paths, paths[0])
	_, err := ReadFiles(paths...)
	if err == nil {
		t.Fatal("read 4/3 of the cap")
	}
	if got := err.Error(); strings.Count(got, "\n") != 0 || !strings.Contains(got, paths[0]+": cannot read: the file is 21.3 MB, and with the files before it more than 64.0 MB") {
		t.Errorf("got %q", got)
	}
	if _, err := ReadFiles(paths[:3]...); err != nil {
		t.Errorf("three files within the cap: %v", err)
	}
}

// 10^7 rows of CSV are refused by a line count before any row is parsed.
func TestTenMillionRowCSVRefused(t *testing.T) {
	rows := bytes.Repeat([]byte("c,70\n"), 10_000_000)
	data := append([]byte("id,bdfe\n"), rows...)
	start := time.Now()
	got := issueText(t, File{"rows.csv", data})
	wantIn(t, got, "rows.csv", "10000001 lines", "at most 1000000")
	t.Logf("refused in %v", time.Since(start)) // reported, not asserted
	// The cap itself: MaxCSVLines lines pass the check, one more does not
	// (a last line without a newline counts).
	at := rows[:5*MaxCSVLines]
	if newLoader().tooManyLines(File{"at.csv", at}) {
		t.Error("refused a file of exactly MaxCSVLines lines")
	}
	if !newLoader().tooManyLines(File{"over.csv", append(at[:len(at):len(at)], 'x')}) {
		t.Error("took a file of MaxCSVLines+1 lines")
	}
}

// Files loaded together hold at most MaxCouples couples (lowered here to
// keep the test small): one more is one problem naming the count.
func TestCoupleCap(t *testing.T) {
	defer func(old int) { maxCouples = old }(maxCouples)
	maxCouples = 3
	a := File{"a.csv", []byte("id,bdfe\na,70\nb,71\n")}
	if _, err := Load(a, File{"b.csv", []byte("id,bdfe\nc,72\n")}); err != nil {
		t.Fatalf("at the cap: %v", err)
	}
	got := issueText(t, a, File{"b.csv", []byte("id,bdfe\nc,72\nd,73\n")})
	wantIn(t, got, "b.csv: 4 couples in all", "at most 3")
}

// A YAML alias bomb ("billion laughs") is refused without expanding it:
// aliases are never followed.
func TestYAMLAliasBomb(t *testing.T) {
	var b strings.Builder
	b.WriteString("format: hatsieve/1\nlols:\n  a: &a [\"lol\",\"lol\",\"lol\",\"lol\",\"lol\",\"lol\",\"lol\",\"lol\",\"lol\"]\n")
	prev := "a"
	for _, n := range []string{"b", "c", "d", "e", "f", "g", "h", "i"} {
		fmt.Fprintf(&b, "  %s: &%s [*%s,*%s,*%s,*%s,*%s,*%s,*%s,*%s,*%s]\n", n, n, prev, prev, prev, prev, prev, prev, prev, prev, prev)
		prev = n
	}
	bomb := b.String()
	var before, after runtime.MemStats
	for _, tc := range []struct{ name, doc, want string }{
		{"unknown key", bomb, "unknown key"},
		{"title", bomb + "title: *i\n", "unknown key"},
		{"couples", strings.Replace(bomb, "lols:", "couples:", 1), "couples"},
		{"tags", "format: hatsieve/1\nx: &x [a, b]\ncouples:\n  - {id: c, bdfe: 70, tags: [*x, *x]}\n", "tags"},
		{"merge", "format: hatsieve/1\ncouples:\n  - &c {id: c, bdfe: 70}\n  - {<<: *c, id: d}\n", "<<"},
	} {
		runtime.ReadMemStats(&before)
		got := issueText(t, File{"bomb.yaml", []byte(tc.doc)})
		runtime.ReadMemStats(&after)
		wantIn(t, got, "bomb.yaml", tc.want)
		if grew := after.TotalAlloc - before.TotalAlloc; grew > 16<<20 {
			t.Errorf("%s: loading allocated %d MB", tc.name, grew>>20)
		}
	}
}

// Nesting deeper than the parser allows is one clear problem, not a crash;
// nesting just under it is refused by the schema.
func TestYAMLDeepNesting(t *testing.T) {
	deep := "format: hatsieve/1\ncouples: " + strings.Repeat("[", 100_000) + "\n"
	wantIn(t, issueText(t, File{"deep.yaml", []byte(deep)}), "deep.yaml:2", "depth")
	deep = "format: hatsieve/1\ntitle: " + strings.Repeat("{a: ", 50_000) + strings.Repeat("}", 50_000) + "\n"
	wantIn(t, issueText(t, File{"deep.yaml", []byte(deep)}), "deep.yaml", "depth")
	ok := "format: hatsieve/1\ncouples: " + strings.Repeat("[", 9000) + strings.Repeat("]", 9000) + "\n"
	wantIn(t, issueText(t, File{"nine.yaml", []byte(ok)}), "nine.yaml:2")
	block := "format: hatsieve/1\ncouples:\n"
	for i := range 500 {
		block += strings.Repeat(" ", i+1) + "- \n"
	}
	wantIn(t, issueText(t, File{"block.yaml", []byte(block)}), "block.yaml")
}

// Very long lines and names load; a message quoting a very long value is
// cut to MaxMessage characters.
func TestVeryLongLinesAndNames(t *testing.T) {
	long := strings.Repeat("n", 256<<10)
	yaml := "format: hatsieve/1\ncouples:\n  - {id: d, name: " + long + ", roles: donor, bdfe: 70, note: " + long + "}\n  - {id: a, roles: acceptor, bdfe: 80}\n"
	lib, err := Load(File{"long.yaml", []byte(yaml)})
	if err != nil {
		t.Fatal(err)
	}
	if len(lib.Couples[0].Name) != len(long) {
		t.Error("long name cut on loading")
	}
	csvIn := "id,name,bdfe\nd," + long + ",70\n"
	if lib, err := Load(File{"long.csv", []byte(csvIn)}); err != nil || len(lib.Couples[0].Name) != len(long) {
		t.Errorf("long CSV cell: %v", err)
	}
	for _, f := range []File{
		{"long.csv", []byte("id,bdfe," + long + "\n")},
		{"long.yaml", []byte("format: hatsieve/1\ncouples:\n  - {id: d, bdfe: " + long + "}\n")},
		{"long.yaml", []byte("format: hatsieve/1\ncouples:\n  - {id: d, bdfe: 70, roles: " + long + "}\n")},
		{"long.yaml", []byte("format: hatsieve/1\n" + long + ": 1\n")},
		{"line.csv", []byte("id,bdfe\n" + strings.Repeat("x", 2<<20))},
	} {
		got := issueText(t, f)
		for _, l := range strings.Split(got, "\n") {
			if utf8.RuneCountInString(l) > MaxMessage+len(f.Name)+100 {
				t.Errorf("%s: message of %d characters", f.Name, utf8.RuneCountInString(l))
			}
		}
	}
}

// Text that is not UTF-8 is named by its line; a byte-order mark and CRLF
// line ends load as if they were not there.
func TestEncodingsAndLineEnds(t *testing.T) {
	latin1 := []byte("id,name,bdfe\na,x,70\nb,caf\xe9,71\n")
	wantIn(t, issueText(t, File{"l1.csv", latin1}), "l1.csv:3:", "not UTF-8", "0xe9", "save the file as UTF-8")
	wantIn(t, issueText(t, File{"l1.yaml", []byte("format: hatsieve/1\ntitle: caf\xe9\n")}), "l1.yaml:2:", "not UTF-8")
	wantIn(t, issueText(t, File{"u16.csv", []byte{0xff, 0xfe, 'i', 0, 'd', 0}}), "UTF-16")

	yaml := "format: hatsieve/1\ncouples:\n  - {id: d, roles: donor, bdfe: 70}\n  - {id: a, roles: acceptor, bdfe: 80}\n"
	csvIn := "id,roles,bdfe\nd,donor,70\na,acceptor,80\n"
	for _, f := range []File{
		{"bom.yaml", append([]byte("\uFEFF"), yaml...)},
		{"crlf.yaml", []byte(strings.ReplaceAll(yaml, "\n", "\r\n"))},
		{"bomcrlf.yaml", []byte("\uFEFF" + strings.ReplaceAll(yaml, "\n", "\r\n"))},
		{"bom.csv", append([]byte("\uFEFF"), csvIn...)},
		{"crlf.csv", []byte(strings.ReplaceAll(csvIn, "\n", "\r\n"))},
		{"bomcrlf.csv", []byte("\uFEFF" + strings.ReplaceAll(csvIn, "\n", "\r\n"))},
	} {
		lib, err := Load(f)
		if err != nil {
			t.Errorf("%s: %v", f.Name, err)
			continue
		}
		if len(lib.Couples) != 2 || lib.Couples[0].ID != "d" || lib.Couples[1].ID != "a" {
			t.Errorf("%s: couples %v", f.Name, lib.Couples)
		}
	}
	// Line numbers count CRLF lines as lines.
	wantIn(t, issueText(t, File{"crlf.csv", []byte("id,bdfe\r\na,70\r\nb,x\r\n")}), "crlf.csv:3:")
	wantIn(t, issueText(t, File{"crlf.yaml", []byte("format: hatsieve/1\r\ncouples:\r\n  - {id: a, bdfe: 70}\r\n  - {id: b, bdfe: x}\r\n")}), "crlf.yaml:4:")
}

// Only regular files are read: a folder, a named pipe and a device are
// refused by their mode (a pipe would otherwise wait for a writer for
// ever), and so is a path through a file.
func TestReadFilesRefusesWhatIsNotAFile(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.yaml")
	if err := mkfifo(fifo); err != nil {
		t.Fatalf("mkfifo: %v", err)
	}
	plain := filepath.Join(dir, "plain.yaml")
	if err := os.WriteFile(plain, []byte("format: hatsieve/1\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ path, want string }{
		{dir, "is a folder"},
		{fifo, "is a named pipe"},
		{"/dev/null", "is a device"},
		{filepath.Join(plain, "x.yaml"), "a part of the path is a file"},
		{filepath.Join(dir, "missing.yaml"), "no such file"},
	} {
		done := make(chan error, 1)
		go func() { _, err := ReadFiles(tc.path); done <- err }()
		select {
		case err := <-done:
			if err == nil {
				t.Errorf("%s: read", tc.path)
				continue
			}
			wantIn(t, err.Error(), tc.path+": cannot read: "+tc.want)
		case <-time.After(10 * time.Second):
			// Unblock the reader, so the test binary can end.
			if w, err := os.OpenFile(tc.path, os.O_WRONLY, 0); err == nil {
				w.Close()
			}
			t.Fatalf("%s: reading hangs", tc.path)
		}
	}
}
