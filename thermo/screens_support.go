package thermo

import "math"

// CrossLog10K is the Log10K of CrossRelation alone, for ranking many pairs
// by their rate estimate: no σ, note or range test is made. ok is false
// where CrossRelation would fail (a constant not finite and above 0, log K
// not finite, or k_DD·k_AA not below Z²).
func CrossLog10K(kD, kA, log10K float64) (log10k float64, ok bool) {
	for _, k := range [...]float64{kD, kA} {
		if !(k > 0) || math.IsInf(k, 0) {
			return 0, false
		}
	}
	if math.IsNaN(log10K) || math.IsInf(log10K, 0) {
		return 0, false
	}
	a := math.Log10(kD) + math.Log10(kA)
	m := a - 2*math.Log10(CollisionZ)
	if !(m < 0) {
		return 0, false
	}
	return 0.5 * (a + log10K + log10K*log10K/(4*m)), true
}
