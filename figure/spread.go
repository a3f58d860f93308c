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

// nearest returns the indices of the k couples whose values lie nearest
// to ref, in their original order.
func nearest(cs []Couple, ref float64, k int) []int {
	idx := make([]int, len(cs))
	for i := range idx {
		idx[i] = i
	}
	if k >= len(cs) {
		return idx
	}
	k = max(k, 0)
	sortStable(idx, func(a, b int) bool {
		return math.Abs(cs[a].Value-ref) < math.Abs(cs[b].Value-ref)
	})
	keep := idx[:k]
	sortStable(keep, func(a, b int) bool { return a < b })
	return keep
}

// nearestKeeping is nearest, with couple keep (when ≥ 0) always among them.
func nearestKeeping(cs []Couple, ref float64, k, keep int) []int {
	idx := nearest(cs, ref, k)
	if keep < 0 || keep >= len(cs) || k >= len(cs) || k <= 0 {
		return idx
	}
	for _, i := range idx {
		if i == keep {
			return idx
		}
	}
	// Drop the one furthest from ref for keep.
	far := 0
	for j, i := range idx {
		if math.Abs(cs[i].Value-ref) >= math.Abs(cs[idx[far]].Value-ref) {
			far = j
		}
	}
	idx[far] = keep
	sortStable(idx, func(a, b int) bool { return a < b })
	return idx
}
