package thermo

import (
	"fmt"
	"math"
	"strings"
)

// Comparing across phases and solvents.
//
// A BDFE measured in one medium meets one from another through the reviews'
// approximation for a non-polar X–H, where X• and X–H are solvated alike:
//
//	BDFE(solution) ≈ BDFE(gas) + ΔG°solv(H•)
//
// (Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961, §3.1.1), with
// ΔG°solv(H•) = G_H(solvent) − ΔfG°(H•, g) on the basis in force. A pair whose
// couples sit in different media is therefore compared on their H2 margins:
// ΔG° = [BDFE(D) − G_H(D)] − [BDFE(A) − G_H(A)], which is the same on either
// C_G basis for cycle-derived BDFEs, and reduces to BDFE(D) − BDFE(A) in one
// solvent.

// PolarCrossSigma is the extra σ (kcal/mol) charged to each O–H or N–H couple
// of a cross-phase pair. The 2010 review (§3.1.1) says the approximation
// above holds for non-polar X–H, and that for an H-bonding group the
// difference in solvation of X• and X–H must be estimated separately
// (following Ingold, with Abraham's hydrogen-bond model). How large it is
// depends on the solvent's H-bond basicity; 2 kcal/mol is our estimate of
// its size for a phenol or N–H in a basic solvent (the ±2 kcal/mol spread of
// Bordwell-relation BDFEs, Bordwell, Liu, J. Am. Chem. Soc. 1996, 118, 10819,
// sets the scale). Estimate.
const PolarCrossSigma = 2.0

// CrossPhaseNote is the note a screen shows beside a pair whose couples sit
// in different media.
const CrossPhaseNote = "different media: compared as BDFE − G_H of each side, i.e. BDFE(solution) ≈ BDFE(gas) + ΔG°solv(H•) (an approximation for non-polar X–H; σ added)"

// PolarCrossNote is added for an O–H or N–H couple in a cross-phase pair.
const PolarCrossNote = "O–H/N–H: H-bonding to the solvent makes the gas/solution approximation weaker; σ widened by 2.0 kcal/mol (estimate)"

// IsPolarBond reports whether a bond label ("O–H", "N-H", "O—H") names an
// O–H or N–H bond, whose solvation differs between X• and X–H.
func IsPolarBond(bond string) bool {
	b := strings.TrimSpace(bond)
	if b == "" {
		return false
	}
	return (b[0] == 'O' || b[0] == 'N') && len(b) > 1 && !isLetter(b[1])
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }

// CrossSigma2 is the σ² one couple adds to a pair across media: its
// solvent's CrossSigma, and PolarCrossSigma for an O–H or N–H bond.
func CrossSigma2(cp *Couple) float64 {
	s2 := 0.0
	if cp.Solvent != nil {
		s2 = cp.Solvent.CrossSigma * cp.Solvent.CrossSigma
	}
	if IsPolarBond(cp.Bond) {
		s2 += PolarCrossSigma * PolarCrossSigma
	}
	return s2
}

// crossDG is ΔG° of a pair across media: the difference of H2 margins, with
// both margins' σ and both sides' CrossSigma2 in quadrature. The ranker
// computes the same sums in the same order.
func crossDG(d, a *Resolved) Energy {
	s := pairSigma2(marginSig2(d), marginSig2(a), 0, 0, CrossSigma2(d.Couple), CrossSigma2(a.Couple), false, true)
	return Energy{Kcal: d.Margin.Kcal - a.Margin.Kcal, SigData: math.Sqrt(s)}
}

// marginSig2 is σ² of r's H2 margin, rounded as written.
func marginSig2(r *Resolved) float64 {
	s := r.Margin.Sigma()
	return float64(s * s)
}

// SolvationOfH returns ΔG°solv(H•) = G_H(s) − ΔfG°(H•, g) under c, the
// amount by which a non-polar X–H's BDFE in s exceeds its gas-phase BDFE.
// It depends on the basis, as G_H does.
func SolvationOfH(s *Solvent, c Conditions) (Number, error) {
	gh, err := c.H2LineOf(s)
	if err != nil {
		return Number{}, err
	}
	g := GasHAtomFreeEnergy(BDFETemperature)
	return Number{V: gh.V - g, Sigma: gh.Sigma, Source: "G_H − ΔfG°(H•, g); " + gh.Source, Status: worst(gh.Status, Derived)}, nil
}

