package data

import (
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
)

// runsFor makes every YAML file of the usual shape take the fast path, in
// runs of n couples, until the test ends.
func runsFor(t testing.TB, n int) {
	oldMin, oldItems := yamlRunsMin, yamlRunItems
	yamlRunsMin, yamlRunItems = 0, n
	t.Cleanup(func() { yamlRunsMin, yamlRunItems = oldMin, oldItems })
}

// sameBothPaths loads files through Load (runs where it can) and with every
// file parsed whole, and fails unless the libraries and the problem lists
// are the same.
func sameBothPaths(t testing.TB, files ...File) loadStats {
	t.Helper()
	_, st, _ := load(files, true, false)
	fast, ferr := Load(files...)
	whole, _, werr := load(files, false, false)
	if fmt.Sprint(ferr) != fmt.Sprint(werr) || !reflect.DeepEqual(ferr, werr) {
		t.Fatalf("problems differ (runs %+v):\nruns:  %v\nwhole: %v", st, ferr, werr)
	}
	if !sameLibraries(fast, whole) {
		t.Fatalf("libraries differ (runs %+v)", st)
	}
	return st
}

func TestRunsMatchWholeOnTestdata(t *testing.T) {
	var names []string
	for _, dir := range []string{"../testdata/good", "../testdata/bad"} {
		n, _ := filepath.Glob(filepath.Join(dir, "*.yaml"))
		names = append(names, n...)
	}
	if len(names) < 10 {
		t.Fatalf("only %d test libraries", len(names))
	}
	fast := 0
	for _, n := range []int{1, 2, 1000} {
		runsFor(t, n)
		for _, name := range names {
			b, err := os.ReadFile(name)
			if err != nil {
				t.Fatal(err)
			}
			st := sameBothPaths(t, File{filepath.Base(name), b})
			fast += st.runFiles
		}
	}
	// Most test libraries have a couples list of the usual shape.
	if fast < len(names) {
		t.Errorf("only %d of %d loads took the fast path", fast, 3*len(names))
	}
}

// generated is synthLibrary (bench_test.go) with its couples written at
// column 2; edit changes its text.
func generated(n int, edit func(string) string) File {
	s := string(synthLibrary(n, false))
	if edit != nil {
		s = edit(s)
	}
	return File{"gen.yaml", []byte(s)}
}

// item returns the text of couple i's first line.
func item(i int) string { return fmt.Sprintf("  - id: c%06d\n", i) }

