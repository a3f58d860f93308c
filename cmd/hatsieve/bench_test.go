package main

import (
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// BenchmarkRankTop100 is the command run.sh times against the numpy peer:
// the best 100 pairs by ΔG° of 10^4 donors × 10^4 acceptors (hatsieve-gen
// -donors 10000 -acceptors 10000 -seed 1), read from CSV, ranked and
// written as CSV, in one process (so the collector's start from an empty
// heap is not in it: testdata/bench/run.sh times whole processes).
//
//	go test ./cmd/hatsieve -run XXX -bench RankTop100 -benchtime 20x
func BenchmarkRankTop100(b *testing.B) {
	path := filepath.Join(b.TempDir(), "rank.csv")
	gen := exec.Command("go", "run", "../hatsieve-gen", "-donors", "10000", "-acceptors", "10000", "-seed", "1", "-o", path)
	if out, err := gen.CombinedOutput(); err != nil {
		b.Fatalf("hatsieve-gen: %v\n%s", err, out)
	}
	if _, err := os.Stat(path); err != nil {
		b.Fatal(err)
	}
	e := env{stdin: strings.NewReader(""), stdout: io.Discard, stderr: io.Discard}
	for b.Loop() {
		if status := run([]string{"rank", "-l", path, "--top", "100", "--format", "csv"}, e); status != exitOK {
			b.Fatalf("status %d", status)
		}
	}
}
