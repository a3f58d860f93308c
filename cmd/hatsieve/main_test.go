package main

import (
	"bytes"
	"runtime/debug"
	"strings"
	"testing"
)

// runCmd runs one hatsieve command line in-process, with empty stdin and
// in-memory stdout/stderr (not a terminal), and returns the exit status and
// both streams. A panic inside the command is caught and reported as a test
// error with exit status -1, so one bad case does not hide the others.
func runCmd(t testing.TB, args ...string) (status int, stdout, stderr string) {
	t.Helper()
	var out, errb bytes.Buffer
	e := env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb}
	func() {
		defer func() {
			if r := recover(); r != nil {
				t.Errorf("hatsieve %s: panic: %v\n%s", strings.Join(args, " "), r, debug.Stack())
				status = -1
			}
		}()
		status = run(args, e)
	}()
	return status, out.String(), errb.String()
}

// oneErrorLine checks that stderr holds exactly one non-empty line, as every
// error must (README.md: exit status), and that it names the program, with no stack trace.
func oneErrorLine(t testing.TB, args []string, stderr string) {
	t.Helper()
	lines := strings.Split(strings.TrimSuffix(stderr, "\n"), "\n")
	if stderr == "" || !strings.HasSuffix(stderr, "\n") || len(lines) != 1 || strings.TrimSpace(lines[0]) == "" {
		t.Errorf("hatsieve %s: want exactly one stderr line, got %q", strings.Join(args, " "), stderr)
		return
	}
	if !strings.HasPrefix(lines[0], "hatsieve: ") {
		t.Errorf("hatsieve %s: error line %q does not start with \"hatsieve: \"", strings.Join(args, " "), lines[0])
	}
	for _, bad := range []string{"goroutine ", "panic", ".go:"} {
		if strings.Contains(lines[0], bad) {
			t.Errorf("hatsieve %s: error line looks like a trace (%q): %q", strings.Join(args, " "), bad, lines[0])
		}
	}
}

func TestVersion(t *testing.T) {
	status, out, errs := runCmd(t, "version")
	if status != exitOK || errs != "" {
		t.Fatalf("version: status %d, stderr %q", status, errs)
	}
	if want := "hatsieve " + version + "\n"; out != want {
		t.Errorf("version printed %q, want %q", out, want)
	}

	args := []string{"version", "extra"}
	status, out, errs = runCmd(t, args...)
	if status != exitUsage {
		t.Errorf("version extra: status %d, want %d", status, exitUsage)
	}
	if out != "" {
		t.Errorf("version extra: wrote %q to stdout", out)
	}
	oneErrorLine(t, args, errs)
}

func TestUnknownCommandIsUsage(t *testing.T) {
	for _, args := range [][]string{{"frobnicate"}, {"bdfee", "--solvent", "MeCN"}, {"version", "--nope"}} {
		status, out, errs := runCmd(t, args...)
		if status != exitUsage {
			t.Errorf("%q: status %d, want %d", args, status, exitUsage)
		}
		if out != "" {
			t.Errorf("%q: wrote %q to stdout", args, out)
		}
		oneErrorLine(t, args, errs)
	}
}

func TestHelpGoesToStdout(t *testing.T) {
	for _, args := range [][]string{{"help"}, {"bdfe", "-h"}, {"solvents", "--help"}, {"version", "-h"}} {
		status, out, errs := runCmd(t, args...)
		if status != exitOK || errs != "" {
			t.Errorf("%q: status %d, stderr %q", args, status, errs)
		}
		if !strings.Contains(out, "usage") && !strings.Contains(out, "hatsieve") {
			t.Errorf("%q: no usage text on stdout: %q", args, out)
		}
	}
	// The top usage names every command README.md describes.
	_, out, _ := runCmd(t, "help")
	for _, c := range []string{"bdfe", "rank", "check", "solvents", "version", "--cg-basis", "--units"} {
		if !strings.Contains(out, c) {
			t.Errorf("help does not mention %s", c)
		}
	}
}
