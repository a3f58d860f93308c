package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/data"
)

// TestCheckBadFiles runs 'hatsieve check' on every file of testdata/bad and
// looks for the message stored beside it in NAME.want: the text that must
// follow the file name on one stderr line (":LINE: field: what is wrong").
func TestCheckBadFiles(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("testdata/bad/*")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, f := range files {
		if strings.HasSuffix(f, ".want") {
			continue
		}
		n++
		t.Run(filepath.Base(f), func(t *testing.T) {
			want, err := os.ReadFile(f + ".want")
			if err != nil {
				t.Fatalf("no expected message: %v", err)
			}
			frag := strings.TrimRight(string(want), "\n")
			status, out, errs := runCmd(t, "check", f)
			if status != exitData {
				t.Errorf("status %d, want %d", status, exitData)
			}
			if out != "" {
				t.Errorf("stdout %q, want nothing", out)
			}
			lines := strings.Split(strings.TrimSuffix(errs, "\n"), "\n")
			// at most the capped problems and one closing line
			if max := data.MaxIssuesPerFile + 1; len(lines) > max {
				t.Errorf("%d stderr lines, want at most %d", len(lines), max)
			}
			found := false
			for _, l := range lines {
				if !strings.HasPrefix(l, "hatsieve: "+f) {
					t.Errorf("stderr line %q does not start with the file name", l)
				}
				for _, bad := range []string{"goroutine ", "panic", ".go:"} {
					if strings.Contains(l, bad) {
						t.Errorf("stderr line looks like a trace: %q", l)
					}
				}
				if strings.Contains(l, "hatsieve: "+f+frag) {
					found = true
				}
			}
			if !found {
				t.Errorf("stderr lacks %q:\n%s", f+frag, errs)
			}
		})
	}
	if n < 25 {
		t.Errorf("only %d bad files, want at least 25", n)
	}
}

func TestCheckGoodFiles(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("testdata/good/*")
	if err != nil || len(files) < 3 {
		t.Fatalf("good files: %v %v", files, err)
	}
	for _, args := range append([][]string{{"check"}, append([]string{"check"}, files...)}, eachFile(files)...) {
		status, out, errs := runCmd(t, args...)
		if status != exitOK || errs != "" {
			t.Errorf("%q: status %d, stderr %q", args, status, errs)
		}
		if !strings.HasPrefix(out, "ok: ") {
			t.Errorf("%q: stdout %q, want it to start with \"ok: \"", args, out)
		}
	}
}

func eachFile(files []string) [][]string {
	var out [][]string
	for _, f := range files {
		out = append(out, []string{"check", f})
	}
	return out
}

func TestCheckEmbeddedLibrary(t *testing.T) {
	status, out, errs := runCmd(t, "check")
	if status != exitOK || errs != "" {
		t.Fatalf("check: status %d, stderr %q", status, errs)
	}
	if !strings.Contains(out, "ok: embedded library") {
		t.Errorf("stdout %q", out)
	}
	// Every directly given solution BDFE or BDE of the embedded library
	// says its basis: no warning.
	if strings.Contains(out, "warning:") {
		t.Errorf("check warns about the embedded library:\n%s", out)
	}
}

// A solution BDE says basis: 2010 because it is converted with Bordwell's
// C_H less the 2010 review's C_G: CpCr(CO)3H, BDE 62 in MeCN (Tilset, Parker,
// J. Am. Chem. Soc. 1989, 111, 6711, from memory), gives 62 − (59.5 − 54.9)
// = 57.4 on the 2010 basis (C_H 59.5: Bordwell, Liu, J. Org. Chem. 1996, 61,
// 4778; C_G 54.9: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961), and
// on the 2022 basis moves with C_G, by 52.6 − 54.9 (Agarwal et al., Chem.
// Rev. 2022, 122, 1, from memory).
func TestEmbeddedBDEOnTheBasisOfItsConversion(t *testing.T) {
	for basis, want := range map[string]float64{"2010": 57.4, "2022": 57.4 + 52.6 - 54.9} {
		status, out, _ := runCmd(t, "library", "--format", "json", "--cg-basis", basis, "--find", "cpcr-h")
		var list []map[string]any
		if status != exitOK || json.Unmarshal([]byte(out), &list) != nil || len(list) != 1 {
			t.Fatalf("library --find cpcr-h: status %d, %q", status, out)
		}
		if got := list[0]["bdfe_kcal_mol"].(float64); math.Abs(got-want) > 0.01 {
			t.Errorf("%s basis: cpcr-h BDFE %v, want %.2f", basis, got, want)
		}
	}
}

