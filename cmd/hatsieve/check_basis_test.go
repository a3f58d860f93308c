package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A BDFE given directly in solution without a basis is taken on the basis in
// force, so its H2 verdict moves with the basis while the value does not:
// check warns, and still exits 0. A gas-phase value or one with a basis is
// not warned about. (The H2 line in MeCN moves by 2.3 kcal/mol between the
// 2010 and 2022 bases, Agarwal et al., Chem. Rev. 2022, 122, 1.)
func TestCheckWarnsAboutMissingBasis(t *testing.T) {
	f := filepath.Join(t.TempDir(), "b.yaml")
	if err := os.WriteFile(f, []byte(`format: hatsieve/1
couples:
  - {id: nob, solvent: MeCN, bdfe: 70, source: s}
  - {id: withb, solvent: MeCN, bdfe: 70, basis: 2010, source: s}
  - {id: gasv, solvent: gas, bdfe: 90, source: s}
`), 0o644); err != nil {
		t.Fatal(err)
	}
	status, out, errs := runCmd(t, "check", f)
	if status != exitOK || errs != "" {
		t.Fatalf("status %d, stderr %q", status, errs)
	}
	if !strings.Contains(out, f+":3: warning: couple nob: a BDFE in acetonitrile without a basis") {
		t.Errorf("no warning for the couple without a basis:\n%s", out)
	}
	if strings.Contains(out, "couple withb: a BDFE") || strings.Contains(out, "couple gasv: a BDFE") {
		t.Errorf("warned about a couple with a basis or in the gas phase:\n%s", out)
	}
}
