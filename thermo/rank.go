package thermo

import (
	"cmp"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sort"
	"strings"
	"sync"
	"sync/atomic"
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

// Rank forms every donor × acceptor pair (never a couple with itself), keeps
// those that pass the filters and returns the best Top of them in order: by
// the metric, then by donor id, then by acceptor id, so the result does not
// depend on input order. Top ≤ 0 returns every pair.
//
// With Top > 0 it never builds the N×M list and holds O(Top + N + M)
// memory. Ordered by ΔG° or log10 K, the best pairs are drawn lazily: with
// acceptors sorted by BDFE, a heap holds the next pair of every donor's row
// (O((N+M) log M + Top log N)). Ordered by a donor's or an acceptor's own
// value, couples are visited best first and the walk stops once no later
// pair can enter. σ and ΔG°/σ go over the pairs on every core, each worker
// with a bounded heap, passing over runs of pairs that bounds on σ prove
// cannot enter. Every path orders by the same keys and tie-breaks, so the
// paths agree pair for pair with sorting the whole list.
func Rank(donors, acceptors []*Resolved, c Conditions, o RankOptions) []Pair {
	if len(donors) == 0 || len(acceptors) == 0 {
		return nil
	}
	t := newRanker(donors, acceptors, c, o)
	if len(t.d.bdfe) == 0 {
		return []Pair{} // no donor of the tendencies asked for
	}
	var best []cand
	switch {
	case o.Top <= 0 || !t.finite:
		best = t.stream(o.Top, o.Workers)
	case o.Sort == ByDG || o.Sort == ByLog10K:
		best = t.frontier(o.Top)
	case o.Sort == ByDonorBDFE || o.Sort == ByDonorMargin:
		best = t.byDonor(o.Top)
	case o.Sort == ByAcceptorBDFE:
		best = t.byAcceptor(o.Top)
	default:
		best = t.stream(o.Top, o.Workers)
	}
	out := make([]Pair, len(best))
	for i, cd := range best {
		out[i] = MakePair(donors[t.d.orig[cd.d]], acceptors[t.a.orig[cd.a]], c)
	}
	return out
}

// side holds one side's couples as flat arrays (struct of arrays), built
// once, so the pair loops read numbers and small ints and never follow a
// pointer (couples are compared by address, ids only to break ties).
type side struct {
	orig   []int32   // index in the caller's slice
	bdfe   []float64 // kcal/mol
	sig2   []float64 // σ² of the data part of the BDFE
	cg2    []float64 // σ² of the C_G part
	cross2 []float64 // CrossSigma2 of the couple
	margin []float64 // H2 margin: ΔG° across media is the difference of margins
	msig2  []float64 // σ² of the H2 margin
	cg     []int32   // solvent whose C_G the BDFE carries, −1 for none
	solv   []int32   // the couple's solvent
	couple []*Couple // the couple, so a couple is never paired with itself
	id     []string  // the couple's id, the tie-break
}

// newSide lays out the couples rs[idx] and reports whether every number of
// them is finite. A light side (for the frontier, which reads ΔG° alone)
// leaves out the σ² arrays and the C_G solvents, though their numbers are
// still checked.
func newSide(rs []*Resolved, idx []int32, solvents map[*Solvent]int32, light bool) (side, bool) {
	n := len(idx)
	s := side{
		orig: idx, bdfe: make([]float64, n), margin: make([]float64, n),
		solv: make([]int32, n), couple: make([]*Couple, n), id: make([]string, n),
	}
	if !light {
		s.sig2, s.cg2, s.cross2, s.msig2 = make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
		s.cg = make([]int32, n)
	}
	var last *Solvent
	var lastID int32
	sid := func(v *Solvent) int32 {
		if v == nil {
			return -1
		}
		if v == last {
			return lastID
		}
		id, ok := solvents[v]
		if !ok {
			id = int32(len(solvents))
			solvents[v] = id
		}
		last, lastID = v, id
		return id
	}
	finite := true
	for k, i := range idx {
		r := rs[i]
		finite = finite && sideFinite(r)
		if !light {
			s.sig2[k], s.cg2[k] = r.BDFE.SigData*r.BDFE.SigData, r.BDFE.SigCG*r.BDFE.SigCG
			s.cross2[k], s.msig2[k] = CrossSigma2(r.Couple), marginSig2(r)
			s.cg[k] = sid(r.BDFE.CG)
		}
		s.bdfe[k], s.margin[k] = r.BDFE.Kcal, r.Margin.Kcal
		s.solv[k] = sid(r.Couple.Solvent)
		s.couple[k], s.id[k] = r.Couple, r.Couple.ID
	}
	return s, finite
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// sideFinite says whether every number of r that a side holds (newSide) is
// finite, squares of σ included.
func sideFinite(r *Resolved) bool {
	b := r.BDFE
	return isFinite(b.Kcal) && isFinite(r.Margin.Kcal) && isFinite(b.SigData*b.SigData) &&
		isFinite(b.SigCG*b.SigCG) && isFinite(marginSig2(r)) && isFinite(CrossSigma2(r.Couple))
}

// permute returns the side reordered so that its k-th couple is s's order[k]-th.
func (s side) permute(order []int32) side {
	p := side{}
	p.orig = gather(s.orig, order)
	p.bdfe = gather(s.bdfe, order)
	p.sig2 = gather(s.sig2, order)
	p.cg2 = gather(s.cg2, order)
	p.cross2 = gather(s.cross2, order)
	p.margin = gather(s.margin, order)
	p.msig2 = gather(s.msig2, order)
	p.cg = gather(s.cg, order)
	p.solv = gather(s.solv, order)
	p.couple = gather(s.couple, order)
	p.id = gather(s.id, order)
	return p
}

func gather[T any](v []T, order []int32) []T {
	if v == nil {
		return nil // an array a light side leaves out
	}
	out := make([]T, len(order))
	for k, i := range order {
		out[k] = v[i]
	}
	return out
}

// sortedOrder returns the indices of key sorted by key (ascending, or
// descending when desc), ties by id. The keys are finite.
//
// The keys are sorted as integers that order as the floats do, by a
// least-significant-digit radix sort (8 passes of a byte, each stable),
// then runs of equal keys by id: some 10× fewer steps than a comparison
// sort calling a function per comparison, for 10^4 couples.
func sortedOrder(key []float64, id []string, desc bool) []int32 {
	n := len(key)
	sign := 1.0
	if desc {
		sign = -1
	}
	u, u2 := make([]uint64, n), make([]uint64, n)
	order, order2 := make([]int32, n), make([]int32, n)
	for i, k := range key {
		b := math.Float64bits(sign*k + 0) // + 0 makes −0 into +0, which compare equal
		if b>>63 == 1 {
			b = ^b // negative: larger magnitudes first
		} else {
			b |= 1 << 63
		}
		u[i], order[i] = b, int32(i)
	}
	var count [256]int
	for shift := 0; shift < 64; shift += 8 {
		clear(count[:])
		for _, b := range u {
			count[byte(b>>shift)]++
		}
		if count[byte(u[0]>>shift)] == n {
			continue // every key has this byte: the pass would change nothing
		}
		at := 0
		for d, c := range count {
			count[d], at = at, at+c
		}
		for i, b := range u {
			d := byte(b >> shift)
			u2[count[d]], order2[count[d]] = b, order[i]
			count[d]++
		}
		u, u2, order, order2 = u2, u, order2, order
	}
	for lo := 0; lo < n; {
		hi := lo + 1
		for hi < n && u[hi] == u[lo] {
			hi++
		}
		if hi-lo > 1 {
			slices.SortStableFunc(order[lo:hi], func(x, y int32) int { return strings.Compare(id[x], id[y]) })
		}
		lo = hi
	}
	return order
}

// ranker is one ranking request with its couples laid out flat.
type ranker struct {
	d, a   side
	metric Metric
	// sign is 1 when smaller keys are better, −1 when larger are: every path
	// compares sign·key ascending.
	sign       float64
	kT         float64 // 2.303RT, for log10 K
	dmin, dmax float64 // the ΔG° window, ±Inf when open
	finite     bool    // every number is finite, so sorted orders are total
}

func newRanker(donors, acceptors []*Resolved, c Conditions, o RankOptions) *ranker {
	t := &ranker{metric: o.Sort, sign: 1, kT: RTLn10(c.T()), dmin: math.Inf(-1), dmax: math.Inf(1)}
	if o.Sort.NaturalDescending() != o.Reverse {
		t.sign = -1
	}
	if o.DGMin != nil {
		t.dmin = *o.DGMin
	}
	if o.DGMax != nil {
		t.dmax = *o.DGMax
	}
	// The H2 tendency filter acts on donors alone: drop them first.
	di := make([]int32, 0, len(donors))
	for i, d := range donors {
		if len(o.Tendencies) == 0 || slices.Contains(o.Tendencies, d.Tendency) {
			di = append(di, int32(i))
		}
	}
	ai := make([]int32, len(acceptors))
	for j := range ai {
		ai[j] = int32(j)
	}
	// The frontier (the best Top by ΔG° or log10 K) reads no σ: its sides
	// are light, unless a number is not finite and the pairs are streamed.
	light := o.Top > 0 && (o.Sort == ByDG || o.Sort == ByLog10K)
	if light && o.Sort == ByDG && o.DGMin == nil && o.DGMax == nil {
		if medium := mediumOf(donors, di, acceptors, ai); medium != nil {
			d, dok := firstByBDFE(donors, di, o.Top+1, t.sign, medium)
			if a, aok := firstByBDFE(acceptors, ai, o.Top+1, -t.sign, medium); dok && aok {
				di, ai = d, a
			}
		}
	}
	for {
		solvents := map[*Solvent]int32{}
		var dFinite, aFinite bool
		t.d, dFinite = newSide(donors, di, solvents, light)
		t.a, aFinite = newSide(acceptors, ai, solvents, light)
		t.finite = dFinite && aFinite && !math.IsNaN(t.dmin) && !math.IsNaN(t.dmax)
		if t.finite || !light {
			return t
		}
		light = false
	}
}

// mediumOf is the solvent of the first couple of donors[di], or else of
// acceptors[ai]; nil when there is none.
func mediumOf(donors []*Resolved, di []int32, acceptors []*Resolved, ai []int32) *Solvent {
	switch {
	case len(di) > 0:
		return donors[di[0]].Couple.Solvent
	case len(ai) > 0:
		return acceptors[ai[0]].Couple.Solvent
	}
	return nil
}

// firstByBDFE returns the places (ascending) of the k couples of rs[idx]
// that come first by sign·BDFE, ties by id (idx itself when it holds no
// more than k), and whether every couple of rs[idx] is in medium with every
// number newSide checks finite; only then may the frontier take the k
// first alone. (It may say no when the numbers are finite, at the edge of
// the float range: the frontier then lays out every couple.)
//
// Within one medium ΔG° = BDFE(donor) − BDFE(acceptor), and pairs tied on
// ΔG° go by donor id, then acceptor id: a donor with k+1 donors before it
// in this order (sign 1, best first) has, with any acceptor, k+1 pairs as
// good or better and ahead on the tie-break, at most one of them a couple
// paired with itself. So the best k pairs by ΔG° take their donors among
// the first k+1 donors and, likewise (sign −1), their acceptors among the
// first k+1 acceptors, and the frontier need lay out only those.
func firstByBDFE(rs []*Resolved, idx []int32, k int, sign float64, medium *Solvent) ([]int32, bool) {
	ok := func(r *Resolved) bool { return r.Couple.Solvent == medium && sideFinite(r) }
	if k <= 0 || len(idx) <= k {
		for _, i := range idx {
			if !ok(rs[i]) {
				return idx, false
			}
		}
		return idx, true
	}
	// A candidate keyed by sign·BDFE and the id, as a pair is by ΔG° and
	// the donor id: topK keeps the k first.
	h := newTopK(k)
	for _, i := range idx {
		r := rs[i]
		if !ok(r) {
			return idx, false
		}
		h.offer(cand{key: sign * r.BDFE.Kcal, did: r.Couple.ID, d: i})
	}
	out := make([]int32, len(h.items))
	for j, c := range h.items {
		out[j] = c.d
	}
	slices.Sort(out)
	return out, true
}

// cand is a pair kept for the result: its signed key, the donor's and
// acceptor's ids, and their places in the ranker's sides.
type cand struct {
	key      float64
	did, aid string
	d, a     int32
}

// better orders candidates best first: signed key, then donor id, then
// acceptor id.
func better(x, y cand) bool {
	if x.key != y.key {
		return x.key < y.key
	}
	if x.did != y.did {
		return x.did < y.did
	}
	return x.aid < y.aid
}

func compareCand(x, y cand) int {
	switch {
	case x.key < y.key:
		return -1
	case x.key > y.key:
		return 1
	case x.key != y.key: // NaN, only when inputs are not finite
		if better(x, y) {
			return -1
		}
		if better(y, x) {
			return 1
		}
		return 0
	}
	if c := strings.Compare(x.did, y.did); c != 0 {
		return c
	}
	return strings.Compare(x.aid, y.aid)
}

// finish sorts candidates best first and keeps the best k (all when k ≤ 0).
func finish(all []cand, k int) []cand {
	slices.SortFunc(all, compareCand)
	if k > 0 && len(all) > k {
		all = all[:k]
	}
	return all
}

// topK keeps the best k candidates offered to it in a heap whose root is the
// worst kept; with k ≤ 0 it keeps everything.
type topK struct {
	k     int
	items []cand
	worst float64 // key of the root once full, +Inf before
}

func newTopK(k int) *topK {
	h := &topK{k: k, worst: math.Inf(1)}
	if k > 0 {
		h.items = make([]cand, 0, k)
	}
	return h
}

func (h *topK) full() bool { return h.k > 0 && len(h.items) == h.k }

// heapify orders items (already k of them) into the heap.
func (h *topK) heapify() {
	for i := len(h.items)/2 - 1; i >= 0; i-- {
		h.down(i)
	}
	h.worst = h.items[0].key
}

func (h *topK) down(i int) {
	it := h.items
	for {
		w := 2*i + 1
		if w >= len(it) {
			return
		}
		if r := w + 1; r < len(it) && better(it[w], it[r]) {
			w = r
		}
		if !better(it[i], it[w]) {
			return
		}
		it[i], it[w] = it[w], it[i]
		i = w
	}
}

func (h *topK) offer(c cand) {
	if h.k <= 0 {
		h.items = append(h.items, c)
		return
	}
	if len(h.items) < h.k {
		h.items = append(h.items, c)
		it := h.items
		for i := len(it) - 1; i > 0; {
			p := (i - 1) / 2
			if !better(it[p], it[i]) {
				break
			}
			it[p], it[i] = it[i], it[p]
			i = p
		}
		if len(it) == h.k {
			h.worst = it[0].key
		}
		return
	}
	if !better(c, h.items[0]) {
		return
	}
	h.items[0] = c
	h.down(0)
	h.worst = h.items[0].key
}

// dgKey is the signed key of a pair ordered by ΔG° or log10 K, computed as
// the pair would be: log10 K = −ΔG°/(2.303RT).
func (t *ranker) dgKey(dg float64) float64 {
	if t.metric == ByLog10K {
		return t.sign * (-dg / t.kT)
	}
	return t.sign * dg
}

// stream visits every pair, donors shared among workers in small blocks,
// each worker keeping its own best k; the heaps are merged at the end.
func (t *ranker) stream(k, workers int) []cand {
	n := len(t.d.bdfe)
	acc, groups := t.accGroups()
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, n))
	const block = 8
	var next atomic.Int64
	res := make([][]cand, workers)
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			h := newTopK(k)
			for {
				lo := int(next.Add(block)) - block
				if lo >= n {
					break
				}
				for i := lo; i < min(lo+block, n); i++ {
					switch {
					case t.metric == BySigma && t.finite:
						t.scanSigma(i, acc, groups, h)
					case t.metric == ByZScore && t.finite:
						t.scanZ(i, acc, groups, h)
					default:
						t.scanDonor(i, acc, h)
					}
				}
			}
			res[w] = h.items
		}()
	}
	wg.Wait()
	return finish(slices.Concat(res...), k)
}

