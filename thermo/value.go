package thermo

import "math"

// Default uncertainties for a value given without one. These are common
// practice in the field, not a published standard; a value that takes one is
// marked SigmaAssumed so screens can say so.
const (
	DefaultSigmaPKa  = 0.5  // pKa units
	DefaultSigmaE    = 0.02 // V
	DefaultSigmaBDFE = 1.0  // kcal/mol
)

// Value is a measured number with its standard uncertainty.
type Value struct {
	V            float64
	Sigma        float64
	SigmaAssumed bool // Sigma is a default, not given with the value
	// SigmaGiven says Sigma was stated with the value, so a zero means exact
	// (an electrode potential set by a potentiostat, say) and no default
	// replaces it.
	SigmaGiven bool
}

// WithDefaultSigma returns v, with sigma set to def and marked assumed when
// the value came without an uncertainty (Sigma zero and not explicitly given).
func (v Value) WithDefaultSigma(def float64) Value {
	if v.Sigma == 0 && !v.SigmaAssumed && !v.SigmaGiven {
		v.Sigma = def
		v.SigmaAssumed = true
	}
	return v
}

// Potential is a standard potential in volts, referred to an electrode in the
// couple's solvent.
type Potential struct {
	Value
	Vs        Electrode
	VsAssumed bool // the electrode was not written; the solvent's default was taken
}

// Energy is a free energy in kcal/mol whose uncertainty is kept in two parts:
// the part from the data (pKa, E°, a directly given BDFE, conversions) and the
// part from the solvent constant C_G. A difference of two energies that both
// carry the same solvent's C_G drops the C_G part.
type Energy struct {
	Kcal    float64
	SigData float64
	SigCG   float64
	// CG is the solvent whose C_G this energy contains, nil if none.
	CG *Solvent
}

// Sigma is the total standard uncertainty.
func (e Energy) Sigma() float64 { return math.Hypot(e.SigData, e.SigCG) }

// Diff returns a − b with the uncertainty of the difference: C_G parts of the
// same solvent cancel; otherwise every part is added in quadrature.
func Diff(a, b Energy) Energy {
	d := Energy{Kcal: a.Kcal - b.Kcal, SigData: math.Hypot(a.SigData, b.SigData)}
	if a.CG != nil && a.CG == b.CG {
		return d
	}
	d.SigCG = math.Hypot(a.SigCG, b.SigCG)
	return d
}
