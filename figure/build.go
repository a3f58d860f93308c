package figure

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"github.com/hatsieve/hatsieve/data"
	"github.com/hatsieve/hatsieve/thermo"
)

// Conditions is the caption's account of what the numbers of ev mean:
// solvent, C_G and its basis ("explicit" when given, "estimate" where no
// published value exists), the H2 line at the H2 pressure in force,
// temperature, pH, units and the library; the facts of
// thermo.ConditionsText, written as a sentence.
func Conditions(ev *data.Evaluated, u thermo.Units) string {
	ul := u.Label()
	s, c := ev.Working, ev.Cond
	parts := []string{"Solvent " + data.Printable(solventName(ev))}
	if n, err := c.CGOf(s); err == nil {
		b := c.BasisLabel(s) + " basis"
		if n.Status == thermo.Estimate || (!c.Explicit(s) && s.CGEstimated(c.Basis)) {
			b += ", an estimate"
		}
		parts = append(parts, fmt.Sprintf("C_G %.2f %s vs %v (%s)", u.From(n.V), ul, s.Ref, b))
	} else if s.IsGas() {
		parts = append(parts, "gas phase (no C_G)")
	}
	h2 := fmt.Sprintf("H2 line G_H = %.2f %s", u.From(ev.H2Line.V), ul)
	if ev.H2Line.Status == thermo.Estimate {
		h2 += " (an estimate)"
	}
	if p := c.PH2Atm(); p != thermo.StandardH2Pressure {
		h2 += fmt.Sprintf(" at p(H2) = %g atm", p)
	}
	parts = append(parts, h2, thermo.TemperatureText(c))
	if c.PH != nil {
		parts = append(parts, fmt.Sprintf("pH %g", *c.PH))
	}
	parts = append(parts, "energies in "+ul)
	return strings.Join(parts, "; ") + ". Library: " + libraryText(ev) + "."
}

// hasDemo reports whether ev resolves a couple of the invented demo.
func hasDemo(ev *data.Evaluated) bool {
	for _, side := range [][]*thermo.Resolved{ev.Donors, ev.Acceptors} {
		for _, r := range side {
			if strings.HasPrefix(r.Couple.ID, "demo-") {
				return true
			}
		}
	}
	return false
}

// libraryText names a library in a caption: the embedded one by what it
// is, others by their titles (or files), the first three and how many
// more.
func libraryText(ev *data.Evaluated) string {
	l := ev.Lib
	embedded := len(l.Files) > 0
	for _, f := range l.Files {
		embedded = embedded && strings.HasPrefix(f, data.EmbeddedPrefix)
	}
	if embedded {
		if hasDemo(ev) {
			return "the embedded reference set (published values; ids demo-… are invented)"
		}
		return "the embedded reference set (published values)"
	}
	names := l.Titles
	if len(names) == 0 {
		names = l.Files
	}
	if len(names) > 3 {
		return data.Printable(strings.Join(names[:3], " + ")) + fmt.Sprintf(" and %d more", len(names)-3)
	}
	return data.Printable(strings.Join(names, " + "))
}

// CoupleOf is the figure's view of a resolved couple in units u.
func CoupleOf(r *thermo.Resolved, u thermo.Units) Couple {
	return Couple{
		Label:    r.Couple.ID,
		Value:    u.From(r.BDFE.Kcal),
		Sigma:    u.From(r.BDFE.Sigma()),
		Tendency: r.Tendency,
		BelowH2:  r.Margin.Kcal < 0,
	}
}

// LadderOf builds the ladder of the given donors and acceptors of ev (all
// of them, or what a screen shows).
func LadderOf(ev *data.Evaluated, donors, acceptors []*thermo.Resolved, u thermo.Units) LadderInput {
	in := LadderInput{
		Title:      "BDFE ladder, " + solventName(ev),
		H2Line:     u.From(ev.H2Line.V),
		H2Pressure: ev.Cond.PH2Atm(),
		Units:      u.Label(),
	}
	for _, r := range donors {
		in.Donors = append(in.Donors, CoupleOf(r, u))
	}
	for _, r := range acceptors {
		in.Acceptors = append(in.Acceptors, CoupleOf(r, u))
	}
	in.Caption = Conditions(ev, u) + " Error bars ±1σ; a donor is H2 downhill when BDFE − G_H < −2σ, uphill when > +2σ."
	return in
}

// CouplesOf returns the donors and the acceptors of pairs (the rows a
// screen shows), each once, in order of first appearance, at most n of
// each (n ≤ 0: all): the couples of a map of those pairs.
func CouplesOf(pairs []thermo.Pair, n int) (donors, acceptors []*thermo.Resolved) {
	return collect(pairs, n)
}

