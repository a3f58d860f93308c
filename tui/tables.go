package tui

import (
	"fmt"
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
	// ev holds the couples shown: those of the bond class chosen.
	ev    *data.Evaluated
	class bondClass

	// Pairs: a flat slice, with each pair's donor and acceptor index.
	pairs  []thermo.Pair
	pd, pa []int32
	total  int  // donors × acceptors before the cap
	capped bool // pairs holds only the best maxPairs by rankedBy
	// The ranking that chose the pairs held when capped.
	rankedBy  thermo.Metric
	rankRev   bool
	rankWorst bool // the window is the far end of the column's natural order

	donors, acceptors []*data.Entry // aligned with ev.Donors, ev.Acceptors
	di, ai            map[*thermo.Resolved]int32
	// Readable names (the couple's name, else its id; the id is added
	// where two couples share a name), and their rank as a sort key.
	donorName, accName []string
	donorOrd, accOrd   []float64
	// Lower-cased text a filter matches against, per couple.
	donorText, accText []string
	crossing           bool // couples of several solvents are shown

	// flask holds the concentrations of the conversion and rate columns.
	flask thermo.Flask
}

// estimate is what thermo makes of pair p in the flask of the tables: the
// equilibrium conversion and the cross-relation rate estimate from the
// couples' self-exchange constants (a zero estimate when the flask cannot
// be used, which the conditions dialog does not let happen). Cells and
// sort keys use it; it leaves out the race text (see estimatePair).
func (t *tables) estimate(p *thermo.Pair) thermo.FlaskEstimate {
	c := t.ev.Cond
	e, _ := thermo.EstimateLogK(p.Log10K, p.DG.Sigma()/thermo.RTLn10(c.T()), c, t.flask, t.kSelf(p.Donor), t.kSelf(p.Acceptor))
	return e
}

// estimatePair is estimate with the race against H2 evolution (its
// energies in units u), for the detail panel.
func (t *tables) estimatePair(p *thermo.Pair, u thermo.Units) thermo.FlaskEstimate {
	e, _ := thermo.EstimatePair(*p, t.ev.Cond, t.flask, t.kSelf(p.Donor), t.kSelf(p.Acceptor), u)
	return e
}

// rateKey is the cross-relation log k of pair i of the table, the sort
// key of the log k column (thermo.CrossLog10K: CrossRelation's estimate
// without its note, so that 10^6 keys stay cheap), with the couples'
// constants read by index.
func (t *tables) rateKey(i int32) (float64, bool) {
	kD, kA := t.donors[t.pd[i]].KSelf, t.acceptors[t.pa[i]].KSelf
	if kD == nil || kA == nil {
		return 0, false
	}
	return thermo.CrossLog10K(kD.K, kA.K, t.pairs[i].Log10K)
}

// kSelf is the self-exchange constant the library gives r's couple, or nil.
func (t *tables) kSelf(r *thermo.Resolved) *thermo.SelfExchange {
	if e := t.ev.Entry(r.Couple); e != nil {
		return e.KSelf
	}
	return nil
}

// tableSpec is what the layout depends on besides the evaluation.
type tableSpec struct {
	maxPairs int
	class    bondClass
	metric   thermo.Metric // the ranking that keeps the best maxPairs
	reverse  bool
	worst    bool // reverse of the column's natural order
	flask    thermo.Flask
}

// buildTables lays out ev with every bond class, ranked by ΔG°.
func buildTables(ev *data.Evaluated, maxPairs int) *tables {
	return layTables(ev, tableSpec{maxPairs: maxPairs, metric: thermo.ByDG})
}

// layTables lays out ev; it is the heavy step (ranking every pair).
func layTables(ev *data.Evaluated, s tableSpec) *tables {
	ev = ofClass(ev, s.class)
	t := &tables{ev: ev, class: s.class, flask: s.flask}
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
	t.di = make(map[*thermo.Resolved]int32, len(ev.Donors))
	for i, r := range ev.Donors {
		t.di[r] = int32(i)
		t.donors = append(t.donors, ev.Entry(r.Couple))
	}
	t.ai = make(map[*thermo.Resolved]int32, len(ev.Acceptors))
	for i, r := range ev.Acceptors {
		t.ai[r] = int32(i)
		t.acceptors = append(t.acceptors, ev.Entry(r.Couple))
	}
	t.donorName, t.accName = readableNames(t.donors), readableNames(t.acceptors)
	t.donorOrd = textOrder(len(t.donors), func(i int) string { return t.donorName[i] })
	t.accOrd = textOrder(len(t.acceptors), func(i int) string { return t.accName[i] })
	t.donorText = filterTexts(t.donors)
	t.accText = filterTexts(t.acceptors)
	for _, e := range ev.All {
		t.crossing = t.crossing || e.Couple.Solvent != ev.Working
	}
	t.rank(s.metric, s.reverse, s.maxPairs)
	t.rankWorst = s.worst
	return t
}

// rank fills the pairs: every pair, or the best maxPairs by metric.
func (t *tables) rank(metric thermo.Metric, reverse bool, maxPairs int) {
	if maxPairs <= 0 {
		maxPairs = DefaultMaxPairs
	}
	o := thermo.RankOptions{Sort: thermo.ByDG}
	t.capped = t.total > maxPairs
	if t.capped {
		o = thermo.RankOptions{Sort: metric, Reverse: reverse, Top: maxPairs}
	}
	t.rankedBy, t.rankRev = o.Sort, o.Reverse
	t.pairs = t.ev.Rank(o)
	t.pd = make([]int32, len(t.pairs))
	t.pa = make([]int32, len(t.pairs))
	for i := range t.pairs {
		t.pd[i] = t.di[t.pairs[i].Donor]
		t.pa[i] = t.ai[t.pairs[i].Acceptor]
	}
}

// reranked is t with its pairs ranked afresh over the whole library: the
// best maxPairs by metric (reverse: the other end). The couples are shared.
func (t *tables) reranked(metric thermo.Metric, reverse bool, maxPairs int) *tables {
	nt := *t
	nt.rank(metric, reverse, maxPairs)
	return &nt
}

// holds tells whether the pairs held suit the Pairs grid's sort: every
// pair, or the window ranked by its key in its direction. A key thermo
// does not rank by (a name, the mark) is suited by any window.
func (t *tables) holds(g *grid) bool {
	met, ok := pairMetric(g.sortCol)
	return !t.capped || !ok || (met == t.rankedBy && g.rev == t.rankWorst)
}

// windowText says which pairs a capped table holds.
func (t *tables) windowText() string {
	end := "best"
	if t.rankWorst {
		end = "worst"
	}
	return fmt.Sprintf("%s %d by %s", end, len(t.pairs), metricTitle(t.rankedBy))
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
