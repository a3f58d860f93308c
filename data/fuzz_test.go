package data

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// addSeeds adds the shared test libraries whose names end in ext.
func addSeeds(f *testing.F, ext string) {
	for _, dir := range []string{"../testdata/good", "../testdata/bad"} {
		names, _ := filepath.Glob(filepath.Join(dir, "*"+ext))
		for _, n := range names {
			if b, err := os.ReadFile(n); err == nil {
				f.Add(b)
			}
		}
	}
}

// checkLoad is what every load must satisfy, whatever the input: no panic;
// either a library or Issues, never both or neither; each issue names the
// file, fits on one line and the file has at most MaxIssuesPerFile+1 lines;
// a library evaluates without panicking, and each of its couples has data
// for a BDFE.
func checkLoad(t *testing.T, name string, data []byte) {
	lib, err := Load(File{Name: name, Data: data})
	if (lib == nil) == (err == nil) {
		t.Fatalf("library %v with error %v", lib != nil, err)
	}
	if err != nil {
		var is Issues
		if !errors.As(err, &is) || len(is) == 0 {
			t.Fatalf("error %T %v is not Issues", err, err)
		}
		if len(is) > MaxIssuesPerFile+1 {
			t.Fatalf("%d issues", len(is))
		}
		for _, x := range is {
			if x.Pos.File != name || strings.ContainsAny(x.String(), "\n") {
				t.Fatalf("issue %q", x.String())
			}
		}
		return
	}
	for _, c := range lib.Couples {
		in := c.In
		if in.BDFE == nil && in.BDE == nil && (in.PKa == nil || in.EAnion == nil) &&
			(in.PKaCation == nil || in.ECation == nil) && (in.AcidPKa == nil || in.Reductant == nil) {
			t.Fatalf("couple %s loaded without data for a BDFE", c.ID)
		}
	}
	for _, s := range []string{"", "water", "gas"} {
		if _, err := Evaluate(lib, Options{Solvent: s, Cross: true}); err != nil {
			t.Fatalf("evaluate in %q: %v", s, err)
		}
	}
}

func FuzzLoadYAML(f *testing.F) {
	addSeeds(f, ".yaml")
	for _, df := range DefaultFiles() {
		f.Add(df.Data)
	}
	f.Add([]byte("format: hatsieve/1\ncouples:\n  - {id: a, bdfe: {value: 1, sigma: 0.1}}\n"))
	f.Add([]byte("a: &x [*x]\n"))
	addRunSeeds(f)
	f.Fuzz(func(t *testing.T, data []byte) {
		checkLoad(t, "f.yaml", data)
		checkRuns(t, data) // yaml_runs_test.go
	})
}

func FuzzLoadCSV(f *testing.F) {
	addSeeds(f, ".csv")
	f.Add([]byte("id,pka,e_anion,e_anion_vs,roles\nx,20,-0.5,SCE,donor;acceptor\n"))
	f.Add([]byte("\uFEFFid,bdfe,bdfe_sigma\n\"a\"\"b\",70,1\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		checkLoad(t, "f.csv", data)
		sameInParts(t, "input", data) // csv_parts_test.go
	})
}

// Evaluate must leave the library unchanged however often it runs.
func TestEvaluateLeavesLibraryAlone(t *testing.T) {
	lib := mustDefault(t)
	before := len(lib.Couples)
	for _, s := range []string{"water", "acetonitrile"} {
		if _, err := Evaluate(lib, Options{Solvent: s, Cond: thermo.Conditions{Basis: thermo.Basis2010}}); err != nil {
			t.Fatal(err)
		}
	}
	if len(lib.Couples) != before {
		t.Error("couples changed")
	}
}
