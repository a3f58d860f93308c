package data

import (
	"bytes"
	"fmt"
	"runtime"
	"testing"
)

// A large CSV is split into cells without copying the file's bytes; what the
// couples keep must be copies all the same, so a caller may reuse the buffer
// it passed to Load.
func TestCSVCouplesKeepNoViewOfTheInput(t *testing.T) {
	for _, procs := range []int{1, 2} {
		t.Run(fmt.Sprintf("GOMAXPROCS=%d", procs), func(t *testing.T) {
			defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
			src := synthetic(4000, true) // some 300 kB: read in runs when procs > 1
			buf := bytes.Clone(src)
			lib, err := Load(File{Name: "big.csv", Data: buf})
			if err != nil {
				t.Fatal(err)
			}
			type kept struct{ id, name, bond, source, status, solvent string }
			before := make([]kept, len(lib.Couples))
			for i, c := range lib.Couples {
				before[i] = kept{c.ID, c.Name, c.Bond, c.Source, c.Status, c.Solvent.Key}
			}
			for i := range buf {
				buf[i] = 'x'
			}
			for i, c := range lib.Couples {
				now := kept{c.ID, c.Name, c.Bond, c.Source, c.Status, c.Solvent.Key}
				if now != before[i] {
					t.Fatalf("couple %d changed with the input buffer: %+v, was %+v", i, now, before[i])
				}
			}
			if len(lib.Couples) != 4000 || lib.Couples[3999].ID != "c3999" || lib.Couples[0].Source != "synthetic" {
				t.Fatalf("loaded %d couples, last %q", len(lib.Couples), lib.Couples[len(lib.Couples)-1].ID)
			}
		})
	}
}
