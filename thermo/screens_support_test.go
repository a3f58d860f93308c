package thermo

import (
	"math"
	"testing"
)

// CrossLog10K gives CrossRelation's log k, and fails where it fails.
func TestCrossLog10KMatchesCrossRelation(t *testing.T) {
	for _, kD := range []float64{1e-2, 4.7, 220, 1e6, 3e10} {
		for _, kA := range []float64{1, 220, 1e8, 2e11} {
			for _, L := range []float64{-30, -5, 0, 3.66, 12, 30} {
				x, err := CrossRelation(SelfExchange{K: kD}, SelfExchange{K: kA}, L, 0, BDFETemperature)
				got, ok := CrossLog10K(kD, kA, L)
				if ok != (err == nil) {
					t.Fatalf("kD %g kA %g log K %g: ok %v, CrossRelation error %v", kD, kA, L, ok, err)
				}
				if ok && math.Abs(got-x.Log10K) > 1e-12 {
					t.Errorf("kD %g kA %g log K %g: %g, CrossRelation %g", kD, kA, L, got, x.Log10K)
				}
			}
		}
	}
	// Source: the cross relation k = √(k11·k22·K·f), ln f = (ln K)²/(4·ln(k11·k22/Z²)),
	// Z = 10^11 M⁻¹ s⁻¹ (Mayer, Acc. Chem. Res. 2011, 44, 36); hand-computed
	// for k11 = 4.7, k22 = 220, K = 10^(5/1.3642) (ΔG° = −5 kcal/mol at 298.15 K):
	// log10(k11·k22) = 3.01452, M = −18.98548, L = 3.66515,
	// log k = ½(3.01452 + 3.66515 − 0.17689) = 3.25139.
	got, ok := CrossLog10K(4.7, 220, 5/1.3642)
	if !ok || math.Abs(got-3.2514) > 2e-3 {
		t.Errorf("hand-computed example: %g (ok %v), want 3.2514", got, ok)
	}
	for _, bad := range [][3]float64{{0, 1, 0}, {1, math.Inf(1), 0}, {1, 1, math.NaN()}, {1e11, 1e11, 0}} {
		if _, ok := CrossLog10K(bad[0], bad[1], bad[2]); ok {
			t.Errorf("%v accepted", bad)
		}
	}
}
