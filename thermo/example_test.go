package thermo_test

import (
	"fmt"

	"github.com/hatsieve/hatsieve/thermo"
)

// The proton-first cycle for N-hydroxyphthalimide in acetonitrile: pKa 23.5
// and E°(PINO•/PINO⁻) = −0.1 V vs Fc+/Fc give 84.8 kcal/mol on the 2010 basis
// (Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §5.1.2).
func ExampleCycle() {
	mecn := thermo.Builtin().MustLookup("MeCN")
	pka := thermo.Value{V: 23.5, Sigma: 0.5}
	e := thermo.Potential{Value: thermo.Value{V: -0.1, Sigma: 0.02}, Vs: thermo.Fc}
	bdfe, _, err := thermo.Cycle(pka, e, mecn, thermo.Conditions{Basis: thermo.Basis2010})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("BDFE %.1f kcal/mol, σ(data) %.2f, σ(C_G) %.2f\n", bdfe.Kcal, bdfe.SigData, bdfe.SigCG)
	// Output:
	// BDFE 84.7 kcal/mol, σ(data) 0.82, σ(C_G) 1.00
}

// Resolve picks a route, checks that routes agree and places the bond against
// the H2 line. The margin in volts is the potential of hydrogenation, the
// same on either C_G basis.
func ExampleResolve() {
	mecn := thermo.Builtin().MustLookup("acetonitrile")
	nhpi := &thermo.Couple{ID: "nhpi", Name: "N-hydroxyphthalimide", Bond: "O–H", Solvent: mecn,
		In: thermo.Inputs{
			PKa:    &thermo.Value{V: 23.5},
			EAnion: &thermo.Potential{Value: thermo.Value{V: -0.1}, Vs: thermo.Fc},
		}}
	for _, b := range []thermo.Basis{thermo.Basis2010, thermo.Basis2022} {
		r, err := thermo.Resolve(nhpi, thermo.Conditions{Basis: b})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%v basis: BDFE %.1f via %v; H2 line %.2f; margin %+.1f = %+.3f V vs H2, %v\n",
			b, r.BDFE.Kcal, r.Route.Short(), r.H2Line.V, r.Margin.Kcal, thermo.PotentialVsH2(r.Margin), r.Tendency)
	}
	// Output:
	// 2010 basis: BDFE 84.7 via PT-ET; H2 line 54.25; margin +30.4 = +1.318 V vs H2, uphill
	// 2022 basis: BDFE 82.4 via PT-ET; H2 line 51.95; margin +30.4 = +1.318 V vs H2, uphill
}

// MakePair gives ΔG°(HAT) for TEMPO–H giving its H atom to the phthalimide
// N-oxyl radical (PINO•), both from their cycles in acetonitrile, so C_G and
// its uncertainty cancel. TEMPO–H: pKa 41, E(TEMPO•/TEMPO⁻) −1.95 V vs Fc
// (2010 review §5.1.1; a peak potential, used here as E°).
func ExampleMakePair() {
	mecn := thermo.Builtin().MustLookup("MeCN")
	c := thermo.Conditions{Basis: thermo.Basis2022}
	cycle := func(id string, pka, e float64) *thermo.Resolved {
		r, err := thermo.Resolve(&thermo.Couple{ID: id, Solvent: mecn, In: thermo.Inputs{
			PKa:    &thermo.Value{V: pka, Sigma: 0.5},
			EAnion: &thermo.Potential{Value: thermo.Value{V: e, Sigma: 0.02}, Vs: thermo.Fc},
		}}, c)
		if err != nil {
			panic(err)
		}
		return &r
	}
	tempoh, nhpi := cycle("tempoh", 41, -1.95), cycle("nhpi", 23.5, -0.1)
	p := thermo.MakePair(tempoh, nhpi, c)
	fmt.Printf("ΔG°(HAT) %.1f ± %.1f kcal/mol, log10 K %.1f, σ(C_G) in ΔG %.0f\n",
		p.DG.Kcal, p.DG.Sigma(), p.Log10K, p.DG.SigCG)
	fmt.Printf("H2 wins: %v\n", p.H2Wins)
	// Output:
	// ΔG°(HAT) -18.8 ± 1.2 kcal/mol, log10 K 13.8, σ(C_G) in ΔG 0
	// H2 wins: false
}

// ElectrodeWindow: an acid of pKa 12.5 with an electrode in acetonitrile. H
// delivery to an acceptor bond of 60 kcal/mol becomes thermoneutral at a
// milder potential than the one at which the same acid starts to give H2.
func ExampleElectrodeWindow() {
	mecn := thermo.Builtin().MustLookup("MeCN")
	v, err := thermo.ElectrodeWindow(60, 12.5, mecn, thermo.Conditions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("thermoneutral %+.3f V vs %v, H2 onset %+.3f V, window %.3f V\n", v.Thermoneutral, v.Ref, v.H2Onset, v.Window)
	// Output:
	// thermoneutral -0.419 V vs Fc+/Fc, H2 onset -0.767 V, window 0.349 V
}
