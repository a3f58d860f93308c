package thermo

import "math"

// Physical constants, CODATA 2018 (exact in the 2019 SI).
const (
	// Faraday is the Faraday constant in C/mol.
	Faraday = 96485.33212
	// GasConstant is the molar gas constant in J/(mol·K).
	GasConstant = 8.314462618
	// JoulePerCalorie is the thermochemical calorie.
	JoulePerCalorie = 4.184
	// DefaultTemperature is 25 °C in kelvin, the temperature of the tables.
	DefaultTemperature = 298.15
)

// FaradayKcal is F in kcal mol⁻¹ V⁻¹ (23.0605; tables round it to 23.06).
const FaradayKcal = Faraday / (1000 * JoulePerCalorie)

// RTLn10 returns 2.303·RT in kcal/mol at temperature t in kelvin
// (1.3642 at 298.15 K; tables round it to 1.37).
func RTLn10(t float64) float64 {
	return math.Ln10 * GasConstant * t / (1000 * JoulePerCalorie)
}

// Hydrogen-atom constants used for the gas-phase H2 line and for converting a
// gas-phase BDE to a BDFE. Source: NIST Chemistry WebBook (CODATA key values,
// Cox, Wagman, Medvedev 1989): ΔfH°(H•, g) = 52.103 kcal/mol,
// S°(H•, g) = 27.418 and S°(H2, g) = 31.2333 cal mol⁻¹ K⁻¹ at 1 bar.
const (
	HAtomEnthalpyOfFormation = 52.103  // kcal/mol
	HAtomEntropy             = 27.4180 // cal/(mol·K)
	H2Entropy                = 31.2333 // cal/(mol·K)
)

// GasHAtomFreeEnergy returns ΔfG°(H•, g) in kcal/mol at temperature t,
// ΔfH° − T·(S°(H•) − ½S°(H2)), about 48.58 at 298.15 K; this is the H2 line
// of the gas phase.
func GasHAtomFreeEnergy(t float64) float64 {
	return HAtomEnthalpyOfFormation - t*(HAtomEntropy-0.5*H2Entropy)/1000
}

// GasEntropyTerm returns T·S°(H•, g) in kcal/mol, the difference between a
// gas-phase BDE and BDFE when the entropies of X–H and X• are taken as equal.
func GasEntropyTerm(t float64) float64 { return t * HAtomEntropy / 1000 }
