package thermo

import (
	"fmt"
	"math"
)

// Sources cited by the built-in tables.
const (
	srcReview2010  = "Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, Table 1"
	srcReview2022  = "Agarwal et al., Chem. Rev. 2022, 122, 1"
	srcRoberts     = "Roberts, Bullock, Inorg. Chem. 2013, 52, 3823"
	srcPegis       = "Pegis, Roberts, Wasylenko, Mayer, Mayer, Inorg. Chem. 2015, 54, 11883"
	srcCRC         = "CRC Handbook of Chemistry and Physics, electrochemical series"
	srcConnelly    = "Connelly, Geiger, Chem. Rev. 1996, 96, 877, Table 1"
	srcPavlishchuk = "Pavlishchuk, Addison, Inorg. Chim. Acta 2000, 298, 97"
	srcBordwell    = "Bordwell, Liu, J. Org. Chem. 1996, 61, 4778"
	srcNIST        = "NIST Chemistry WebBook, CODATA key values for H(g) and H2(g)"
	cgSigmaNote    = "; σ 1 kcal/mol is our estimate"
	// est2022 explains the 2022-basis C_G of a solvent the 2022 review's
	// table was not found for.
	est2022 = "estimate: the 2010 value lowered by acetonitrile's 2.3 kcal/mol revision; the revision is known " +
		"only for acetonitrile (−2.3) and water (−4.9), so σ = √(1² + 2.6²) = 2.8 covers a water-sized one"
)

// Estimated2022Sigma is the σ (kcal/mol) of a 2022-basis C_G that is an
// estimate (see est2022): C_G's own 1 kcal/mol and the 2.6 kcal/mol spread
// between the known revisions, in quadrature.
const Estimated2022Sigma = 2.8

// DefaultCrossSigma is the extra σ (kcal/mol) charged to each side of a pair
// whose two couples were measured in different solvents: the spread of
// Bordwell-relation BDFEs about gas-phase and non-polar values (±2 kcal/mol,
// Bordwell, Liu, J. Am. Chem. Soc. 1996, 118, 10819) split over the two sides.
const DefaultCrossSigma = 1.4

func num(v, sigma float64, src string, st Status) *Number {
	return &Number{V: v, Sigma: sigma, Source: src, Status: st}
}

