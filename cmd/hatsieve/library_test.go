package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// libraryContractKeys are the keys every object of 'library --format json'
// carries (README.md, "The reference library"); with --units kj the two
// energy keys end in _kj_mol instead.
var libraryContractKeys = []string{"id", "name", "bond", "solvent", "roles", "bdfe_kcal_mol",
	"sigma_kcal_mol", "basis", "route", "source", "status"}

func libraryJSON(t *testing.T, args ...string) []map[string]any {
	t.Helper()
	args = append([]string{"library", "--format", "json"}, args...)
	status, out, errs := runCmd(t, args...)
	if status != exitOK || errs != "" {
		t.Fatalf("hatsieve %s: status %d, stderr %q", strings.Join(args, " "), status, errs)
	}
	var list []map[string]any
	if err := json.Unmarshal([]byte(out), &list); err != nil {
		t.Fatalf("library json: %v\n%s", err, out)
	}
	return list
}

func TestLibraryJSONKeys(t *testing.T) {
	for _, units := range []string{"kcal", "kj"} {
		want := slices.Clone(libraryContractKeys)
		if units == "kj" {
			for i, k := range want {
				want[i] = strings.Replace(k, "_kcal_mol", "_kj_mol", 1)
			}
		}
		list := libraryJSON(t, "--units", units)
		if len(list) == 0 {
			t.Fatal("empty library")
		}
		for _, o := range list {
			for _, k := range want {
				if _, ok := o[k]; !ok {
					t.Fatalf("--units %s: %v has no key %q", units, o["id"], k)
				}
			}
			if _, ok := o["bdfe_kcal_mol"]; ok && units == "kj" {
				t.Fatalf("--units kj still writes bdfe_kcal_mol: %v", o["id"])
			}
		}
	}
}

// bondClass is the class a bond counts for: metal–H bonds count as M–H.
func bondClass(bond string) string {
	atom, _, _ := strings.Cut(normBond(bond), "–")
	if isMetal(atom) {
		return metalBond
	}
	return normBond(bond)
}

// The embedded reference library: at least 150 published couples in at least
// 6 solvents, the gas phase among them, every class present, each with a
// source, a status and a BDFE.
func TestLibraryEmbeddedCoverage(t *testing.T) {
	list := libraryJSON(t, "--cg-basis", "2010")
	solvents := map[string]int{}
	classes := map[string]int{}
	published := 0
	for _, o := range list {
		id, _ := o["id"].(string)
		if s, _ := o["source"].(string); strings.TrimSpace(s) == "" {
			t.Errorf("%s: no source", id)
		}
		status, _ := o["status"].(string)
		if status == "" {
			t.Errorf("%s: no status", id)
		}
		if _, ok := o["bdfe_kcal_mol"].(float64); !ok {
			t.Errorf("%s: no BDFE (%v)", id, o["problem"])
		}
		if o["basis"] != "2010" && o["basis"] != "absolute" {
			t.Errorf("%s: basis %v with --cg-basis 2010", id, o["basis"])
		}
		if status == "invented" {
			continue
		}
		published++
		solvents[o["solvent"].(string)]++
		classes[bondClass(o["bond"].(string))]++
	}
	if published < 150 {
		t.Errorf("%d published couples, want at least 150", published)
	}
	if len(solvents) < 6 || solvents["gas"] == 0 {
		t.Errorf("solvents %v: want at least 6, gas among them", solvents)
	}
	for _, c := range []string{"O–H", "N–H", "C–H", "S–H", metalBond} {
		if classes[c] == 0 {
			t.Errorf("no %s couple (classes %v)", c, classes)
		}
	}
}

func ids(list []map[string]any) []string {
	var out []string
	for _, o := range list {
		out = append(out, o["id"].(string))
	}
	return out
}

