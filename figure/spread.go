package figure

import "math"

// spread places labels wanted at the ascending values v so that neighbours
// are at least gap apart and all lie within [lo, hi], moving them as little
// as possible (least squares). With q_i = p_i − i·gap the gap constraint
// becomes q non-decreasing, so the positions are the isotonic regression of
// v_i − i·gap (pool adjacent violators), clipped to the bounds (for one
// common pair of bounds, clipping the unbounded fit is optimal). The labels
// must fit: (len(v)−1)·gap ≤ hi − lo; callers drop labels first (see fit).
func spread(v []float64, gap, lo, hi float64) []float64 {
	n := len(v)
	out := make([]float64, n)
	if n == 0 {
		return out
	}
	type block struct {
		sum  float64
		size int
	}
	blocks := make([]block, 0, n)
	for i, x := range v {
		blocks = append(blocks, block{x - float64(i)*gap, 1})
		for len(blocks) > 1 {
			a, b := blocks[len(blocks)-2], blocks[len(blocks)-1]
			if a.sum/float64(a.size) <= b.sum/float64(b.size) {
				break
			}
			blocks = blocks[:len(blocks)-2]
			blocks = append(blocks, block{a.sum + b.sum, a.size + b.size})
		}
	}
	qhi := hi - float64(n-1)*gap
	i := 0
	for _, b := range blocks {
		q := math.Min(math.Max(b.sum/float64(b.size), lo), math.Max(qhi, lo))
		for range b.size {
			out[i] = q + float64(i)*gap
			i++
		}
	}
	return out
}

// capacity is how many labels gap apart fit in [lo, hi].
func capacity(gap, lo, hi float64) int {
	if gap <= 0 {
		return math.MaxInt
	}
	return max(int(math.Floor((hi-lo)/gap+1e-9))+1, 1)
}

// spanKeeping returns the indices of at most k couples of cs spanning
// their range (see Spanning), couple keep (when ≥ 0) among them, in
// their original order.
func spanKeeping(cs []Couple, h2 float64, k, keep int) []int {
	vals := make([]float64, len(cs))
	margins := make([]float64, len(cs))
	for i, c := range cs {
		vals[i], margins[i] = c.Value, c.Value-h2
	}
	var seed []int
	if keep >= 0 && keep < len(cs) {
		seed = []int{keep}
	}
	return spanIndices(vals, margins, max(k, 0), seed)
}