// Builtin returns a fresh copy of the built-in solvent table.
func Builtin() *Table {
	// Reference-electrode offsets measured in water, used in every solvent
	// for SCE/NHE/Ag-AgCl relative to one another.
	const sceVsNHE, agclVsNHE = 0.241, 0.197

	// fcOffsets builds the offsets of an organic solvent whose reference is
	// Fc+/Fc, given E(Fc+/Fc) vs SCE in that solvent. NHE and Ag/AgCl go
	// through the aqueous offsets: Solvent.ConversionNote says so.
	fcOffsets := func(fcVsSCE, sigma float64, src string, st Status) map[Electrode]Number {
		aq := "; aqueous offset applied in an organic solvent"
		return map[Electrode]Number{
			SCE: {V: -fcVsSCE, Sigma: sigma, Source: src, Status: st},
			NHE: {V: -fcVsSCE - sceVsNHE, Sigma: sigma, Source: src + "; SCE +0.241 V vs NHE, " + srcCRC + aq, Status: worst(st, Derived)},
			AgCl: {V: -fcVsSCE - sceVsNHE + agclVsNHE, Sigma: sigma, Source: src + "; Ag/AgCl(sat. KCl) +0.197 V vs NHE, " + srcCRC + aq,
				Status: worst(st, Derived)},
		}
	}

	gas := &Solvent{
		Key: "gas", Name: "gas phase", Aliases: []string{"gas phase", "vapour", "vapor", "g"},
		GH: num(GasHAtomFreeEnergy(DefaultTemperature), 0.01,
			"ΔfG°(H•, g) = ΔfH° − T(S°(H•) − ½S°(H2)), "+srcNIST, Derived),
		CrossSigma: DefaultCrossSigma,
		Note:       "no C_G: give BDFEs directly or as BDEs",
	}

	mecn := &Solvent{
		Key: "acetonitrile", Name: "acetonitrile", Aliases: []string{"MeCN", "CH3CN", "ACN", "AN"},
		CG2010:     num(54.9, 1, srcReview2010+" (reproduces its NHPI and Fc/benzoic-acid examples)"+cgSigmaNote, Derived),
		CG2022:     num(52.6, 1, srcReview2022+cgSigmaNote, FromMemory),
		Ref:        Fc,
		EH2:        num(-0.028, 0.004, srcRoberts, Checked),
		Offsets:    mecnOffsets(fcOffsets),
		CH:         num(59.5, 0, srcBordwell, Checked),
		CrossSigma: DefaultCrossSigma,
	}

	water := &Solvent{
		Key: "water", Name: "water", Aliases: []string{"H2O", "aq", "aqueous"},
		CG2010: num(57.6, 1, srcReview2010+cgSigmaNote, FromMemory),
		CG2022: num(52.7, 1, srcReview2022+", Table 13 hydrazine row: 78.5 − 1.3642·7.2 − 23.0605·0.69"+cgSigmaNote, Derived),
		Ref:    NHE,
		EH2:    num(0, 0, "E°(H+/H2) = 0 V vs NHE by definition", Checked),
		Offsets: map[Electrode]Number{
			SCE:  {V: sceVsNHE, Sigma: 0.003, Source: srcCRC + " (some texts +0.244)", Status: Checked},
			AgCl: {V: agclVsNHE, Sigma: 0.002, Source: srcCRC + " (saturated KCl)", Status: Checked},
		},
		CrossSigma: DefaultCrossSigma,
		Note:       "potentials vs NHE; ferrocene is not a reference in water",
	}

	dmso := &Solvent{
		Key: "dmso", Name: "DMSO", Aliases: []string{"dimethyl sulfoxide", "dimethylsulfoxide", "Me2SO"},
		CG2010:     num(71.1, 1, srcReview2010+cgSigmaNote, FromMemory),
		CG2022:     num(71.1-2.3, Estimated2022Sigma, est2022, Estimate),
		Ref:        Fc,
		GH:         num(52.0, 2, "estimate: taken equal to acetonitrile's", Estimate),
		Offsets:    fcOffsets(0.44, 0.03, srcConnelly, FromMemory),
		CH:         num(73.3, 0, srcBordwell, Checked),
		CrossSigma: DefaultCrossSigma,
	}

	dmf := &Solvent{
		Key: "dmf", Name: "DMF", Aliases: []string{"N,N-dimethylformamide", "dimethylformamide"},
		CG2010:     num(69.7, 1, srcReview2010+cgSigmaNote, FromMemory),
		CG2022:     num(69.7-2.3, Estimated2022Sigma, est2022, Estimate),
		Ref:        Fc,
		EH2:        num(-0.662, 0.01, srcPegis, Checked),
		Offsets:    fcOffsets(0.45, 0.03, srcConnelly, FromMemory),
		CrossSigma: DefaultCrossSigma,
	}

	thf := &Solvent{
		Key: "thf", Name: "THF", Aliases: []string{"tetrahydrofuran"},
		CG2010:     num(66, 1.5, srcReview2010+cgSigmaNote, FromMemory),
		CG2022:     num(66-2.3, Estimated2022Sigma, est2022, Estimate),
		Ref:        Fc,
		GH:         num(52.0, 2, "estimate: taken equal to acetonitrile's", Estimate),
		Offsets:    fcOffsets(0.56, 0.03, srcConnelly, FromMemory),
		CrossSigma: DefaultCrossSigma,
	}

	meoh := &Solvent{
		Key: "methanol", Name: "methanol", Aliases: []string{"MeOH", "CH3OH"},
		CG2010:     num(65.3, 1.5, srcReview2010+cgSigmaNote, FromMemory),
		CG2022:     num(65.3-2.3, Estimated2022Sigma, est2022, Estimate),
		Ref:        Fc,
		GH:         num(52.0, 2, "estimate: taken equal to acetonitrile's", Estimate),
		CrossSigma: DefaultCrossSigma,
		Note:       "no published Fc+/Fc vs SCE conversion was found for methanol: give potentials vs Fc+/Fc",
	}

	benzene := &Solvent{
		Key: "benzene", Name: "benzene", Aliases: []string{"C6H6", "PhH"},
		CG2010:     num(71, 1.5, srcReview2010+cgSigmaNote, FromMemory),
		CG2022:     num(71-2.3, Estimated2022Sigma, est2022, Estimate),
		Ref:        Fc,
		GH:         num(52.0, 2, "estimate: taken equal to acetonitrile's", Estimate),
		CrossSigma: DefaultCrossSigma,
	}

	return NewTable(mecn, water, dmso, dmf, thf, meoh, benzene, gas)
}

// mecnOffsets are acetonitrile's conversions. Fc+/Fc vs SCE is +0.38 V
// (Pavlishchuk & Addison's table for MeCN at 25 °C); Connelly & Geiger's
// +0.40 V differs by 0.02 V, carried in σ = √(0.01² + 0.02²). Ag/Ag+ (0.01 M
// AgNO3 in MeCN) puts Fc+/Fc at +0.082 V (the same table, as quoted).
func mecnOffsets(fcOffsets func(float64, float64, string, Status) map[Electrode]Number) map[Electrode]Number {
	sig := math.Hypot(0.01, 0.02)
	src := srcPavlishchuk + " (+0.40 V in " + srcConnelly + "; the 0.02 V difference is in σ)"
	o := fcOffsets(0.38, sig, src, FromMemory)
	o[AgAg] = Number{V: -0.082, Sigma: 0.02,
		Source: srcPavlishchuk + ", Fc+/Fc +0.082 V vs Ag/Ag+ (0.01 M AgNO3, MeCN), as quoted in secondary sources; " +
			"σ 0.02 V for the electrolyte and junction (estimate)", Status: FromMemory}
	return o
}

// MustLookup is Lookup for names known to be in the table; it panics otherwise.
func (t *Table) MustLookup(name string) *Solvent {
	s, err := t.Lookup(name)
	if err != nil {
		panic(fmt.Sprint("thermo: ", err))
	}
	return s
}
