package thermo

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// The ranking engine takes shortcuts (a lazy frontier for ΔG°, early stops
// for one-sided keys, bounded heaps per worker). These tests hold it to a
// brute-force reference that forms every pair, computes its key the plain
// way and sorts the whole list: the order must match pair for pair,
// including ties, which are settled by donor id then acceptor id.

// refKey is the key of one pair as the plain definition gives it.
func refKey(m Metric, d, a *Resolved, k float64) (dg, key float64) {
	dg = d.BDFE.Kcal - a.BDFE.Kcal
	sd := float64(d.BDFE.SigData*d.BDFE.SigData) + float64(a.BDFE.SigData*a.BDFE.SigData)
	if d.BDFE.CG == nil || d.BDFE.CG != a.BDFE.CG {
		sd += float64(d.BDFE.SigCG*d.BDFE.SigCG) + float64(a.BDFE.SigCG*a.BDFE.SigCG)
	}
	if ds, as := d.Couple.Solvent, a.Couple.Solvent; ds != as {
		// Across media the H2 margins are compared (BDFE(solution) ≈
		// BDFE(gas) + ΔG°solv(H•), 2010 review §3.1.1), with both margins'
		// σ and each side's cross-solvent σ.
		dg = d.Margin.Kcal - a.Margin.Kcal
		dm, am := d.Margin.Sigma(), a.Margin.Sigma()
		sd = float64(dm*dm) + float64(am*am) + float64(ds.CrossSigma*ds.CrossSigma) + float64(as.CrossSigma*as.CrossSigma)
	}
	sig := math.Sqrt(sd)
	switch m {
	case BySigma:
		return dg, sig
	case ByLog10K:
		return dg, -dg / k
	case ByDonorBDFE:
		return dg, d.BDFE.Kcal
	case ByAcceptorBDFE:
		return dg, a.BDFE.Kcal
	case ByDonorMargin:
		return dg, d.Margin.Kcal
	case ByZScore:
		if sig == 0 {
			return dg, math.Copysign(math.Inf(1), dg)
		}
		return dg, dg / sig
	}
	return dg, dg
}

// rankBrute builds every allowed pair, sorts the whole list and cuts it.
func rankBrute(donors, acceptors []*Resolved, c Conditions, o RankOptions) []Pair {
	type row struct {
		d, a *Resolved
		key  float64
	}
	k := RTLn10(c.T())
	var all []row
	for _, d := range donors {
		if len(o.Tendencies) > 0 && !slices.Contains(o.Tendencies, d.Tendency) {
			continue
		}
		for _, a := range acceptors {
			if a.Couple == d.Couple {
				continue
			}
			dg, key := refKey(o.Sort, d, a, k)
			if (o.DGMin != nil && dg < *o.DGMin) || (o.DGMax != nil && dg > *o.DGMax) {
				continue
			}
			all = append(all, row{d, a, key})
		}
	}
	desc := o.Sort.NaturalDescending() != o.Reverse
	slices.SortFunc(all, func(x, y row) int {
		if x.key != y.key {
			if (x.key < y.key) != desc {
				return -1
			}
			return 1
		}
		if x.d.Couple.ID != y.d.Couple.ID {
			if x.d.Couple.ID < y.d.Couple.ID {
				return -1
			}
			return 1
		}
		if x.a.Couple.ID < y.a.Couple.ID {
			return -1
		}
		if x.a.Couple.ID > y.a.Couple.ID {
			return 1
		}
		return 0
	})
	if o.Top > 0 && len(all) > o.Top {
		all = all[:o.Top]
	}
	out := make([]Pair, len(all))
	for i, r := range all {
		out[i] = MakePair(r.d, r.a, c)
	}
	return out
}

// library is a random set of couples for ranking. Values come from a few
// levels so that many pairs tie on every key.
type library struct {
	donors, acceptors []*Resolved
}