// PairIn returns the LadderPair of p in a ladder built by LadderOf from
// donors and acceptors, or nil when either couple is not among them.
func PairIn(p *thermo.Pair, donors, acceptors []*thermo.Resolved, u thermo.Units) *LadderPair {
	if p == nil {
		return nil
	}
	di, ai := slices.Index(donors, p.Donor), slices.Index(acceptors, p.Acceptor)
	if di < 0 || ai < 0 {
		return nil
	}
	return &LadderPair{Donor: di, Acceptor: ai, DG: u.From(p.DG.Kcal)}
}

// Pick is the rule that chooses the couples of a side when not all are
// drawn.
type Pick int

const (
	// PickSpan spans the side's BDFE range: the weakest and the strongest
	// bond, the one nearest the H2 line, then each next the one furthest in
	// BDFE from those already chosen (the default: a slide of the scale).
	PickSpan Pick = iota
	// PickNearH2 takes those nearest the H2 line (those that decide between
	// H delivery and H2 evolution).
	PickNearH2
)

// Rule is the caption's words for the rule.
func (p Pick) Rule() string {
	if p == PickNearH2 {
		return "as those nearest the H2 line"
	}
	return "to span the BDFE range (the two extremes, the one nearest the H2 line, then each the one furthest in BDFE from those shown)"
}

// LadderFrom builds the ladder of the donors and acceptors of ev; n > 0
// keeps at most n on each side, chosen by pick, and the caption says how
// many of how many and by what rule.
func LadderFrom(ev *data.Evaluated, u thermo.Units, n int, pick Pick) LadderInput {
	choose := func(rs []*thermo.Resolved) []*thermo.Resolved {
		if pick == PickNearH2 {
			return NearestH2(rs, n)
		}
		return Spanning(rs, n, nil)
	}
	d, a := choose(ev.Donors), choose(ev.Acceptors)
	in := LadderOf(ev, d, a, u)
	in.DonorsOf, in.AcceptorsOf = len(ev.Donors), len(ev.Acceptors)
	if len(d) < len(ev.Donors) || len(a) < len(ev.Acceptors) {
		in.Caption += fmt.Sprintf(" %s, chosen %s.", shownOf(len(d), len(ev.Donors), len(a), len(ev.Acceptors)), pick.Rule())
	}
	return in
}

// shownOf says how many of how many couples a figure draws.
func shownOf(d, allD, a, allA int) string {
	return fmt.Sprintf("Shown: %d of %d donors and %d of %d acceptors", d, allD, a, allA)
}

// Spanning returns at most n couples of rs spread over their BDFE range,
// in their original order: the couples in keep (when among rs) first, then
// the weakest and the strongest bond and the one nearest the H2 line, then
// repeatedly the couple furthest in BDFE from every one already chosen
// (ties to the earlier in rs). n ≤ 0 returns rs.
func Spanning(rs []*thermo.Resolved, n int, keep []*thermo.Resolved) []*thermo.Resolved {
	if n <= 0 || n >= len(rs) {
		return rs
	}
	vals := make([]float64, len(rs))
	margins := make([]float64, len(rs))
	var seed []int
	for i, r := range rs {
		vals[i], margins[i] = r.BDFE.Kcal, r.Margin.Kcal
		if slices.Contains(keep, r) {
			seed = append(seed, i)
		}
	}
	idx := spanIndices(vals, margins, n, seed)
	out := make([]*thermo.Resolved, len(idx))
	for k, i := range idx {
		out[k] = rs[i]
	}
	return out
}

// spanIndices is Spanning on values: margin[i] is value i's distance to
// the H2 line (signed), seed the indices chosen first. The indices come
// back ascending.
func spanIndices(vals, margin []float64, n int, seed []int) []int {
	if n >= len(vals) {
		n = len(vals)
	}
	chosen := make([]bool, len(vals))
	var out []int
	add := func(i int) {
		if i >= 0 && !chosen[i] && len(out) < n {
			chosen[i] = true
			out = append(out, i)
		}
	}
	for _, i := range seed {
		add(i)
	}
	lo, hi, near := -1, -1, -1
	for i, v := range vals {
		if lo < 0 || v < vals[lo] {
			lo = i
		}
		if hi < 0 || v > vals[hi] {
			hi = i
		}
		if near < 0 || math.Abs(margin[i]) < math.Abs(margin[near]) {
			near = i
		}
	}
	add(lo)
	add(hi)
	add(near)
	// dist[i] is the distance from value i to the nearest chosen one.
	dist := make([]float64, len(vals))
	for i := range dist {
		dist[i] = math.Inf(1)
		for _, j := range out {
			dist[i] = math.Min(dist[i], math.Abs(vals[i]-vals[j]))
		}
	}
	for len(out) < n {
		best := -1
		for i := range vals {
			if !chosen[i] && (best < 0 || dist[i] > dist[best]) {
				best = i
			}
		}
		add(best)
		for i := range dist {
			dist[i] = math.Min(dist[i], math.Abs(vals[i]-vals[best]))
		}
	}
	sort.Ints(out)
	return out
}

