package main

import (
	"strings"
	"testing"
)

// Any command line: no panic, exit status 0, 1 or 2, and when it fails,
// stderr is lines that start with "hatsieve: " and hold no raw control
// character. Lines that would write a file (--out) are skipped, and so are
// library paths (-l, check), so that nothing outside the test is touched.
func FuzzCommandLine(f *testing.F) {
	for _, s := range []string{
		"bdfe --solvent MeCN --pka 20 --e0 -1.0 --vs SCE",
		"bdfe --solvent water --pka x --e0 1e999",
		"rank --top 3 --sort sigma --h2 downhill,uphill --format json --units kj",
		"rank --cg-basis 2010 --cg 54 --solvent acetonitrile --temperature 310 --dg-min -10 --dg-max 5",
		"solvents --format json",
		"rank --format table --reverse --cross",
		"version",
		"--solvent dmso --units kj",
		"rank --sort \x1b[2J",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, line string) {
		args := strings.Fields(line)
		for _, a := range args {
			a = strings.TrimLeft(a, "-")
			if strings.HasPrefix(a, "out") || strings.HasPrefix(a, "l") || a == "check" || strings.HasPrefix(a, "library") {
				t.Skip("touches files")
			}
		}
		if len(args) > 0 && !strings.HasPrefix(args[0], "-") {
			if _, ok := commands[args[0]]; !ok && args[0] != "help" {
				args[0] = "rank"
			}
		}
		status, _, errs := runCmd(t, args...)
		if status != exitOK && status != exitData && status != exitUsage {
			t.Fatalf("%q: exit status %d", args, status)
		}
		if status == exitOK {
			return
		}
		for _, l := range strings.Split(strings.TrimSuffix(errs, "\n"), "\n") {
			if !strings.HasPrefix(l, "hatsieve: ") {
				t.Fatalf("%q: stderr line %q", args, l)
			}
			if where, bad := rawControl(l); bad {
				t.Fatalf("%q: raw control %s", args, where)
			}
		}
	})
}
