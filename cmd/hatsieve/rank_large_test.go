package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// writePairLibrary writes a CSV library of nd donors and na acceptors with
// invented BDFEs (numbers for the test, not chemistry) and returns its path.
func writePairLibrary(t *testing.T, nd, na int) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("id,roles,solvent,bdfe\n")
	for i := range nd {
		fmt.Fprintf(&b, "d%05d,donor,acetonitrile,%.2f\n", i, 60+float64(i%200)/10)
	}
	for i := range na {
		fmt.Fprintf(&b, "a%05d,acceptor,acetonitrile,%.2f\n", i, 70+float64(i%300)/10)
	}
	path := filepath.Join(t.TempDir(), "big.csv")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// heapAllocated runs f and returns the bytes it allocated on the heap.
func heapAllocated(f func()) uint64 {
	var before, after runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&before)
	f()
	runtime.ReadMemStats(&after)
	return after.TotalAlloc - before.TotalAlloc
}

// rank --top 0 on a library with more pairs than it writes at once is
// refused up front with one line that gives the count and points at --top,
// and the refusal costs memory bounded by the cap, not by donors ×
// acceptors (2000 × 2000 pairs would be 4·10^6 rows, some 400 MB as pairs).
func TestRankAllPairsRefusedInBoundedMemory(t *testing.T) {
	defer func(old int) { maxAllPairs = old }(maxAllPairs)
	maxAllPairs = 10_000
	lib := writePairLibrary(t, 2000, 2000)
	for _, extra := range [][]string{nil, {"--dg-max", "100"}, {"--h2", "uphill,downhill,near line"}} {
		for _, format := range []string{"csv", "json", "table"} {
			args := append([]string{"rank", "-l", lib, "--top", "0", "--format", format}, extra...)
			var status int
			var out, errs string
			n := heapAllocated(func() { status, out, errs = runCmd(t, args...) })
			if status != exitData || out != "" {
				t.Fatalf("%q: status %d, %d bytes out", args, status, len(out))
			}
			oneErrorLine(t, args, errs)
			for _, want := range []string{"more than 10000 pairs", "2000 donors × 2000 acceptors", "--top N"} {
				if !strings.Contains(errs, want) {
					t.Errorf("%q: %q does not say %q", args, errs, want)
				}
			}
			if n > 64<<20 {
				t.Errorf("%q: allocated %d MB to refuse", args, n>>20)
			}
		}
	}
}

// Under the cap, --top 0 writes every pair, in each format, in memory that
// does not hold a second copy of the output.
func TestRankAllPairsWritten(t *testing.T) {
	lib := writePairLibrary(t, 60, 50)
	status, out, errs := runCmd(t, "rank", "-l", lib, "--top", "0", "--format", "csv")
	if status != exitOK {
		t.Fatalf("status %d: %s", status, errs)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(recs) != 1+60*50 {
		t.Fatalf("%d records (%v)", len(recs), err)
	}
	if got := rankJSON(t, "-l", lib, "--top", "0"); len(got) != 60*50 {
		t.Errorf("json: %d pairs", len(got))
	}
	_, table, _ := runCmd(t, "rank", "-l", lib, "--top", "0")
	if n := strings.Count(table, "\n"); n != 60*50+4 { // library, conditions, header, rows, notes
		t.Errorf("table: %d lines", n)
	}
}

// One rounding rule: the numbers of a pair read the same in CSV and JSON
// (four decimals, no float noise), and the table shows those values.
// 73.1 − 0.1 is 72.99999999999999 in floats: it must be written 73.
func TestOneRoundingRule(t *testing.T) {
	path := filepath.Join(t.TempDir(), "r.csv")
	os.WriteFile(path, []byte("id,roles,bdfe,bdfe_sigma\nd,donor,73.1,0.1\na,acceptor,0.1,0.2\n"), 0o644)
	_, out, _ := runCmd(t, "rank", "-l", path, "--format", "csv")
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil || len(recs) != 2 {
		t.Fatalf("%v %q", err, out)
	}
	for i, h := range recs[0] {
		v := recs[1][i]
		if strings.Contains(v, "0000000") || strings.Contains(v, "9999999") {
			t.Errorf("csv %s = %s: float noise", h, v)
		}
		if j := strings.IndexByte(v, '.'); j >= 0 && strings.Trim(v, "0123456789.-") == "" && len(v)-j-1 > 4 {
			t.Errorf("csv %s = %s: more than 4 decimals", h, v)
		}
	}
	cell := map[string]string{}
	for i, h := range recs[0] {
		cell[h] = recs[1][i]
	}
	if cell["dg_kcal_mol"] != "73" || cell["sigma_kcal_mol"] != "0.2236" {
		t.Errorf("csv dg %s σ %s, want 73 and 0.2236", cell["dg_kcal_mol"], cell["sigma_kcal_mol"])
	}
	_, js, _ := runCmd(t, "rank", "-l", path, "--format", "json")
	var list []map[string]json.RawMessage
	if err := json.Unmarshal([]byte(js), &list); err != nil || len(list) != 1 {
		t.Fatalf("%v %s", err, js)
	}
	for k, raw := range list[0] {
		if c, ok := cell[k]; ok && raw[0] != '"' && raw[0] != 't' && raw[0] != 'f' && string(raw) != c {
			t.Errorf("%s: json %s, csv %s", k, raw, c)
		}
	}
	_, table, _ := runCmd(t, "rank", "-l", path)
	if !strings.Contains(table, "+73.0  0.2") {
		t.Errorf("table does not show ΔG° +73.0 σ 0.2:\n%s", table)
	}
}

// --out - writes to standard output; --out FOLDER says it is a folder.
func TestRankOutDashAndFolder(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	status, out, errs := runCmd(t, "rank", "--top", "3", "--format", "csv", "--out", "-")
	if status != exitOK || !strings.HasPrefix(out, "donor,acceptor,") {
		t.Fatalf("status %d, %q, %q", status, out, errs)
	}
	if _, err := os.Stat(filepath.Join(dir, "-")); err == nil {
		t.Error("a file named - was made")
	}
	args := []string{"rank", "--out", dir}
	status, _, errs = runCmd(t, args...)
	oneErrorLine(t, args, errs)
	if status != exitData || !strings.Contains(errs, "is a folder; give a file name") || strings.Contains(errs, "library file") {
		t.Errorf("status %d: %q", status, errs)
	}
}

// Every command's --help prints a real usage on stdout (check took no flag,
// and printed an empty one), and no message writes a flag with one dash.
func TestHelpAndTwoDashes(t *testing.T) {
	for name := range commands {
		status, out, _ := runCmd(t, name, "--help")
		if status != exitOK || !strings.HasPrefix(out, "usage:\n  hatsieve "+name) {
			t.Errorf("%s --help: status %d, %q", name, status, out)
		}
	}
	if _, out, _ := runCmd(t, "check", "--help"); !strings.Contains(out, "reports every problem") {
		t.Errorf("check --help: %q", out)
	}
	for _, args := range [][]string{
		{"rank", "--top", "x"}, {"rank", "-top", "x"}, {"rank", "--nope"}, {"rank", "--top"}, {"check", "-x"},
		{"rank", "--cross=maybe"}, {"rank", "-l", " "},
	} {
		status, _, errs := runCmd(t, args...)
		if status != exitUsage {
			t.Errorf("%q: status %d", args, status)
		}
		oneErrorLine(t, args, errs)
		if strings.Contains(strings.ReplaceAll(errs, "--", ""), " -") {
			t.Errorf("%q: a flag with one dash in %q", args, errs)
		}
	}
}
