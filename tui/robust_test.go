package tui

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"
	"unicode/utf8"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"github.com/hatsieve/hatsieve/data"
)

// hostile is what a library from anywhere may hold: clear screen, an OSC 52
// clipboard write ended by a bell, a carriage return, a right-to-left
// override, a one-byte CSI (C1), DEL, a line separator and a tab.
const hostile = "\x1b[2J\x1b]52;c;aGk=\x07\r\u202e\u009b31m\x7f\u2028\t"

// rawControl returns the first character of s a terminal would act on,
// other than a line break and, when sgr is true, colour sequences.
func rawControl(s string, sgr bool) (string, bool) {
	for i := 0; i < len(s); {
		if s[i] == '\n' {
			i++
			continue
		}
		if sgr {
			if n := sgrLen(s[i:]); n > 0 {
				i += n
				continue
			}
		}
		r, n := utf8.DecodeRuneInString(s[i:])
		if (r == utf8.RuneError && n <= 1) || r < 0x20 || (r >= 0x7f && r < 0xa0) || r == 0x2028 || r == 0x2029 ||
			r == 0x061c || r == 0x200e || r == 0x200f || (r >= 0x202a && r <= 0x202e) || (r >= 0x2066 && r <= 0x2069) {
			return fmt.Sprintf("%q at %d in %q", s[i:i+n], i, s[max(0, i-40):min(len(s), i+40)]), true
		}
		i += n
	}
	return "", false
}

// hostileLibrary loads a YAML library with hostile text in every text a
// screen shows: title, ids, names, bonds, sources, statuses are checked so
// stay plain, notes, tags, series names, and a solvent's name and source.
func hostileLibrary(t *testing.T) *data.Library {
	t.Helper()
	q := func(s string) string { return fmt.Sprintf("%q", s) }
	h := func(s string) string { return q(s + hostile + "end") }
	doc := "format: hatsieve/1\n" +
		"title: " + h("title") + "\n" +
		"solvent: acetonitrile\n" +
		"solvents:\n  - {name: " + h("solv") + ", ref: Fc+/Fc, c_g_2022: 54.9, e_h2: -0.028 V vs Fc+/Fc, source: " + h("ssrc") + "}\n" +
		"couples:\n" +
		"  - {id: " + q("d\u202e1") + ", name: " + h("dname") + ", bond: " + h("O–H") + ", roles: donor, bdfe: 62, source: " + h("dsrc") +
		", note: " + h("dnote") + ", tags: [" + h("dtag") + "]}\n" +
		"  - {id: " + q("d\u20662") + ", name: " + h("d2") + ", roles: donor, pka: 24, e_anion: -1.1 V vs Fc+/Fc, source: " + h("s") + "}\n" +
		"  - {id: a1, name: " + h("aname") + ", roles: acceptor, bdfe: 70, source: " + h("asrc") + ", note: " + h("anote") + "}\n" +
		"  - {id: " + q("a\u202d2") + ", name: " + h("a2") + ", roles: both, bdfe: 66, solvent: " + h("solv") + "}\n" +
		"acids:\n  - {id: " + q("h\u202ea") + ", name: " + h("acid") + ", pka: 12, source: " + h("asrc") + ", note: " + h("anote") + "}\n" +
		"reductants:\n  - {id: r, name: " + h("red") + ", e0: -1.35 V vs Fc+/Fc, source: " + h("rsrc") + "}\n" +
		"series:\n  - {id: s1, name: " + h("series") + ", steps: [a1, " + q("a\u202d2") + "]}\n"
	lib, err := data.Load(data.File{Name: "hostile\x1b[2J.yaml", Data: []byte(doc)})
	if err != nil {
		t.Fatal(err)
	}
	return lib
}

