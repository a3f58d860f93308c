package main

import (
	"bufio"
	"encoding/csv"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"syscall"
	"testing"
	"time"
	"unicode/utf8"
)

const childEnv = "HATSIEVE_CMD_WRITE_CHILD"

// TestMain turns the test binary into 'hatsieve' when asked: the arguments
// come from the environment, and rank --out stops half-way through its
// file and waits to be stopped (see TestRankOutInterrupted).
func TestMain(m *testing.M) {
	if args := os.Getenv(childEnv); args != "" {
		testWriteHook = func(w io.Writer) io.Writer { return &stall{w: w, n: 64 << 10} }
		os.Exit(run(strings.Split(args, "\x1f"), env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr}))
	}
	os.Exit(m.Run())
}

// stall passes n bytes, pushes them to the file, says WRITING on stdout,
// then blocks for ever.
type stall struct {
	w io.Writer
	n int
}

func (s *stall) Write(p []byte) (int, error) {
	if s.n > 0 {
		s.n -= len(p)
		return s.w.Write(p)
	}
	if f, ok := s.w.(interface{ Flush() error }); ok {
		f.Flush()
	}
	fmt.Println("WRITING")
	select {}
}

// hostile: clear screen, OSC 52 clipboard write, bell, CR, right-to-left
// override, one-byte CSI, DEL, line separator.
const hostile = "\x1b[2J\x1b]52;c;aGk=\x07\r\u202e\u009b31m\x7f\u2028"

// rawControl returns the first character of s a terminal would act on,
// other than a line break.
func rawControl(s string) (string, bool) {
	for i, r := range s {
		if r == '\n' {
			continue
		}
		if _, n := utf8.DecodeRuneInString(s[i:]); (r == utf8.RuneError && n <= 1) || r < 0x20 || (r >= 0x7f && r < 0xa0) ||
			r == 0x2028 || r == 0x2029 || (r >= 0x202a && r <= 0x202e) || (r >= 0x2066 && r <= 0x2069) || r == 0x200e || r == 0x200f || r == 0x061c {
			return fmt.Sprintf("%q in %q", r, s[max(0, i-30):min(len(s), i+30)]), true
		}
	}
	return "", false
}