// TemperatureText says what the temperature in force changes, for the top
// line of the screens and the commands: "298.15 K", or "ΔG°, BDFEs at
// 298.15 K; log K at 323.15 K" when another temperature is set.
func TemperatureText(c Conditions) string {
	if c.T() == BDFETemperature {
		return "298.15 K"
	}
	return fmt.Sprintf("ΔG°, BDFEs at 298.15 K; log K at %.2f K", c.T())
}

// ConditionsText is the line of conditions in force for working solvent s:
// solvent, C_G and its basis (explicit, estimated), H2 line, temperature,
// pH and units, e.g. "acetonitrile · C_G 52.60 kcal/mol vs Fc+/Fc (2022
// basis) · H2 line 51.95 · 298.15 K · kcal/mol".
func ConditionsText(c Conditions, s *Solvent, u Units) string {
	var parts []string
	parts = append(parts, s.Name)
	if cg, err := c.CGOf(s); err == nil {
		b := c.BasisLabel(s) + " basis"
		if cg.Status == Estimate {
			b += ", estimate"
		}
		parts = append(parts, fmt.Sprintf("C_G %.2f %s vs %v (%s)", u.From(cg.V), u.Label(), s.Ref, b))
	} else if s.IsGas() {
		parts = append(parts, "no C_G (gas phase)")
	}
	if gh, err := c.H2LineOf(s); err == nil {
		e := ""
		if gh.Status == Estimate {
			e = " (estimate)"
		}
		parts = append(parts, fmt.Sprintf("H2 line %.2f%s", u.From(gh.V), e))
	}
	if c.PH2Atm() != StandardH2Pressure {
		parts = append(parts, fmt.Sprintf("p(H2) %g atm", c.PH2Atm()))
	}
	parts = append(parts, TemperatureText(c))
	if c.PH != nil {
		parts = append(parts, fmt.Sprintf("pH %g", *c.PH))
	}
	parts = append(parts, u.Label())
	return strings.Join(parts, " · ")
}

// CGEstimated reports whether C_G of s on basis b is an estimate (no
// published value: see the Source of the number).
func (s *Solvent) CGEstimated(b Basis) bool {
	n := s.CG2022
	if b == Basis2010 {
		n = s.CG2010
	}
	return n != nil && n.Status == Estimate
}

// OnEstimate reports whether the constants in force for s under c rest on an
// estimate: the C_G of the basis in force, or the H2 line. An explicit C_G
// is the user's and is not an estimate.
func (c Conditions) OnEstimate(s *Solvent) bool {
	cg, err := c.CGOf(s)
	if err == nil && cg.Status == Estimate {
		return true
	}
	gh, err := c.H2LineOf(s)
	return err == nil && gh.Status == Estimate
}

// H2OnEstimate reports whether r's H2 verdict (its margin) rests on an
// estimated constant under c. For a cycle-derived BDFE in a solvent with a
// known E°(H+/H2), C_G cancels in the margin, so an estimated C_G does not
// matter; otherwise the H2 line's status decides.
func (r *Resolved) H2OnEstimate(c Conditions) bool {
	s := r.Couple.Solvent
	if s.IsGas() {
		return false
	}
	if r.BDFE.CG == s && s.EH2 != nil {
		return s.EH2.Status == Estimate
	}
	if r.BDFE.CG == s && !c.Explicit(s) && s.GH != nil && s.CG2022 != nil {
		return s.GH.Status == Estimate || s.CG2022.Status == Estimate
	}
	return r.H2Line != nil && r.H2Line.Status == Estimate
}