// No control character from a library reaches the terminal: every pane,
// the detail panel, the solvent picker, help, marks, the filter and the
// export prompt are drawn, in plain and in colour, and each view is
// checked. The text itself is kept: the export writes it as loaded.
func TestHostileTextNeverReachesTheTerminal(t *testing.T) {
	lib := hostileLibrary(t)
	for _, colour := range []bool{false, true} {
		t.Run(map[bool]string{false: "plain", true: "colour"}[colour], func(t *testing.T) {
			r := plainRenderer()
			if colour {
				r = lipgloss.NewRenderer(io.Discard)
				r.SetColorProfile(termenv.TrueColor)
			}
			m := New(lib, Options{StateDir: t.TempDir(), NoCaution: true, Renderer: r, Eval: data.Options{Cross: true}})
			m = send(t, m, tea.WindowSizeMsg{Width: 120, Height: 40})
			m = drain(t, m, m.Init())
			if m.t == nil || len(m.t.pairs) == 0 {
				t.Fatalf("no pairs: %s", m.errMsg)
			}
			check := func(step string) {
				t.Helper()
				v := m.View()
				if where, bad := rawControl(v, true); bad {
					t.Errorf("%s: raw control %s", step, where)
				}
				if !colour && strings.Contains(v, "\x1b") {
					t.Errorf("%s: an escape in a plain view", step)
				}
			}
			check("pairs")
			if !strings.Contains(screen(m), `title\x1b[2J`) {
				t.Errorf("the title is not shown with its escapes visible:\n%s", screen(m))
			}
			steps := [][]string{
				{"space"}, {"enter"}, {"pgdown"}, {"esc"}, {"2"}, {"enter"}, {"esc"}, {"3"}, {"enter"}, {"esc"},
				{"4"}, {"5"}, {"1"}, {"down", "space"}, {"v"}, {"down"}, {"esc"}, {"c"}, {"c"}, {"c"}, {"c"}, {"c"}, {"c"}, {"c"}, {"?"}, {"esc"},
				{"/"}, {"d", "\x1b", "\u202e", "\x07"}, {"esc"}, {"x"}, {"esc"},
			}
			for _, ks := range steps {
				for _, k := range ks {
					if k == "\x1b" || k == "\x07" || k == "\u202e" {
						m = send(t, m, tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune(k)})
						continue
					}
					m = keys(t, m, k)
				}
				check(strings.Join(ks, " "))
			}
			// Every row of every table, through the detail panel.
			for p := range 3 {
				m = keys(t, m, fmt.Sprint(p+1), "home")
				for range m.grids[p].len() {
					m = keys(t, m, "enter")
					check(fmt.Sprintf("detail of pane %d row %d", p+1, m.grids[p].cursor))
					m = keys(t, m, "esc", "down")
				}
			}
			// The export keeps the text as loaded (neutralised for spreadsheets).
			out := filepath.Join(t.TempDir(), "h.csv")
			m = keys(t, m, "1", "x")
			m = setPath(m, out)
			m = keys(t, m, "enter")
			check("after export")
			f, err := os.Open(out)
			if err != nil {
				t.Fatalf("export: %v (%s)", err, m.status)
			}
			defer f.Close()
			recs, err := csv.NewReader(f).ReadAll()
			if err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(fmt.Sprint(recs), hostile+"end") {
				t.Error("the export does not keep the names as loaded")
			}
		})
	}
}

// A couple with a very long name and note: every screen still fits, the
// detail panel shows the start of the text.
func TestVeryLongText(t *testing.T) {
	lib := testLibrary()
	long := strings.Repeat("long name ", 50_000)
	lib.Couples[0].Name, lib.Couples[0].Note, lib.Couples[0].Source = long, long, long
	lib.Titles = []string{long}
	m := open(t, lib, 80, 24, t.TempDir())
	for _, k := range []string{"1", "2", "3", "4", "5", "1"} {
		m = keys(t, m, k)
		checkFrame(t, m, 80, 24)
	}
	for p := range 3 {
		m = keys(t, m, fmt.Sprint(p+1), "home")
		for range m.grids[p].len() {
			m = keys(t, m, "enter", "pgdown")
			checkFrame(t, m, 80, 24)
			m = keys(t, m, "esc", "down")
		}
	}
}

