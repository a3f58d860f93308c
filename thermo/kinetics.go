package thermo

import (
	"errors"
	"fmt"
	"math"
)

// ---- equilibrium conversion

// Conversion is the equilibrium position of D–H + A ⇌ D + A–H started from
// [D–H]0 and [A]0 with no products, one H transferred per D–H and per A
// (1:1:1). A combined donor (acid + reductant) delivers one H per acid and
// one electron per reductant: the same count per H, with [D–H]0 the
// concentration of the limiting partner.
type Conversion struct {
	X        float64 // [D] = [A–H] at equilibrium, mol/L
	Fraction float64 // X/[A]0: the fraction of acceptor converted, 0..1
	// Left is ([A]0 − X)/[A]0, computed without the cancellation of
	// 1 − Fraction, so that 10⁻¹⁵ of acceptor left is not rounded to 0.
	Left float64
}

// EquilibriumConversion solves K = x²/((d0 − x)(a0 − x)) for x in
// [0, min(d0, a0)], with K = 10^log10K, d0 = [D–H]0 and a0 = [A]0 in mol/L.
//
// (K − 1)x² − K(d0 + a0)x + K·d0·a0 = 0 has the root
//
//	x = 2·d0·a0 / (s + r),  s = d0 + a0,  r = √((d0 − a0)² + 4·d0·a0/K),
//
// the form with no difference of near-equal numbers: both terms of the
// denominator are positive for every K, including K = 1 (x = d0·a0/s) where
// the textbook form divides 0 by 0. 1/K is taken as 10^(−log10K), so K
// itself is never formed (log10K = ±300 neither overflows nor rounds to
// 1). What is left of the acceptor, a0 − x = a0·(a0 − d0 + r)/(s + r), is
// computed with r − (d0 − a0) = (4·d0·a0/K)/(r + d0 − a0) when d0 > a0.
func EquilibriumConversion(log10K, d0, a0 float64) (Conversion, error) {
	if math.IsNaN(log10K) {
		return Conversion{}, errors.New("log K is not a number")
	}
	for _, c := range [...]float64{d0, a0} {
		if !(c > 0) || math.IsInf(c, 0) {
			return Conversion{}, fmt.Errorf("concentrations must be finite and above 0 mol/L, got %g", c)
		}
	}
	s := d0 + a0
	// q = 4·d0·a0/K, as 4·d0·a0·10^(−log10K) = (2√(d0·a0)·10^(−log10K/2))²:
	// the root r is then a hypotenuse, which neither overflows nor
	// underflows where its square would.
	h := 2 * math.Sqrt(d0) * math.Sqrt(a0) * math.Pow(10, -log10K/2)
	r := math.Hypot(d0-a0, h)
	var x, left float64
	if math.IsInf(r, 1) {
		// K so small that no acceptor is converted to double precision.
		return Conversion{X: 0, Fraction: 0, Left: 1}, nil
	}
	x = 2 * d0 * a0 / (s + r)
	if d0 > a0 {
		// r − (d0 − a0) = h²/(r + d0 − a0), h² = 4·d0·a0/K.
		diff := h / (r + (d0 - a0)) * h
		left = diff / (s + r)
	} else {
		left = (a0 - d0 + r) / (s + r)
	}
	return Conversion{X: x, Fraction: min(x/a0, 1), Left: left}, nil
}

// ---- the Marcus cross relation

// CollisionZ is Z, the collision frequency of the cross relation,
// 10^11 M⁻¹ s⁻¹ (the value used for H-atom transfer by Mayer and
// co-workers, e.g. Acc. Chem. Res. 2011, 44, 36).
const CollisionZ = 1e11

// SelfExchange is the self-exchange rate constant of a couple, X–H + X• →
// X• + H–X, in M⁻¹ s⁻¹, with its uncertainty as a factor (k is known
// within ×/÷ Factor; 1 or 0 means not stated), where it comes from and its
// status (checked, derived, from memory, estimate...).
type SelfExchange struct {
	K      float64
	Factor float64
	Source string
	Status string
	Note   string
}

// Sigma10 is the uncertainty of log10 k: log10 of the factor, or 0 when
// none was stated.
func (s SelfExchange) Sigma10() float64 {
	if s.Factor > 1 {
		return math.Log10(s.Factor)
	}
	return 0
}