func TestRunsMatchWholeOnGenerated(t *testing.T) {
	runsFor(t, 7)
	bom := "\uFEFF"
	for _, tc := range []struct {
		name  string
		edit  func(string) string
		retry bool // a run is refused by the parser: loaded again whole
		slow  bool // not of the usual shape: never read in runs
	}{
		{"as written", nil, false, false},
		{"error in a later run", func(s string) string {
			return strings.Replace(s, item(150), item(150)+"    bdfe: 300\n    pka: abc\n", 1)
		}, false, false},
		{"duplicate ids across runs", func(s string) string {
			s = strings.Replace(s, item(140), "  - id: c000003\n", 1)
			return strings.Replace(s, item(190), "  - id: c000100\n", 1)
		}, false, false},
		{"unknown key and misspelt role late", func(s string) string {
			s = strings.Replace(s, item(170), item(170)+"    bdef: 70\n", 1)
			return strings.Replace(s, item(180), item(180)+"    roles: doner\n", 1)
		}, false, false},
		{"CRLF", func(s string) string { return strings.ReplaceAll(s, "\n", "\r\n") }, false, false},
		{"BOM", func(s string) string { return bom + s }, false, false},
		{"BOM and CRLF with an error", func(s string) string {
			s = strings.Replace(s, item(99), item(99)+"    e_anion: 9 V vs SCE\n", 1)
			return bom + strings.ReplaceAll(s, "\n", "\r\n")
		}, false, false},
		{"comments and blank lines", func(s string) string {
			for _, i := range []int{1, 8, 14, 15, 21, 77} {
				s = strings.Replace(s, item(i), "\n# a comment at column 0\n\n  # one at 2\n      # one deeper\n\n"+item(i), 1)
			}
			return strings.Replace(s, item(30), item(30)+"    # inside an item\n\n", 1)
		}, false, false},
		{"comments after values", func(s string) string {
			return strings.ReplaceAll(s, "    status: invented\n", "    status: invented # why\n")
		}, false, false},
		{"block scalars", func(s string) string {
			s = strings.Replace(s, item(20), item(20)+"    note: |\n      line one\n\n      - line two: not an item\n", 1)
			return strings.Replace(s, item(40), item(40)+"    note: >-\n      folded\n      text\n", 1)
		}, false, false},
		{"multi-line plain and quoted scalars", func(s string) string {
			s = strings.Replace(s, item(50), item(50)+"    note: first\n      second\n", 1)
			return strings.Replace(s, item(60), item(60)+"    note: \"one\n      two \\u00e9\"\n", 1)
		}, false, false},
		{"nested mappings and flow mappings", func(s string) string {
			s = strings.Replace(s, item(70), item(70)+"    bde:\n      value: 80\n      sigma: 2\n", 1)
			return strings.Replace(s, item(71), "  - {id: flow, bdfe: 70}\n"+item(71), 1)
		}, false, false},
		{"duplicate key in an item", func(s string) string {
			return strings.Replace(s, item(80), item(80)+"    source: a\n    source: b\n", 1)
		}, false, false},
		{"anchor and alias in one run", func(s string) string {
			s = strings.Replace(s, item(91), item(91)+"    note: &n shared\n", 1)
			return strings.Replace(s, item(92), item(92)+"    tags: [*n]\n", 1)
		}, false, false},
		{"alias to an earlier run", func(s string) string {
			s = strings.Replace(s, item(10), item(10)+"    note: &n shared\n", 1)
			return strings.Replace(s, item(90), item(90)+"    note: *n\n", 1)
		}, true, false},
		{"alias to the header", func(s string) string {
			s = strings.Replace(s, "solvent: acetonitrile\n", "solvent: &s acetonitrile\n", 1)
			return strings.Replace(s, item(90), item(90)+"    solvent: *s\n", 1)
		}, true, false},
		{"syntax error in a later run", func(s string) string {
			return strings.Replace(s, item(160), item(160)+"    tags: [a, b\n", 1)
		}, true, false},
		{"unclosed quote across runs", func(s string) string {
			return strings.Replace(s, item(104), item(104)+"    note: \"open\n", 1)
		}, true, false},
		{"tab in a later run", func(s string) string {
			return strings.Replace(s, item(120), item(120)+"\tnote: x\n", 1)
		}, false, true},
		{"control character in a value", func(s string) string {
			return strings.Replace(s, item(120), item(120)+"    note: a\x07b\n", 1)
		}, true, false},
		{"keys after the couples", func(s string) string {
			return s + "series:\n  - id: s1\n    steps: [c000001, c000002]\ncombine: []\ntitle: again\n"
		}, false, false},
		{"couples given twice", func(s string) string {
			return s + "couples:\n  - id: z\n    bdfe: 70\n"
		}, false, false},
		{"couples at column 0", func(s string) string {
			return strings.ReplaceAll(strings.ReplaceAll(s, "\n  - ", "\n- "), "\n    ", "\n  ")
		}, false, false},
		{"item at column 1", func(s string) string {
			return strings.Replace(s, item(130), " - id: odd\n", 1)
		}, false, true},
		{"document marker", func(s string) string { return "---\n" + s }, false, true},
		{"two documents", func(s string) string { return s + "---\nformat: hatsieve/1\n" }, false, true},
		{"flow top level", func(s string) string { return "{" + s }, false, true},
		{"lone CR", func(s string) string {
			return strings.Replace(s, "name: synthetic couple 7\n", "name: synthetic couple 7\r", 1)
		}, false, true},
		{"line separator", func(s string) string { return strings.Replace(s, "couple 7\n", "couple 7\u2028\n", 1) }, false, true},
		{"couples with a tag", func(s string) string { return strings.Replace(s, "couples:\n", "couples: !!seq\n", 1) }, false, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := sameBothPaths(t, generated(200, tc.edit))
			switch {
			case tc.slow && st.runFiles != 0:
				t.Errorf("read in runs")
			case !tc.slow && st.runFiles != 1:
				t.Errorf("not read in runs")
			case !tc.slow && st.retry != tc.retry:
				t.Errorf("loaded again whole: %v, want %v", st.retry, tc.retry)
			}
		})
	}
}