func hostileFile(t *testing.T, dir string) string {
	t.Helper()
	q := func(s string) string { return fmt.Sprintf("%q", s) }
	h := func(s string) string { return q(s + hostile + "end") }
	doc := "format: hatsieve/1\ntitle: " + h("title") + "\nsolvent: " + h("solv") + "\n" +
		"solvents:\n  - {name: " + h("solv") + ", ref: Fc+/Fc, c_g_2022: 54.9, e_h2: -0.028 V vs Fc+/Fc, source: " + h("src") + "}\n" +
		"couples:\n" +
		"  - {id: " + q("d\u202e1") + ", name: " + h("dname") + ", roles: donor, bdfe: 62, source: " + h("dsrc") + ", note: " + h("n") + "}\n" +
		"  - {id: " + q("=a\u20661") + ", name: " + h("aname") + ", roles: acceptor, pka: 20, e_anion: -1.0, source: " + h("asrc") + "}\n"
	path := filepath.Join(dir, "hostile\x1b]0;x\x07.yaml")
	if err := os.WriteFile(path, []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// Table output and messages show library text harmlessly; JSON and CSV
// keep it as written (CSV neutralising formula starts).
func TestTerminalSafeOutput(t *testing.T) {
	dir := t.TempDir()
	lib := hostileFile(t, dir)
	for _, args := range [][]string{
		{"rank", "-l", lib},
		{"-l", lib},
		{"check", lib},
		{"rank", "-l", lib, "--solvent", "acetonitrile", "--cross"},
	} {
		status, out, errs := runCmd(t, args...)
		if status != exitOK {
			t.Errorf("%q: status %d, stderr %q", args, status, errs)
		}
		if where, bad := rawControl(out + errs); bad {
			t.Errorf("%q: raw control %s", args, where)
		}
	}
	_, out, _ := runCmd(t, "rank", "-l", lib)
	if !strings.Contains(out, `d\u202e1`) || !strings.Contains(out, `title\x1b[2J`) || !strings.Contains(out, `solv\x1b[2J`) {
		t.Errorf("table does not show the escapes:\n%s", out)
	}
	// A bad file: every message printable, one per line.
	bad := filepath.Join(dir, "bad\x1b[2J.yaml")
	os.WriteFile(bad, []byte("format: hatsieve/1\ncouples:\n  - {id: "+fmt.Sprintf("%q", "x\x1b[2J")+", bdfe: "+fmt.Sprintf("%q", hostile)+"}\n"), 0o644)
	for _, args := range [][]string{{"check", bad}, {"rank", "-l", bad}, {"rank", "-l", lib, "--solvent", "nope" + hostile}} {
		status, out, errs := runCmd(t, args...)
		if status != exitData && status != exitUsage {
			t.Errorf("%q: status %d", args, status)
		}
		if where, raw := rawControl(out + errs); raw {
			t.Errorf("%q: raw control %s", args, where)
		}
	}
	// JSON keeps the ids as written.
	_, out, _ = runCmd(t, "rank", "-l", lib, "--format", "json")
	var rows []map[string]any
	if err := json.Unmarshal([]byte(out), &rows); err != nil || len(rows) != 1 {
		t.Fatalf("json: %v %s", err, out)
	}
	if rows[0]["donor"] != "d\u202e1" || rows[0]["acceptor"] != "=a\u20661" || rows[0]["donor_solvent"] != strings.ToLower("solv"+hostile+"end") {
		t.Errorf("json changed the text: %v", rows[0])
	}
	// CSV keeps it, neutralised against formulas.
	_, out, _ = runCmd(t, "rank", "-l", lib, "--format", "csv")
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(recs) != 2 {
		t.Fatalf("csv: %v %q", err, out)
	}
	cell := map[string]string{}
	for i, h := range recs[0] {
		cell[h] = recs[1][i]
	}
	if cell["donor"] != "d\u202e1" || cell["acceptor"] != "'=a\u20661" || cell["donor_name"] != "dname"+hostile+"end" {
		t.Errorf("csv cells %q %q %q", cell["donor"], cell["acceptor"], cell["donor_name"])
	}
}

// What is not a library file is refused with one line and status 1, and a
// named pipe never makes the command wait.
func TestNotALibraryFile(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.csv")
	if err := mkfifo(fifo); err != nil {
		t.Fatal(err)
	}
	huge := filepath.Join(dir, "huge.yaml")
	f, _ := os.Create(huge)
	f.Truncate(1 << 30) // sparse: no disk used
	f.Close()
	for _, tc := range []struct{ file, want string }{
		{fifo, "named pipe"}, {dir, "folder"}, {huge, "at most 64.0 MB"}, {"/dev/zero", "device"},
	} {
		for _, args := range [][]string{{"check", tc.file}, {"rank", "-l", tc.file}} {
			done := make(chan string, 1)
			go func() {
				status, _, errs := runCmd(t, args...)
				if status != exitData {
					t.Errorf("%q: status %d", args, status)
				}
				done <- errs
			}()
			select {
			case errs := <-done:
				oneErrorLine(t, args, errs)
				if !strings.Contains(errs, tc.want) {
					t.Errorf("%q: %q does not say %q", args, errs, tc.want)
				}
			case <-time.After(10 * time.Second):
				if w, err := os.OpenFile(fifo, os.O_WRONLY, 0); err == nil {
					w.Close()
				}
				t.Fatalf("%q waits", args)
			}
		}
	}
}

// rank --out into a place that cannot take the file: one line, status 1,
// nothing made.
func TestRankOutCannotWrite(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "a-file")
	os.WriteFile(file, []byte("x"), 0o644)
	for _, out := range []string{"/proc/hatsieve-rank-test.csv", filepath.Join(file, "x.csv")} {
		if strings.HasPrefix(out, "/proc") {
			if _, err := os.Stat("/proc/self"); err != nil {
				continue
			}
		}
		args := []string{"rank", "--format", "csv", "--out", out}
		status, stdout, errs := runCmd(t, args...)
		if status != exitData || stdout != "" {
			t.Errorf("%q: status %d stdout %q", args, status, stdout)
		}
		oneErrorLine(t, args, errs)
		if _, err := os.Lstat(out); err == nil {
			t.Errorf("%s was made", out)
		}
	}
	if b, _ := os.ReadFile(file); string(b) != "x" {
		t.Error("the file in the path changed")
	}
}

// rank --out stopped half-way: SIGINT and SIGTERM say so on stderr and exit
// 130 and 143; SIGKILL just ends it. Either way the old file is whole and
// no temporary file is left. The child is this test binary as hatsieve.
func TestRankOutInterrupted(t *testing.T) {
	for _, tc := range []struct {
		sig  syscall.Signal
		exit int
	}{{syscall.SIGINT, 130}, {syscall.SIGTERM, 143}, {syscall.SIGKILL, -1}} {
		t.Run(tc.sig.String(), func(t *testing.T) {
			dir := t.TempDir()
			out := filepath.Join(dir, "pairs.csv")
			const old = "donor,acceptor\r\nold,file\r\n"
			os.WriteFile(out, []byte(old), 0o644)
			cmd := exec.Command(os.Args[0], "-test.run=^$")
			cmd.Env = append(os.Environ(), childEnv+"="+strings.Join([]string{"rank", "--format", "csv", "--top", "0", "--cross", "--out", out, "--force"}, "\x1f"))
			stdout, _ := cmd.StdoutPipe()
			var stderr strings.Builder
			cmd.Stderr = &stderr
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			defer cmd.Process.Kill()
			line := make(chan string, 1)
			go func() {
				s, _ := bufio.NewReader(stdout).ReadString('\n')
				line <- s
			}()
			select {
			case s := <-line:
				if s != "WRITING\n" {
					t.Fatalf("child said %q (stderr %q)", s, stderr.String())
				}
			case <-time.After(60 * time.Second):
				t.Fatal("the child never reached the middle of its write")
			}
			if b, _ := os.ReadFile(out); string(b) != old {
				t.Fatalf("mid-write the file reads %q", b)
			}
			cmd.Process.Signal(tc.sig)
			err := cmd.Wait()
			var ee *exec.ExitError
			if !errors.As(err, &ee) || ee.ExitCode() != tc.exit {
				t.Errorf("child ended with %v, want exit %d", err, tc.exit)
			}
			if tc.sig != syscall.SIGKILL {
				want := "hatsieve: interrupted; " + out + " left as it was\n"
				if stderr.String() != want {
					t.Errorf("stderr %q, want %q", stderr.String(), want)
				}
			}
			if b, _ := os.ReadFile(out); string(b) != old {
				t.Errorf("the old file now reads %q", b)
			}
			es, _ := os.ReadDir(dir)
			var names []string
			for _, e := range es {
				names = append(names, e.Name())
			}
			if !slices.Equal(names, []string{"pairs.csv"}) {
				t.Errorf("folder holds %v", names)
			}
		})
	}
}
