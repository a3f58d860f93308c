package thermo

import (
	"container/heap"
	"fmt"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync"
)

// Metric is a column pairs can be ranked by.
type Metric int

const (
	ByDG           Metric = iota // ΔG°(HAT), most favourable first
	BySigma                      // σ of ΔG°
	ByLog10K                     // log10 K, largest first
	ByDonorBDFE                  // donor BDFE
	ByAcceptorBDFE               // acceptor BDFE
	ByDonorMargin                // donor's H2 margin
	ByZScore                     // ΔG°/σ: how confidently downhill
)

var metricNames = []struct {
	m     Metric
	names []string
}{
	{ByDG, []string{"dg", "delta_g", "dg_hat"}},
	{BySigma, []string{"sigma"}},
	{ByLog10K, []string{"log10_k", "logk", "log_k"}},
	{ByDonorBDFE, []string{"donor_bdfe"}},
	{ByAcceptorBDFE, []string{"acceptor_bdfe"}},
	{ByDonorMargin, []string{"donor_h2_margin", "h2_margin", "margin"}},
	{ByZScore, []string{"z", "dg_over_sigma"}},
}

// MetricNames lists the canonical metric names accepted by ParseMetric.
func MetricNames() []string {
	out := make([]string, len(metricNames))
	for i, m := range metricNames {
		out[i] = m.names[0]
	}
	return out
}

func (m Metric) String() string { return metricNames[m].names[0] }

// ParseMetric reads a metric name (see MetricNames).
func ParseMetric(s string) (Metric, error) {
	k := strings.ToLower(strings.TrimSpace(s))
	for _, m := range metricNames {
		if slices.Contains(m.names, k) {
			return m.m, nil
		}
	}
	return ByDG, fmt.Errorf("unknown sort metric %q (want one of %s)", s, strings.Join(MetricNames(), ", "))
}

// NaturalDescending reports whether a metric reads best largest first.
func (m Metric) NaturalDescending() bool { return m == ByLog10K }

// RankOptions select, filter and order pairs.
type RankOptions struct {
	Sort       Metric
	Reverse    bool // reverse the metric's natural order
	Top        int  // 0 for every pair
	Tendencies []Tendency
	DGMin      *float64 // keep pairs with ΔG° ≥ DGMin (kcal/mol)
	DGMax      *float64 // keep pairs with ΔG° ≤ DGMax (kcal/mol)
	Workers    int      // 0 for GOMAXPROCS
}

// Rank forms every donor × acceptor pair (never a couple with itself),
// keeps those that pass the filters and returns the best Top of them in
// order. It never holds more than Top candidates per worker.
func Rank(donors, acceptors []*Resolved, c Conditions, o RankOptions) []Pair {
	if len(donors) == 0 || len(acceptors) == 0 {
		return nil
	}
	workers := o.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, len(donors))
	keep := func(d *Resolved) bool {
		if len(o.Tendencies) == 0 {
			return true
		}
		return slices.Contains(o.Tendencies, d.Tendency)
	}
	less := pairLess(o)
	k := RTLn10(c.T())
	results := make([]*candHeap, workers)
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			h := &candHeap{less: less}
			for i := w; i < len(donors); i += workers {
				d := donors[i]
				if !keep(d) {
					continue
				}
				for _, a := range acceptors {
					if a.Couple == d.Couple {
						continue
					}
					dg := d.BDFE.Kcal - a.BDFE.Kcal
					if (o.DGMin != nil && dg < *o.DGMin) || (o.DGMax != nil && dg > *o.DGMax) {
						continue
					}
					cd := cand{d: d, a: a, dg: dg, sig: pairSigma(d, a)}
					cd.key = metricKey(o.Sort, cd, k)
					if o.Top > 0 && h.Len() == o.Top {
						if !less(cd, h.items[0]) {
							continue
						}
						h.items[0] = cd
						heap.Fix(h, 0)
						continue
					}
					heap.Push(h, cd)
				}
			}
			results[w] = h
		}()
	}
	wg.Wait()
	var all []cand
	for _, h := range results {
		all = append(all, h.items...)
	}
	slices.SortFunc(all, func(x, y cand) int {
		if less(x, y) {
			return -1
		}
		if less(y, x) {
			return 1
		}
		return 0
	})
	if o.Top > 0 && len(all) > o.Top {
		all = all[:o.Top]
	}
	out := make([]Pair, len(all))
	for i, cd := range all {
		out[i] = MakePair(cd.d, cd.a, c)
	}
	return out
}

type cand struct {
	d, a    *Resolved
	dg, sig float64
	key     float64
}

func metricKey(m Metric, c cand, k float64) float64 {
	switch m {
	case BySigma:
		return c.sig
	case ByLog10K:
		return -c.dg / k
	case ByDonorBDFE:
		return c.d.BDFE.Kcal
	case ByAcceptorBDFE:
		return c.a.BDFE.Kcal
	case ByDonorMargin:
		return c.d.Margin.Kcal
	case ByZScore:
		if c.sig == 0 {
			return math.Copysign(math.Inf(1), c.dg)
		}
		return c.dg / c.sig
	}
	return c.dg
}

// pairLess orders candidates best first: by key (in the metric's natural
// direction, or reversed), then by donor and acceptor id so the order does
// not depend on input order.
func pairLess(o RankOptions) func(x, y cand) bool {
	desc := o.Sort.NaturalDescending() != o.Reverse
	return func(x, y cand) bool {
		if x.key != y.key {
			if desc {
				return x.key > y.key
			}
			return x.key < y.key
		}
		if x.d.Couple.ID != y.d.Couple.ID {
			return x.d.Couple.ID < y.d.Couple.ID
		}
		return x.a.Couple.ID < y.a.Couple.ID
	}
}

// pairSigma is σ(ΔG°) as MakePair computes it, without building the pair.
func pairSigma(d, a *Resolved) float64 {
	sd := d.BDFE.SigData*d.BDFE.SigData + a.BDFE.SigData*a.BDFE.SigData
	if d.BDFE.CG == nil || d.BDFE.CG != a.BDFE.CG {
		sd += d.BDFE.SigCG*d.BDFE.SigCG + a.BDFE.SigCG*a.BDFE.SigCG
	}
	if ds, as := d.Couple.Solvent, a.Couple.Solvent; ds != as {
		sd += ds.CrossSigma*ds.CrossSigma + as.CrossSigma*as.CrossSigma
	}
	return math.Sqrt(sd)
}

// candHeap is a max-heap under less: its root is the worst kept candidate.
type candHeap struct {
	items []cand
	less  func(x, y cand) bool
}

func (h *candHeap) Len() int           { return len(h.items) }
func (h *candHeap) Less(i, j int) bool { return h.less(h.items[j], h.items[i]) }
func (h *candHeap) Swap(i, j int)      { h.items[i], h.items[j] = h.items[j], h.items[i] }
func (h *candHeap) Push(x any)         { h.items = append(h.items, x.(cand)) }
func (h *candHeap) Pop() any {
	n := len(h.items) - 1
	x := h.items[n]
	h.items = h.items[:n]
	return x
}
