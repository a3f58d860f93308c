package data

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math/rand/v2"
	"reflect"
	"runtime/debug"
	"runtime/metrics"
	"slices"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/hatsieve/hatsieve/thermo"
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

// Target (README.md, Performance): 10^5 couples from CSV in ≤ 0.3 s.
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

// Target (README.md, Performance): 10^5 couples from YAML in ≤ 2 s.
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

// Loading benchmarks at 10^3–10^5 couples, CSV and YAML, on synthetic
// libraries shaped like those of cmd/hatsieve-gen: BDFEs over 40–110
// kcal/mol, about half given directly (some with σ), the rest as pKa and
// E°(X•/X⁻) vs Fc+/Fc in acetonitrile, roles mixed. Besides time and
// allocations they report peak-MB, the most memory the Go runtime held from
// the system during one load, less what it had released, above where it
// stood before (sampled every 0.5 ms): close to the RSS a load adds.
//
//	go test ./data -run XXX -bench 'Load/|Evaluate' -benchtime 3x

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

// peakMemory samples what the runtime holds from the operating system
// (less what it has released) while f runs, and returns the largest sample
// above the starting point, in MB. The caller first returns memory to the
// system (debug.FreeOSMemory) outside the timed part.
func peakMemory(f func()) float64 {
	sample := []metrics.Sample{{Name: "/memory/classes/total:bytes"}, {Name: "/memory/classes/heap/released:bytes"}}
	read := func() uint64 {
		metrics.Read(sample)
		return sample[0].Value.Uint64() - sample[1].Value.Uint64()
	}
	base := read()
	peak := base
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
	return float64(max(peak, read())-base) / (1 << 20)
}