// accRec is one acceptor as the pair loops read it: one flat record, so a
// loop walks a single array.
type accRec struct {
	bdfe, sig2, cg2, cross2 float64
	margin, msig2           float64
	couple                  *Couple
	id                      string
	cg, solv                int32
}

// pairDG is ΔG° of a pair as MakePair computes it: the BDFE difference in one
// solvent, the H2-margin difference across media. Within one solvent a
// margin is the BDFE less that solvent's H2 line (H2Margin), so acceptors of
// one solvent sorted by BDFE are sorted by margin too: the frontier and the
// ΔG°/σ cuts rely on it. Their margin σ² need not follow their data σ², so
// the σ scan takes no early stop across media.
func pairDG(db, dm, ab, am float64, cross bool) float64 {
	if cross {
		return dm - am
	}
	return db - ab
}

// donorRec is donor i as the pair loops read it.
type donorRec struct {
	bdfe, margin, sig2, cg2, cross2, msig2 float64
	cg, solv                               int32
}

func (t *ranker) donor(i int) donorRec {
	d := &t.d
	return donorRec{d.bdfe[i], d.margin[i], d.sig2[i], d.cg2[i], d.cross2[i], d.msig2[i], d.cg[i], d.solv[i]}
}

// dg is ΔG° of donor dr with acceptor r.
func (dr *donorRec) dg(r *accRec) float64 {
	return pairDG(dr.bdfe, dr.margin, r.bdfe, r.margin, dr.solv != r.solv)
}