// A duplicate id across two files names both places.
func TestCheckDuplicateAcrossFiles(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.yaml"), filepath.Join(dir, "b.csv")
	if err := os.WriteFile(a, []byte("format: hatsieve/1\ncouples:\n  - id: x\n    bdfe: 70\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(b, []byte("id,bdfe\ny,71\nx,72\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"check", a, b}
	status, out, errs := runCmd(t, args...)
	if status != exitData || out != "" {
		t.Errorf("status %d stdout %q", status, out)
	}
	oneErrorLine(t, args, errs)
	if want := b + ":3: id: duplicate id \"x\": also at " + a + ":3"; !strings.Contains(errs, want) {
		t.Errorf("stderr %q lacks %q", errs, want)
	}
}

func TestCheckUnreadable(t *testing.T) {
	dir := t.TempDir()
	for _, args := range [][]string{{"check", filepath.Join(dir, "missing.yaml")}, {"check", dir}} {
		status, out, errs := runCmd(t, args...)
		if status != exitData || out != "" {
			t.Errorf("%q: status %d stdout %q", args, status, out)
		}
		oneErrorLine(t, args, errs)
	}
}

func TestCheckUsage(t *testing.T) {
	args := []string{"check", "--nope"}
	status, _, errs := runCmd(t, args...)
	if status != exitUsage {
		t.Errorf("status %d, want %d", status, exitUsage)
	}
	oneErrorLine(t, args, errs)
}

// A potential written without an electrode is shown as assumed: NHE in
// water, Fc+/Fc in an organic solvent (README.md, A short tour).
func TestCheckShowsAssumedElectrodes(t *testing.T) {
	status, out, errs := runCmd(t, "check", "../../testdata/good/water.yaml", "../../testdata/good/full.yaml")
	if status != exitOK || errs != "" {
		t.Fatalf("status %d stderr %q", status, errs)
	}
	for _, want := range []string{
		"water.yaml:7: note: couple aq-donor: e_cation has no electrode; taken as vs NHE (assumed)",
		"full.yaml:47: note: couple cycle-assumed: e_anion has no electrode; taken as vs Fc+/Fc (assumed)",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("stdout lacks %q:\n%s", want, out)
		}
	}
	if strings.Contains(out, "cycle-fc: e_anion") {
		t.Error("a potential with its electrode shown as assumed")
	}
}

// A couple that resolves on one C_G basis only is noted; one that resolves
// on neither is a problem.
func TestCheckResolvesOnBothBases(t *testing.T) {
	dir := t.TempDir()
	one := filepath.Join(dir, "one.yaml")
	if err := os.WriteFile(one, []byte(`format: hatsieve/1
solvents:
  - {name: oldsolv, c_g_2010: 60, e_h2: -0.2, source: invented}
couples:
  - {id: a, solvent: oldsolv, pka: 20, e_anion: -0.5}
  - {id: b, bdfe: 70}
`), 0o644); err != nil {
		t.Fatal(err)
	}
	status, out, errs := runCmd(t, "check", one)
	if status != exitOK || errs != "" || !strings.Contains(out, one+":5: note: couple a: usable on the 2010 basis only") {
		t.Errorf("status %d stderr %q stdout %q", status, errs, out)
	}
	none := filepath.Join(dir, "none.yaml")
	// no BDE-to-BDFE conversion is known in water (thermo's table has no C_H there)
	if err := os.WriteFile(none, []byte("format: hatsieve/1\ncouples:\n  - {id: c, solvent: water, bde: 90}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"check", none}
	status, out, errs = runCmd(t, args...)
	if status != exitData || out != "" {
		t.Errorf("status %d stdout %q", status, out)
	}
	oneErrorLine(t, args, errs)
	if !strings.Contains(errs, none+":3: id: couple c cannot be evaluated") {
		t.Errorf("stderr %q", errs)
	}
}

// Notes are capped like problems: 20 per file, then a count.
func TestCheckNotesAreCapped(t *testing.T) {
	var b strings.Builder
	b.WriteString("id,pka,e_anion\n")
	for i := range 30 {
		fmt.Fprintf(&b, "c%d,20,-0.5\n", i)
	}
	f := filepath.Join(t.TempDir(), "many.csv")
	if err := os.WriteFile(f, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	status, out, errs := runCmd(t, "check", f)
	lines := strings.Split(strings.TrimSuffix(out, "\n"), "\n")
	if status != exitOK || errs != "" || len(lines) != 1+data.MaxIssuesPerFile+1 {
		t.Fatalf("status %d, stderr %q, %d lines:\n%s", status, errs, len(lines), out)
	}
	if last := lines[len(lines)-1]; last != f+": 10 more notes not shown (first 20 above)" {
		t.Errorf("last line %q", last)
	}
}
