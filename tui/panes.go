package tui

import (
	"fmt"
	"math"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// The Pairs columns. A new column goes here, with its index constant, a
// case in pairCell (what it shows), one in jobFor (its sort key) and, if
// thermo can rank the whole library by it, one in pairMetric.
const (
	pairDonor = iota
	pairAcc
	pairDG
	pairSigma
	pairLogK
	pairConv // equilibrium conversion in the flask
	pairRate // log10 of the cross-relation rate estimate
	pairDonorBDFE
	pairAccBDFE
	pairH2
	pairMark
)

var pairCols = []column{
	pairDonor:     {title: "donor", width: 12, flex: 1},
	pairAcc:       {title: "acceptor", width: 12, flex: 1},
	pairDG:        {title: "ΔG°", width: 7, right: true},
	pairSigma:     {title: "σ", width: 4, right: true},
	pairLogK:      {title: "log K", width: 6, right: true, desc: true},
	pairConv:      {title: "conv.", width: 6, right: true, desc: true, hide: 1},
	pairRate:      {title: "log k", width: 6, right: true, desc: true, hide: 1},
	pairDonorBDFE: {title: "D BDFE", width: 6, right: true, hide: 2},
	pairAccBDFE:   {title: "A BDFE", width: 6, right: true, hide: 2, desc: true},
	pairH2:        {title: "donor H2", width: 11},
	pairMark:      {title: "mark", width: 4, desc: true},
}

// pairMetric is the thermo ranking behind a Pairs column, when there is
// one: by it the whole library can be ranked again.
func pairMetric(col int) (thermo.Metric, bool) {
	switch col {
	case pairDG:
		return thermo.ByDG, true
	case pairSigma:
		return thermo.BySigma, true
	case pairLogK, pairConv:
		// The flask is the same for every pair, so the conversion rises
		// with log K: ranking by log K ranks by it.
		return thermo.ByLog10K, true
	case pairDonorBDFE:
		return thermo.ByDonorBDFE, true
	case pairAccBDFE:
		return thermo.ByAcceptorBDFE, true
	case pairH2:
		return thermo.ByDonorMargin, true
	}
	return 0, false
}

// metricTitle names a ranking as the screens do.
func metricTitle(m thermo.Metric) string {
	switch m {
	case thermo.BySigma:
		return "σ"
	case thermo.ByLog10K:
		return "log K"
	case thermo.ByDonorBDFE:
		return "donor BDFE"
	case thermo.ByAcceptorBDFE:
		return "acceptor BDFE"
	case thermo.ByDonorMargin:
		return "donor H2 margin"
	case thermo.ByZScore:
		return "ΔG°/σ"
	}
	return "ΔG°"
}

// entryColumns are the Donors and Acceptors columns: the best donor has the
// weakest bond, the best acceptor the strongest.
func entryColumns(acceptor bool) []column {
	return []column{
		{title: "name", width: 12, flex: 3},
		{title: "BDFE", width: 6, right: true, desc: acceptor},
		{title: "σ", width: 4, right: true},
		{title: "route", width: 8},
		{title: "solvent", width: 8, flex: 1},
		{title: "H2 margin", width: 10},
		{title: "closure", width: 8, desc: true},
		{title: "source", width: 8, flex: 2},
		{title: "id", width: 10, flex: 1, hide: 1},
	}
}

const entryID = 8 // the id column, shown when the width allows

const seriesAcc = 2 // the Series acceptor column

var seriesCols = []column{
	{title: "series", width: 10, flex: 1},
	{title: "step", width: 4, right: true},
	{title: "acceptor", width: 12, flex: 2},
	{title: "BDFE", width: 6, right: true},
	{title: "ΔG°", width: 7, right: true},
	{title: "σ", width: 4, right: true},
	{title: "log K", width: 6, right: true, desc: true},
	{title: "note", width: 12, desc: true},
}

// gridSpec is the part of a grid's state a reorder job needs.
type gridSpec struct {
	sortCol int
	desc    bool
	query   string
}

func (g *grid) spec() gridSpec { return gridSpec{g.sortCol, g.desc(), g.query} }

// markKey names a pair by its couples' ids, so a shortlist survives a
// re-evaluation and a restart.
type markKey struct{ D, A string }

func pairKey(p *thermo.Pair) markKey { return markKey{p.Donor.Couple.ID, p.Acceptor.Couple.ID} }

func (m Model) markSnapshot() map[markKey]struct{} {
	out := make(map[markKey]struct{}, len(m.marks))
	for k := range m.marks {
		out[k] = struct{}{}
	}
	return out
}

func (m Model) marked(p *thermo.Pair) bool {
	_, ok := m.marks[pairKey(p)]
	return ok
}

// jobFor builds the sort and filter job of pane p. It reads only t (never
// changed once built), the marks copy and the series rows (rebuilt, never
// changed in place).
func jobFor(t *tables, p pane, s gridSpec, marks map[markKey]struct{}, series []seriesRow) orderJob {
	j := orderJob{desc: s.desc, anchor: -1}
	switch p {
	case panePairs:
		j.n = len(t.pairs)
		pr := t.pairs
		switch s.sortCol {
		case pairDonor:
			j.key = func(i int32) float64 { return t.donorOrd[t.pd[i]] }
		case pairAcc:
			j.key = func(i int32) float64 { return t.accOrd[t.pa[i]] }
		case pairDG:
			j.key = func(i int32) float64 { return pr[i].DG.Kcal }
		case pairSigma:
			j.key = func(i int32) float64 { return pr[i].DG.Sigma() }
		case pairLogK:
			j.key = func(i int32) float64 { return pr[i].Log10K }
		case pairConv:
			// In one flask the conversion rises strictly with log K (thermo's
			// EquilibriumConversion), so log K orders it, and keeps apart
			// conversions that round to 1.
			j.key = func(i int32) float64 { return pr[i].Log10K }
		case pairRate:
			// No estimate sorts after every estimate, in either direction.
			none := math.Inf(1)
			if s.desc {
				none = math.Inf(-1)
			}
			j.key = func(i int32) float64 {
				if k, ok := t.rateKey(i); ok {
					return k
				}
				return none
			}
		case pairDonorBDFE:
			j.key = func(i int32) float64 { return pr[i].Donor.BDFE.Kcal }
		case pairAccBDFE:
			j.key = func(i int32) float64 { return pr[i].Acceptor.BDFE.Kcal }
		case pairH2:
			j.key = func(i int32) float64 { return pr[i].Donor.Margin.Kcal }
		default:
			j.key = func(i int32) float64 {
				if _, ok := marks[pairKey(&pr[i])]; ok {
					return 1
				}
				return 0
			}
		}
		if s.query != "" {
			dm, am := matches(t.donorText, s.query), matches(t.accText, s.query)
			j.keep = func(i int32) bool { return dm[t.pd[i]] || am[t.pa[i]] }
		}
	case paneDonors, paneAcceptors:
		es, text, ord := t.donors, t.donorText, t.donorOrd
		if p == paneAcceptors {
			es, text, ord = t.acceptors, t.accText, t.accOrd
		}
		j.n = len(es)
		j.key, j.skey = entryKey(es, ord, s.sortCol)
		if s.query != "" {
			mt := matches(text, s.query)
			j.keep = func(i int32) bool { return mt[i] }
		}
	case paneSeries:
		j.n = len(series)
		j.key, j.skey = seriesKey(series, s.sortCol)
		if s.query != "" {
			texts := make([]string, len(series))
			for i, r := range series {
				texts[i] = strings.ToLower(r.name + "\x00" + r.pair.Acceptor.Couple.ID + "\x00" + r.pair.Acceptor.Couple.Name)
			}
			mt := matches(texts, s.query)
			j.keep = func(i int32) bool { return mt[i] }
		}
	}
	return j
}

func entryKey(es []*data.Entry, nameOrd []float64, col int) (func(int32) float64, func(int32) string) {
	switch col {
	case 0:
		return func(i int32) float64 { return nameOrd[i] }, nil
	case entryID:
		return nil, func(i int32) string { return es[i].ID }
	case 1:
		return func(i int32) float64 { return es[i].R.BDFE.Kcal }, nil
	case 2:
		return func(i int32) float64 { return es[i].R.BDFE.Sigma() }, nil
	case 3:
		return func(i int32) float64 { return float64(es[i].R.Route) }, nil
	case 4:
		return nil, func(i int32) string { return es[i].Couple.Solvent.Name }
	case 5:
		return func(i int32) float64 { return es[i].R.Margin.Kcal }, nil
	case 6:
		return func(i int32) float64 {
			if es[i].R.Closure != nil {
				return 1
			}
			return 0
		}, nil
	}
	return nil, func(i int32) string { return es[i].Source }
}

func seriesKey(rs []seriesRow, col int) (func(int32) float64, func(int32) string) {
	switch col {
	case 1:
		return func(i int32) float64 { return float64(rs[i].step) }, nil
	case seriesAcc:
		return nil, func(i int32) string { return rs[i].pair.Acceptor.Couple.Name + "\x00" + rs[i].pair.Acceptor.Couple.ID }
	case 3:
		return func(i int32) float64 { return rs[i].pair.Acceptor.BDFE.Kcal }, nil
	case 4:
		return func(i int32) float64 { return rs[i].pair.DG.Kcal }, nil
	case 5:
		return func(i int32) float64 { return rs[i].pair.DG.Sigma() }, nil
	case 6:
		return func(i int32) float64 { return rs[i].pair.Log10K }, nil
	case 7:
		return func(i int32) float64 {
			if rs[i].bottleneck {
				return 1
			}
			return 0
		}, nil
	}
	// Series column: the order the rows were built in (series, then step).
	return func(i int32) float64 { return float64(i) }, nil
}

// --- cells: formatting only ---

func (m Model) pairCell(r int32, col int) string {
	p := &m.t.pairs[r]
	switch col {
	case pairDonor:
		return label(m.labels.get(slotPairD, m.t), m.t.donorName, m.t.pd[r])
	case pairAcc:
		s := label(m.labels.get(slotPairA, m.t), m.t.accName, m.t.pa[r])
		if p.CrossSolvent {
			s += crossMark
		}
		return s
	case pairDG:
		return m.e(p.DG.Kcal) + pairFlags(p, m.t.ev.Cond)
	case pairSigma:
		return m.e(p.DG.Sigma())
	case pairLogK:
		return fmt.Sprintf("%.1f", p.Log10K)
	case pairConv:
		return convText(m.t.estimate(p).Conversion)
	case pairRate:
		x := m.t.estimate(p).Cross
		if x == nil {
			return "–"
		}
		s := fmt.Sprintf("%.1f", x.Log10K)
		if x.OutRange {
			s += "!"
		}
		return s
	case pairDonorBDFE:
		return m.e(p.Donor.BDFE.Kcal)
	case pairAccBDFE:
		return m.e(p.Acceptor.BDFE.Kcal)
	case pairH2:
		return tendency(p.Donor.Tendency)
	}
	if m.marked(p) {
		return "*"
	}
	return ""
}

// pairFlags are the letters after a pair's ΔG°: e when its verdict rests on
// an estimated constant on the basis in force (thermo's Pair.OnEstimate), b
// when a side's BDFE was given without a basis (BasisAssumed). The status
// line of Pairs says what they mean.
func pairFlags(p *thermo.Pair, c thermo.Conditions) string {
	s := ""
	if p.OnEstimate(c) {
		s += "e"
	}
	if p.Donor.BasisAssumed() || p.Acceptor.BasisAssumed() {
		s += "b"
	}
	return s
}

// convText writes the fraction of acceptor converted as a percentage, never
// rounding a conversion that is not complete (or not nil) to "100%" ("0%").
func convText(c thermo.Conversion) string {
	switch x := 100 * c.Fraction; {
	case c.Left <= 0:
		return "100%"
	case x >= 99.95:
		return ">99.9%"
	case c.Fraction <= 0:
		return "0%"
	case x < 0.05:
		return "<0.1%"
	default:
		return fmt.Sprintf("%.1f%%", x)
	}
}

func tendency(t thermo.Tendency) string { return t.Symbol() + " " + t.String() }

func (m Model) entryCell(es []*data.Entry, names []string) cellFunc {
	base := m.t.donorName
	if len(es) > 0 && len(m.t.acceptors) > 0 && &es[0] == &m.t.acceptors[0] {
		base = m.t.accName
	}
	return func(r int32, col int) string {
		e := es[r]
		switch col {
		case 0:
			return label(names, base, r)
		case entryID:
			return e.ID
		case 1:
			if e.R.BasisAssumed() {
				return m.e(e.R.BDFE.Kcal) + "b"
			}
			return m.e(e.R.BDFE.Kcal)
		case 2:
			s := m.e(e.R.BDFE.Sigma())
			if assumed(e.R) {
				s += "a"
			}
			return s
		case 3:
			return e.R.Route.Short()
		case 4:
			return e.Couple.Solvent.Name
		case 5:
			return e.R.Tendency.Symbol() + " " + fmt.Sprintf("%+.1f", m.units.From(e.R.Margin.Kcal))
		case 6:
			if e.R.Closure != nil {
				return "! open"
			}
			if len(e.R.Routes) > 1 {
				return "closes"
			}
			return ""
		}
		return e.Source
	}
}

// assumed tells whether a default σ went into the couple's BDFE; the σ
// cell carries "a" for it. Another per-value marker (an estimated
// constant, say) follows the same way: a predicate here, a letter in the
// cell, a word in the status line of Donors and Acceptors.
func assumed(r *thermo.Resolved) bool {
	in := r.Couple.In
	for _, v := range []*thermo.Value{in.BDFE, in.BDE, in.PKa, in.PKaCation, in.AcidPKa} {
		if v != nil && v.Sigma == 0 {
			return true
		}
	}
	for _, p := range []*thermo.Potential{in.EAnion, in.ECation, in.Reductant} {
		if p != nil && p.Sigma == 0 {
			return true
		}
	}
	return false
}

func (m Model) seriesCell(r int32, col int) string {
	row := &m.series[r]
	p := &row.pair
	switch col {
	case 0:
		return row.name
	case 1:
		return fmt.Sprint(row.step + 1)
	case seriesAcc:
		if r < int32(len(m.labels.ser.s)) {
			return m.labels.ser.s[r]
		}
		return shown(coupleName(p.Acceptor.Couple))
	case 3:
		return m.e(p.Acceptor.BDFE.Kcal)
	case 4:
		return m.e(p.DG.Kcal)
	case 5:
		return m.e(p.DG.Sigma())
	case 6:
		return fmt.Sprintf("%.1f", p.Log10K)
	}
	var notes []string
	if row.bottleneck {
		notes = append(notes, "◀ bottleneck")
	}
	if p.H2Wins {
		notes = append(notes, "H2 wins")
	}
	return strings.Join(notes, ", ")
}

func (m Model) seriesView() string {
	d := m.seriesDonor
	if d == nil {
		return m.st.Dim.Render("no donor selected")
	}
	g := m.grids[paneSeries]
	head := fmt.Sprintf("Donor %s, BDFE %s %s, through %d series (the donor under the last cursor moved, Donors or Pairs)",
		shown(coupleName(d.Couple)), m.e(d.BDFE.Kcal), m.units.Label(), len(m.t.ev.Series))
	if len(m.t.ev.Series) == 0 {
		return head + "\n" + m.st.Dim.Render(" the library defines no series (or none complete in this solvent)")
	}
	body := g.view(m.st, m.seriesCell, func(r int32) bool { return m.series[r].bottleneck }, "no steps match")
	foot := ""
	if r := g.row(); r >= 0 {
		row := m.series[r]
		res := row.res
		foot = fmt.Sprintf("%s: overall ΔG° %s, mean BDFE %s, bottleneck step %d (%s)", shown(row.name),
			m.e(res.Overall), m.e(res.MeanBDFE), res.Bottleneck+1, shown(coupleName(res.Steps[res.Bottleneck].Acceptor.Couple)))
	}
	return head + "\n" + body + "\n" + m.st.Dim.Render(foot)
}