func TestLibraryFilters(t *testing.T) {
	all := libraryJSON(t)
	// --solvent takes aliases and keeps only that solvent.
	mecn := libraryJSON(t, "--solvent", "MeCN")
	if len(mecn) == 0 || len(mecn) >= len(all) {
		t.Fatalf("--solvent MeCN: %d of %d", len(mecn), len(all))
	}
	for _, o := range mecn {
		if o["solvent"] != "acetonitrile" {
			t.Errorf("--solvent MeCN kept %v in %v", o["id"], o["solvent"])
		}
	}
	// --find matches id, name and source, in any case.
	if got := ids(libraryJSON(t, "--find", "TEMPO–H")); !slices.Contains(got, "tempo-h") {
		t.Errorf("--find by name: %v", got)
	}
	if got := ids(libraryJSON(t, "--find", "NHPI")); !slices.Equal(got, []string{"nhpi"}) {
		t.Errorf("--find by id: %v", got)
	}
	bySource := libraryJSON(t, "--find", "tilset")
	if len(bySource) < 3 {
		t.Errorf("--find by source: %v", ids(bySource))
	}
	// --bond with either dash; M-H for any metal.
	oh1, oh2 := libraryJSON(t, "--bond", "O-H"), libraryJSON(t, "--bond", "o–h")
	if len(oh1) == 0 || !slices.Equal(ids(oh1), ids(oh2)) {
		t.Errorf("--bond O-H %d, o–h %d", len(oh1), len(oh2))
	}
	for _, o := range oh1 {
		if o["bond"] != "O–H" {
			t.Errorf("--bond O-H kept %v (%v)", o["id"], o["bond"])
		}
	}
	mh := libraryJSON(t, "--bond", "M-H")
	if len(mh) < 5 {
		t.Errorf("--bond M-H: %v", ids(mh))
	}
	for _, o := range mh {
		if bondClass(o["bond"].(string)) != metalBond {
			t.Errorf("--bond M-H kept %v (%v)", o["id"], o["bond"])
		}
	}
	// --role
	for _, role := range []string{"donor", "acceptor"} {
		got := libraryJSON(t, "--role", role)
		if len(got) == 0 || len(got) >= len(all) {
			t.Errorf("--role %s: %d of %d", role, len(got), len(all))
		}
		for _, o := range got {
			if !slices.Contains(o["roles"].([]any), any(role)) {
				t.Errorf("--role %s kept %v (%v)", role, o["id"], o["roles"])
			}
		}
	}
}

// A loaded file is listed with the basis switch acting on its inputs.
func TestLibraryLoadedFileAndBasis(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "mine.yaml")
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.1.2:
	// NHPI, pKa 23.5 and E° −0.10 V vs Fc in MeCN give BDFE 84.8 (2010 basis).
	if err := os.WriteFile(f, []byte("format: hatsieve/1\nsolvent: MeCN\ncouples:\n"+
		"  - {id: my-nhpi, name: my NHPI, bond: O–H, pka: 23.5, e_anion: -0.10 V vs Fc+/Fc, source: 2010 review, status: user}\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	b10 := libraryJSON(t, "-l", f, "--cg-basis", "2010")
	b22 := libraryJSON(t, "-l", f, "--cg-basis", "2022")
	if len(b10) != 1 || len(b22) != 1 {
		t.Fatalf("listed %v", ids(b10))
	}
	v10, v22 := b10[0]["bdfe_kcal_mol"].(float64), b22[0]["bdfe_kcal_mol"].(float64)
	if d := v10 - 84.8; d > 0.25 || d < -0.25 {
		t.Errorf("BDFE %.2f on the 2010 basis, the 2010 review gives 84.8", v10)
	}
	if !(v22 < v10) || b10[0]["basis"] != "2010" || b22[0]["basis"] != "2022" || b10[0]["route"] == nil {
		t.Errorf("2010 %.2f (%v), 2022 %.2f (%v)", v10, b10[0]["basis"], v22, b22[0]["basis"])
	}
}

func TestLibraryText(t *testing.T) {
	status, out, errs := runCmd(t, "library", "--find", "tempo-h")
	if status != exitOK || errs != "" {
		t.Fatalf("status %d, stderr %q", status, errs)
	}
	if !strings.Contains(out, "tempo-h") || !strings.Contains(out, "C_G basis") {
		t.Errorf("text output:\n%s", out)
	}
}

func TestLibraryBadUsage(t *testing.T) {
	for _, c := range []struct {
		args   []string
		status int
	}{
		{[]string{"library", "--role", "catalyst"}, exitUsage},
		{[]string{"library", "--bond", "OH"}, exitUsage},
		{[]string{"library", "--bond", "O-C"}, exitUsage},
		{[]string{"library", "--format", "csv"}, exitUsage},
		{[]string{"library", "extra"}, exitUsage},
		{[]string{"library", "--cg", "54"}, exitUsage},
		{[]string{"library", "--cg-basis", "1999"}, exitUsage},
		{[]string{"library", "--solvent", "no-such-solvent"}, exitData},
		{[]string{"library", "-l", filepath.Join(t.TempDir(), "missing.yaml")}, exitData},
	} {
		status, out, errs := runCmd(t, c.args...)
		if status != c.status || out != "" {
			t.Errorf("%v: status %d (want %d), stdout %q", c.args, status, c.status, out)
		}
		oneErrorLine(t, c.args, errs)
	}
}

// An explicit --cg is named as such in the JSON and under the table, not as
// the table's basis.
func TestLibraryExplicitCG(t *testing.T) {
	_, out, _ := runCmd(t, "library", "--cg", "54.9", "--solvent", "MeCN", "--find", "tempo-h")
	if !strings.Contains(out, "with an explicit C_G 54.90 kcal/mol in acetonitrile") {
		t.Errorf("table footer:\n%s", out)
	}
	_, out, _ = runCmd(t, "library", "--cg", "54.9", "--solvent", "MeCN", "--find", "tempo-h", "--format", "json")
	if !strings.Contains(out, `"basis": "explicit"`) {
		t.Errorf("JSON:\n%s", out)
	}
}
