package data_test

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"runtime"
	"runtime/metrics"
	"strconv"
	"sync"
	"testing"
	"time"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// Loading benchmarks at 10^3–10^5 couples, CSV and YAML, on synthetic
// libraries shaped like those of cmd/hatsieve-gen: BDFEs over 40–110
// kcal/mol, about half given directly (some with σ), the rest as pKa and
// E°(X•/X⁻) vs Fc+/Fc in acetonitrile. Besides time and allocations they
// report peak-MB, the most memory the Go runtime held during one load.
//
//	go test ./data -run XXX -bench Load -benchtime 3x

// synthLibrary writes n invented couples as CSV or YAML.
func synthLibrary(n int, csv bool) []byte {
	rng := rand.New(rand.NewPCG(uint64(n), 42))
	var b bytes.Buffer
	if csv {
		b.WriteString("id,name,bond,roles,solvent,bdfe,pka,pka_sigma,e_anion,e_anion_sigma,e_anion_vs,source,status,tags\n")
	} else {
		b.WriteString("format: hatsieve/1\ntitle: synthetic\nsolvent: acetonitrile\ncouples:\n")
	}
	roles := []string{"donor", "acceptor", "donor;acceptor"}
	for i := range n {
		id := fmt.Sprintf("c%06d", i)
		role := roles[rng.IntN(3)]
		bdfe := min(110, max(40, 80+13*rng.NormFloat64()))
		var direct, pka, e string
		if rng.IntN(2) == 0 {
			direct = strconv.FormatFloat(bdfe, 'f', 2, 64)
			if rng.IntN(2) == 0 {
				direct += " ± 1.0"
			}
		} else {
			ev := -1 + rng.Float64()
			pka = strconv.FormatFloat((bdfe-52.6-23.06*ev)/1.3642, 'f', 2, 64)
			e = strconv.FormatFloat(ev, 'f', 3, 64)
		}
		if csv {
			vs := ""
			if e != "" {
				vs = "Fc+/Fc"
			}
			fmt.Fprintf(&b, "%s,synthetic couple %d,O–H,%s,acetonitrile,%s,%s,,%s,,%s,invented,invented,synthetic\n", id, i, role, direct, pka, e, vs)
			continue
		}
		fmt.Fprintf(&b, "  - id: %s\n    name: synthetic couple %d\n    bond: O–H\n    roles: %s\n", id, i, role)
		if direct != "" {
			fmt.Fprintf(&b, "    bdfe: %s\n", direct)
		} else {
			fmt.Fprintf(&b, "    pka: %s\n    e_anion: %s V vs Fc+/Fc\n", pka, e)
		}
		b.WriteString("    source: invented\n    status: invented\n    tags: [synthetic]\n")
	}
	return b.Bytes()
}

// peakMemory samples the memory the runtime holds from the operating
// system while f runs, and returns the largest sample in MB.
func peakMemory(f func()) float64 {
	sample := []metrics.Sample{{Name: "/memory/classes/total:bytes"}}
	read := func() uint64 {
		metrics.Read(sample)
		return sample[0].Value.Uint64()
	}
	var peak uint64
	stop := make(chan struct{})
	var wg sync.WaitGroup
	wg.Add(1)
	go func() {
		defer wg.Done()
		t := time.NewTicker(500 * time.Microsecond)
		defer t.Stop()
		for {
			peak = max(peak, read())
			select {
			case <-stop:
				return
			case <-t.C:
			}
		}
	}()
	f()
	close(stop)
	wg.Wait()
	return float64(max(peak, read())) / (1 << 20)
}

func BenchmarkLoad(b *testing.B) {
	for _, format := range []string{"csv", "yaml"} {
		for _, n := range []int{1000, 10000, 100000} {
			src := synthLibrary(n, format == "csv")
			file := data.File{Name: "synthetic." + format, Data: src}
			b.Run(fmt.Sprintf("%s/%d", format, n), func(b *testing.B) {
				b.ReportAllocs()
				b.SetBytes(int64(len(src)))
				var peak float64
				for b.Loop() {
					runtime.GC()
					peak = max(peak, peakMemory(func() {
						lib, err := data.Load(file)
						if err != nil {
							b.Fatal(err)
						}
						if len(lib.Couples) != n {
							b.Fatalf("%d couples, want %d", len(lib.Couples), n)
						}
					}))
				}
				b.ReportMetric(peak, "peak-MB")
			})
		}
	}
}

// BenchmarkEvaluate resolves every couple of a loaded library (routes,
// closure check, H2 margin): the step between loading and ranking.
func BenchmarkEvaluate(b *testing.B) {
	for _, n := range []int{1000, 10000, 100000} {
		lib, err := data.Load(data.File{Name: "synthetic.csv", Data: synthLibrary(n, true)})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				ev, err := data.Evaluate(lib, data.Options{Cond: thermo.Conditions{}})
				if err != nil || len(ev.All) != n {
					b.Fatalf("%v: %d couples", err, len(ev.All))
				}
			}
		})
	}
}