// sig2 is σ(ΔG°)² of donor dr with acceptor r, as MakePair computes it;
// am2 stands for the acceptor's margin σ² (a group's least, for a bound).
func (dr *donorRec) sig2With(r *accRec, a2, am2 float64) float64 {
	if dr.solv != r.solv {
		return pairSigma2(dr.msig2, am2, 0, 0, dr.cross2, r.cross2, false, true)
	}
	return pairSigma2(dr.sig2, a2, dr.cg2, r.cg2, dr.cross2, r.cross2, dr.cg < 0 || dr.cg != r.cg, false)
}

// accGroups lays the acceptors out for the pair loops: grouped by the
// solvent whose C_G they carry, their solvent and the σ² of those two parts,
// so that within a group σ(ΔG°)² grows with the acceptor's data σ² alone;
// and sorted within a group by that σ² (ranking by σ) or by BDFE (otherwise).
// Branches then run in long predictable stretches, and the σ and ΔG°/σ loops
// can cut a group short. It returns the records and the group bounds.
func (t *ranker) accGroups() ([]accRec, []accGroup) {
	a := &t.a
	order := make([]int32, len(a.bdfe))
	for j := range order {
		order[j] = int32(j)
	}
	within := a.bdfe
	if t.metric == BySigma {
		within = a.sig2
	}
	slices.SortFunc(order, func(x, y int32) int {
		return cmp.Or(
			cmp.Compare(a.cg[x], a.cg[y]),
			cmp.Compare(a.solv[x], a.solv[y]),
			cmp.Compare(a.cg2[x], a.cg2[y]),
			cmp.Compare(a.cross2[x], a.cross2[y]),
			cmp.Compare(within[x], within[y]),
			cmp.Compare(x, y))
	})
	t.a = a.permute(order)
	a = &t.a
	acc := make([]accRec, len(a.bdfe))
	var groups []accGroup
	for j := range acc {
		r := accRec{a.bdfe[j], a.sig2[j], a.cg2[j], a.cross2[j], a.margin[j], a.msig2[j], a.couple[j], a.id[j], a.cg[j], a.solv[j]}
		acc[j] = r
		if g := len(groups) - 1; g >= 0 {
			if p := acc[groups[g].lo]; p.cg == r.cg && p.solv == r.solv && p.cg2 == r.cg2 && p.cross2 == r.cross2 {
				groups[g].hi = j + 1
				groups[g].minSig2 = min(groups[g].minSig2, r.sig2)
				groups[g].minM2 = min(groups[g].minM2, r.msig2)
				continue
			}
		}
		groups = append(groups, accGroup{j, j + 1, r.sig2, r.msig2})
	}
	return acc, groups
}