// Several files, the big one read in runs, with ids shared across files and
// a solvent one file defines used in the other.
func TestRunsMatchWholeAcrossFiles(t *testing.T) {
	runsFor(t, 5)
	other := File{"other.yaml", []byte("format: hatsieve/1\nsolvents:\n  - name: goo\n    c_g_2022: 55\n    source: invented\ncouples:\n  - id: c000010\n    bdfe: 70\n")}
	gen := generated(60, func(s string) string {
		return strings.Replace(s, item(40), item(40)+"    solvent: goo\n", 1)
	})
	for _, files := range [][]File{{other, gen}, {gen, other}} {
		if st := sameBothPaths(t, files...); st.runFiles != 2 || st.retry {
			t.Errorf("%d files read in runs", st.runFiles)
		}
	}
}

// The big libraries of the benchmarks and of hatsieve-gen's shape, at the
// default run size: read in runs, and the same library as whole.
func TestRunsMatchWholeLarge(t *testing.T) {
	if testing.Short() {
		t.Skip("large library")
	}
	oldMin := yamlRunsMin
	yamlRunsMin = 0
	defer func() { yamlRunsMin = oldMin }()
	for _, f := range []File{generated(5000, nil), {"s.yaml", synthetic(4000, false)}} {
		if st := sameBothPaths(t, f); st.runFiles != 1 || st.retry {
			t.Errorf("%s: %+v", f.Name, st)
		}
	}
}

// addRunSeeds adds libraries of the usual shape to a YAML fuzz target.
func addRunSeeds(f *testing.F) {
	f.Add(generated(12, nil).Data)
	f.Add(generated(6, func(s string) string { return strings.ReplaceAll(s, "\n", "\r\n") }).Data)
	f.Add([]byte("format: hatsieve/1\ncouples:\n- id: a\n  bdfe: 70\n- id: b\n  tags: [x, y]\n  note: 'q'\nseries: []\n"))
}

// checkRuns loads a fuzzed library both ways, read in runs of two couples
// and whole, and wants the same result. FuzzLoadYAML calls it.
func checkRuns(t *testing.T, data []byte) {
	runsFor(t, 2)
	if _, st, _ := load([]File{{"f.yaml", data}}, true, false); st.runFiles == 0 {
		return
	}
	checkLoad(t, "f.yaml", data)
	sameBothPaths(t, File{"f.yaml", data})
}

// FuzzYAMLRuns fuzzes the text of a couples list, after a fixed header,
// and wants the same result in runs and whole.
func FuzzYAMLRuns(f *testing.F) {
	f.Add([]byte("  - id: a\n    bdfe: 70 ± 1\n    tags: [x, y z]\n  - id: b\n    pka: 20\n    e_anion: -1.2 V vs SCE\n    note: 'n'\n"))
	f.Add([]byte("- id: a\n  name: \"A\"\n  roles: [donor]\n- id: b\n  bdfe: null\n  # c\n\n- id: c\n  bdfe: ~\n"))
	f.Add([]byte("  - id: a\r\n    bdfe: 70\r\n  - id: b\r\n    note: |\r\n      x\r\n  - id: c\r\n    bde: {value: 80, sigma: 1}\r\n"))
	f.Fuzz(func(t *testing.T, body []byte) {
		data := append([]byte("format: hatsieve/1\nsolvent: acetonitrile\ncouples:\n"), body...)
		checkRuns(t, data)
	})
}