func randomLibrary(rng *rand.Rand, n, m, levels int) library {
	solvents := []*Solvent{
		{Key: "s1", Name: "S1", CrossSigma: 1.5},
		{Key: "s2", Name: "S2", CrossSigma: 2},
		{Key: "s3", Name: "S3"},
	}
	level := func(lo, step float64) float64 { return lo + step*float64(rng.IntN(levels)) }
	mk := func(id string) *Resolved {
		s := solvents[rng.IntN(len(solvents))]
		if rng.IntN(4) > 0 {
			s = solvents[0]
		}
		cp := &Couple{ID: id, Solvent: s}
		r := &Resolved{Couple: cp}
		r.BDFE.Kcal = level(60, 2.5)
		r.BDFE.SigData = level(0.5, 0.25)
		if rng.IntN(3) > 0 {
			// cycle-derived: carries the solvent's C_G
			r.BDFE.CG = s
			r.BDFE.SigCG = level(0.2, 0.3)
			if rng.IntN(5) == 0 {
				r.BDFE.SigData = 0
				r.BDFE.SigCG = 0
			}
		}
		// Each solvent has its own H2 line, so pairs across media (compared
		// on margins) order differently from their BDFE difference; the
		// margin's σ grows with the data σ, as H2Margin's does.
		r.Margin.Kcal = r.BDFE.Kcal - map[string]float64{"s1": 64, "s2": 61.5, "s3": 66.5}[s.Key]
		r.Margin.SigData = r.BDFE.SigData + 0.5
		r.Tendency = Classify(r.Margin)
		return r
	}
	var lib library
	// Ids are drawn in shuffled order so that id order and input order differ.
	ids := rng.Perm(n + m)
	for i := range n {
		lib.donors = append(lib.donors, mk(fmt.Sprintf("c%03d", ids[i])))
	}
	for j := range m {
		switch rng.IntN(4) {
		case 0: // a couple that plays both roles, as the data package passes it
			if len(lib.donors) > 0 {
				lib.acceptors = append(lib.acceptors, lib.donors[rng.IntN(len(lib.donors))])
				continue
			}
		case 1: // the same couple resolved twice: still the same couple
			if len(lib.donors) > 0 {
				d := lib.donors[rng.IntN(len(lib.donors))]
				r := *d
				lib.acceptors = append(lib.acceptors, &r)
				continue
			}
		}
		lib.acceptors = append(lib.acceptors, mk(fmt.Sprintf("c%03d", ids[n+j])))
	}
	// A couple may appear once per side only; drop repeats.
	seen := map[*Couple]bool{}
	lib.acceptors = slices.DeleteFunc(lib.acceptors, func(r *Resolved) bool {
		if seen[r.Couple] {
			return true
		}
		seen[r.Couple] = true
		return false
	})
	return lib
}

func pairIDs(ps []Pair) []string {
	out := make([]string, len(ps))
	for i, p := range ps {
		out[i] = p.Donor.Couple.ID + ">" + p.Acceptor.Couple.ID
	}
	return out
}

// samePairs reports the first difference between two rankings, "" if none.
func samePairs(got, want []Pair) string {
	if len(got) != len(want) {
		return fmt.Sprintf("%d pairs, want %d", len(got), len(want))
	}
	for i := range got {
		g, w := got[i], want[i]
		if g.Donor != w.Donor || g.Acceptor != w.Acceptor {
			return fmt.Sprintf("pair %d is %s>%s, want %s>%s", i, g.Donor.Couple.ID, g.Acceptor.Couple.ID, w.Donor.Couple.ID, w.Acceptor.Couple.ID)
		}
		if g.DG != w.DG || g.Log10K != w.Log10K {
			return fmt.Sprintf("pair %d metrics differ: %+v vs %+v", i, g.DG, w.DG)
		}
	}
	return ""
}

func f64(v float64) *float64 { return &v }

// rankCases are option sets crossed with every metric and direction.
func rankCases(nm int) []RankOptions {
	var out []RankOptions
	filters := []RankOptions{
		{},
		{DGMin: f64(-5), DGMax: f64(5)},
		{DGMax: f64(0)},
		{DGMin: f64(2.5)},
		{DGMin: f64(3), DGMax: f64(-3)}, // empty window
		{Tendencies: []Tendency{Downhill}},
		{Tendencies: []Tendency{Uphill, NearLine}, DGMin: f64(-7.5)},
	}
	for _, f := range filters {
		for _, top := range []int{0, 1, 2, 7, 40, nm + 5} {
			for _, w := range []int{0, 3} {
				o := f
				o.Top, o.Workers = top, w
				out = append(out, o)
			}
		}
	}
	return out
}