// accGroup is a run of acceptors that share the C_G solvent, the solvent
// and the σ² of both: within it σ(ΔG°)² grows with the acceptor's data σ²,
// of which minSig2 is the least.
type accGroup struct {
	lo, hi  int
	minSig2 float64
	minM2   float64 // the least margin σ², for pairs across media
}

// scanDonor offers every pair of donor i that passes the filters (any
// metric; the plain loop).
func (t *ranker) scanDonor(i int, acc []accRec, h *topK) {
	d := &t.d
	db, dc, dr, di := d.bdfe[i], d.couple[i], d.id[i], int32(i)
	dn := t.donor(i)
	dmin, dmax, sign := t.dmin, t.dmax, t.sign
	for j := range acc {
		r := &acc[j]
		if r.couple == dc {
			continue
		}
		dg := dn.dg(r)
		if dg < dmin || dg > dmax {
			continue
		}
		var key float64
		switch t.metric {
		case ByDonorBDFE:
			key = db
		case ByAcceptorBDFE:
			key = r.bdfe
		case ByDonorMargin:
			key = d.margin[i]
		case BySigma, ByZScore:
			key = math.Sqrt(dn.sig2With(r, r.sig2, r.msig2))
			if t.metric == ByZScore {
				key = zScore(dg, key)
			}
		case ByLog10K:
			key = -dg / t.kT
		default:
			key = dg
		}
		key *= sign
		if key > h.worst {
			continue
		}
		h.offer(cand{key, dr, r.id, di, int32(j)})
	}
}

