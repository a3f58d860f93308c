package data

import (
	"math"
	"strings"
	"testing"

	"github.com/hatsieve/hatsieve/thermo"
)

// A couple in water whose potential is a formal potential at a pH: the ph
// field, with e_pcet = E°′(X, H+/X–H), vs NHE or vs RHE.
func TestPHField(t *testing.T) {
	files := []File{{"w.yaml", []byte(`format: hatsieve/1
solvent: water
couples:
  - {id: fl-nhe, bond: N–H, ph: 0, e_pcet: 0.30 V vs NHE, source: s, status: checked}
  - {id: x-rhe, bond: O–H, ph: 7, e_pcet: 0.50 V vs RHE, source: s, status: estimate}
`)}, {"w.csv", []byte("id,solvent,ph,e_pcet,e_pcet_vs,source\nx-csv,water,7,0.0859,NHE,s\n")}}
	lib, err := Load(files...)
	if err != nil {
		t.Fatal(err)
	}
	ev := evaluate(t, lib, Options{Cond: thermo.Conditions{Basis: thermo.Basis2010}})
	// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.6.2:
	// flavin average N–H, E°(pH 0) 0.30 V vs NHE, BDFE 64.5 (2010 basis, checked).
	if b := byID(t, ev, "fl-nhe").R.BDFE.Kcal; math.Abs(b-64.5) > 0.05 {
		t.Errorf("flavin %.2f, want 64.5", b)
	}
	// vs RHE at pH 7 and vs NHE at 0.5 − 0.0592·7 are the same couple.
	a, c := byID(t, ev, "x-rhe").R.BDFE.Kcal, byID(t, ev, "x-csv").R.BDFE.Kcal
	if math.Abs(a-c) > 0.01 {
		t.Errorf("RHE %.3f vs NHE %.3f", a, c)
	}
	// A pH outside water, or out of range, is one clear problem.
	for _, bad := range []string{
		"{id: m, solvent: MeCN, ph: 7, e_pcet: 0.5, source: s}",
		"{id: m, solvent: water, ph: 40, e_pcet: 0.5, source: s}",
	} {
		_, err := Load(File{"b.yaml", []byte("format: hatsieve/1\ncouples:\n  - " + bad + "\n")})
		if err == nil || !strings.Contains(err.Error(), "ph") {
			t.Errorf("%s: %v", bad, err)
		}
	}
}

// A couple with no solvent of its own plays in the working solvent: its
// e_pcet without an electrode is then vs NHE in water.
func TestPHFieldInWorkingWater(t *testing.T) {
	lib, err := Load(File{"n.yaml", []byte("format: hatsieve/1\ncouples:\n  - {id: w, ph: 0, e_pcet: 0.30, source: s}\n")})
	if err != nil {
		t.Fatal(err)
	}
	ev := evaluate(t, lib, Options{Solvent: "water", Cond: thermo.Conditions{Basis: thermo.Basis2010}})
	// Source: 2010 review §5.6.2, flavin 0.30 V vs NHE at pH 0 → 64.5 (checked).
	if b := byID(t, ev, "w").R.BDFE.Kcal; math.Abs(b-64.5) > 0.05 {
		t.Errorf("BDFE %.2f, want 64.5", b)
	}
}
