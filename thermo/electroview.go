package thermo

// ElectrodeView answers, for an acid of pKa p used with an electrode in
// solvent s: at what potential does H delivery to an acceptor become
// thermoneutral, and at what potential does the same acid start to give H2?
type ElectrodeView struct {
	Thermoneutral float64 // V vs s.Ref: (BDFE_A − C_G − 2.303RT·p)/F
	H2Onset       float64 // V vs s.Ref: (G_H − C_G − 2.303RT·p)/F
	// Window is Thermoneutral − H2Onset in volts: positive when the acceptor
	// is reached at a milder potential than H2 evolution starts.
	Window float64
	Ref    Electrode
}

// ElectrodeWindow computes the electrode view for acceptor BDFE bdfeA
// (kcal/mol, on the basis of c) and acid pKa p in solvent s.
func ElectrodeWindow(bdfeA, p float64, s *Solvent, c Conditions) (ElectrodeView, error) {
	cg, err := c.CGOf(s)
	if err != nil {
		return ElectrodeView{}, err
	}
	gh, err := c.H2LineOf(s)
	if err != nil {
		return ElectrodeView{}, err
	}
	k := RTLn10(BDFETemperature)
	v := ElectrodeView{
		Thermoneutral: (bdfeA - cg.V - k*p) / FaradayKcal,
		H2Onset:       (gh.V - cg.V - k*p) / FaradayKcal,
		Ref:           s.Ref,
	}
	v.Window = v.Thermoneutral - v.H2Onset
	return v, nil
}

// PotentialVsH2 returns the potential of hydrogenation of a bond, E°(V vs
// H2) = (BDFE − G_H)/F (Agarwal et al., Chem. Rev. 2022): the H2 margin in
// volts.
func PotentialVsH2(margin Energy) float64 { return margin.Kcal / FaradayKcal }