// Skipping without the square root. A pair is passed over before its key is
// computed only when a cheap test on σ² proves the key worse than the worst
// kept: the bounds carry a relative margin of 1e-12, far above the few ulps
// of rounding in σ², √ and ÷, so a pair near the bound is always computed
// exactly and the result is the same as computing every key.
const skipMargin = 1e-12

// scanSigma is scanDonor for σ of ΔG°. Within a group σ² grows with the
// acceptor's σ², so the group is walked best first (smallest σ² first, or
// largest when reversed) and left at the first pair that cannot enter: its
// key is worse than the worst kept, or ties with it and loses on the donor
// id.
func (t *ranker) scanSigma(i int, acc []accRec, groups []accGroup, h *topK) {
	d := &t.d
	dc, dr, di := d.couple[i], d.id[i], int32(i)
	dn := t.donor(i)
	dmin, dmax, sign := t.dmin, t.dmax, t.sign
	step := 1
	if sign < 0 {
		step = -1
	}
	for _, g := range groups {
		if dn.solv != acc[g.lo].solv {
			// Across media σ² follows the acceptor's margin σ², which the
			// group is not sorted by: no early stop.
			t.offerAll(i, acc[g.lo:g.hi], g.lo, h)
			continue
		}
		j, end := g.lo, g.hi
		if step < 0 {
			j, end = end-1, j-1
		}
		for ; j != end; j += step {
			r := &acc[j]
			if r.couple == dc {
				continue
			}
			if dg := dn.dg(r); dg < dmin || dg > dmax {
				continue
			}
			sd := dn.sig2With(r, r.sig2, r.msig2)
			if h.full() {
				w := h.worst
				if (sign > 0 && sd > w*w*(1+skipMargin)) || (sign < 0 && sd < w*w*(1-skipMargin)) {
					break
				}
			}
			key := sign * math.Sqrt(sd)
			if h.full() && key >= h.worst && (key > h.worst || dr > h.items[0].did) {
				// The rest of the group has keys no better, from this same
				// donor: none can enter (σ often ties, with values rounded).
				break
			}
			h.offer(cand{key, dr, r.id, di, int32(j)})
		}
	}
}

