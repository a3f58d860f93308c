package tui

import (
	"slices"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// DefaultMaxPairs caps the Pairs table; above it the best pairs by ΔG° are
// kept and the top line says so.
const DefaultMaxPairs = 1_000_000

// tables is an evaluated library laid out for the screens. It is built in a
// command and never changed afterwards, so reorder jobs may read it from
// other goroutines.
type tables struct {
	ev *data.Evaluated

	// Pairs: a flat slice, with each pair's donor and acceptor index.
	pairs  []thermo.Pair
	pd, pa []int32
	total  int  // donors × acceptors before the cap
	capped bool // pairs holds only the best DefaultMaxPairs by ΔG°

	donors, acceptors []*data.Entry // aligned with ev.Donors, ev.Acceptors
	// Sort keys of text columns: the rank of each text in sorted order.
	donorOrd, accOrd []float64
	// Lower-cased text a filter matches against, per couple.
	donorText, accText []string
}

// buildTables lays out ev; it is the heavy step (ranking every pair).
func buildTables(ev *data.Evaluated, maxPairs int) *tables {
	if maxPairs <= 0 {
		maxPairs = DefaultMaxPairs
	}
	t := &tables{ev: ev}
	// Every donor × acceptor pair but a couple with itself (as thermo.Rank).
	both := 0
	isAcc := make(map[*thermo.Couple]bool, len(ev.Acceptors))
	for _, a := range ev.Acceptors {
		isAcc[a.Couple] = true
	}
	for _, d := range ev.Donors {
		if isAcc[d.Couple] {
			both++
		}
	}
	t.total = len(ev.Donors)*len(ev.Acceptors) - both
	o := thermo.RankOptions{Sort: thermo.ByDG}
	if t.total > maxPairs {
		o.Top = maxPairs
		t.capped = true
	}
	t.pairs = ev.Rank(o)
	di := make(map[*thermo.Resolved]int32, len(ev.Donors))
	for i, r := range ev.Donors {
		di[r] = int32(i)
		t.donors = append(t.donors, ev.Entry(r.Couple))
	}
	ai := make(map[*thermo.Resolved]int32, len(ev.Acceptors))
	for i, r := range ev.Acceptors {
		ai[r] = int32(i)
		t.acceptors = append(t.acceptors, ev.Entry(r.Couple))
	}
	t.pd = make([]int32, len(t.pairs))
	t.pa = make([]int32, len(t.pairs))
	for i := range t.pairs {
		t.pd[i] = di[t.pairs[i].Donor]
		t.pa[i] = ai[t.pairs[i].Acceptor]
	}
	t.donorOrd = textOrder(len(t.donors), func(i int) string { return t.donors[i].ID })
	t.accOrd = textOrder(len(t.acceptors), func(i int) string { return t.acceptors[i].ID })
	t.donorText = filterTexts(t.donors)
	t.accText = filterTexts(t.acceptors)
	return t
}

// textOrder returns, for each of n texts, its rank in sorted order, as a
// sort key.
func textOrder(n int, text func(int) string) []float64 {
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return strings.Compare(text(a), text(b)) })
	ord := make([]float64, n)
	for r, i := range idx {
		ord[i] = float64(r)
	}
	return ord
}

func filterTexts(es []*data.Entry) []string {
	out := make([]string, len(es))
	for i, e := range es {
		out[i] = strings.ToLower(strings.Join([]string{e.ID, e.Name, e.Bond, e.Source, strings.Join(e.Tags, " ")}, "\x00"))
	}
	return out
}

// matches returns which texts contain every word of query.
func matches(texts []string, query string) []bool {
	words := strings.Fields(strings.ToLower(query))
	out := make([]bool, len(texts))
	for i, t := range texts {
		ok := true
		for _, w := range words {
			if !strings.Contains(t, w) {
				ok = false
				break
			}
		}
		out[i] = ok
	}
	return out
}

// seriesRow is one step of one series for the selected donor.
type seriesRow struct {
	series     int // index into ev.Series
	name       string
	step       int
	pair       thermo.Pair
	bottleneck bool
	res        *thermo.SeriesResult
}

// buildSeries drives donor d through every series of ev, listing series
// first (and the others after it, in library order) first.
func buildSeries(ev *data.Evaluated, d *thermo.Resolved, first int) []seriesRow {
	if d == nil {
		return nil
	}
	var rows []seriesRow
	n := len(ev.Series)
	for k := range n {
		si := (first + k) % n
		s := ev.Series[si]
		r := thermo.RunSeries(d, s, ev.Cond)
		res := &r
		name := s.Name
		if name == "" {
			name = s.ID
		}
		for k, p := range r.Steps {
			rows = append(rows, seriesRow{series: si, name: name, step: k, pair: p, bottleneck: k == r.Bottleneck, res: res})
		}
	}
	return rows
}