// BenchmarkLoad loads 10^3, 10^4 and 10^5 couples from CSV and from YAML.
func BenchmarkLoad(b *testing.B) {
	for _, format := range []string{"csv", "yaml"} {
		for _, n := range []int{1000, 10000, 100000} {
			b.Run(fmt.Sprintf("%s/%d", format, n), func(b *testing.B) {
				src := synthLibrary(n, format == "csv")
				file := File{Name: "synthetic." + format, Data: src}
				b.ReportAllocs()
				b.SetBytes(int64(len(src)))
				var peak float64
				for b.Loop() {
					b.StopTimer()
					debug.FreeOSMemory()
					b.StartTimer()
					peak = max(peak, peakMemory(func() {
						lib, err := Load(file)
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
		lib, err := Load(File{Name: "synthetic.csv", Data: synthLibrary(n, true)})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				ev, err := Evaluate(lib, Options{Cond: thermo.Conditions{}})
				if err != nil || len(ev.All) != n {
					b.Fatalf("%v: %d couples", err, len(ev.All))
				}
			}
		})
	}
}

// A CSV file without quotes is read by lines (csvRows): the library, and
// any problems, must be exactly those of reading it with encoding/csv.
func TestCSVByLinesSameAsEncodingCSV(t *testing.T) {
	good := synthLibrary(20000, true)
	lines := strings.SplitAfter(string(good), "\n")
	bad := slices.Clone(lines)
	bad[7000] = strings.Replace(bad[7000], "acetonitrile,", "acetonitrile,not-a-number,", 1)
	bad[7000] = strings.Replace(bad[7000], ",invented,invented", ",invented", 1) // keep the cell count
	bad[15000] = strings.Replace(bad[15000], "c014999", "c000123", 1)            // a duplicate id across runs
	dup := slices.Clone(lines)
	dup[19000] = strings.Replace(dup[19000], "c018999", "c000005", 1)
	empty := slices.Clone(lines)
	empty[5000] = "\n" + empty[5000] + "\r\n" // empty lines, one with a CR
	spaces := slices.Clone(lines)
	spaces[12000] = "  \n" + spaces[12000] // a line of spaces: one cell
	variants := map[string]string{
		"good":   string(good),
		"bad":    strings.Join(bad, ""),
		"dup":    strings.Join(dup, ""),
		"crlf":   strings.ReplaceAll(string(good), "\n", "\r\n"),
		"tab":    strings.ReplaceAll(string(good), ",", "\t"),
		"empty":  strings.Join(empty, ""),
		"spaces": strings.Join(spaces, ""),
		"noeol":  strings.TrimSuffix(string(good), "\n"),
		"creof":  strings.TrimSuffix(string(good), "\n") + "\r",
	}
	for name, src := range variants {
		load := func(byLines bool) (*Library, string) {
			defer func(old bool) { csvByLines = old }(csvByLines)
			csvByLines = byLines
			lib, err := Load(File{Name: "big.csv", Data: []byte(src)})
			msg := ""
			if err != nil {
				msg = err.Error()
			}
			return lib, msg
		}
		seqLib, seqErr := load(false)
		parLib, parErr := load(true)
		if seqErr != parErr {
			t.Errorf("%s: problems differ:\nencoding/csv: %s\nby lines: %s", name, seqErr, parErr)
		}
		if !sameLibraries(seqLib, parLib) {
			t.Errorf("%s: libraries differ", name)
		}
		wantErr := name == "bad" || name == "dup" || name == "spaces"
		if !wantErr && (parLib == nil || len(parLib.Couples) != 20000) {
			t.Errorf("%s: %v", name, parErr)
		}
		if name == "good" && parLib.Couples[19999].Pos.Line != 20001 {
			t.Errorf("good: last couple at line %d", parLib.Couples[19999].Pos.Line)
		}
		if wantErr && parErr == "" {
			t.Errorf("%s: no problem reported", name)
		}
	}
}

// splitList's shortcut for a single item gives what the full split gives.
func TestSplitListShortcut(t *testing.T) {
	full := func(s string) []string {
		var out []string
		for _, p := range strings.FieldsFunc(s, func(r rune) bool { return r == ';' || r == ',' }) {
			if p = strings.TrimSpace(p); p != "" {
				out = append(out, p)
			}
		}
		return out
	}
	for _, s := range []string{"", " ", "donor", "  donor ", "a;b", "a, b", ";", " ; ,", "x;", "\tsynthetic\n", "ö"} {
		if got, want := splitList(s), full(s); !reflect.DeepEqual(got, want) {
			t.Errorf("splitList(%q) = %q, want %q", s, got, want)
		}
	}
}

// lineRows returns the rows of quote-free CSV text one by one, as csvRows
// reads them, with their lines counted from lineBase+1 (tests compare them
// with encoding/csv's).
func lineRows(data []byte, comma byte, lineBase int) func() ([]string, int, error) {
	text, line := string(data), lineBase
	return func() ([]string, int, error) {
		var l string
		if l, text, line = nextRow(text, line); l == "" {
			return nil, line, io.EOF
		}
		var ends [rowCells]int
		n := splitCells(&ends, l, comma)
		if n > len(ends) {
			return strings.Split(l, string(comma)), line, nil
		}
		rec := make([]string, n)
		start := 0
		for k := range rec {
			rec[k], start = l[start:ends[k]], ends[k]+1
		}
		return rec, line, nil
	}
}

// lineRows reads quote-free CSV text exactly as encoding/csv does: the same
// rows, cells and line numbers.
func TestLineRowsAsEncodingCSV(t *testing.T) {
	texts := []string{
		"a,b,c\n1,2,3\n",
		"a,b,c\r\n1,2,3\r\n\r\n4,5,6",
		"\n\na,b\n\n\nc,d\n",
		"a,b\r",
		"a,b\n  \n,\n,,\n x , y \n",
		"a\rb,c\r\r\nd,e\n",
		"a;b\n1;2\n",
		"a\tb\n1\t2\n\t\n",
		"ö,ü\n€,x\n",
		"",
		"\r\n",
		"a,b\n" + strings.Repeat("x,", 3*rowCells) + "y\nc,d\n", // more cells than csvRows keeps
	}
	for _, text := range texts {
		comma := sniffComma([]byte(text))
		r := csv.NewReader(strings.NewReader(text))
		r.Comma, r.FieldsPerRecord = comma, -1
		want, got := readerRows(r), lineRows([]byte(text), byte(comma), 0)
		for row := 0; ; row++ {
			wrec, wline, werr := want()
			grec, gline, gerr := got()
			if werr != gerr || !slices.Equal(wrec, grec) || (werr == nil && wline != gline) {
				t.Errorf("%q row %d: encoding/csv %q line %d (%v), lineRows %q line %d (%v)", text, row, wrec, wline, werr, grec, gline, gerr)
				break
			}
			if werr != nil {
				break
			}
		}
	}
}

// A row with more or fewer cells than the header is refused with its line
// and its count, also when it has more cells than csvRows keeps, whether
// the file is read by lines or by encoding/csv.
func TestCSVRowCellCount(t *testing.T) {
	src := "id,name,bdfe\n" +
		"a1,one,80\n" +
		"a2,two" + strings.Repeat(",1", 3*rowCells) + "\n" +
		"a3,three,81,\n" +
		"a4,four\n" +
		"a5,five,82\n"
	want := []string{
		"rows.csv:3: row: 164 cells, the header has 3",
		"rows.csv:4: row: 4 cells, the header has 3",
		"rows.csv:5: row: 2 cells, the header has 3",
	}
	for _, byLines := range []bool{true, false} {
		func() {
			defer func(old bool) { csvByLines = old }(csvByLines)
			csvByLines = byLines
			_, err := Load(File{Name: "rows.csv", Data: []byte(src)})
			var is Issues
			if !errors.As(err, &is) {
				t.Fatalf("by lines %v: error %v, want Issues", byLines, err)
			}
			var got []string
			for _, x := range is {
				got = append(got, x.String())
			}
			if !slices.Equal(got, want) {
				t.Errorf("by lines %v:\n got %q\nwant %q", byLines, got, want)
			}
		}()
	}
}