// offerAll offers donor i with each acceptor of recs (recs[k] is acceptor
// lo+k) by σ, the window and the heap deciding.
func (t *ranker) offerAll(i int, recs []accRec, lo int, h *topK) {
	d := &t.d
	dn := t.donor(i)
	dc, dr := d.couple[i], d.id[i]
	for k := range recs {
		r := &recs[k]
		if r.couple == dc {
			continue
		}
		if dg := dn.dg(r); dg < t.dmin || dg > t.dmax {
			continue
		}
		key := t.sign * math.Sqrt(dn.sig2With(r, r.sig2, r.msig2))
		if key > h.worst {
			continue
		}
		h.offer(cand{key, dr, r.id, int32(i), int32(lo + k)})
	}
}

// scanZ is scanDonor for ΔG°/σ. With e = sign·ΔG° the signed key is e/σ
// (±Inf when σ is zero). Once the worst kept key w is negative, a pair with
// e > 0 cannot enter, nor one with e < 0 and e² < w²σ²; while w ≥ 0, a pair
// with e > 0 and e² > w²σ² cannot. Within a group sorted by BDFE, ΔG° falls
// along the group, so the pairs with e ≤ 0 and those in the ΔG° window are
// runs found by binary search.
func (t *ranker) scanZ(i int, acc []accRec, groups []accGroup, h *topK) {
	d := &t.d
	dc, dr, di := d.couple[i], d.id[i], int32(i)
	dn := t.donor(i)
	dmin, dmax, sign := t.dmin, t.dmax, t.sign
	full, neg, c2 := false, false, 0.0
	bounds := func() {
		if full = h.full(); full {
			w := h.worst
			if neg = w < 0; neg {
				c2 = w * w * (1 - skipMargin)
			} else {
				c2 = w * w * (1 + skipMargin)
			}
		}
	}
	bounds()
	for _, g := range groups {
		lo, hi := g.lo, g.hi
		// While w < 0, a pair needs e ≤ w·σ, and σ ≥ σmin, the least σ of
		// this donor with the group: pairs with e > −t0 cannot enter, t0 =
		// |w|·σmin less the margin. (t0 is NaN, cutting nothing, when w is
		// −Inf and σmin zero.)
		t0 := 0.0
		if neg {
			r0 := &acc[lo]
			sdmin := dn.sig2With(r0, g.minSig2, g.minM2)
			t0 = -h.worst * math.Sqrt(sdmin) * (1 - skipMargin)
		}
		// ΔG° = db − bdfe falls along the group: cut the head where it is
		// above the window (or e > −t0, ranking most negative first) and
		// the tail where it is below (or e > −t0, reversed: e = −ΔG°).
		cutHead := func(dg float64) bool { return dg > dmax || (neg && sign > 0 && dg > -t0) }
		cutTail := func(dg float64) bool { return dg < dmin || (neg && sign < 0 && dg < t0) }
		lo += sort.Search(hi-lo, func(k int) bool { return !cutHead(dn.dg(&acc[lo+k])) })
		hi = lo + sort.Search(hi-lo, func(k int) bool { return cutTail(dn.dg(&acc[lo+k])) })
		for j := lo; j < hi; j++ {
			r := &acc[j]
			if r.couple == dc {
				continue
			}
			dg := dn.dg(r)
			if dg < dmin || dg > dmax {
				continue
			}
			e := sign * dg
			if neg && e > 0 {
				continue
			}
			sd := dn.sig2With(r, r.sig2, r.msig2)
			if full {
				if neg {
					if e < 0 && e*e < c2*sd {
						continue
					}
				} else if e > 0 && e*e > c2*sd {
					continue
				}
			}
			key := zScore(e, math.Sqrt(sd))
			if key > h.worst {
				continue
			}
			h.offer(cand{key, dr, r.id, di, int32(j)})
			bounds()
		}
	}
}

