package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The README's library example is what a new user copies first: it must
// pass check and rank as shown.
func TestReadmeLibraryExample(t *testing.T) {
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
	body = body[:strings.Index(body, "```")]
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
