package thermo

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// benchCouples returns n resolved couples in acetonitrile with BDFEs spread
// over 40–110 kcal/mol (centred near 75), half of them cycle-derived
// (carrying C_G) and half given directly, with the H2 line at 52.
func benchCouples(rng *rand.Rand, prefix string, n int, mecn *Solvent) []*Resolved {
	out := make([]*Resolved, n)
	for i := range out {
		b := 75 + 15*rng.NormFloat64()
		b = min(110, max(40, b))
		r := &Resolved{Couple: &Couple{ID: fmt.Sprintf("%s%06d", prefix, i), Solvent: mecn, Roles: RoleBoth}}
		if rng.IntN(2) == 0 {
			r.BDFE = Energy{Kcal: b, SigData: 0.8 + 0.4*rng.Float64(), SigCG: 0.5, CG: mecn}
		} else {
			r.BDFE = Energy{Kcal: b, SigData: 1 + rng.Float64()}
		}
		r.Margin = H2Margin(r.BDFE, Number{V: 52, Sigma: 0.6}, mecn)
		r.Tendency = Classify(r.Margin)
		out[i] = r
	}
	return out
}

var benchSizes = []int{100, 1000, 10000}

// BenchmarkRank ranks n donors × m acceptors, keeping the best 100: by ΔG°
// (lazy frontier), by ΔG° within a window, by ΔG°/σ for donors above the H2
// line and by σ (pairs streamed, most skipped by bounds), and by donor BDFE
// within a ΔG° window (donors best first, early stop); and the best 10^5 by
// ΔG° (a large table). Mpairs/s counts every pair of the n × m, visited or not.
//
//	go test ./thermo -run XXX -bench Rank -benchtime 3x
func BenchmarkRank(b *testing.B) {
	mecn := &Solvent{Key: "acetonitrile", Name: "MeCN", CrossSigma: 1}
	cases := []struct {
		name string
		o    RankOptions
	}{
		{"dg", RankOptions{Sort: ByDG, Top: 100}},
		{"dg-window", RankOptions{Sort: ByDG, Top: 100, DGMin: f64(-5), DGMax: f64(5)}},
		{"z-uphill", RankOptions{Sort: ByZScore, Top: 100, Tendencies: []Tendency{Uphill}}},
		{"sigma", RankOptions{Sort: BySigma, Top: 100}},
		{"donor-bdfe-window", RankOptions{Sort: ByDonorBDFE, Top: 100, DGMin: f64(-3), DGMax: f64(-1)}},
		{"dg-top1e5", RankOptions{Sort: ByDG, Top: 100000}},
	}
	for _, n := range benchSizes {
		for _, m := range benchSizes {
			rng := rand.New(rand.NewPCG(uint64(n), uint64(m)))
			donors := benchCouples(rng, "d", n, mecn)
			acceptors := benchCouples(rng, "a", m, mecn)
			for _, c := range cases {
				b.Run(fmt.Sprintf("%s/%dx%d", c.name, n, m), func(b *testing.B) {
					b.ReportAllocs()
					for b.Loop() {
						if got := Rank(donors, acceptors, Conditions{}, c.o); len(got) == 0 {
							b.Fatal("no pairs")
						}
					}
					b.ReportMetric(float64(n)*float64(m)/b.Elapsed().Seconds()*float64(b.N)/1e6, "Mpairs/s")
				})
			}
		}
	}
}
