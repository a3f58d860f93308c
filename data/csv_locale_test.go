package data

import (
	"strings"
	"testing"
)

// A spreadsheet in a locale that writes 66,5 saves CSV with ';' between
// cells: its decimal commas are read as decimal points, in values and
// uncertainties, written alone or with ±, on both row readers (with and
// without quotes). With ',' as the separator a decimal comma stays an error.
func TestSemicolonCSVWithDecimalCommas(t *testing.T) {
	text := "id;roles;bdfe;bdfe_sigma;pka;e_anion;e_anion_vs;tags;note\n" +
		"a;donor;66,5;0,5;;;;x,y;plain\n" +
		"b;acceptor;;;20,1;-0,25 ± 0,01;SCE;;\"quoted; note, kept\"\n"
	for _, src := range []string{text, strings.Replace(text, "\"quoted; note, kept\"", "unquoted", 1)} {
		lib, err := Load(File{Name: "eu.csv", Data: []byte(src)})
		if err != nil {
			t.Fatal(err)
		}
		a, b := lib.Couples[0], lib.Couples[1]
		if a.In.BDFE.V != 66.5 || a.In.BDFE.Sigma != 0.5 {
			t.Errorf("bdfe %+v", *a.In.BDFE)
		}
		if b.In.PKa.V != 20.1 || b.In.EAnion.V != -0.25 || b.In.EAnion.Sigma != 0.01 {
			t.Errorf("pka %+v e_anion %+v", *b.In.PKa, *b.In.EAnion)
		}
		if strings.Join(a.Tags, "|") != "x|y" {
			t.Errorf("tags %q: a text cell keeps its commas", a.Tags)
		}
	}
	_, err := Load(File{Name: "us.csv", Data: []byte("id,roles,bdfe\na,donor,\"66,5\"\n")})
	if err == nil || !strings.Contains(err.Error(), `"66,5" is not a number`) {
		t.Errorf("a decimal comma with ',' separators: %v", err)
	}
}