func TestRankMatchesBruteForce(t *testing.T) {
	c := Conditions{}
	for seed := range uint64(10) {
		rng := rand.New(rand.NewPCG(seed, 7))
		levels := []int{2, 3, 8, 40}[seed%4]
		lib := randomLibrary(rng, 1+rng.IntN(25), 1+rng.IntN(25), levels)
		nm := len(lib.donors) * len(lib.acceptors)
		for m := range Metric(len(metricNames)) {
			for _, rev := range []bool{false, true} {
				for _, o := range rankCases(nm) {
					o.Sort, o.Reverse = m, rev
					got := Rank(lib.donors, lib.acceptors, c, o)
					want := rankBrute(lib.donors, lib.acceptors, c, o)
					if d := samePairs(got, want); d != "" {
						t.Fatalf("seed %d levels %d %v reverse=%v top=%d workers=%d dg=[%v,%v] h2=%v: %s\ngot  %v\nwant %v",
							seed, levels, m, rev, o.Top, o.Workers, o.DGMin, o.DGMax, o.Tendencies, d, pairIDs(got), pairIDs(want))
					}
				}
			}
		}
	}
}

// All BDFEs equal: every pair ties on ΔG°, and the frontier must still give
// the pairs in id order.
func TestRankAllTied(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 3))
	lib := randomLibrary(rng, 30, 30, 1)
	for _, r := range append(slices.Clone(lib.donors), lib.acceptors...) {
		r.Margin.Kcal = r.BDFE.Kcal - 64 // one H2 line: pairs across media tie too
	}
	for _, m := range []Metric{ByDG, ByLog10K, ByDonorBDFE, ByAcceptorBDFE, BySigma} {
		for _, top := range []int{1, 5, 31, 2000} {
			o := RankOptions{Sort: m, Top: top}
			got := Rank(lib.donors, lib.acceptors, Conditions{}, o)
			want := rankBrute(lib.donors, lib.acceptors, Conditions{}, o)
			if d := samePairs(got, want); d != "" {
				t.Fatalf("%v top %d: %s", m, top, d)
			}
			ids := pairIDs(got)
			if !slices.IsSorted(ids) && m != BySigma {
				t.Errorf("%v top %d: tied pairs not in id order: %v", m, top, ids)
			}
		}
	}
}

// The result depends on the couples, not on the order they are given in.
func TestRankIndependentOfInputOrder(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 5))
	lib := randomLibrary(rng, 40, 50, 5)
	for m := range Metric(len(metricNames)) {
		for _, o := range []RankOptions{{Top: 10}, {Top: 0}, {Top: 25, DGMin: f64(-5), Tendencies: []Tendency{Uphill, Downhill}}} {
			o.Sort = m
			want := pairIDs(Rank(lib.donors, lib.acceptors, Conditions{}, o))
			for range 5 {
				d, a := slices.Clone(lib.donors), slices.Clone(lib.acceptors)
				rng.Shuffle(len(d), func(i, j int) { d[i], d[j] = d[j], d[i] })
				rng.Shuffle(len(a), func(i, j int) { a[i], a[j] = a[j], a[i] })
				if got := pairIDs(Rank(d, a, Conditions{}, o)); !slices.Equal(got, want) {
					t.Fatalf("%v top %d: shuffled input gives %v, want %v", m, o.Top, got, want)
				}
			}
		}
	}
}

// A small hand-made case whose order can be read off: ΔG° = BDFE(D) − BDFE(A).
// Source: Warren, Tronic, Mayer, Chem. Rev. 2010, 110, 6961 (ΔG° of an
// H-atom transfer as the difference of the two BDFEs; section from memory).
func TestRankByDGHandMade(t *testing.T) {
	s := &Solvent{Key: "x", Name: "X"}
	mk := func(id string, bdfe float64) *Resolved {
		return &Resolved{Couple: &Couple{ID: id, Solvent: s}, BDFE: Energy{Kcal: bdfe, SigData: 1}}
	}
	d1, d2 := mk("d1", 70), mk("d2", 80)
	a1, a2 := mk("a1", 75), mk("a2", 85)
	both := mk("b", 78) // plays both roles: never paired with itself
	donors := []*Resolved{d2, both, d1}
	acceptors := []*Resolved{a1, both, a2}
	got := pairIDs(Rank(donors, acceptors, Conditions{}, RankOptions{Top: 4}))
	// ΔG°: d1>a2 −15, b>a2 −7, d1>b −8, d2>a2 −5, d1>a1 −5, ...
	want := []string{"d1>a2", "d1>b", "b>a2", "d1>a1"}
	if !slices.Equal(got, want) {
		t.Errorf("top 4 by ΔG° = %v, want %v", got, want)
	}
	got = pairIDs(Rank(donors, acceptors, Conditions{}, RankOptions{Top: 2, Reverse: true}))
	// largest ΔG° first: d2>a1 +5, b>a1 +3 and d2>b +2
	want = []string{"d2>a1", "b>a1"}
	if !slices.Equal(got, want) {
		t.Errorf("top 2 by ΔG° reversed = %v, want %v", got, want)
	}
	if n := len(Rank(donors, acceptors, Conditions{}, RankOptions{})); n != 8 {
		t.Errorf("every pair: %d, want 3×3 − 1 self pair = 8", n)
	}
}

