package thermo

// Pair is one donor with one acceptor and the metrics of H-atom transfer
// between them: D–H + A• → D• + A–H.
type Pair struct {
	Donor, Acceptor *Resolved

	// DG is ΔG°(HAT) = BDFE(D–H) − BDFE(A–H), with C_G cancelling when both
	// BDFEs come from the cycle in the same solvent.
	DG     Energy
	Log10K float64

	// CrossSolvent marks a donor and acceptor whose data come from different
	// solvents (or one from the gas phase): DG is then the difference of
	// their H2 margins, BDFE(solution) ≈ BDFE(gas) + ΔG°solv(H•), and
	// carries both margins' σ and CrossSigma2 of each couple.
	CrossSolvent bool

	// Stepwise first-step free energies (nil where the data are missing or
	// the solvents differ):
	//   PT first: D–H + A• → D⁻ + A–H•+, 2.303RT·[pKa(DH) − pKa(AH•+)]
	//   ET first: D–H + A• → D–H•+ + A⁻, F·[E°(DH•+/DH) − E°(A•/A⁻)]
	// and the second legs that complete each path.
	PTFirst, ETSecond *float64 // ETSecond = F·[E°(D•/D⁻) − E°(AH•+/AH)]
	ETFirst, PTSecond *float64 // PTSecond = 2.303RT·[pKa(DH•+) − pKa(AH)]

	// H2Wins: the acceptor's bond lies below the H2 line, so H2 formation
	// beats H delivery to it for every donor.
	H2Wins bool
}

// MakePair computes the metrics of donor d with acceptor a.
func MakePair(d, a *Resolved, c Conditions) Pair {
	p := Pair{Donor: d, Acceptor: a}
	p.DG = Diff(d.BDFE, a.BDFE)
	ds, as := d.Couple.Solvent, a.Couple.Solvent
	if ds != as {
		// Different media: compare H2 margins, BDFE(solution) ≈ BDFE(gas)
		// + ΔG°solv(H•) (see CrossPhaseNote).
		p.CrossSolvent = true
		p.DG = crossDG(d, a)
	}
	p.Log10K = -p.DG.Kcal / RTLn10(c.T())
	k := RTLn10(BDFETemperature) // pKa differences are 298.15 K free energies
	p.H2Wins = a.Margin.Kcal < 0
	if p.CrossSolvent {
		return p
	}
	di, ai := d.Couple.In, a.Couple.In
	if di.PKa != nil && ai.PKaCation != nil {
		p.PTFirst = ptr(k * (di.PKa.V - ai.PKaCation.V))
	}
	if e1, ok := potentialVsRef(di.EAnion, ds); ok {
		if e2, ok := potentialVsRef(ai.ECation, as); ok {
			p.ETSecond = ptr(FaradayKcal * (e1 - e2))
		}
	}
	if e1, ok := potentialVsRef(di.ECation, ds); ok {
		if e2, ok := potentialVsRef(ai.EAnion, as); ok {
			p.ETFirst = ptr(FaradayKcal * (e1 - e2))
		}
	}
	if di.PKaCation != nil && ai.PKa != nil {
		p.PTSecond = ptr(k * (di.PKaCation.V - ai.PKa.V))
	}
	return p
}

func potentialVsRef(p *Potential, s *Solvent) (float64, bool) {
	if p == nil {
		return 0, false
	}
	r, err := s.ToRef(*p)
	if err != nil {
		return 0, false
	}
	return r.V, true
}

func ptr(v float64) *float64 { return &v }
