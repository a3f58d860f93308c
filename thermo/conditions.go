package thermo

import (
	"fmt"
	"math"
	"strconv"
)

// StandardH2Pressure is p°, the pressure of the H2 standard state in atm,
// that of E°(H+/H2). (IUPAC now uses 1 bar; the difference,
// ½RT·ln 1.01325 = 0.004 kcal/mol, is far below any BDFE's uncertainty.)
const StandardH2Pressure = 1.0

// Default concentrations of a flask: [D–H]0 and [A]0 in mol/L.
const (
	DefaultDonorM    = 0.01
	DefaultAcceptorM = 0.01
)

// PH2Atm returns the H2 pressure in force in atm: c.PH2, or p° when it is
// zero.
func (c Conditions) PH2Atm() float64 {
	if c.PH2 == 0 {
		return StandardH2Pressure
	}
	return c.PH2
}

// H2PressureTerm returns ½·RT·ln(p/p°) in kcal/mol at temperature t (K) and
// H2 pressure p (atm): what a donor's H2 margin gains at pressure p. Per H
// atom, X–H → X• + ½H2(p) is ΔG = BDFE − G_H + ½RT·ln(p/p°), so below 1 atm
// the H2 line rises (the term is negative: 10⁻³ atm at 298.15 K gives −2.05)
// and more donors lie below it. It is zero at p = p°.
func H2PressureTerm(p, t float64) float64 {
	return 0.5 * GasConstant * t / (1000 * JoulePerCalorie) * math.Log(p/StandardH2Pressure)
}

// H2Shift is H2PressureTerm at the pressure in force. Like every free
// energy hatsieve reports it is a 298.15 K quantity (BDFETemperature):
// --temperature changes only log K and what follows from it.
func (c Conditions) H2Shift() float64 { return H2PressureTerm(c.PH2Atm(), BDFETemperature) }

// CheckPH2 reports a pressure that cannot be used: zero or less, or not
// finite.
func CheckPH2(p float64) error {
	if !(p > 0) || math.IsInf(p, 0) {
		return fmt.Errorf("H2 pressure must be a finite number of atm above 0, got %g", p)
	}
	return nil
}

// Flask holds the initial concentrations of an equilibrium estimate,
// mol/L. Zero fields take the defaults.
type Flask struct {
	DonorM, AcceptorM float64 // [D–H]0, [A]0
}

// Concentrations returns the flask's concentrations with the defaults
// filled in.
func (f Flask) Concentrations() (donor, acceptor float64) {
	donor, acceptor = f.DonorM, f.AcceptorM
	if donor == 0 {
		donor = DefaultDonorM
	}
	if acceptor == 0 {
		acceptor = DefaultAcceptorM
	}
	return donor, acceptor
}

// FlaskText is one line that names the conditions of a flask beyond the
// C_G basis: temperature, H2 pressure and, when f is not nil, the initial
// concentrations, e.g. "298.15 K | p(H2) 0.001 atm | [D–H]0 0.01 M, [A]0 0.01 M".
func FlaskText(c Conditions, f *Flask) string {
	s := TemperatureText(c) + " | p(H2) " + strconv.FormatFloat(c.PH2Atm(), 'g', 4, 64) + " atm"
	if f != nil {
		d, a := f.Concentrations()
		s += " | [D–H]0 " + strconv.FormatFloat(d, 'g', 4, 64) + " M, [A]0 " + strconv.FormatFloat(a, 'g', 4, 64) + " M"
	}
	return s
}