// CrossNote is the accuracy that goes with every cross-relation estimate.
const CrossNote = "Marcus cross relation, work terms neglected: good to about an order of magnitude where it holds " +
	"(within one or two orders of magnitude in the tests of Mayer, Acc. Chem. Res. 2011, 44, 36)"

// Cross is an estimate of the rate constant of D–H + A → D + A–H from the
// Marcus cross relation
//
//	k_DA = √(k_DD·k_AA·K·f),  ln f = (ln K)² / (4·ln(k_DD·k_AA/Z²)).
type Cross struct {
	Log10K   float64 // log10 of k_DA in M⁻¹ s⁻¹
	F        float64 // f (0 < f ≤ 1 while k_DD·k_AA < Z²)
	Log10F   float64
	Sigma10  float64 // σ of Log10K from the inputs' σ (k_self factors, σ of log K); not the method's own error
	Lambda   float64 // the intrinsic barrier scale λ = 4·ΔG‡0 in kcal/mol
	OutRange bool    // |ln K| > |ln(k_DD·k_AA/Z²)|: outside the range of the relation (see CrossRelation)
	Note     string  // CrossNote, then what the range test found (no energies: see Lambda)
}

// CrossRelation estimates k_DA for a pair with log10 K = log10K (σ
// sigmaLog10K) from the self-exchange constants of the donor's couple (kD)
// and the acceptor's (kA), at temperature t (K; it only scales Lambda).
//
// In base 10, with L = log10 K and M = log10(k_DD·k_AA/Z²) (< 0), the
// relation reads log10 f = L²/(4M) and
//
//	log10 k_DA = ½·(log10(k_DD·k_AA) + L + L²/(4M)).
//
// Range. The relation is Marcus' parabola ΔG‡ = ΔG‡0·(1 + ΔG°/λ)² with
// λ = 4·ΔG‡0 and ΔG‡0 = −½RT·ln(k_DD·k_AA/Z²): as a function of L,
// log10 k_DA rises to its maximum, k = Z, at L = −2M (ΔG° = −λ, no barrier)
// and falls beyond it (the inverted region; for the reverse direction the
// same holds at L = 2M). So |L| ≥ 2|M| is certainly outside its range. It is
// flagged already at |L| > |M| (|ΔG°| > λ/2): there the downhill barrier has
// fallen to a quarter of ΔG‡0, the f term carries a quarter of M, the
// estimate lies within a few orders of magnitude of Z, where encounter
// rather than activation limits the rate, and nothing in the tests of the
// relation for H-atom transfer reaches that far. A bound halfway to the
// mathematical one is a judgement, not a published limit (common practice,
// no source).
func CrossRelation(kD, kA SelfExchange, log10K, sigmaLog10K, t float64) (Cross, error) {
	for _, k := range [...]float64{kD.K, kA.K} {
		if !(k > 0) || math.IsInf(k, 0) {
			return Cross{}, fmt.Errorf("a self-exchange rate constant must be finite and above 0 M⁻¹ s⁻¹, got %g", k)
		}
	}
	if math.IsNaN(log10K) || math.IsInf(log10K, 0) {
		return Cross{}, fmt.Errorf("log K must be finite, got %g", log10K)
	}
	a := math.Log10(kD.K) + math.Log10(kA.K)
	m := a - 2*math.Log10(CollisionZ)
	if !(m < 0) {
		return Cross{}, fmt.Errorf("k_DD·k_AA = 10^%.2f M⁻² s⁻² is not below Z² = 10^22: the cross relation does not apply", a)
	}
	L := log10K
	lf := L * L / (4 * m)
	c := Cross{Log10F: lf, F: math.Pow(10, lf)}
	c.Log10K = 0.5 * (a + L + lf)
	// σ: ∂/∂log10 k_ii = ½(1 − L²/(4M²)); ∂/∂L = ½(1 + L/(2M)).
	gk := 0.5 * (1 - L*L/(4*m*m))
	gl := 0.5 * (1 + L/(2*m))
	c.Sigma10 = math.Sqrt(gk*gk*(kD.Sigma10()*kD.Sigma10()+kA.Sigma10()*kA.Sigma10()) + gl*gl*sigmaLog10K*sigmaLog10K)
	c.Lambda = -2 * RTLn10(t) * m
	c.Note = CrossNote
	if math.Abs(L) > math.Abs(m) {
		c.OutRange = true
		// λ itself is left to the display, in the units chosen there.
		c.Note += fmt.Sprintf("; |log K| = %.1f is beyond |log10(k_DD·k_AA/Z²)| = %.1f (|ΔG°| above λ/2): outside the range of the relation", math.Abs(L), -m)
	}
	if c.Log10K > DiffusionLog10 {
		c.Note += fmt.Sprintf("; above ~10^%g M⁻¹ s⁻¹ diffusion, not H transfer, limits the rate", DiffusionLog10)
	}
	return c, nil
}