// BDFEOnEstimate reports whether r's BDFE contains an estimated C_G under c:
// a cycle in a solvent whose C_G in force is an estimate, or a directly
// given value moved between bases by one.
func (r *Resolved) BDFEOnEstimate(c Conditions) bool {
	s := r.Couple.Solvent
	if s.IsGas() || c.Explicit(s) {
		return false
	}
	if r.BDFE.CG == s {
		return s.CGEstimated(c.Basis)
	}
	in := r.Couple.In
	if (r.Route == RouteDirect || r.Route == RouteBDE) && in.BasisGiven && in.BDFEBasis != c.Basis {
		return s.CGEstimated(Basis2010) || s.CGEstimated(Basis2022)
	}
	return false
}

// OnEstimate reports whether the pair's verdict rests on an estimated
// constant on the basis in force: the donor's H2 verdict, or a ΔG° in which
// an estimated C_G or H2 line does not cancel.
func (p Pair) OnEstimate(c Conditions) bool {
	if p.Donor.H2OnEstimate(c) {
		return true
	}
	if p.CrossSolvent {
		return p.Donor.H2OnEstimate(c) || p.Acceptor.H2OnEstimate(c)
	}
	s := p.Donor.Couple.Solvent
	if p.Donor.BDFE.CG == s && p.Acceptor.BDFE.CG == s {
		return false // C_G cancels
	}
	return p.Donor.BDFEOnEstimate(c) || p.Acceptor.BDFEOnEstimate(c)
}

// BasisAssumed reports whether r's BDFE was given directly in solution
// without saying on which C_G basis: it is then taken on the basis in force,
// so its H2 verdict moves with the basis while its value does not.
func (r *Resolved) BasisAssumed() bool {
	in := r.Couple.In
	if r.Couple.Solvent == nil || r.Couple.Solvent.IsGas() || in.BasisGiven {
		return false
	}
	return r.Route == RouteDirect || r.Route == RouteBDE
}

// RouteOf returns the value of route rt among r's routes.
func (r *Resolved) RouteOf(rt Route) (RouteValue, bool) {
	for _, v := range r.Routes {
		if v.Route == rt {
			return v, true
		}
	}
	return RouteValue{}, false
}

// NernstSlope returns 2.303RT/F in volts at temperature t: 0.05916 V at
// 298.15 K, the shift of a one-proton, one-electron potential per pH unit.
func NernstSlope(t float64) float64 { return RTLn10(t) / FaradayKcal }

// VsRHE returns a potential vs NHE in water as a potential vs the reversible
// hydrogen electrode at pH: E(RHE) = E(NHE) + 2.303RT/F·pH (298.15 K).
func VsRHE(eNHE, pH float64) float64 { return eNHE + NernstSlope(BDFETemperature)*pH }

// FromRHE is the inverse of VsRHE.
func FromRHE(eRHE, pH float64) float64 { return eRHE - NernstSlope(BDFETemperature)*pH }

// ElectrodeViewRHE gives the two potentials of an electrode view in water
// (vs NHE) against RHE at pH.
func ElectrodeViewRHE(v ElectrodeView, pH float64) (thermoneutral, h2Onset float64) {
	return VsRHE(v.Thermoneutral, pH), VsRHE(v.H2Onset, pH)
}

// EstimateNote is the note for a verdict resting on an estimated constant.
const EstimateNote = "rests on an estimated constant (a 2022-basis C_G or an H2 line no source gives): see 'hatsieve solvents'"

// Notes are what a screen shows beside a pair under c: the cross-phase
// approximation and, for an O–H or N–H side, its weaker form; a verdict
// resting on an estimated constant; a side whose BDFE was given without a
// basis.
func (p Pair) Notes(c Conditions) []string {
	var out []string
	if p.CrossSolvent {
		out = append(out, CrossPhaseNote)
		if IsPolarBond(p.Donor.Couple.Bond) || IsPolarBond(p.Acceptor.Couple.Bond) {
			out = append(out, PolarCrossNote)
		}
	}
	if p.OnEstimate(c) {
		out = append(out, EstimateNote)
	}
	for _, r := range []*Resolved{p.Donor, p.Acceptor} {
		if r.BasisAssumed() {
			out = append(out, fmt.Sprintf("%s: BDFE given without a basis, taken on the %s basis", r.Couple.ID, c.Basis))
		}
	}
	return out
}