// NearestH2 returns the n couples of rs whose BDFE lies nearest the H2
// line, in their original order; n ≤ 0 returns them all.
func NearestH2(rs []*thermo.Resolved, n int) []*thermo.Resolved {
	if n <= 0 || n >= len(rs) {
		return rs
	}
	idx := make([]int, len(rs))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(i, j int) bool {
		return math.Abs(rs[idx[i]].Margin.Kcal) < math.Abs(rs[idx[j]].Margin.Kcal)
	})
	idx = idx[:n]
	sort.Ints(idx)
	out := make([]*thermo.Resolved, n)
	for i, k := range idx {
		out[i] = rs[k]
	}
	return out
}

func solventName(ev *data.Evaluated) string {
	if ev.Working.Name != "" {
		return ev.Working.Name
	}
	return ev.Working.Key
}

// Mark names a pair by its couples' ids, as the screens' shortlist does.
type Mark struct{ Donor, Acceptor string }

// MapOf builds the map of donors × acceptors of ev, rows and columns in
// order of BDFE (the weakest donor bond first, the strongest acceptor bond
// first, so the most downhill pairs gather at the top left), ΔG° as
// thermo pairs them, and the pairs in marks shown as shortlisted.
func MapOf(ev *data.Evaluated, donors, acceptors []*thermo.Resolved, marks map[Mark]bool, u thermo.Units) MapInput {
	d := append([]*thermo.Resolved(nil), donors...)
	a := append([]*thermo.Resolved(nil), acceptors...)
	sort.SliceStable(d, func(i, j int) bool { return d[i].BDFE.Kcal < d[j].BDFE.Kcal })
	sort.SliceStable(a, func(i, j int) bool { return a[i].BDFE.Kcal > a[j].BDFE.Kcal })
	in := MapInput{
		Title: "ΔG°(HAT) of every pairing, " + solventName(ev),
		Units: u.Label(),
		DG:    make([][]float64, len(d)),
	}
	for _, r := range d {
		in.Donors = append(in.Donors, CoupleOf(r, u))
	}
	for _, r := range a {
		in.Acceptors = append(in.Acceptors, CoupleOf(r, u))
	}
	for i, dr := range d {
		in.DG[i] = make([]float64, len(a))
		for j, ar := range a {
			if dr.Couple == ar.Couple {
				in.DG[i][j] = math.NaN() // a couple is never paired with itself
				continue
			}
			p := thermo.MakePair(dr, ar, ev.Cond)
			in.DG[i][j] = u.From(p.DG.Kcal)
			if marks[Mark{dr.Couple.ID, ar.Couple.ID}] {
				in.Marked = append(in.Marked, [2]int{i, j})
			}
		}
	}
	in.Caption = Conditions(ev, u) + " ΔG°(HAT) = BDFE(donor) − BDFE(acceptor), purple downhill, orange uphill; rows and columns by BDFE." +
		" ▼ BDFE − G_H < −2σ, ≈ within ±2σ."
	if len(in.Marked) > 0 {
		in.Caption += " A framed cell is a shortlisted pair."
	}
	return in
}

// MaxMapSide is the most donors or acceptors a map draws: beyond, the
// labels fall below 6 pt on a slide.
const MaxMapSide = 120

// MapSelect says which couples a map draws.
type MapSelect struct {
	N int // at most N donors and N acceptors; 0 for all that pass the filters
	// Ranked takes the couples of the best pairs in rank's order (Rank.Sort)
	// until N of each are in; otherwise the N span the BDFE range of the
	// couples that pass the filters (PickSpan).
	Ranked bool
	Rank   thermo.RankOptions // the sort and the filters (tendencies, ΔG° window)
	// Keep names couples (by id) chosen before any other when they pass
	// the filters: those of a shortlist's pairs.
	Keep map[string]bool
}

