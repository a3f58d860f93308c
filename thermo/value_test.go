package thermo

import (
	"math"
	"testing"
)

// Default uncertainties (common practice, no source): pKa 0.5, E° 0.02 V,
// direct BDFE 1.0 kcal/mol, marked assumed; a σ stated with the value, even
// zero, is kept.
func TestDefaultSigmas(t *testing.T) {
	for _, x := range []struct {
		in   Value
		want Value
	}{
		{Value{V: 3}, Value{V: 3, Sigma: 0.5, SigmaAssumed: true}},
		{Value{V: 3, Sigma: 0.2}, Value{V: 3, Sigma: 0.2}},
		{Value{V: 3, SigmaGiven: true}, Value{V: 3, SigmaGiven: true}},
		{Value{V: 3, Sigma: 0.5, SigmaAssumed: true}, Value{V: 3, Sigma: 0.5, SigmaAssumed: true}},
	} {
		if got := x.in.WithDefaultSigma(DefaultSigmaPKa); got != x.want {
			t.Errorf("%+v.WithDefaultSigma(0.5) = %+v, want %+v", x.in, got, x.want)
		}
	}

	mecn := solvent(t, "MeCN")
	k := RTLn10(DefaultTemperature)
	routes := map[string]Inputs{
		"proton first":   {PKa: val(23.5), EAnion: pot(-0.1, Fc)},
		"electron first": {PKaCation: val(-4), ECation: pot(0.71, Fc)},
		"combined":       {AcidPKa: val(20.7), Reductant: pot(0, Fc)},
	}
	for name, in := range routes {
		r := resolve(t, &Couple{ID: name, Solvent: mecn, In: in}, on2022)
		near(t, name+": σ(data) with default σ", r.BDFE.SigData, math.Hypot(k*DefaultSigmaPKa, FaradayKcal*DefaultSigmaE), 1e-12)
	}
	exact := Inputs{PKa: &Value{V: 23.5, SigmaGiven: true}, EAnion: &Potential{Value: Value{V: -0.1, SigmaGiven: true}, Vs: Fc}}
	r := resolve(t, &Couple{ID: "exact", Solvent: mecn, In: exact}, on2022)
	near(t, "σ(data) with σ given as 0", r.BDFE.SigData, 0, 0)
	d := resolve(t, &Couple{ID: "d", Solvent: mecn, In: Inputs{BDFE: val(70)}}, on2022)
	near(t, "direct BDFE default σ", d.BDFE.SigData, DefaultSigmaBDFE, 0)
}
