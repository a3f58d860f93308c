package data

import (
	"fmt"
	"strings"
	"testing"
)

// synthetic builds a library of n couples as CSV or YAML. The values are
// arbitrary numbers for timing, not chemistry.
func synthetic(n int, csv bool) []byte {
	var b strings.Builder
	if csv {
		b.WriteString("id,name,bond,roles,solvent,bdfe,bdfe_sigma,pka,e_anion,e_anion_vs,source,status\n")
		for i := range n {
			if i%2 == 0 {
				fmt.Fprintf(&b, "c%d,couple %d,O–H,both,acetonitrile,%.2f,0.8,,,,synthetic,estimate\n", i, i, 60+float64(i%400)/10)
			} else {
				fmt.Fprintf(&b, "c%d,couple %d,N–H,donor,MeCN,,,%.1f,%.3f,SCE,synthetic,estimate\n", i, i, 10+float64(i%300)/10, -1+float64(i%100)/100)
			}
		}
		return []byte(b.String())
	}
	b.WriteString("format: hatsieve/1\nsolvent: acetonitrile\ncouples:\n")
	for i := range n {
		if i%2 == 0 {
			fmt.Fprintf(&b, "  - id: c%d\n    name: couple %d\n    bdfe: %.2f ± 0.8\n    source: synthetic\n", i, i, 60+float64(i%400)/10)
		} else {
			fmt.Fprintf(&b, "  - id: c%d\n    roles: donor\n    pka: %.1f\n    e_anion: %.3f V vs SCE\n", i, 10+float64(i%300)/10, -1+float64(i%100)/100)
		}
	}
	return []byte(b.String())
}

// Target (DESIGN §8): 10^5 couples from CSV in ≤ 0.3 s.
func BenchmarkLoadCSV100k(b *testing.B) {
	data := synthetic(100_000, true)
	b.SetBytes(int64(len(data)))
	b.ReportAllocs()
	for b.Loop() {
		lib, err := Load(File{"bench.csv", data})
		if err != nil || len(lib.Couples) != 100_000 {
			b.Fatal(err)
		}
	}
}

// Target (DESIGN §8): 10^5 couples from YAML in ≤ 2 s.
func BenchmarkLoadYAML100k(b *testing.B) {
	data := synthetic(100_000, false)
	b.SetBytes(int64(len(data)))
	b.ReportAllocs()
	for b.Loop() {
		lib, err := Load(File{"bench.yaml", data})
		if err != nil || len(lib.Couples) != 100_000 {
			b.Fatal(err)
		}
	}
}

func TestSyntheticLibrariesLoad(t *testing.T) {
	for _, csv := range []bool{true, false} {
		lib, err := Load(File{map[bool]string{true: "s.csv", false: "s.yaml"}[csv], synthetic(1000, csv)})
		if err != nil || len(lib.Couples) != 1000 {
			t.Fatalf("csv %v: %v", csv, err)
		}
	}
}