// MapCouples chooses the donors and acceptors of a map. The filters are
// rank's: donors of the H2 tendencies asked for, and couples that take part
// in at least one pair inside the ΔG° window.
func MapCouples(ev *data.Evaluated, sel MapSelect) (donors, acceptors []*thermo.Resolved) {
	donors, acceptors = filtered(ev, sel.Rank)
	kept := func(rs []*thermo.Resolved) []*thermo.Resolved {
		var out []*thermo.Resolved
		for _, r := range rs {
			if sel.Keep[r.Couple.ID] {
				out = append(out, r)
			}
		}
		return out
	}
	kd, ka := kept(donors), kept(acceptors)
	if sel.Ranked && sel.N > 0 {
		return rankedCouples(ev, sel.Rank, sel.N, kd, ka)
	}
	return Spanning(donors, sel.N, kd), Spanning(acceptors, sel.N, ka)
}

// filtered returns the donors of the tendencies asked for and the couples
// with a partner inside the ΔG° window, each side in order of BDFE.
func filtered(ev *data.Evaluated, o thermo.RankOptions) (donors, acceptors []*thermo.Resolved) {
	for _, d := range ev.Donors {
		if len(o.Tendencies) == 0 || slices.Contains(o.Tendencies, d.Tendency) {
			donors = append(donors, d)
		}
	}
	acceptors = append([]*thermo.Resolved(nil), ev.Acceptors...)
	byBDFE := func(s []*thermo.Resolved) {
		sort.SliceStable(s, func(i, j int) bool { return s[i].BDFE.Kcal < s[j].BDFE.Kcal })
	}
	byBDFE(donors)
	byBDFE(acceptors)
	if o.DGMin == nil && o.DGMax == nil {
		return donors, acceptors
	}
	lo, hi := math.Inf(-1), math.Inf(1)
	if o.DGMin != nil {
		lo = *o.DGMin
	}
	if o.DGMax != nil {
		hi = *o.DGMax
	}
	// ΔG° = BDFE(D) − BDFE(A) in [lo, hi]: a partner's BDFE lies in a window.
	keep := func(side, other []*thermo.Resolved, win func(v float64) (float64, float64)) []*thermo.Resolved {
		var out []*thermo.Resolved
		for _, r := range side {
			a, b := win(r.BDFE.Kcal)
			k := sort.Search(len(other), func(i int) bool { return other[i].BDFE.Kcal >= a })
			if k < len(other) && other[k].BDFE.Kcal <= b {
				out = append(out, r)
			}
		}
		return out
	}
	donors = keep(donors, acceptors, func(d float64) (float64, float64) { return d - hi, d - lo })
	acceptors = keep(acceptors, donors, func(a float64) (float64, float64) { return a + lo, a + hi })
	return donors, acceptors
}

// maxRankedPairs bounds the pairs ranked to find the couples of a map.
const maxRankedPairs = 1 << 20

// rankedCouples takes the couples kd and ka, then those of the best pairs
// under o, in order, until n donors and n acceptors are in (or
// maxRankedPairs were ranked).
func rankedCouples(ev *data.Evaluated, o thermo.RankOptions, n int, kd, ka []*thermo.Resolved) (donors, acceptors []*thermo.Resolved) {
	total := len(ev.Donors) * len(ev.Acceptors)
	k := max(4*n*n, 64)
	for {
		k = min(k, total, maxRankedPairs)
		o.Top = k
		pairs := ev.Rank(o)
		donors, acceptors = collectAfter(pairs, n, kd, ka)
		if len(pairs) < k || k == total || k == maxRankedPairs || (len(donors) >= n && len(acceptors) >= n) {
			return donors, acceptors
		}
		k *= 4
	}
}

func collect(pairs []thermo.Pair, n int) (donors, acceptors []*thermo.Resolved) {
	return collectAfter(pairs, n, nil, nil)
}

// collectAfter is collect with the couples kd and ka taken first (at most
// n of each).
func collectAfter(pairs []thermo.Pair, n int, kd, ka []*thermo.Resolved) (donors, acceptors []*thermo.Resolved) {
	seenD := map[*thermo.Resolved]bool{}
	seenA := map[*thermo.Resolved]bool{}
	for _, r := range kd {
		if n <= 0 || len(donors) < n {
			seenD[r] = true
			donors = append(donors, r)
		}
	}
	for _, r := range ka {
		if n <= 0 || len(acceptors) < n {
			seenA[r] = true
			acceptors = append(acceptors, r)
		}
	}
	for _, p := range pairs {
		if !seenD[p.Donor] && (n <= 0 || len(donors) < n) {
			seenD[p.Donor] = true
			donors = append(donors, p.Donor)
		}
		if !seenA[p.Acceptor] && (n <= 0 || len(acceptors) < n) {
			seenA[p.Acceptor] = true
			acceptors = append(acceptors, p.Acceptor)
		}
		if n > 0 && len(donors) >= n && len(acceptors) >= n {
			break
		}
	}
	return donors, acceptors
}