func TestScreenSafe(t *testing.T) {
	for in, want := range map[string]string{
		"plain\nlines":                  "plain\nlines",
		"\x1b[1;38;2;1;2;3mbold\x1b[0m": "\x1b[1;38;2;1;2;3mbold\x1b[0m",
		"a\x1b[2Jb":                     `a\x1b[2Jb`,
		"\x1b]52;c;aGk=\x07":            `\x1b]52;c;aGk=\x07`,
		"r\rt\tu":                       `r\rt\tu`,
		"\u202eabc\u009b":               `\u202eabc\x9b`,
		"\x1b[31":                       `\x1b[31`,
		"x\x1b":                         `x\x1b`,
	} {
		if got := screenSafe(in); got != want {
			t.Errorf("screenSafe(%q) = %q, want %q", in, got, want)
		}
	}
}

// A damaged shortlist (cut short, not JSON, another format, a mark without
// ids, too large) is reported, kept whole beside the path, and the marks
// start empty; the next mark writes a new shortlist. A path that is a
// folder or a named pipe is reported and left alone, and reading it never
// waits.
func TestDamagedShortlist(t *testing.T) {
	lib := testLibrary()
	good := func(t *testing.T) (string, []byte) {
		dir := t.TempDir()
		m := open(t, lib, 80, 24, dir)
		m = keys(t, m, "space", "down", "space")
		b, err := os.ReadFile(m.marksPath)
		if err != nil {
			t.Fatal(err)
		}
		return m.marksPath, b
	}
	_, saved := good(t)
	for _, tc := range []struct {
		name   string
		damage func(path string) error
	}{
		{"truncated", func(p string) error { return os.WriteFile(p, saved[:len(saved)/2], 0o644) }},
		{"garbage", func(p string) error { return os.WriteFile(p, []byte("\x00\xff\xfe not json"), 0o644) }},
		{"other format", func(p string) error {
			return os.WriteFile(p, []byte(strings.Replace(string(saved), "hatsieve-shortlist/1", "other/9", 1)), 0o644)
		}},
		{"empty mark", func(p string) error {
			return os.WriteFile(p, []byte(`{"format":"hatsieve-shortlist/1","marks":[{"donor":"","acceptor":"a"}]}`), 0o644)
		}},
		{"two documents", func(p string) error { return os.WriteFile(p, append(append([]byte{}, saved...), saved...), 0o644) }},
		{"huge", func(p string) error { return os.Truncate(p, maxShortlistBytes+1) }},
		{"empty", func(p string) error { return os.WriteFile(p, nil, 0o644) }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path, _ := good(t)
			if err := tc.damage(path); err != nil {
				t.Fatal(err)
			}
			before, _ := os.ReadFile(path)
			m := open(t, lib, 80, 24, filepath.Dir(path))
			if len(m.marks) != 0 {
				t.Errorf("%d marks from a damaged shortlist", len(m.marks))
			}
			if !strings.Contains(m.status, "shortlist was damaged") || !strings.Contains(m.status, "kept as") {
				t.Errorf("status %q", m.status)
			}
			kept, _ := filepath.Glob(path + ".damaged-*")
			if len(kept) != 1 {
				t.Fatalf("kept copies: %v", kept)
			}
			if after, _ := os.ReadFile(kept[0]); string(after) != string(before) {
				t.Error("the kept copy differs from the damaged file")
			}
			m = keys(t, m, "space")
			if got, err := ReadShortlist(path); err != nil || len(got) != 1 {
				t.Errorf("after a mark: %v, %v", got, err)
			}
			if _, err := os.Stat(kept[0]); err != nil {
				t.Error("the kept copy went away")
			}
		})
	}
	for _, tc := range []struct {
		name string
		make func(path string) error
	}{
		{"folder", func(p string) error { return os.Mkdir(p, 0o755) }},
		{"named pipe", func(p string) error { return mkfifo(p) }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			path, _ := good(t)
			os.Remove(path)
			if err := tc.make(path); err != nil {
				t.Fatal(err)
			}
			done := make(chan Model, 1)
			go func() { done <- open(t, lib, 80, 24, filepath.Dir(path)) }()
			var m Model
			select {
			case m = <-done:
			case <-time.After(10 * time.Second):
				if w, err := os.OpenFile(path, os.O_WRONLY, 0); err == nil {
					w.Close()
				}
				t.Fatal("opening the screens waits on the shortlist path")
			}
			if !strings.Contains(m.status, "not a regular file") {
				t.Errorf("status %q", m.status)
			}
			if st, err := os.Lstat(path); err != nil || st.Mode().IsRegular() {
				t.Errorf("the %s at the shortlist path was replaced", tc.name)
			}
		})
	}
}

