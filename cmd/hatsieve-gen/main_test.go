package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

func gen(t *testing.T, args ...string) []byte {
	t.Helper()
	var out, errb bytes.Buffer
	if code := run(args, &out, &errb); code != 0 {
		t.Fatalf("hatsieve-gen %v: exit %d: %s", args, code, errb.String())
	}
	return out.Bytes()
}

// The generated files load without a single issue, hold the couples asked
// for with the roles asked for, and CSV and YAML describe the same couples.
func TestGeneratedLibrariesLoad(t *testing.T) {
	args := []string{"-n", "300", "-donors", "40", "-acceptors", "60", "-seed", "9"}
	csvLib, err := data.Load(data.File{Name: "gen.csv", Data: gen(t, append(args, "-format", "csv")...)})
	if err != nil {
		t.Fatalf("CSV: %v", err)
	}
	yamlLib, err := data.Load(data.File{Name: "gen.yaml", Data: gen(t, append(args, "-format", "yaml")...)})
	if err != nil {
		t.Fatalf("YAML: %v", err)
	}
	if len(csvLib.Couples) != 400 || len(yamlLib.Couples) != 400 {
		t.Fatalf("couples: CSV %d, YAML %d, want 400", len(csvLib.Couples), len(yamlLib.Couples))
	}
	evc, err := data.Evaluate(csvLib, data.Options{})
	if err != nil {
		t.Fatal(err)
	}
	evy, err := data.Evaluate(yamlLib, data.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(evc.Problems) > 0 || len(evc.All) != 400 {
		t.Fatalf("CSV evaluation: %d couples, problems %v", len(evc.All), evc.Problems)
	}
	var cycle, direct int
	for i, e := range evc.All {
		y := evy.All[i]
		if e.ID != y.ID || e.Roles != y.Roles || e.R.BDFE.Kcal != y.R.BDFE.Kcal || e.R.BDFE.Sigma() != y.R.BDFE.Sigma() || e.R.Route != y.R.Route {
			t.Fatalf("couple %d: CSV %s %v %+v, YAML %s %v %+v", i, e.ID, e.Roles, e.R.BDFE, y.ID, y.Roles, y.R.BDFE)
		}
		b := e.R.BDFE.Kcal
		if b < 39.9 || b > 110.1 {
			t.Errorf("%s: BDFE %.2f outside 40–110", e.ID, b)
		}
		if e.R.Closure != nil {
			t.Errorf("%s: the two routes disagree: %+v", e.ID, e.R.Closure)
		}
		want := thermo.RoleBoth
		switch e.ID[0] {
		case 'd':
			want = thermo.RoleDonor
		case 'a':
			want = thermo.RoleAcceptor
		}
		if e.ID[0] != 'c' && e.Roles != want {
			t.Errorf("%s: roles %v, want %v", e.ID, e.Roles, want)
		}
		switch e.R.Route {
		case thermo.RouteProtonFirst:
			cycle++
		case thermo.RouteDirect:
			direct++
		}
	}
	// About 55% direct and 40% by the cycle (1 in 20 carries both, the direct first).
	if cycle < 80 || direct < 150 {
		t.Errorf("routes: %d by the cycle, %d direct; want a mix", cycle, direct)
	}
	if len(evc.Donors) < 100 || len(evc.Acceptors) < 100 {
		t.Errorf("%d donors, %d acceptors", len(evc.Donors), len(evc.Acceptors))
	}
}

func TestSameSeedSameFile(t *testing.T) {
	a := gen(t, "-n", "50", "-seed", "3")
	b := gen(t, "-n", "50", "-seed", "3")
	c := gen(t, "-n", "50", "-seed", "4")
	if !bytes.Equal(a, b) {
		t.Error("the same seed gave two different files")
	}
	if bytes.Equal(a, c) {
		t.Error("two seeds gave the same file")
	}
}

func TestBadUsageAndNoOverwrite(t *testing.T) {
	for _, args := range [][]string{{}, {"-n", "-1"}, {"-n", "3", "-format", "xml"}, {"-n", "3", "extra"}, {"-bogus"}} {
		var out, errb bytes.Buffer
		if code := run(args, &out, &errb); code != 2 || strings.Count(errb.String(), "\n") != 1 {
			t.Errorf("%v: exit %d, stderr %q; want 2 and one line", args, code, errb.String())
		}
	}
	path := filepath.Join(t.TempDir(), "lib.csv")
	if err := os.WriteFile(path, []byte("mine"), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if code := run([]string{"-n", "3", "-o", path}, &out, &errb); code != 1 {
		t.Errorf("existing -o: exit %d, want 1", code)
	}
	if b, _ := os.ReadFile(path); string(b) != "mine" {
		t.Errorf("existing file changed to %q", b)
	}
	if code := run([]string{"-n", "3", "-o", path, "-force"}, &out, &errb); code != 0 {
		t.Errorf("-force: exit %d: %s", code, errb.String())
	}
	if b, _ := os.ReadFile(path); !strings.HasPrefix(string(b), "id,name,") {
		t.Errorf("-force did not write the library: %q", b)
	}
}
