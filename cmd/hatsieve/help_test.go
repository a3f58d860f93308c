package main

import (
	"strings"
	"testing"
)

// The top usage names every command and the common options; each command's
// --help lists its own options apart from the common ones, a one-letter
// alias beside its long name, and every option the command takes.
func TestTopUsageAndCommandHelp(t *testing.T) {
	for name := range commands {
		if !strings.Contains(topUsage, "\n  hatsieve "+name) {
			t.Errorf("top usage lacks %s", name)
		}
	}
	for f := range commonFlags {
		if !strings.Contains(topUsage, "--"+f+" ") {
			t.Errorf("top usage lacks --%s", f)
		}
	}
	for _, name := range []string{"rank", "pair", "window", "library"} {
		_, out, _ := runCmd(t, name, "--help")
		if !strings.Contains(out, "\n  -l, --library FILE\n") || strings.Contains(out, "--l ") {
			t.Errorf("%s --help: -l not shown with --library:\n%s", name, out)
		}
		own, common, ok := strings.Cut(out, "\ncommon options:\n")
		if !ok || !strings.Contains(common, "--cg-basis 2010|2022") || strings.Contains(own, "--cg-basis") {
			t.Errorf("%s --help: common options not apart:\n%s", name, out)
		}
		if !strings.Contains(out, "\n"+moreHelp[name]+"\n") {
			t.Errorf("%s --help does not say what the command does", name)
		}
	}
	_, out, _ := runCmd(t, "rank", "--help")
	for _, f := range []string{"--cross", "--dg-min DG", "--top N", "--sort METRIC", "--out FILE", "--reverse", "--temperature K"} {
		if !strings.Contains(out, "\n  "+f+"\n") {
			t.Errorf("rank --help lacks %q", f)
		}
	}
}