// The screens work on the library as loaded: the file changed, then gone,
// changes nothing on screen, re-evaluating and exporting still work, and
// the marks go to the same shortlist as before.
func TestLibraryFileChangesUnderTheScreens(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "lib.yaml")
	doc := "format: hatsieve/1\ntitle: invented changing set\ncouples:\n" +
		"  - {id: quilo, roles: donor, bdfe: 62, status: invented}\n" +
		"  - {id: vexol, roles: donor, pka: 24, e_anion: -1.1 V vs Fc+/Fc, status: invented}\n" +
		"  - {id: tarn, roles: acceptor, bdfe: 70, status: invented}\n"
	if err := os.WriteFile(f, []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	lib, err := data.LoadFiles(f)
	if err != nil {
		t.Fatal(err)
	}
	state := t.TempDir()
	key := LibraryKey(lib)
	m := open(t, lib, 100, 30, state)
	first := screen(m)
	m = keys(t, m, "space")
	os.WriteFile(f, []byte("format: hatsieve/1\ncouples: [garbage\n"), 0o644)
	m = keys(t, m, "b", "b") // re-evaluates twice
	rows := func(s string) string {
		return strings.ReplaceAll(strings.Join(strings.Split(s, "\n")[3:6], "\n"), "*", " ")
	}
	if rows(screen(m)) != rows(first) || !strings.Contains(screen(m), "2 pairs · 1 marked · invented changing set") {
		t.Errorf("the screen changed with the file:\n%s\nwas\n%s", screen(m), first)
	}
	os.Remove(f)
	m = keys(t, m, "v", "down", "enter") // another working solvent
	if m.errMsg != "" || m.t == nil {
		t.Fatalf("after the file went: %q", m.errMsg)
	}
	m = keys(t, m, "v", "up", "enter", "down", "space")
	if LibraryKey(lib) != key {
		t.Error("the shortlist key changed with the file")
	}
	if filepath.Base(m.marksPath) != "shortlist-"+key+".json" {
		t.Errorf("marks saved to %s", m.marksPath)
	}
	got, err := ReadShortlist(m.marksPath)
	if err != nil || len(got) != 2 {
		t.Errorf("shortlist %v, %v; want the two marks", got, err)
	}
	out := filepath.Join(dir, "out.csv")
	m = keys(t, m, "x")
	m = setPath(m, out)
	m = keys(t, m, "enter")
	if !strings.Contains(m.status, "wrote 2 pairs") {
		t.Errorf("export after the file went: %q", m.status)
	}
}