// DiffusionLog10 is log10 of the rate constant, M⁻¹ s⁻¹, above which a
// bimolecular reaction in a common organic solvent is limited by
// diffusion (about 10^10 in MeCN; from memory).
const DiffusionLog10 = 10.0

// ---- H-atom transfer against H2 evolution

// H2Race says, for a pair that is downhill to H-atom transfer (ΔG° < −2σ)
// while its donor is downhill to H2 (Tendency Downhill at the pressure in
// force), what can be said about which wins. It returns "" for any other
// pair. No library field holds rates of H2 evolution, so the answer is
// thermodynamic: per H atom, which path releases more free energy, and the
// HAT estimate when there is one. Its energies are given in units u.
func H2Race(p Pair, c Conditions, hat *Cross, u Units) string {
	if !(p.DG.Kcal < -2*p.DG.Sigma()) || p.Donor.Tendency != Downhill {
		return ""
	}
	s := fmt.Sprintf("HAT (ΔG° %+.1f %s) and H2 evolution from the donor (%+.1f %s per H at %s atm) are both downhill: ",
		u.From(p.DG.Kcal), u.Label(), u.From(p.Donor.Margin.Kcal), u.Label(), fmtG(c.PH2Atm()))
	if hat != nil {
		s += fmt.Sprintf("HAT estimated at 10^%.1f M⁻¹ s⁻¹, but ", hat.Log10K)
	}
	s += "no rate data for H2 evolution; thermodynamics only"
	switch {
	case p.DG.Kcal < p.Donor.Margin.Kcal:
		s += " (HAT is the more downhill per H)"
	case p.DG.Kcal > p.Donor.Margin.Kcal:
		s += " (H2 evolution is the more downhill per H)"
	}
	return s
}

func fmtG(v float64) string { return fmt.Sprintf("%g", v) }

// ---- one call for a pair in a flask

// FlaskEstimate is what the conditions and a flask make of one pairing: the
// equilibrium conversion, the cross-relation rate estimate (nil, with the
// reason in NoRate, when a self-exchange constant is missing or the
// relation does not apply) and, for a pair, the H2 race text (see H2Race).
type FlaskEstimate struct {
	Conversion Conversion
	Cross      *Cross
	NoRate     string
	Race       string
}

// EstimateLogK computes the conversion and rate estimate for log10 K (σ
// sigLog10K) in flask f, with the donor's and acceptor's self-exchange
// constants kD and kA (nil when unknown). It fails only for concentrations
// that cannot be used.
func EstimateLogK(log10K, sigLog10K float64, c Conditions, f Flask, kD, kA *SelfExchange) (FlaskEstimate, error) {
	var e FlaskEstimate
	d, a := f.Concentrations()
	conv, err := EquilibriumConversion(log10K, d, a)
	if err != nil {
		return e, err
	}
	e.Conversion = conv
	switch {
	case kD == nil && kA == nil:
		e.NoRate = "no self-exchange rate constant for either couple"
	case kD == nil:
		e.NoRate = "no self-exchange rate constant for the donor's couple"
	case kA == nil:
		e.NoRate = "no self-exchange rate constant for the acceptor's couple"
	default:
		x, err := CrossRelation(*kD, *kA, log10K, sigLog10K, c.T())
		if err != nil {
			e.NoRate = err.Error()
			break
		}
		e.Cross = &x
	}
	return e, nil
}

// EstimatePair is EstimateLogK for a pair (log K and its σ from ΔG° at the
// temperature in force), with the H2 race text, its energies in units u.
func EstimatePair(p Pair, c Conditions, f Flask, kD, kA *SelfExchange, u Units) (FlaskEstimate, error) {
	e, err := EstimateLogK(p.Log10K, p.DG.Sigma()/RTLn10(c.T()), c, f, kD, kA)
	if err != nil {
		return e, err
	}
	e.Race = H2Race(p, c, e.Cross, u)
	return e, nil
}