func TestParseMetric(t *testing.T) {
	for _, name := range MetricNames() {
		m, err := ParseMetric(" " + name + " ")
		if err != nil || m.String() != name {
			t.Errorf("ParseMetric(%q) = %v, %v", name, m, err)
		}
	}
	if _, err := ParseMetric("bogus"); err == nil {
		t.Error("ParseMetric(bogus): no error")
	}
}

// Larger libraries with nearly continuous values: the heaps fill early and
// the skip tests (σ bounds, ΔG°/σ cuts, early stops) do most of the work.
// With one σ for every couple the cuts sit right at the boundary of the
// kept set, where a bound that is off by 1% would drop pairs.
func TestRankLargerMatchesBruteForce(t *testing.T) {
	for _, sameSigma := range []bool{false, true} {
		rng := rand.New(rand.NewPCG(99, 1))
		lib := randomLibrary(rng, 250, 300, 2)
		// Realistic spreads: BDFEs over 40–110 kcal/mol, σ of the data
		// 0.5–1.5, σ(C_G) one value per solvent, so acceptors fall in a few
		// large groups.
		for _, r := range append(slices.Clone(lib.donors), lib.acceptors...) {
			r.BDFE.Kcal = 40 + 70*rng.Float64()
			r.BDFE.SigData = 0.5 + rng.Float64()
			if r.BDFE.CG != nil {
				r.BDFE.SigCG = 0.3 + 0.1*float64(len(r.BDFE.CG.Key))
			}
			if sameSigma {
				r.BDFE.SigData, r.BDFE.SigCG, r.BDFE.CG, r.Couple.Solvent = 1, 0, nil, lib.donors[0].Couple.Solvent
			}
			r.Margin.Kcal = r.BDFE.Kcal - 52
			r.Tendency = Classify(r.Margin)
		}
		for m := range Metric(len(metricNames)) {
			for _, rev := range []bool{false, true} {
				opts := []RankOptions{{Top: 50}, {Top: 200, DGMin: f64(-20), DGMax: f64(20)}, {Top: 30, Tendencies: []Tendency{Uphill}}}
				if sameSigma {
					opts = []RankOptions{{Top: 50}, {Top: 3, Workers: 2}, {Top: 2000}}
				}
				for _, o := range opts {
					o.Sort, o.Reverse = m, rev
					got := Rank(lib.donors, lib.acceptors, Conditions{}, o)
					want := rankBrute(lib.donors, lib.acceptors, Conditions{}, o)
					if d := samePairs(got, want); d != "" {
						t.Fatalf("same σ %v, %v reverse=%v top=%d: %s", sameSigma, m, rev, o.Top, d)
					}
				}
			}
		}
	}
}

