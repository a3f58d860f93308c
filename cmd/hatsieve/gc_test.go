package main

import (
	"math"
	"runtime/debug"
	"testing"
)

// tuneGC turns the collector off for small inputs (with a soft memory limit
// as a guard), keeps it on for large ones, and leaves settings made in the
// environment alone.
func TestTuneGC(t *testing.T) {
	restore := func() {
		debug.SetGCPercent(100)
		debug.SetMemoryLimit(math.MaxInt64)
	}
	t.Cleanup(restore)
	cases := []struct {
		name         string
		gogc, memlim string
		bytes        int64
		wantPercent  int
		wantLimitSet bool
	}{
		{"small input", "", "", 1 << 20, -1, true},
		{"embedded library", "", "", 0, -1, true},
		{"large input", "", "", 64 << 20, 400, false},
		{"GOGC from the environment", "50", "", 1 << 20, 100, false},
		{"GOMEMLIMIT from the environment", "", "1GiB", 1 << 20, 100, false},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			restore()
			t.Setenv("GOGC", c.gogc)
			t.Setenv("GOMEMLIMIT", c.memlim)
			tuneGC(c.bytes)
			if got := debug.SetGCPercent(100); got != c.wantPercent {
				t.Errorf("GC percent %d, want %d", got, c.wantPercent)
			}
			limit := debug.SetMemoryLimit(-1)
			if set := limit != math.MaxInt64; set != c.wantLimitSet {
				t.Errorf("memory limit %d: set %v, want %v", limit, set, c.wantLimitSet)
			}
		})
	}
}