// pairSigma2 is σ(ΔG°)² of a pair from the squares of its parts: the data
// parts always, the C_G parts unless both BDFEs carry the same solvent's C_G
// (addCG false), the cross-solvent parts when the solvents differ. Each sum
// is rounded as written, so every path computes the same key.
func pairSigma2(d2, a2, dcg2, acg2, dcr2, acr2 float64, addCG, cross bool) float64 {
	s := float64(d2 + a2)
	if addCG {
		s = float64(s + float64(dcg2+acg2))
	}
	if cross {
		s = float64(s + float64(dcr2+acr2))
	}
	return s
}

// zScore is ΔG°/σ, ±Inf when σ is zero.
func zScore(dg, sig float64) float64 {
	if sig == 0 {
		return math.Copysign(math.Inf(1), dg)
	}
	return dg / sig
}

// frontier draws pairs by ΔG° (or log10 K) lazily. With acceptors sorted by
// BDFE (descending when the most negative ΔG° is best), ΔG° only worsens
// along a donor's row of acceptors, and the ΔG° window cuts each row to one
// contiguous run. A heap holds the next pair of every row; popping it yields pairs in order of
// key. Pairs are offered to the bounded heap until it is full and the next
// key is worse than the worst kept: pairs tied with the worst kept are still
// offered, so ties are settled by ids exactly as in the full sort.
func (t *ranker) frontier(k int) []cand {
	// asc: ΔG° ascending is best first (ΔG°, or log10 K reversed).
	asc := (t.sign > 0) == (t.metric == ByDG)
	// Only the acceptors need sorting: heapifying the rows orders donors.
	// They are sorted by solvent, then BDFE: across media ΔG° follows the
	// acceptor's H2 margin, which within one solvent is its BDFE less a
	// constant, so every row is one solvent's run, monotone as before.
	order := sortedOrder(t.a.bdfe, t.a.id, asc)
	slices.SortStableFunc(order, func(x, y int32) int { return cmp.Compare(t.a.solv[x], t.a.solv[y]) })
	t.a = t.a.permute(order)
	d, a := &t.d, &t.a
	dgOf := func(i, j int) float64 {
		return pairDG(d.bdfe[i], d.margin[i], a.bdfe[j], a.margin[j], d.solv[i] != a.solv[j])
	}
	fr := frontierHeap(t.frontierRows(asc, dgOf))
	for i := len(fr)/2 - 1; i >= 0; i-- {
		fr.down(i)
	}
	out := t.drain(&fr, k, dgOf)
	orderTiedRuns(out)
	return out
}

// drain takes pairs off the frontier fr in order of key and returns the
// best k of them, each row moving on to its next acceptor as its pair is
// taken. A couple never pairs with itself.
func (t *ranker) drain(fr *frontierHeap, k int, dgOf func(i, j int) float64) []cand {
	d, a := &t.d, &t.a
	// Pairs come off the frontier in order of key, so the first k are kept
	// as they come. After that only pairs tied with the k-th key can still
	// enter, in place of the kept pairs with that key (a run at the end of
	// out): those slots go to the best ids, held in a bounded heap.
	out := make([]cand, 0, min(k, len(d.bdfe)*len(a.bdfe)))
	var ties *topK
	for len(*fr) > 0 {
		top := &(*fr)[0]
		if len(out) == k {
			last := out[k-1].key
			if top.key > last {
				break
			}
			if ties == nil {
				from := k - 1
				for from > 0 && out[from-1].key == last {
					from--
				}
				ties = &topK{k: k - from, items: out[from:], worst: last}
				ties.heapify()
			}
		}
		i, j := top.i, top.j
		if d.couple[i] != a.couple[j] {
			if c := (cand{top.key, d.id[i], a.id[j], i, j}); len(out) < k {
				out = append(out, c)
			} else {
				ties.offer(c)
			}
		}
		if top.j++; top.j < top.end {
			top.key = t.dgKey(dgOf(int(i), int(top.j)))
		} else {
			fr.pop()
		}
		fr.down(0)
	}
	return out
}

// orderTiedRuns orders by ids each run of equal keys in out, which is
// otherwise in order of key.
func orderTiedRuns(out []cand) {
	for lo := 0; lo < len(out); {
		hi := lo + 1
		for hi < len(out) && out[hi].key == out[lo].key {
			hi++
		}
		if hi-lo > 1 {
			slices.SortFunc(out[lo:hi], compareCand)
		}
		lo = hi
	}
}

// frontierHeap is the rows of the frontier, a binary min-heap by key.
type frontierHeap []frontierCell

