package main

import (
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/data"
)

// The README's library example is what a new user copies first: it must
// pass check and rank as shown.
func TestReadmeLibraryExample(t *testing.T) {
	_, body := readme(t)
	path := filepath.Join(t.TempDir(), "example.yaml")
	if err := os.WriteFile(path, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	status, out, errOut := runCmd(t, "check", path)
	if status != exitOK || !strings.Contains(out, "3 couples (1 combined donor)") {
		t.Fatalf("check on the README example: status %d, stdout %q, stderr %q", status, out, errOut)
	}
	status, out, errOut = runCmd(t, "rank", "-l", path, "--format", "csv")
	if status != exitOK || !strings.Contains(out, "my-acid+my-red") || !strings.Contains(out, "my-phenol") {
		t.Fatalf("rank on the README example: status %d, stdout %q, stderr %q", status, out, errOut)
	}
}

// README's first lines give the two commands a new user runs.
func TestReadmeOpensWithTheTwoCommands(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	head := string(b)
	if i := strings.Index(head, "## "); i > 0 {
		head = head[:i]
	}
	for _, cmd := range []string{"go run ./cmd/hatsieve", "go test ./..."} {
		if !strings.Contains(head, cmd) {
			t.Errorf("README's opening lacks %q", cmd)
		}
	}
}

// readme returns README.md and its yaml example.
func readme(t *testing.T) (text, example string) {
	t.Helper()
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	start := strings.Index(s, "```yaml\n")
	if start < 0 {
		t.Fatal("README has no yaml example")
	}
	body := s[start+len("```yaml\n"):]
	return s, body[:strings.Index(body, "```")]
}

// Every 'go run ./cmd/hatsieve ...' line of README's sh blocks runs and exits
// 0, with mylib.yaml the README's own example; the figure commands belong to
// their own section and test (figure_test.go), and a file a command writes
// lands in a temporary folder.
func TestReadmeCommandsRun(t *testing.T) {
	s, example := readme(t)
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "mylib.yaml"), []byte(example), 0o644); err != nil {
		t.Fatal(err)
	}
	t.Chdir(dir)
	n := 0
	for _, block := range strings.Split(s, "```sh\n")[1:] {
		block = block[:strings.Index(block, "```")]
		for _, line := range strings.Split(block, "\n") {
			cmd, ok := strings.CutPrefix(strings.TrimSpace(line), "go run ./cmd/hatsieve")
			if !ok {
				continue
			}
			if i := strings.Index(cmd, "#"); i >= 0 {
				cmd = cmd[:i]
			}
			args := strings.Fields(cmd)
			if len(args) > 0 && args[0] == "figure" {
				continue
			}
			n++
			status, out, errs := runCmd(t, args...)
			if status != exitOK || (out == "" && !slices.Contains(args, "--out")) {
				t.Errorf("README: hatsieve %s: status %d, stderr %q", strings.Join(args, " "), status, errs)
			}
		}
	}
	if n < 15 {
		t.Errorf("only %d README commands found", n)
	}
}

// The window example in README is the program's current output: each part
// of it between "..." lines appears in the output, in order.
func TestReadmeWindowExampleIsCurrent(t *testing.T) {
	s, _ := readme(t)
	const prompt = "$ hatsieve window ru-pyim --top 5\n"
	i := strings.Index(s, prompt)
	if i < 0 {
		t.Fatal("README shows no window example")
	}
	shown := s[i+len(prompt):]
	shown = shown[:strings.Index(shown, "```")]
	_, out, _ := runCmd(t, "window", "ru-pyim", "--top", "5")
	rest := out
	for _, part := range strings.Split(shown, "...\n") {
		j := strings.Index(rest, part)
		if j < 0 || (rest == out && j != 0) {
			t.Fatalf("README's window example is not the output; this part is not where it should be:\n%s\noutput:\n%s", part, out)
		}
		rest = rest[j+len(part):]
	}
}

// The status counts README gives are those of the embedded files.
func TestReadmeStatusCounts(t *testing.T) {
	s, _ := readme(t)
	lib, err := data.Default()
	if err != nil {
		t.Fatal(err)
	}
	couples, acids, reds := map[string]int{}, map[string]int{}, map[string]int{}
	nc, combined := 0, 0
	for _, c := range lib.Couples {
		if c.AcidID != "" {
			combined++
			continue
		}
		nc++
		couples[c.Status]++
	}
	for _, a := range lib.Acids {
		acids[a.Status]++
	}
	for _, r := range lib.Reductants {
		reds[r.Status]++
	}
	want := fmt.Sprintf("of %d couples, %d `checked`, %d `derived`, %d `estimate`, %d `from memory`\nand %d `invented` (the demo); of %d acids %d `checked`, %d `from memory`, %d invented; of %d\nreductants %d `checked`, %d `from memory`, %d invented. The %d combined donors",
		nc, couples["checked"], couples["derived"], couples["estimate"], couples["from memory"], couples["invented"],
		len(lib.Acids), acids["checked"], acids["from memory"], acids["invented"],
		len(lib.Reductants), reds["checked"], reds["from memory"], reds["invented"], combined)
	if !strings.Contains(s, want) {
		t.Errorf("README's status counts are not the library's; want:\n%s", want)
	}
	if len(couples)+len(acids)+len(reds) != 5+3+3 {
		t.Errorf("statuses other than those README counts: %v %v %v", couples, acids, reds)
	}
}