// Many shortlist saves at once, as the runtime runs commands, keep the
// newest on disk (run under -race, this also checks the store's locking).
func TestConcurrentSaves(t *testing.T) {
	dir := t.TempDir()
	m := open(t, testLibrary(), 80, 24, dir)
	lib := testLibrary()
	var wg sync.WaitGroup
	const n = 32
	for i := 1; i <= n; i++ {
		marks := make([]markKey, i)
		for k := range marks {
			marks[k] = markKey{fmt.Sprintf("d%02d", k), "a"}
		}
		cmd := saveCmd(m.state, m.marksPath, uint64(i), lib, marks)
		wg.Add(1)
		go func() {
			defer wg.Done()
			if msg := cmd().(savedMsg); msg.err != nil {
				t.Error(msg.err)
			}
		}()
	}
	wg.Wait()
	got, err := ReadShortlist(m.marksPath)
	if err != nil || len(got) != n {
		t.Errorf("after concurrent saves: %d marks (%v), want %d", len(got), err, n)
	}
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".tmp") {
			t.Errorf("temporary file left: %s", e.Name())
		}
	}
}

// Whatever bytes the shortlist file holds: no panic; either marks and no
// error, the file left as it was, or a damaged report with the file kept
// whole under the name reported and the marks empty.
func FuzzReadShortlist(f *testing.F) {
	f.Add([]byte(`{"format":"hatsieve-shortlist/1","files":[],"titles":["t"],"marks":[{"donor":"d","acceptor":"a"}]}`))
	f.Add([]byte(`{"format":"hatsieve-shortlist/1","marks":[{"donor":"d","acceptor":"a"}`))
	f.Add([]byte(`{"format":"hatsieve-shortlist/1","marks":null}`))
	f.Add([]byte("\xef\xbb\xbf{}"))
	f.Add([]byte(`[]`))
	f.Fuzz(func(t *testing.T, b []byte) {
		dir := t.TempDir()
		path := filepath.Join(dir, "shortlist-x.json")
		if err := os.WriteFile(path, b, 0o644); err != nil {
			t.Fatal(err)
		}
		marks, err := ReadShortlist(path)
		if err == nil {
			if now, _ := os.ReadFile(path); string(now) != string(b) {
				t.Fatal("a good shortlist was changed by reading it")
			}
			for _, k := range marks {
				if k.D == "" || k.A == "" {
					t.Fatalf("mark %v without ids", k)
				}
			}
			return
		}
		var d *damagedError
		if !errors.As(err, &d) {
			t.Fatalf("error %v is not a damaged report", err)
		}
		if len(marks) != 0 {
			t.Fatalf("%d marks from a damaged file", len(marks))
		}
		kept, rerr := os.ReadFile(d.kept)
		if rerr != nil || string(kept) != string(b) {
			t.Fatalf("kept copy %q (%v), want the damaged bytes", kept, rerr)
		}
		if _, serr := os.Stat(path); serr == nil {
			t.Fatal("the damaged file is still at the shortlist path")
		}
		if strings.ContainsAny(err.Error(), "\n") {
			t.Fatalf("report of more than one line: %q", err)
		}
	})
}

// An export the folder refuses is reported in the status line and nothing
// is made; the screens go on.
func TestExportRefusedByFolder(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "a-file")
	os.WriteFile(file, []byte("x"), 0o644)
	targets := []string{filepath.Join(file, "out.csv"), filepath.Join(dir, "missing", "out.csv")}
	if _, err := os.Stat("/proc/self"); err == nil {
		targets = append(targets, "/proc/hatsieve-tui-test.csv")
	}
	m := open(t, testLibrary(), 80, 24, t.TempDir())
	for _, target := range targets {
		m = keys(t, m, "x")
		m = setPath(m, target)
		m = keys(t, m, "enter")
		if !strings.HasPrefix(m.status, "export failed: ") || focus(m) != "" {
			t.Errorf("%s: status %q, focus %q", target, m.status, focus(m))
		}
		if _, err := os.Lstat(target); err == nil {
			t.Errorf("%s was made", target)
		}
		checkFrame(t, m, 80, 24)
	}
	if b, _ := os.ReadFile(file); string(b) != "x" {
		t.Error("the file in the path changed")
	}
}