// down moves cell i down the heap to its place.
func (fr frontierHeap) down(i int) {
	for {
		c := 2*i + 1
		if c >= len(fr) {
			return
		}
		if r := c + 1; r < len(fr) && fr[r].key < fr[c].key {
			c = r
		}
		if !(fr[c].key < fr[i].key) {
			return
		}
		fr[i], fr[c] = fr[c], fr[i]
		i = c
	}
}

// pop puts the last cell in place of the first and drops it from the end
// (the caller then moves the first down).
func (fr *frontierHeap) pop() {
	h := *fr
	h[0] = h[len(h)-1]
	*fr = h[:len(h)-1]
}

// frontierCell is the next pair of one row of the frontier: donor i with
// acceptors j up to end (one solvent's run), keyed by the pair at j.
type frontierCell struct {
	key       float64
	i, j, end int32
}

// frontierRows returns the first cell of every row: each donor with each
// run of acceptors in one solvent, cut to the ΔG° window.
func (t *ranker) frontierRows(asc bool, dgOf func(i, j int) float64) []frontierCell {
	d, a := &t.d, &t.a
	type run struct{ lo, hi int }
	var runs []run
	for j := range a.bdfe {
		if len(runs) > 0 && a.solv[runs[len(runs)-1].lo] == a.solv[j] {
			runs[len(runs)-1].hi = j + 1
		} else {
			runs = append(runs, run{j, j + 1})
		}
	}
	fr := make([]frontierCell, 0, len(d.bdfe)*len(runs))
	for i := range d.bdfe {
		for _, rn := range runs {
			lo, hi := rn.lo, rn.hi
			// before: pairs cut off at the start of the row; after: at its end.
			before := func(j int) bool { return dgOf(i, j) < t.dmin }
			after := func(j int) bool { return dgOf(i, j) > t.dmax }
			if !asc {
				before, after = after, before
			}
			if !math.IsInf(t.dmin, 0) || !math.IsInf(t.dmax, 0) {
				lo += sort.Search(hi-lo, func(j int) bool { return !before(lo + j) })
				hi = lo + sort.Search(hi-lo, func(j int) bool { return after(lo + j) })
			}
			if lo < hi {
				fr = append(fr, frontierCell{t.dgKey(dgOf(i, lo)), int32(i), int32(lo), int32(hi)})
			}
		}
	}
	return fr
}

// byDonor ranks by a key of the donor alone (its BDFE or H2 margin): donors
// are visited best first, and the walk stops at the first donor whose pairs
// can no longer enter.
func (t *ranker) byDonor(k int) []cand {
	key := t.d.bdfe
	if t.metric == ByDonorMargin {
		key = t.d.margin
	}
	t.d = t.d.permute(sortedOrder(key, t.d.id, t.sign < 0))
	key = t.d.bdfe
	if t.metric == ByDonorMargin {
		key = t.d.margin
	}
	d, a := &t.d, &t.a
	h := newTopK(k)
	for i, kv := range key {
		kv *= t.sign
		dr := d.id[i]
		if h.full() {
			if w := h.items[0]; kv > w.key || (kv == w.key && dr > w.did) {
				break
			}
		}
		db, dm, dc, dsv := d.bdfe[i], d.margin[i], d.couple[i], d.solv[i]
		for j, ab := range a.bdfe {
			if a.couple[j] == dc {
				continue
			}
			if dg := pairDG(db, dm, ab, a.margin[j], dsv != a.solv[j]); dg < t.dmin || dg > t.dmax {
				continue
			}
			h.offer(cand{kv, dr, a.id[j], int32(i), int32(j)})
		}
	}
	return finish(h.items, k)
}

// byAcceptor ranks by the acceptor's BDFE: acceptors are visited best first,
// and the walk stops at the first acceptor whose pairs can no longer enter.
func (t *ranker) byAcceptor(k int) []cand {
	t.a = t.a.permute(sortedOrder(t.a.bdfe, t.a.id, t.sign < 0))
	d, a := &t.d, &t.a
	h := newTopK(k)
	for j, ab := range a.bdfe {
		kv := t.sign * ab
		if h.full() && kv > h.worst {
			break
		}
		ac, ar, am, asv := a.couple[j], a.id[j], a.margin[j], a.solv[j]
		for i, db := range d.bdfe {
			if d.couple[i] == ac {
				continue
			}
			if dg := pairDG(db, d.margin[i], ab, am, d.solv[i] != asv); dg < t.dmin || dg > t.dmax {
				continue
			}
			h.offer(cand{kv, d.id[i], ar, int32(i), int32(j)})
		}
	}
	return finish(h.items, k)
}