// Within one solvent the best Top pairs by ΔG° are ranked from the Top+1
// first donors and acceptors by BDFE alone (firstByBDFE): the same pairs as
// sorting every pair, with many ties, couples that play both roles, and
// either direction.
func TestRankOneMediumMatchesBruteForce(t *testing.T) {
	// A couple first on both sides pairs with itself: the next donor (or
	// acceptor) must be laid out too.
	s := &Solvent{Key: "s", Name: "S"}
	mk := func(id string, bdfe float64) *Resolved {
		return &Resolved{Couple: &Couple{ID: id, Solvent: s}, BDFE: Energy{Kcal: bdfe, SigData: 1}}
	}
	x, y, z := mk("x", 70), mk("y", 71), mk("z", 69)
	for _, c := range []struct {
		donors, acceptors []*Resolved
		want              string
	}{
		{[]*Resolved{x, y}, []*Resolved{x}, "y>x"},
		{[]*Resolved{x}, []*Resolved{x, z}, "x>z"},
		{[]*Resolved{y, x}, []*Resolved{z, x}, "x>z"},
	} {
		got := pairIDs(Rank(c.donors, c.acceptors, Conditions{}, RankOptions{Sort: ByDG, Top: 1}))
		if len(got) != 1 || got[0] != c.want {
			t.Errorf("best of %v: %v, want %s", pairIDs(rankBrute(c.donors, c.acceptors, Conditions{}, RankOptions{Sort: ByDG})), got, c.want)
		}
	}
	for seed := range uint64(12) {
		rng := rand.New(rand.NewPCG(seed, 11))
		levels := []int{1, 2, 3, 8, 40}[seed%5]
		lib := randomLibrary(rng, 1+rng.IntN(40), 1+rng.IntN(40), levels)
		one := lib.donors[0].Couple.Solvent
		for _, r := range append(slices.Clone(lib.donors), lib.acceptors...) {
			r.Couple.Solvent = one
			if r.BDFE.CG != nil {
				r.BDFE.CG = one
			}
		}
		nm := len(lib.donors) * len(lib.acceptors)
		for _, rev := range []bool{false, true} {
			for _, top := range []int{1, 2, 3, 7, 40, nm + 5} {
				for _, h2 := range [][]Tendency{nil, {Uphill, NearLine}} {
					o := RankOptions{Sort: ByDG, Reverse: rev, Top: top, Tendencies: h2}
					got := Rank(lib.donors, lib.acceptors, Conditions{}, o)
					want := rankBrute(lib.donors, lib.acceptors, Conditions{}, o)
					if d := samePairs(got, want); d != "" {
						t.Fatalf("seed %d levels %d reverse=%v top=%d h2=%v: %s\ngot  %v\nwant %v", seed, levels, rev, top, h2, d, pairIDs(got), pairIDs(want))
					}
					if tr := newRanker(lib.donors, lib.acceptors, Conditions{}, o); len(tr.d.bdfe) > top+1 || len(tr.a.bdfe) > top+1 {
						t.Fatalf("seed %d top %d: the frontier laid out %d donors and %d acceptors, want at most %d each", seed, top, len(tr.d.bdfe), len(tr.a.bdfe), top+1)
					}
				}
			}
		}
	}
}

// firstByBDFE keeps the k first couples by (sign·BDFE, id), in their
// places' order, whatever order they come in.
func TestFirstByBDFE(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	lib := randomLibrary(rng, 60, 1, 4)
	rs := lib.donors
	one := rs[0].Couple.Solvent
	for _, r := range rs {
		r.Couple.Solvent = one
	}
	idx := make([]int32, len(rs))
	for i := range idx {
		idx[i] = int32(i)
	}
	for _, sign := range []float64{1, -1} {
		sorted := slices.Clone(idx)
		slices.SortFunc(sorted, func(x, y int32) int {
			if c := cmp.Compare(sign*rs[x].BDFE.Kcal, sign*rs[y].BDFE.Kcal); c != 0 {
				return c
			}
			return strings.Compare(rs[x].Couple.ID, rs[y].Couple.ID)
		})
		for _, k := range []int{0, 1, 2, 5, 59, 60, 61} {
			got, ok := firstByBDFE(rs, idx, k, sign, one)
			if !ok {
				t.Fatalf("sign %v k %d: couples of one solvent not taken as one medium", sign, k)
			}
			want := idx
			if k > 0 && k < len(idx) {
				want = slices.Clone(sorted[:k])
				slices.Sort(want)
			}
			if !slices.Equal(got, want) {
				t.Fatalf("sign %v k %d: %v, want %v", sign, k, got, want)
			}
		}
	}
	// One couple in another solvent, or with a number that is not finite,
	// and the k first cannot stand for the rest.
	other := &Solvent{Key: "other", Name: "Other"}
	for _, spoil := range []func(r *Resolved){
		func(r *Resolved) { r.Couple.Solvent = other },
		func(r *Resolved) { r.BDFE.SigData = math.Inf(1) },
		func(r *Resolved) { r.Margin.Kcal = math.NaN() },
	} {
		for _, at := range []int{0, 3, 59} {
			r := *rs[at]
			cp := *r.Couple
			r.Couple = &cp
			spoiled := slices.Clone(rs)
			spoiled[at] = &r
			spoil(&r)
			for _, k := range []int{2, 100} {
				if _, ok := firstByBDFE(spoiled, idx, k, 1, one); ok {
					t.Errorf("couple %d spoiled, k %d: still taken as one medium with finite numbers", at, k)
				}
			}
		}
	}
	// A medium whose cross σ is not finite: no couple's side is.
	saved := one.CrossSigma
	one.CrossSigma = math.Inf(1)
	if _, ok := firstByBDFE(rs, idx, 2, 1, one); ok {
		t.Error("a medium with an infinite cross σ taken as finite")
	}
	one.CrossSigma = saved
}
