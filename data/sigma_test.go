package data

import "testing"

// A σ written as zero is a statement that the value is exact; it must not be
// replaced by the assumed default (README.md: defaults apply only to values
// given without σ).
func TestStatedZeroSigmaIsKept(t *testing.T) {
	lib, err := Load(File{Name: "exact.yaml", Data: []byte(`format: hatsieve/1
solvent: acetonitrile
couples:
  - id: exact
    bond: O–H
    pka: "23.5 ± 0"
    e_anion: {value: -0.1, sigma: 0, vs: Fc+/Fc}
  - id: bare
    bond: O–H
    pka: 23.5
    e_anion: -0.1 V vs Fc+/Fc
`)})
	if err != nil {
		t.Fatal(err)
	}
	byID := map[string]*Couple{}
	for _, c := range lib.Couples {
		byID[c.ID] = c
	}
	ex := byID["exact"].In
	if ex.PKa.Sigma != 0 || !ex.PKa.SigmaGiven || ex.EAnion.Sigma != 0 || !ex.EAnion.SigmaGiven {
		t.Errorf("stated σ 0 not kept as given: pKa %+v, E %+v", *ex.PKa, ex.EAnion.Value)
	}
	bare := byID["bare"].In
	if bare.PKa.SigmaGiven || bare.EAnion.SigmaGiven {
		t.Errorf("values without σ marked as given: pKa %+v, E %+v", *bare.PKa, bare.EAnion.Value)
	}
}
